import { describe, expect, it } from 'vitest';
import {
  type AnalysisMethod,
  assimilate,
  type Observation,
  type ObservationOperator,
} from '../../server/src/calibration/assimilate.ts';
import type { Ensemble, EnsembleMember } from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import { biasPrior, type ParameterSpec } from '../../server/src/calibration/parameterPrior.ts';
import { augmented, drawGaussian, kalmanPosterior, sampleMoments } from './_linearGaussian.ts';

// Linear-Gaussian case: augmented vector z = [s0, s1, s2, b] (three state entries, one additive
// bias parameter), two observations y_A = s0 + b, y_B = 0.5 s1 + s2. For a linear observation
// operator a square-root ensemble filter updates the sample mean and covariance exactly as the
// Kalman filter does (Tippett et al. 2003, MWR 131; Evensen 2009, on square-root schemes;
// from memory); with many members both approach the analytic posterior within Monte Carlo error.
const observationMatrix = [
  [1, 0, 0, 1],
  [0, 0.5, 1, 0],
];
const priorMean = [0.9, 0.7, 0.2, 0];
const priorCovariance = [
  [0.04, 0.02, 0.0, 0.0],
  [0.02, 0.05, 0.01, 0.0],
  [0.0, 0.01, 0.03, 0.0],
  [0.0, 0.0, 0.0, 0.0004],
];
const specs: ParameterSpec[] = [biasPrior('rhBias:A', 0.02, 'test')];
const layout = { depthM: Float64Array.from([0.005, 0.02, 0.05]) };
const observations: Observation[] = [
  { id: 'A', value: 0.8, errorSd: 0.05, depthM: 0.005 },
  { id: 'B', value: 0.5, errorSd: 0.08, depthM: 0.05 },
];
const linearOperator: ObservationOperator = {
  predict: (member) => {
    const z = augmented(member);
    return Float64Array.from(observationMatrix, (row) =>
      row.reduce((sum, h, i) => sum + h * (z[i] ?? 0), 0),
    );
  },
};

function ensembleOf(vectors: number[][]): Ensemble {
  const members: EnsembleMember[] = vectors.map((v) => ({
    state: Float64Array.from(v.slice(0, 3)),
    parameters: Float64Array.from(v.slice(3)),
    carried: null,
  }));
  return { members, random: createEnsembleRandom(1), timeS: 0, analysisCount: 0 };
}

const methods: { name: string; method: AnalysisMethod }[] = [
  { name: 'ETKF', method: { kind: 'etkf' } },
  { name: 'serial EnSRF', method: { kind: 'serial-ensrf', localisation: null } },
];

/**
 * Runs one analysis without inflation and checks its sample moments against the Kalman update of
 * the prior's sample moments, to `digits` decimals.
 */
function expectExactKalmanUpdate(
  prior: ReturnType<typeof ensembleOf>,
  observed: Observation[],
  operator: ObservationOperator,
  rows: number[][],
  method: (typeof methods)[number]['method'],
  digits: number,
): void {
  const forecast = sampleMoments(prior.members.map(augmented));
  const expected = kalmanPosterior(
    forecast.mean,
    forecast.covariance,
    rows,
    observed.map((o) => o.value),
    observed.map((o) => o.errorSd),
  );
  const { ensemble } = assimilate(prior, observed, operator, specs, layout, {
    method,
    inflation: { kind: 'none' },
  });
  const analysis = sampleMoments(ensemble.members.map(augmented));
  analysis.mean.forEach((value, i) => expect(value).toBeCloseTo(expected.mean[i] ?? NaN, digits));
  analysis.covariance.forEach((row, i) =>
    row.forEach((value, j) =>
      expect(value).toBeCloseTo(expected.covariance[i]?.[j] ?? NaN, digits),
    ),
  );
}

describe.each(methods)('assimilate() with the $name, linear-Gaussian case', ({ method }) => {
  it('updates the sample mean and covariance exactly as the Kalman filter (12 members)', () => {
    const prior = ensembleOf(drawGaussian(priorMean, priorCovariance, 12, createEnsembleRandom(7)));
    // Exact identity up to rounding: 1e-12 absolute on values of order 1e-1..1e-4.
    expectExactKalmanUpdate(prior, observations, linearOperator, observationMatrix, method, 12);
  });

  it('stays exact with more observations than members (5 members, 8 observations)', () => {
    const manyRows = Array.from({ length: 8 }, (_, j) =>
      [1, 0, 0, 0].map((_, i) => Math.cos(1 + i * (j + 1))),
    );
    const manyObservations: Observation[] = manyRows.map((_, j) => ({
      id: `P${j}`,
      value: 0.5 + 0.05 * j,
      errorSd: 0.05 + 0.01 * j,
      depthM: 0.01,
    }));
    const manyOperator: ObservationOperator = {
      predict: (member) => {
        const z = augmented(member);
        return Float64Array.from(manyRows, (row) =>
          row.reduce((sum, h, i) => sum + h * (z[i] ?? 0), 0),
        );
      },
    };
    const prior = ensembleOf(drawGaussian(priorMean, priorCovariance, 5, createEnsembleRandom(8)));
    expectExactKalmanUpdate(prior, manyObservations, manyOperator, manyRows, method, 11);
  });

  it('matches the analytic posterior within Monte Carlo error with 2000 members', () => {
    const memberCount = 2000;
    const prior = ensembleOf(
      drawGaussian(priorMean, priorCovariance, memberCount, createEnsembleRandom(11)),
    );
    const expected = kalmanPosterior(
      priorMean,
      priorCovariance,
      observationMatrix,
      observations.map((o) => o.value),
      observations.map((o) => o.errorSd),
    );
    const { ensemble } = assimilate(prior, observations, linearOperator, specs, layout, {
      method,
      inflation: { kind: 'none' },
    });
    const analysis = sampleMoments(ensemble.members.map(augmented));
    // Tolerance: 5 Monte Carlo standard errors. Mean: sqrt(P_ii / N) of the prior sample mean
    // (the analysis shrinks it). Covariance: the standard error of a sample covariance,
    // sqrt((P_ii P_jj + P_ij^2) / N) (Wishart), evaluated on the posterior.
    const posteriorCovariance = expected.covariance;
    analysis.mean.forEach((value, i) => {
      const tolerance = 5 * Math.sqrt((priorCovariance[i]?.[i] ?? 0) / memberCount);
      expect(Math.abs(value - (expected.mean[i] ?? NaN))).toBeLessThan(tolerance);
    });
    analysis.covariance.forEach((row, i) =>
      row.forEach((value, j) => {
        const pii = posteriorCovariance[i]?.[i] ?? 0;
        const pjj = posteriorCovariance[j]?.[j] ?? 0;
        const pij = posteriorCovariance[i]?.[j] ?? 0;
        const tolerance = 5 * Math.sqrt((pii * pjj + pij * pij) / memberCount);
        expect(Math.abs(value - pij)).toBeLessThan(tolerance);
      }),
    );
  });

  it('moves the mean towards the observation with the default inflation', () => {
    const prior = ensembleOf(drawGaussian(priorMean, priorCovariance, 32, createEnsembleRandom(3)));
    const { ensemble } = assimilate(prior, observations, linearOperator, specs, layout, { method });
    const forecast = sampleMoments(prior.members.map(augmented));
    const analysis = sampleMoments(ensemble.members.map(augmented));
    // With inflation the covariance grows before the update, the mean update stays a Kalman one:
    // the analysis mean moves towards the observations for the observed combination y_A.
    const predictedA = (z: number[]) => (z[0] ?? 0) + (z[3] ?? 0);
    expect(Math.abs(predictedA(analysis.mean) - 0.8)).toBeLessThan(
      Math.abs(predictedA(forecast.mean) - 0.8),
    );
  });
});
