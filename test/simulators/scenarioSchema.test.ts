import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { validationIssues as issuesOf } from '../helpers/validationIssues.ts';
import {
  SCENARIOS_DIR,
  loadScenarioFolder,
  scenarioRunMismatches,
} from '../../simulators/src/scenarioFolder.ts';
import { parseScenario, utcOffsetMin } from '../../simulators/src/scenarioSchema.ts';

const folder = join(SCENARIOS_DIR, 'level3-topping');
const scenarioJson = () =>
  JSON.parse(readFileSync(join(folder, 'scenario.json'), 'utf8')) as Record<string, unknown>;
const runJson = () =>
  JSON.parse(readFileSync(join(folder, 'run.json'), 'utf8')) as Record<string, unknown>;

describe('the level3-topping scenario folder', () => {
  it("run.json validates against the server's run configuration schema", () => {
    const config = parseRunConfig(runJson());
    expect(config.site).toBe('ferngate-deck');
    expect(config.element).toMatchObject({ kind: 'topping', thicknessMm: 75 });
    expect(config.probes).toHaveLength(8);
  });

  it('scenario.json validates and agrees with run.json', () => {
    const loaded = loadScenarioFolder('level3-topping');
    expect(loaded.scenario.measureLogs).toHaveProperty('no-action', []);
    expect(loaded.scenario.measureLogs.fogging?.map((measure) => measure.kind)).toContain(
      'fogging',
    );
  });
});

describe('parseScenario()', () => {
  it.each([
    {
      what: 'a negative seed',
      edit: (s: Record<string, unknown>) => ({ ...s, seed: -1 }),
      issue: 'seed must be at least 0: got -1',
    },
    {
      what: 'a probe below the element',
      edit: (s: Record<string, unknown>) => {
        const probes = structuredClone(s.probeStrings) as { sensors: { depthMm: number }[] }[];
        (probes[0]?.sensors[0] as { depthMm: number }).depthMm = 140;
        return { ...s, probeStrings: probes };
      },
      issue:
        'probeStrings[0].sensors[0].depthMm must be between 0 and the element thickness (75 mm): got 140',
    },
    {
      what: 'an unknown default measure log',
      edit: (s: Record<string, unknown>) => ({ ...s, defaultMeasureLog: 'hoping' }),
      issue: 'defaultMeasureLog must name one of measureLogs (no-action, fogging): got "hoping"',
    },
    {
      what: 'an event ending before it starts',
      edit: (s: Record<string, unknown>) => {
        const weather = structuredClone(s.weather) as { events: { endAt: string }[] };
        (weather.events[0] as { endAt: string }).endAt = '2026-07-16T12:00:00+02:00';
        return { ...s, weather };
      },
      issue:
        'weather.events[0].endAt must be after 2026-07-16T12:45:00+02:00: got 2026-07-16T12:00:00+02:00',
    },
    {
      what: 'a time without an offset',
      edit: (s: Record<string, unknown>) => ({ ...s, startAt: '2026-07-16T11:00:00' }),
      issue:
        'startAt must be an ISO 8601 date and time with an offset, e.g. 2026-07-16T11:15:00+02:00: got "2026-07-16T11:00:00"',
    },
    {
      what: 'a misspelt field',
      edit: (s: Record<string, unknown>) => ({ ...s, durationHours: 3 }),
      issue: 'configuration has unknown field(s) durationHours',
    },
  ])('names the field, rule and value for $what', ({ edit, issue }) => {
    expect(issuesOf(() => parseScenario(edit(scenarioJson())))).toContain(issue);
  });
});

describe('scenarioRunMismatches()', () => {
  it('lists a probe run.json has and no probe string sends, and a depth that differs', () => {
    const scenario = parseScenario(scenarioJson());
    const run = runJson() as {
      probes: { device: string; sensor: string; depthMm: number; quantity: string }[];
    };
    run.probes.push({ device: 'probe-c9', sensor: 'rh-05', quantity: 'rh', depthMm: 5 });
    (run.probes[1] as { depthMm: number }).depthMm = 20;
    expect(scenarioRunMismatches(scenario, parseRunConfig(run))).toEqual([
      "probeStrings[0].sensors[1].depthMm must equal run.json's: scenario has 15, run.json 20",
      'run.json probe probe-c9/rh-05 must be simulated: no probe string sends it',
    ]);
  });
});

describe('utcOffsetMin()', () => {
  it.each([
    ['2026-07-16T11:15:00+02:00', 120],
    ['2026-01-10T08:00:00-05:30', -330],
    ['2026-01-10T08:00:00Z', 0],
  ])('%s is %d min', (text, expected) => {
    expect(utcOffsetMin(text)).toBe(expected);
  });
});
