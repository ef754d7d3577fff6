/**
 * A scenario folder: `simulators/scenarios/<name>/scenario.json` (what the simulators play) and
 * `run.json` (the run configuration a user would give the server). Loading checks both files
 * and that they agree on what the server can know: the site's devices, sensors, depths,
 * quantities, the element's thickness and the placement time.
 */
import { readFileSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ValidationError } from '../../server/src/config/index.ts';
import { parseRunConfig } from '../../server/src/config/index.ts';
import type { RunConfig } from '../../server/src/config/index.ts';
import { parseScenario } from './scenarioSchema.ts';
import type { Scenario } from './scenarioSchema.ts';

/** The folder holding the shipped scenarios. */
export const SCENARIOS_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '..', 'scenarios');

/** The scenario `npm run demo` plays. */
export const DEMO_SCENARIO = 'level3-topping';

export interface ScenarioFolder {
  folder: string;
  scenario: Scenario;
  /** run.json as written (what is posted to the server). */
  runConfigInput: unknown;
  /** run.json validated by the server's schema, defaults filled in. */
  runConfig: RunConfig;
}

function readJson(path: string, what: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new ValidationError(what, [`cannot be read at ${path}: ${(error as Error).message}`]);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new ValidationError(what, [`${path} must be JSON: ${(error as Error).message}`]);
  }
}

/**
 * Loads a scenario folder by name (under SCENARIOS_DIR) or path.
 *
 * @throws ValidationError naming the file, field, rule and value of every problem
 */
export function loadScenarioFolder(nameOrPath: string): ScenarioFolder {
  const folder =
    isAbsolute(nameOrPath) || nameOrPath.includes('/')
      ? resolve(nameOrPath)
      : join(SCENARIOS_DIR, nameOrPath);
  const scenario = parseScenario(readJson(join(folder, 'scenario.json'), 'scenario.json'));
  const runConfigInput = readJson(join(folder, 'run.json'), 'run.json');
  const runConfig = parseRunConfig(runConfigInput);
  const problems = scenarioRunMismatches(scenario, runConfig);
  if (problems.length > 0) throw new ValidationError(`scenario ${scenario.name}`, problems);
  return { folder, scenario, runConfigInput, runConfig };
}

/**
 * Lists where a scenario and its run configuration disagree, one line each: every simulated
 * sensor must be in the run with the same quantity and depth and every run sensor simulated;
 * thickness, drying case, placement time, weather device, mast height and sensor names must match.
 */
export function scenarioRunMismatches(scenario: Scenario, run: RunConfig): string[] {
  const problems: string[] = [];
  const expect = (field: string, scenarioValue: unknown, runValue: unknown) => {
    if (scenarioValue !== runValue) {
      problems.push(
        `${field} must equal run.json's: scenario has ${JSON.stringify(scenarioValue)}, run.json ${JSON.stringify(runValue)}`,
      );
    }
  };
  expect('truth.thicknessMm', scenario.truth.thicknessMm, run.element.thicknessMm);
  expect('truth.drying', scenario.truth.drying, run.element.drying);
  expect('truth.placedAt', Date.parse(scenario.truth.placedAt), Date.parse(run.placedAt));
  expect('weather.device', scenario.weather.device, run.weather.device);
  expect('weather.mastHeightM', scenario.weather.mastHeightM, run.weather.mastHeightM);
  for (const quantity of Object.keys(
    run.weather.sensors,
  ) as (keyof RunConfig['weather']['sensors'])[]) {
    expect(
      `weather.sensors.${quantity}`,
      scenario.weather.sensors[quantity],
      run.weather.sensors[quantity],
    );
  }
  const runProbes = new Map(run.probes.map((probe) => [`${probe.device}/${probe.sensor}`, probe]));
  const simulated = new Set<string>();
  scenario.probeStrings.forEach((probeString, index) =>
    probeString.sensors.forEach((sensor, sensorIndex) => {
      const key = `${probeString.device}/${sensor.sensor}`;
      simulated.add(key);
      const field = `probeStrings[${index}].sensors[${sensorIndex}]`;
      const probe = runProbes.get(key);
      if (probe === undefined) {
        problems.push(`${field} (${key}) must be one of run.json's probes: it is not`);
        return;
      }
      expect(`${field}.quantity`, sensor.quantity, probe.quantity);
      expect(`${field}.depthMm`, sensor.depthMm, probe.depthMm);
    }),
  );
  for (const key of runProbes.keys()) {
    if (!simulated.has(key))
      problems.push(`run.json probe ${key} must be simulated: no probe string sends it`);
  }
  return problems;
}
