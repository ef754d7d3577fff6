import { describe, expect, it } from 'vitest';
import { assimilate, type ObservationOperator } from '../../server/src/calibration/assimilate.ts';
import {
  createEnsemble,
  type Ensemble,
  type EnsembleSnapshot,
  forecastEnsemble,
  restoreEnsemble,
  snapshotEnsemble,
} from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import {
  exponentialDryingModel,
  initialMember,
  PROBE_DEPTH_M,
  RATE_SPEC,
  trueRelativeHumidity,
} from './_exponentialDrying.ts';

// Determinism (issue 6, item 6): the same seed and readings give identical numbers, and a run
// restored from a snapshot taken mid-run ends where an uninterrupted run ends. The model draws
// noise from the ensemble's generator at every step, so the generator's state must be restored too.
const intervalS = 600;
const model = exponentialDryingModel(0.002);
const operator: ObservationOperator = {
  predict: (member) => Float64Array.of(member.state[0] ?? NaN),
};
const layout = { depthM: Float64Array.of(PROBE_DEPTH_M) };

function readingAt(cycle: number): number {
  // Fixed pseudo-noise from its own generator, so the readings are the same in every run.
  const noise = createEnsembleRandom(1000 + cycle);
  return trueRelativeHumidity(cycle * intervalS) + 0.01 * noise.normal();
}

function runCycles(start: Ensemble, fromCycle: number, toCycle: number): Ensemble {
  let ensemble = start;
  for (let cycle = fromCycle + 1; cycle <= toCycle; cycle++) {
    ensemble = forecastEnsemble(ensemble, model, cycle * intervalS);
    const observation = { id: 'P1', value: readingAt(cycle), errorSd: 0.01, depthM: PROBE_DEPTH_M };
    ensemble = assimilate(ensemble, [observation], operator, [RATE_SPEC], layout).ensemble;
  }
  return ensemble;
}

const fresh = (seed: number) =>
  createEnsemble({ seed, specs: [RATE_SPEC], timeS: 0, initialMember });

function numbers(ensemble: Ensemble): number[] {
  return ensemble.members.flatMap((member) => [...member.state, ...member.parameters]);
}

describe('createEnsemble() / forecastEnsemble() / assimilate() determinism', () => {
  it('gives identical numbers for the same seed and readings', () => {
    expect(numbers(runCycles(fresh(42), 0, 30))).toEqual(numbers(runCycles(fresh(42), 0, 30)));
  });

  it('gives different numbers for another seed', () => {
    expect(numbers(runCycles(fresh(43), 0, 30))).not.toEqual(numbers(runCycles(fresh(42), 0, 30)));
  });

  it('draws 32 members by default', () => {
    expect(fresh(1).members).toHaveLength(32);
  });
});

describe('snapshotEnsemble() / restoreEnsemble()', () => {
  it('resumes mid-run through JSON and ends identical to an uninterrupted run', () => {
    const uninterrupted = runCycles(fresh(7), 0, 40);
    const halfway = runCycles(fresh(7), 0, 17);
    const json = JSON.stringify(snapshotEnsemble(halfway));
    const resumed = runCycles(restoreEnsemble(JSON.parse(json) as EnsembleSnapshot), 17, 40);
    expect(numbers(resumed)).toEqual(numbers(uninterrupted));
    expect(resumed.timeS).toBe(uninterrupted.timeS);
    expect(resumed.analysisCount).toBe(40);
    expect(resumed.random.snapshot()).toEqual(uninterrupted.random.snapshot());
  });

  it('carries per-member data through the caller-supplied converters', () => {
    const ensemble: Ensemble<{ ledger: Float64Array }> = {
      members: [
        {
          state: Float64Array.of(1),
          parameters: Float64Array.of(2),
          carried: { ledger: Float64Array.of(3, 4) },
        },
        {
          state: Float64Array.of(NaN),
          parameters: Float64Array.of(5),
          carried: { ledger: Float64Array.of(6) },
        },
      ],
      random: createEnsembleRandom(3),
      timeS: 3600,
      analysisCount: 2,
    };
    const snapshot = JSON.parse(
      JSON.stringify(snapshotEnsemble(ensemble, (carried) => Array.from(carried.ledger))),
    ) as EnsembleSnapshot;
    const restored = restoreEnsemble(snapshot, (json) => ({
      ledger: Float64Array.from(json as number[]),
    }));
    expect(restored.members[0]?.carried.ledger).toEqual(Float64Array.of(3, 4));
    expect(restored.members[1]?.state[0]).toBeNaN();
    expect(restored.timeS).toBe(3600);
  });

  it('rejects a snapshot of an unknown version', () => {
    const snapshot = { ...snapshotEnsemble(fresh(1)), version: 2 } as unknown as EnsembleSnapshot;
    expect(() => restoreEnsemble(snapshot)).toThrow(/ensemble snapshot version must be 1: got 2/);
  });
});

describe('forecastEnsemble()', () => {
  it('never runs event time backwards', () => {
    const ensemble = forecastEnsemble(fresh(1), model, 600);
    expect(forecastEnsemble(ensemble, model, 300)).toBe(ensemble);
    expect(forecastEnsemble(ensemble, model, Number.NaN)).toBe(ensemble);
  });
});
