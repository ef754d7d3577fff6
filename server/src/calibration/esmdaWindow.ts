/**
 * Ensemble smoother with multiple data assimilation (ES-MDA) over a window of readings: the
 * members' state at the window's start and their parameters are updated from all readings in the
 * window at once, the same data being assimilated `Na` times with its error covariance inflated
 * by coefficients alpha_i whose reciprocals sum to 1; the model is re-run through the window
 * between updates. Emerick and Reynolds (2013), Computers & Geosciences 55, algorithm of section
 * 2 (from memory). For a linear model and Gaussian errors it reproduces the Kalman posterior of
 * the whole window as the ensemble grows; for a nonlinear model the repeated small updates
 * behave better than one large one.
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { type EnsembleMatrix, removeRowMeans } from './_ensembleMatrix.ts';
import { fromAnalysisMatrix, toAnalysisMatrix } from './_memberPacking.ts';
import type { Observation, ObservationOperator, StateLayout } from './assimilate.ts';
import { type Ensemble, type ForecastModel, forecastEnsemble } from './ensemble.ts';
import {
  type ObservationTransform,
  transformObservation,
  transformObservationErrorSd,
} from './observationTransform.ts';
import type { ParameterSpec } from './parameterPrior.ts';

/** The readings of one time in the window. */
export interface WindowReadings {
  /** Event time of the readings, s; after the ensemble's start time. */
  timeS: number;
  observations: readonly Observation[];
}

/** Options of {@link esmdaWindow}. */
export interface EsmdaOptions {
  /**
   * Inflation coefficients alpha_i of the observation error covariance, one per iteration; the
   * reciprocals should sum to 1 (otherwise the posterior spread is mis-scaled). Default
   * [4, 4, 4, 4]: four equal steps, the common choice in Emerick and Reynolds (2013).
   */
  coefficients?: readonly number[];
  /** Default `{ kind: 'relative-humidity' }`. */
  observationTransform?: ObservationTransform;
}

/** One observation of the window, located in time. */
interface WindowEntry {
  timeIndex: number;
  observation: Observation;
  observed: number;
  errorSd: number;
}

/**
 * Runs ES-MDA over a window and returns the updated ensemble at the window's start and its
 * forecast to the last reading time. Missing readings (non-finite value or error) are left out;
 * an observation that some member cannot predict (non-finite) is left out of that iteration.
 * Random draws (the perturbed observations, members outer, observations inner, and whatever the
 * model draws) come from the ensemble's generator, so the result is repeatable.
 *
 * Update of iteration i, with X the analysis-space perturbations at the start (n x N), D' the
 * predicted-observation perturbations (M x N), R = diag(sd^2):
 * `z_k <- z_k + X D'^T (D' D'^T + (N-1) alpha_i R)^-1 (d_obs + sqrt(alpha_i) R^(1/2) e_k - d_k)`,
 * e_k standard normal.
 *
 * @param start - the ensemble at the window's start (its `timeS`).
 * @param readings - the window's readings; times at or before the start are ignored.
 * @returns `start`: updated members at the start time; `end`: those members run to the last
 *   reading time (equal to `start` when the window holds no usable reading).
 */
export function esmdaWindow<C>(
  start: Ensemble<C>,
  readings: readonly WindowReadings[],
  model: ForecastModel<C>,
  operator: ObservationOperator<C>,
  specs: readonly ParameterSpec[],
  layout: StateLayout,
  options: EsmdaOptions = {},
): { start: Ensemble<C>; end: Ensemble<C> } {
  const coefficients = options.coefficients ?? [4, 4, 4, 4];
  const observationTransform = options.observationTransform ?? { kind: 'relative-humidity' };
  const stateTransform = layout.transform ?? { kind: 'identity' };
  const times = readings
    .filter((reading) => reading.timeS > start.timeS)
    .sort((a, b) => a.timeS - b.timeS);
  const entries: WindowEntry[] = [];
  times.forEach((reading, timeIndex) => {
    const usable = reading.observations
      .filter((o) => Number.isFinite(o.value) && o.errorSd > 0 && Number.isFinite(o.errorSd))
      .sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
    for (const observation of usable) {
      entries.push({
        timeIndex,
        observation,
        observed: transformObservation(observationTransform, observation.value),
        errorSd: transformObservationErrorSd(
          observationTransform,
          observation.value,
          observation.errorSd,
        ),
      });
    }
  });
  const memberCount = start.members.length;
  if (entries.length === 0 || memberCount < 2) return { start, end: start };

  let current = start;
  for (const alpha of coefficients) {
    const { predictions } = runWindow(
      current,
      times,
      entries,
      model,
      operator,
      observationTransform,
    );
    const usable = entries.map((_, j) => rowIsFinite(predictions, j));
    const analysis = toAnalysisMatrix(current.members, specs, stateTransform);
    const perturbations = { ...analysis, values: analysis.values.slice() };
    removeRowMeans(perturbations);
    const innovations = perturbedInnovations(current, predictions, entries, usable, alpha);
    removeRowMeans(predictions);
    updateStart(analysis, perturbations, predictions, innovations, entries, usable, alpha);
    current = {
      ...current,
      members: fromAnalysisMatrix(analysis, current.members, specs, stateTransform),
      analysisCount: current.analysisCount + 1,
    };
  }
  const { end } = runWindow(current, times, [], model, operator, observationTransform);
  return { start: current, end };
}

/** Runs a copy of the ensemble through the window, collecting transformed predictions. */
function runWindow<C>(
  ensemble: Ensemble<C>,
  times: readonly WindowReadings[],
  entries: readonly WindowEntry[],
  model: ForecastModel<C>,
  operator: ObservationOperator<C>,
  transform: ObservationTransform,
): { predictions: EnsembleMatrix; end: Ensemble<C> } {
  const memberCount = ensemble.members.length;
  const predictions: EnsembleMatrix = {
    rowCount: entries.length,
    memberCount,
    values: new Float64Array(entries.length * memberCount),
  };
  let running = ensemble;
  times.forEach((reading, timeIndex) => {
    running = forecastEnsemble(running, model, reading.timeS);
    const rows = entries
      .map((entry, row) => ({ entry, row }))
      .filter(({ entry }) => entry.timeIndex === timeIndex);
    if (rows.length === 0) return;
    const observations = rows.map(({ entry }) => entry.observation);
    running.members.forEach((member, k) => {
      const predicted = operator.predict(member, observations);
      rows.forEach(({ row }, j) => {
        predictions.values[row * memberCount + k] = transformObservation(
          transform,
          predicted[j] ?? Number.NaN,
        );
      });
    });
  });
  return { predictions, end: running };
}

function rowIsFinite(matrix: EnsembleMatrix, row: number): boolean {
  for (let k = 0; k < matrix.memberCount; k++) {
    if (!Number.isFinite(matrix.values[row * matrix.memberCount + k])) return false;
  }
  return true;
}

/** E (M x N): d_obs + sqrt(alpha) sd e - d_k; zero rows for unusable observations. */
function perturbedInnovations<C>(
  ensemble: Ensemble<C>,
  predictions: EnsembleMatrix,
  entries: readonly WindowEntry[],
  usable: readonly boolean[],
  alpha: number,
): Matrix {
  const memberCount = predictions.memberCount;
  const innovations = new Matrix(entries.length, memberCount);
  const scale = Math.sqrt(alpha);
  for (let k = 0; k < memberCount; k++) {
    entries.forEach((entry, j) => {
      if (!usable[j]) return;
      const noise = scale * entry.errorSd * ensemble.random.normal();
      innovations.set(
        j,
        k,
        entry.observed + noise - (predictions.values[j * memberCount + k] ?? 0),
      );
    });
  }
  return innovations;
}

/**
 * Z <- Z + (X D'^T) (D' D'^T + (N-1) alpha R)^-1 E, with unusable rows of D' and E set to zero;
 * the product is taken through the n x M and M x N factors, never an N x N matrix, so the cost
 * is O(M^3 + n N M + M^2 N).
 */
function updateStart(
  analysis: EnsembleMatrix,
  perturbations: EnsembleMatrix,
  predictionPerturbations: EnsembleMatrix,
  innovations: Matrix,
  entries: readonly WindowEntry[],
  usable: readonly boolean[],
  alpha: number,
): void {
  const { memberCount } = predictionPerturbations;
  const count = entries.length;
  const d = new Matrix(count, memberCount);
  for (let j = 0; j < count; j++) {
    if (!usable[j]) continue;
    for (let k = 0; k < memberCount; k++)
      d.set(j, k, predictionPerturbations.values[j * memberCount + k] ?? 0);
  }
  const system = d.mmul(d.transpose());
  entries.forEach((entry, j) => {
    system.set(j, j, system.get(j, j) + (memberCount - 1) * alpha * entry.errorSd * entry.errorSd);
  });
  const solved = new CholeskyDecomposition(system).solve(innovations);
  const x = new Matrix(analysis.rowCount, memberCount);
  for (let i = 0; i < analysis.rowCount; i++) {
    for (let k = 0; k < memberCount; k++)
      x.set(i, k, perturbations.values[i * memberCount + k] ?? 0);
  }
  const increments = x.mmul(d.transpose()).mmul(solved);
  for (let i = 0; i < analysis.rowCount; i++) {
    for (let k = 0; k < memberCount; k++) {
      analysis.values[i * memberCount + k] =
        (analysis.values[i * memberCount + k] ?? 0) + increments.get(i, k);
    }
  }
}
