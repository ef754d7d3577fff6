/**
 * The twin experiment of test/live/twinExperiment.test.ts over many seeds, as a script (not a
 * test): `npx tsx test/live/twinSeeds.ts [first-last] ['{"memberCount":48}']` replays the
 * level3-topping twin for run ids `ferngate-l3-twin-<n>` (n from first to last, default 1-22)
 * with the given engine options on top of the test's, and prints per run the RMSE ratio, the
 * 90 % band's coverage, both RMSEs, the prior band's width as an sd (p95 - p05) / 3.29 beside the
 * prior's error, and the calibrated multipliers; then how many runs meet each target. The prior
 * is the test's: no assimilation, no exposure walk. First it prints the model's floor: the same
 * engine and readings with the truth's hidden parameters in every member (no assimilation, no
 * walk), i.e. what the calibration could reach if it found them exactly. About 2.5 s per run on
 * one core.
 */
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunEngine, RunEngineOptions, RunState } from '../../server/src/live/index.ts';
import { PARAMETER_INDEX } from '../../server/src/live/memberModel.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { truthStressMPa, twinFigures } from '../helpers/twinMetrics.ts';
import { playTwin, readingBatches } from './twinReadings.ts';
import type { TwinRun } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');

/** Carried state of a member as the engine's snapshot writes it (the fields changed here). */
interface CarriedJson {
  parameters: { permeabilityMultiplier: number; exposureMultiplier: number };
  bleedFilmKgM2: number;
}

/**
 * The engine restarted from its own snapshot with the truth's hidden parameters in every member
 * (permeability and exposure multipliers, and the bleed film the members start with); null
 * while the engine has no ensemble yet.
 */
function withHiddenParameters(engine: RunEngine, runId: string, options: RunEngineOptions) {
  const snapshot = engine.snapshot();
  const body = snapshot.body as {
    ensemble: {
      members: { state: (number | null)[]; parameters: number[]; carried: CarriedJson }[];
    } | null;
  };
  if (body.ensemble === null) return null;
  const truth = folder.scenario.truth;
  for (const member of body.ensemble.members) {
    member.parameters[PARAMETER_INDEX.permeabilityMultiplier] = truth.permeabilityMultiplier;
    member.parameters[PARAMETER_INDEX.exposureMultiplier] = truth.exposureMultiplier;
    member.parameters[PARAMETER_INDEX.initialBleedFilmKgM2] = truth.initialBleedFilmKgM2;
    member.carried.parameters.permeabilityMultiplier = truth.permeabilityMultiplier;
    member.carried.parameters.exposureMultiplier = truth.exposureMultiplier;
    member.carried.bleedFilmKgM2 = truth.initialBleedFilmKgM2;
    member.state[member.state.length - 1] = truth.initialBleedFilmKgM2; // the film's entry
  }
  return createRunEngine(runId, folder.runConfig, options, snapshot);
}

/**
 * Runs the engine over the twin, 5 minutes of readings at a time; states by event time. With
 * `hidden`, every member takes the truth's hidden parameters after the first cycle that made
 * the ensemble (its first 5 minutes; the bleed film is set to the hidden one then).
 */
function replay(
  twin: TwinRun,
  runId: string,
  options: RunEngineOptions,
  hidden = false,
): Map<number, RunState> {
  let engine = createRunEngine(runId, folder.runConfig, options);
  let patched = !hidden;
  engine.setMeasures(twin.measures);
  const states = new Map<number, RunState>();
  for (const batch of readingBatches(twin.readings, 300)) {
    engine.addReadings(batch);
    const state = engine.advance();
    if (!patched) {
      const restarted = withHiddenParameters(engine, runId, options);
      if (restarted !== null) {
        engine = restarted;
        patched = true;
      }
    }
    if (state?.eventTimeMs != null) states.set(state.eventTimeMs, state);
  }
  return states;
}

/** Root-mean-square of the 90 % band widths read as normal sds, MPa, over the hardening samples. */
function bandSdMPa(states: ReadonlyMap<number, RunState>, times: Iterable<number>): number {
  let sum = 0;
  let count = 0;
  for (const timeMs of times) {
    const state = states.get(timeMs);
    if (state?.phase !== 'hardening' || state.nowBands === null) continue;
    const band = state.nowBands.surfaceStressMPa;
    sum += ((band.p95 - band.p05) / 3.29) ** 2;
    count += 1;
  }
  return Math.sqrt(sum / count);
}

const [firstText, lastText] = (process.argv[2] ?? '1-22').split('-');
const first = Number(firstText);
const last = Number(lastText ?? firstText);
const extra = JSON.parse(process.argv[3] ?? '{}') as RunEngineOptions;
const options: RunEngineOptions = { outlookEveryAnalyses: 1000, ...extra };
const prior: RunEngineOptions = { ...options, assimilation: false, exposureRandomWalkPerSqrtH: 0 };
const twin = playTwin(folder.scenario, { logName: 'no-action' });
const truthTimes = [...truthStressMPa(twin.truth).keys()];
const floorStates = replay(twin, 'ferngate-l3-twin-hidden', { ...prior, memberCount: 4 }, true);
const floor = twinFigures(twin.truth, floorStates, floorStates);
console.info(
  `floor: the truth's hidden parameters in every member, no assimilation: stress RMSE ` +
    `${floor.calibratedRmseMPa.toFixed(4)} MPa over ${floor.count} samples`,
);
let ratioMet = 0;
let coverageMet = 0;
let bothMet = 0;
for (let n = first; n <= last; n += 1) {
  const runId = `ferngate-l3-twin-${n}`;
  const calibrated = replay(twin, runId, options);
  const priorStates = replay(twin, runId, prior);
  const figures = twinFigures(twin.truth, calibrated, priorStates);
  const final = [...calibrated.values()].at(-1);
  const parameter = (name: string) => {
    const entry = final?.calibration.find((c) => c.name === name);
    return entry === undefined
      ? '-'
      : `${entry.mean.toFixed(2)} [${entry.p05.toFixed(2)}, ${entry.p95.toFixed(2)}]`;
  };
  const ratioOk = figures.rmseRatio <= 0.5;
  const coverageOk = figures.coverage >= 0.8;
  if (ratioOk) ratioMet += 1;
  if (coverageOk) coverageMet += 1;
  if (ratioOk && coverageOk) bothMet += 1;
  console.info(
    `run ${n}: ratio ${figures.rmseRatio.toFixed(3)}, coverage ${figures.coverage.toFixed(2)}, ` +
      `RMSE calibrated ${figures.calibratedRmseMPa.toFixed(4)} MPa, prior ${figures.priorRmseMPa.toFixed(4)} MPa ` +
      `(prior band sd ${bandSdMPa(priorStates, truthTimes).toFixed(4)} MPa), ${figures.count} samples; ` +
      `permeability ${parameter('permeabilityMultiplier')}, exposure ${parameter('evaporationExposureMultiplier')}` +
      (ratioOk && coverageOk ? '' : ' - misses a target'),
  );
}
const runs = last - first + 1;
console.info(
  `options ${JSON.stringify(extra)}: both targets in ${bothMet} of ${runs} runs, ratio <= 0.5 in ${ratioMet}, coverage >= 0.8 in ${coverageMet}`,
);
