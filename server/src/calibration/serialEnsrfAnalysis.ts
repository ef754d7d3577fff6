/**
 * Serial ensemble square-root filter (EnSRF): observations with independent errors assimilated
 * one at a time, each a scalar Kalman update of the mean and a deterministic square-root update
 * of the perturbations, with optional covariance localisation in depth.
 * Whitaker and Hamill (2002), Monthly Weather Review 130, section 2 (equations recalled, not re-read: from memory);
 * localisation by a Schur product with the Gaspari-Cohn function (Houtekamer and Mitchell 2001,
 * MWR 129; Gaspari and Cohn 1999).
 */
import type { EnsembleMatrix } from './_ensembleMatrix.ts';
import { gaspariCohn } from './gaspariCohn.ts';

/** Depths used to localise: one per state row and one per observation, m; NaN = not localised. */
export interface LocalisationInDepth {
  /** Gaspari-Cohn half-width c, m: weight about 0.21 at c, zero beyond 2c. */
  halfWidthM: number;
  stateDepthM: Float64Array;
  observationDepthM: Float64Array;
}

/**
 * Updates state perturbations and means in place, observation by observation in row order.
 *
 * For observation j with predicted perturbations y (its row of Y, kept current as earlier
 * observations update it), variance of the prediction `s2 = y.y / (N-1)`, error variance r and
 * innovation d: for every row i (state rows and the remaining predicted observations)
 * `K_i = rho_ij cov(x_i, y) / (s2 + r)`, `mean_i += K_i d`, `x_i <- x_i - alpha K_i y` with
 * `alpha = 1 / (1 + sqrt(r / (s2 + r)))`, rho_ij the Gaspari-Cohn weight of their depths (1 when
 * either depth is NaN or localisation is off). Without localisation and with a linear observation
 * operator the result equals the batch Kalman update of the sample mean and covariance.
 *
 * Cost: O(m (n + m) N) with no matrix factorisation.
 *
 * @param statePerturbations - X (n x N), overwritten.
 * @param stateMeans - overwritten with analysis means.
 * @param observationPerturbations - Y (m x N); overwritten (it is updated along the way).
 * @param innovations - y_obs - mean prediction; overwritten as predictions are updated.
 * @param errorSd - observation error standard deviations, > 0.
 * @param localisation - depths and half-width, or null for none.
 */
export function serialEnsrfAnalysis(
  statePerturbations: EnsembleMatrix,
  stateMeans: Float64Array,
  observationPerturbations: EnsembleMatrix,
  innovations: Float64Array,
  errorSd: Float64Array,
  localisation: LocalisationInDepth | null,
): void {
  const memberCount = statePerturbations.memberCount;
  const m = observationPerturbations.rowCount;
  if (m === 0 || memberCount < 2) return;
  const y = new Float64Array(memberCount);
  const observed = observationPerturbations.values;

  for (let j = 0; j < m; j++) {
    let variance = 0;
    for (let k = 0; k < memberCount; k++) {
      const value = observed[j * memberCount + k] ?? 0;
      y[k] = value;
      variance += value * value;
    }
    variance /= memberCount - 1;
    const r = (errorSd[j] ?? 1) ** 2;
    const denominator = variance + r;
    const innovation = innovations[j] ?? 0;
    const alpha = 1 / (1 + Math.sqrt(r / denominator));
    const observationDepth = localisation?.observationDepthM[j] ?? Number.NaN;
    const scale = 1 / ((memberCount - 1) * denominator);

    // State rows, then the predicted observations still to be assimilated (rows l > j).
    const stateRows = statePerturbations.rowCount;
    for (let row = 0; row < stateRows + m; row++) {
      if (row >= stateRows && row - stateRows <= j) continue;
      const isState = row < stateRows;
      const index = isState ? row : row - stateRows;
      const target = isState ? statePerturbations.values : observed;
      let weight = 1;
      if (localisation !== null) {
        const depth = isState
          ? localisation.stateDepthM[index]
          : localisation.observationDepthM[index];
        weight = gaspariCohn((depth ?? Number.NaN) - observationDepth, localisation.halfWidthM);
        if (weight === 0) continue;
      }
      const offset = index * memberCount;
      let covariance = 0;
      for (let k = 0; k < memberCount; k++) covariance += (target[offset + k] ?? 0) * (y[k] ?? 0);
      const gain = weight * covariance * scale;
      if (gain === 0) continue;
      if (isState) stateMeans[index] = (stateMeans[index] ?? 0) + gain * innovation;
      // The predicted mean of a later observation moves by the shift: its innovation the other way.
      else innovations[index] = (innovations[index] ?? 0) - gain * innovation;
      const step = alpha * gain;
      for (let k = 0; k < memberCount; k++)
        target[offset + k] = (target[offset + k] ?? 0) - step * (y[k] ?? 0);
    }
  }
}
