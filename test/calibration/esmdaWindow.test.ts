import { describe, expect, it } from 'vitest';
import type { Observation, ObservationOperator } from '../../server/src/calibration/assimilate.ts';
import {
  createEnsemble,
  type Ensemble,
  type EnsembleMember,
  type ForecastModel,
} from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import { esmdaWindow, type WindowReadings } from '../../server/src/calibration/esmdaWindow.ts';
import { biasPrior, type ParameterSpec } from '../../server/src/calibration/parameterPrior.ts';
import {
  exponentialDryingModel,
  initialMember,
  PROBE_DEPTH_M,
  RATE_SPEC,
  TRUE_RATE_PER_S,
  trueRelativeHumidity,
} from './_exponentialDrying.ts';
import { augmented, drawGaussian, kalmanPosterior, sampleMoments } from './_linearGaussian.ts';

// Linear-Gaussian window: a static model (members do not change in time) observed at two times.
// With a linear model and Gaussian errors ES-MDA reproduces, as the ensemble grows, the Kalman
// posterior of all the window's data at once (Emerick and Reynolds 2013, section 2, from memory).
const priorMean = [0.9, 0.7, 0.2, 0];
const priorCovariance = [
  [0.04, 0.02, 0.0, 0.0],
  [0.02, 0.05, 0.01, 0.0],
  [0.0, 0.01, 0.03, 0.0],
  [0.0, 0.0, 0.0, 0.0004],
];
const rows: Record<string, number[]> = {
  A: [1, 0, 0, 1],
  B: [0, 0.5, 1, 0],
  C: [0, 1, 0, 0],
};
const specs: ParameterSpec[] = [biasPrior('rhBias:A', 0.02, 'test')];
const layout = { depthM: Float64Array.from([0.005, 0.02, 0.05]) };
const staticModel: ForecastModel = {
  advance: (member) => ({
    state: member.state.slice(),
    parameters: member.parameters.slice(),
    carried: null,
  }),
};
const linearOperator: ObservationOperator = {
  predict: (member, observations) => {
    const z = augmented(member);
    return Float64Array.from(observations, (o) =>
      (rows[o.id] ?? []).reduce((sum, h, i) => sum + h * (z[i] ?? 0), 0),
    );
  },
};
const window: WindowReadings[] = [
  {
    timeS: 600,
    observations: [
      { id: 'A', value: 0.8, errorSd: 0.05, depthM: 0.005 },
      { id: 'B', value: 0.5, errorSd: 0.08, depthM: 0.05 },
    ],
  },
  {
    timeS: 1200,
    observations: [
      { id: 'A', value: 0.78, errorSd: 0.05, depthM: 0.005 },
      { id: 'C', value: 0.6, errorSd: 0.04, depthM: 0.02 },
    ],
  },
];

function ensembleOf(vectors: number[][], seed: number): Ensemble {
  const members: EnsembleMember[] = vectors.map((v) => ({
    state: Float64Array.from(v.slice(0, 3)),
    parameters: Float64Array.from(v.slice(3)),
    carried: null,
  }));
  return { members, random: createEnsembleRandom(seed), timeS: 0, analysisCount: 0 };
}

describe('esmdaWindow() on a linear-Gaussian window', () => {
  it('matches the Kalman posterior of all the window data within Monte Carlo error (3000 members)', () => {
    const memberCount = 3000;
    const prior = ensembleOf(
      drawGaussian(priorMean, priorCovariance, memberCount, createEnsembleRandom(21)),
      22,
    );
    const stacked: Observation[] = window.flatMap((reading) => [...reading.observations]);
    const expected = kalmanPosterior(
      priorMean,
      priorCovariance,
      stacked.map((o) => rows[o.id] ?? []),
      stacked.map((o) => o.value),
      stacked.map((o) => o.errorSd),
    );
    const { start } = esmdaWindow(prior, window, staticModel, linearOperator, specs, layout);
    const analysis = sampleMoments(start.members.map(augmented));
    // Tolerances: 5 Monte Carlo standard errors as in the filter test (sqrt(P_ii / N) for the
    // mean; sqrt((P_ii P_jj + P_ij^2) / N) for a covariance), doubled for the covariance because
    // the perturbed observations of each of the four steps add their own sampling noise.
    analysis.mean.forEach((value, i) => {
      const tolerance = 5 * Math.sqrt((priorCovariance[i]?.[i] ?? 0) / memberCount);
      expect(Math.abs(value - (expected.mean[i] ?? NaN))).toBeLessThan(tolerance);
    });
    analysis.covariance.forEach((row, i) =>
      row.forEach((value, j) => {
        const pii = expected.covariance[i]?.[i] ?? 0;
        const pjj = expected.covariance[j]?.[j] ?? 0;
        const pij = expected.covariance[i]?.[j] ?? 0;
        expect(Math.abs(value - pij)).toBeLessThan(
          10 * Math.sqrt((pii * pjj + pij * pij) / memberCount),
        );
      }),
    );
  });

  it('treats missing readings as absent and returns the start unchanged for an empty window', () => {
    const prior = ensembleOf(
      drawGaussian(priorMean, priorCovariance, 20, createEnsembleRandom(4)),
      5,
    );
    const withGap = window.map((reading, t) =>
      t === 1
        ? {
            ...reading,
            observations: [
              ...reading.observations,
              { id: 'B', value: NaN, errorSd: 0.08, depthM: 0.05 },
            ],
          }
        : reading,
    );
    const again = ensembleOf(
      drawGaussian(priorMean, priorCovariance, 20, createEnsembleRandom(4)),
      5,
    );
    const a = esmdaWindow(prior, withGap, staticModel, linearOperator, specs, layout).start;
    const b = esmdaWindow(again, window, staticModel, linearOperator, specs, layout).start;
    expect(a.members.map(augmented)).toEqual(b.members.map(augmented));
    const empty = esmdaWindow(prior, [], staticModel, linearOperator, specs, layout);
    expect(empty.start).toBe(prior);
    expect(empty.end).toBe(prior);
  });
});

describe('esmdaWindow() twin experiment on exponential drying', () => {
  // The set-up of the filter's twin experiment (assimilate.twin.test.ts), smoothed over one 12 h
  // window: 48 readings every 15 minutes, 1 %RH noise, 0.1 %RH quantisation, 32 members.
  const truthNoise = createEnsembleRandom(2024);
  const readings: WindowReadings[] = Array.from({ length: 48 }, (_, i) => {
    const timeS = (i + 1) * 900;
    const value =
      Math.round((trueRelativeHumidity(timeS) + 0.01 * truthNoise.normal()) * 1000) / 1000;
    return { timeS, observations: [{ id: 'P1', value, errorSd: 0.01, depthM: PROBE_DEPTH_M }] };
  });
  const operator: ObservationOperator = {
    predict: (member) => Float64Array.of(member.state[0] ?? NaN),
  };
  const run = (seed: number) =>
    esmdaWindow(
      createEnsemble({ seed, specs: [RATE_SPEC], timeS: 0, initialMember }),
      readings,
      exponentialDryingModel(),
      operator,
      [RATE_SPEC],
      { depthM: Float64Array.of(PROBE_DEPTH_M) },
    );
  const { start, end } = run(99);
  const logs = start.members.map((member) => Math.log(member.parameters[0] ?? NaN));
  const mean = logs.reduce((sum, v) => sum + v, 0) / logs.length;
  const sd = Math.sqrt(logs.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (logs.length - 1));

  it('brings the rate within 15 % of the hidden value and covers it within 3 sd', () => {
    expect(Math.abs(mean - Math.log(TRUE_RATE_PER_S))).toBeLessThan(Math.log(1.15));
    expect(Math.abs(mean - Math.log(TRUE_RATE_PER_S))).toBeLessThan(3 * sd);
    expect(sd).toBeLessThan(RATE_SPEC.priorSd / 4);
  });

  it('ends the window at the last reading time, tracking the truth within 2 %RH', () => {
    expect(end.timeS).toBe(48 * 900);
    const meanRh =
      end.members.reduce((sum, member) => sum + (member.state[0] ?? NaN), 0) / end.members.length;
    expect(Math.abs(meanRh - trueRelativeHumidity(48 * 900))).toBeLessThan(0.02);
  });

  it('is repeatable from the seed', () => {
    expect(run(99).start.members.map(augmented)).toEqual(start.members.map(augmented));
  });
});
