/**
 * Inflation against ensemble collapse. An ensemble filter with few members underestimates its
 * own spread (sampling error, unmodelled model error), and the parameters, which have no
 * dynamics, lose spread at every analysis: without a remedy the filter stops listening to the
 * probes. Two named remedies:
 * - `multiplicative`: forecast covariance times a factor before the analysis (perturbations
 *   times its square root; Anderson and Anderson 1999, MWR 127). For a parameter observed over
 *   and over it acts as a forgetting factor: the spread settles at a floor instead of decaying.
 * - `relaxation-to-prior-spread` (RTPS): after the analysis each entry's spread is relaxed
 *   towards its forecast spread, `sd_a <- (1 - alpha) sd_a + alpha sd_f` (Whitaker and Hamill
 *   2012, MWR 140). It slows collapse but, for a static parameter, does not stop it.
 */
import { type EnsembleMatrix, rowSpreads, scaleRows } from './_ensembleMatrix.ts';

/** The inflation applied at each analysis. */
export type InflationOption =
  | { kind: 'none' }
  /** factor >= 1 on the covariance (1.02 = 2 % per analysis). */
  | { kind: 'multiplicative'; factor: number }
  /**
   * alpha in [0, 1]: 0 = no relaxation, 1 = analysis keeps the forecast spread. `exceptParameters`
   * names parameters whose analysis spread is kept as it is (e.g. a sensor's constant bias: no
   * model error to make up for, so relaxing it only re-widens it at every analysis).
   */
  | {
      kind: 'relaxation-to-prior-spread';
      alpha: number;
      exceptParameters?: readonly string[];
    };

/**
 * Default: multiplicative, 1.02 per analysis. With readings every 5 minutes that is a memory of
 * roughly 1 / 0.02 = 50 analyses (about 4 h), so parameters can follow slow changes (exposure,
 * a measure's efficiency) while the spread of a parameter the probes pin down settles at a floor.
 * Our assumption; tune with the twin experiment.
 */
export const DEFAULT_INFLATION: InflationOption = { kind: 'multiplicative', factor: 1.02 };

/**
 * Multiplies perturbations by sqrt(factor) (covariance by factor). Factors below 1 or NaN are
 * treated as 1 (no deflation: that would only speed collapse).
 */
export function inflateMultiplicatively(perturbations: EnsembleMatrix, factor: number): void {
  if (!(factor > 1)) return;
  scaleRows(perturbations, Math.sqrt(factor));
}

/**
 * RTPS: scales each row of analysis perturbations by `(1 - alpha) + alpha sd_f / sd_a`, so that
 * its spread becomes `(1 - alpha) sd_a + alpha sd_f`. Rows with sd_a = 0 (nothing to scale) are
 * left alone; alpha is clamped to [0, 1], NaN treated as 0.
 *
 * @param analysisPerturbations - overwritten.
 * @param forecastSpreads - sd_f of each row, from before the analysis.
 */
export function relaxToPriorSpread(
  analysisPerturbations: EnsembleMatrix,
  forecastSpreads: Float64Array,
  alpha: number,
): void {
  const a = Number.isNaN(alpha) ? 0 : Math.min(1, Math.max(0, alpha));
  if (a === 0) return;
  const analysisSpreads = rowSpreads(analysisPerturbations);
  const factors = new Float64Array(analysisSpreads.length);
  analysisSpreads.forEach((sdA, i) => {
    factors[i] = sdA > 0 ? 1 - a + (a * (forecastSpreads[i] ?? sdA)) / sdA : 1;
  });
  scaleRows(analysisPerturbations, factors);
}
