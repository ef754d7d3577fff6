/**
 * Cumulative pore-size distribution F(D): the fraction of the pore volume in pores narrower than
 * diameter D (physics.md section 2), its density in ln D and its inverse D(F), for the three forms
 * of `PoreSizeDistribution`.
 *
 * - Log-normal mixture: F(D) = sum_i w_i Phi((ln D - ln D50_i) / ln sg_i), shares normalised to
 *   sum 1. Inverse by a safeguarded Newton solve in ln D bracketed by the modes' own quantiles
 *   (the mixture quantile lies between the smallest and largest mode quantile).
 * - Porosimetry table: monotone cubic (PCHIP, Fritsch and Butland 1984) in ln D through the
 *   points sorted by diameter. Outside the table (our assumption): when the smallest diameter
 *   holds a fraction F_1 > 0 (pores finer than mercury reached), a knot (D_1 / 10, 0) is added,
 *   so that fraction spreads over one decade below; when the widest holds F_N < 1, a knot
 *   (10 D_N, 1) is added. F = 0 below the first knot and 1 above the last.
 * - van Genuchten (1980) as a distribution: F(D) = [1 + (alpha 4 gamma_fit / D)^n]^-m, m = 1 - 1/n,
 *   i.e. the fitted retention curve read through Young-Laplace at the fit's surface tension.
 */
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';
import type { LogNormalPoreMode, PoreSizeDistribution, PoreTablePoint } from './retentionCurve.ts';
import {
  hermiteDerivative,
  hermiteValue,
  lowerIndex,
  pchipSlopes,
  solveIncreasing,
} from './_poreNumerics.ts';

/**
 * Cumulative fraction taken as the widest pore D_max of a distribution without an upper bound
 * (log-normal, van Genuchten): F(D_max) = 1 - 1e-6. Our assumption: wide enough that the
 * truncated volume is negligible, narrow enough to keep the air-entry pressure physical.
 */
export const UNBOUNDED_TOP_FRACTION = 1 - 1e-6;

/** Decades by which a porosimetry table is extended below its first / above its last point. */
export const TABLE_EXTENSION_DECADES = 1;

interface TableKnots {
  logDiameters: number[];
  fractions: number[];
  slopes: number[];
}

const tableCache = new WeakMap<readonly PoreTablePoint[], TableKnots>();

function tableKnots(points: readonly PoreTablePoint[]): TableKnots {
  const cached = tableCache.get(points);
  if (cached !== undefined) return cached;
  const sorted = points
    .filter((point) => point.diameterM > 0 && Number.isFinite(point.cumulativeFraction))
    .map((point) => ({
      u: Math.log(point.diameterM),
      f: Math.min(1, Math.max(0, point.cumulativeFraction)),
    }))
    .sort((first, second) => first.u - second.u);
  const logDiameters: number[] = [];
  const fractions: number[] = [];
  let runningMax = 0;
  for (const { u, f } of sorted) {
    runningMax = Math.max(runningMax, f); // the parser rejects decreasing tables; here we level them
    if (logDiameters.length > 0 && u === logDiameters[logDiameters.length - 1]) {
      fractions[fractions.length - 1] = runningMax;
      continue;
    }
    logDiameters.push(u);
    fractions.push(runningMax);
  }
  const extension = TABLE_EXTENSION_DECADES * Math.LN10;
  if (logDiameters.length > 0 && (fractions[0] as number) > 0) {
    logDiameters.unshift((logDiameters[0] as number) - extension);
    fractions.unshift(0);
  }
  if (logDiameters.length > 0 && (fractions[fractions.length - 1] as number) < 1) {
    logDiameters.push((logDiameters[logDiameters.length - 1] as number) + extension);
    fractions.push(1);
  }
  const knots = { logDiameters, fractions, slopes: pchipSlopes(logDiameters, fractions) };
  tableCache.set(points, knots);
  return knots;
}

/** Knots (ln D, F, dF/dlnD) of a table after sorting, levelling and the extensions. */
export function poreTableKnots(points: readonly PoreTablePoint[]): Readonly<TableKnots> {
  return tableKnots(points);
}

function tableAt(knots: TableKnots, u: number, derivative: boolean): number {
  const { logDiameters: x, fractions: y, slopes: d } = knots;
  const last = x.length - 1;
  if (last < 0 || Number.isNaN(u)) return Number.NaN;
  if (u <= (x[0] as number)) return derivative ? 0 : (y[0] as number);
  if (u >= (x[last] as number)) return derivative ? 0 : (y[last] as number);
  const k = lowerIndex(x, u);
  const h = (x[k + 1] as number) - (x[k] as number);
  const t = (u - (x[k] as number)) / h;
  const args = [
    t,
    h,
    y[k] as number,
    y[k + 1] as number,
    d[k] as number,
    d[k + 1] as number,
  ] as const;
  return derivative ? hermiteDerivative(...args) : hermiteValue(...args);
}

function modeSpread(mode: LogNormalPoreMode): number {
  return Math.log(mode.geometricSd);
}

function totalShare(modes: readonly LogNormalPoreMode[]): number {
  return modes.reduce((sum, mode) => sum + mode.volumeFraction, 0);
}

function lognormalAt(modes: readonly LogNormalPoreMode[], u: number, derivative: boolean): number {
  const total = totalShare(modes);
  let sum = 0;
  for (const mode of modes) {
    const mu = Math.log(mode.medianDiameterM);
    const sigma = modeSpread(mode);
    if (derivative) {
      const z = (u - mu) / sigma;
      sum +=
        sigma > 0
          ? (mode.volumeFraction * Math.exp(-0.5 * z * z)) / (sigma * Math.sqrt(2 * Math.PI))
          : 0;
    } else {
      sum += mode.volumeFraction * (sigma > 0 ? normalCdf(u, mu, sigma) : u >= mu ? 1 : 0);
    }
  }
  return sum / total;
}

function vanGenuchtenScaleM(psd: Extract<PoreSizeDistribution, { kind: 'van-genuchten' }>): number {
  return 4 * psd.surfaceTensionNPerM * psd.alphaPerPa;
}

/**
 * Cumulative pore volume fraction F(D): share of the pore volume in pores narrower than D.
 *
 * @param psd the distribution (log-normal mixture, table, or van Genuchten).
 * @param diameterM pore diameter D in m. D <= 0 gives 0, D = +Infinity gives 1, NaN gives NaN.
 * @returns F in 0..1, non-decreasing in D (untruncated: see `maxPoreDiameterM`).
 */
export function poreCumulativeFraction(psd: PoreSizeDistribution, diameterM: number): number {
  if (Number.isNaN(diameterM)) return Number.NaN;
  if (diameterM <= 0) return 0;
  if (diameterM === Number.POSITIVE_INFINITY) return 1;
  const u = Math.log(diameterM);
  switch (psd.kind) {
    case 'lognormal':
      return lognormalAt(psd.modes, u, false);
    case 'table':
      return tableAt(tableKnots(psd.points), u, false);
    case 'van-genuchten': {
      const m = 1 - 1 / psd.n;
      return Math.pow(1 + Math.pow(vanGenuchtenScaleM(psd) / diameterM, psd.n), -m);
    }
  }
}

/**
 * Volume density per unit of ln D, dF/d(ln D), at diameter D (m). 0 outside the support;
 * NaN for NaN. Log-normal: sum_i w_i phi(z_i) / ln sg_i; table: derivative of the PCHIP;
 * van Genuchten: m n x (1 + x)^(-m-1) with x = (alpha 4 gamma / D)^n.
 */
export function poreVolumeDensityPerLogDiameter(
  psd: PoreSizeDistribution,
  diameterM: number,
): number {
  if (Number.isNaN(diameterM)) return Number.NaN;
  if (!(diameterM > 0) || diameterM === Number.POSITIVE_INFINITY) return 0;
  const u = Math.log(diameterM);
  switch (psd.kind) {
    case 'lognormal':
      return lognormalAt(psd.modes, u, true);
    case 'table':
      return tableAt(tableKnots(psd.points), u, true);
    case 'van-genuchten': {
      const m = 1 - 1 / psd.n;
      const x = Math.pow(vanGenuchtenScaleM(psd) / diameterM, psd.n);
      return m * psd.n * x * Math.pow(1 + x, -m - 1);
    }
  }
}

/**
 * Inverse of the distribution: the diameter D (m) with F(D) = fraction, taken as the smallest such
 * D where F is flat. Log-normal: safeguarded Newton in ln D to 1e-13 relative; table: the same on
 * the PCHIP piece; van Genuchten: closed form D = alpha 4 gamma / (F^(-1/m) - 1)^(1/n).
 *
 * @param fraction F in 0..1. F <= 0 gives the lower end of the support (0 for the log-normal and
 *   van Genuchten forms, the first rising knot of a table); F >= 1 gives the upper end (+Infinity
 *   for the unbounded forms); NaN gives NaN.
 */
export function poreDiameterAtFractionM(psd: PoreSizeDistribution, fraction: number): number {
  if (Number.isNaN(fraction)) return Number.NaN;
  switch (psd.kind) {
    case 'lognormal':
      return lognormalInverse(psd.modes, fraction);
    case 'table':
      return tableInverse(tableKnots(psd.points), fraction);
    case 'van-genuchten': {
      if (fraction <= 0) return 0;
      if (fraction >= 1) return Number.POSITIVE_INFINITY;
      const m = 1 - 1 / psd.n;
      return vanGenuchtenScaleM(psd) / Math.pow(Math.pow(fraction, -1 / m) - 1, 1 / psd.n);
    }
  }
}

function lognormalInverse(modes: readonly LogNormalPoreMode[], fraction: number): number {
  if (fraction <= 0) return 0;
  if (fraction >= 1) return Number.POSITIVE_INFINITY;
  let low = Number.POSITIVE_INFINITY;
  let high = Number.NEGATIVE_INFINITY;
  for (const mode of modes) {
    if (!(mode.volumeFraction > 0)) continue;
    const quantile = normalQuantile(
      fraction,
      Math.log(mode.medianDiameterM),
      Math.max(modeSpread(mode), 0),
    );
    low = Math.min(low, quantile);
    high = Math.max(high, quantile);
  }
  if (!(high >= low)) return Number.NaN;
  if (high === low) return Math.exp(low);
  const u = solveIncreasing(
    (x) => lognormalAt(modes, x, false) - fraction,
    low,
    high,
    1e-13 * Math.max(1, Math.abs(low)),
    (x) => lognormalAt(modes, x, true),
  );
  return Math.exp(u);
}

function tableInverse(knots: TableKnots, fraction: number): number {
  const { logDiameters: x, fractions: y } = knots;
  const last = x.length - 1;
  if (last < 0) return Number.NaN;
  let k = 0; // first knot whose fraction reaches the target
  const target = Math.min(1, Math.max(0, fraction));
  while (k < last && (y[k] as number) < target) k++;
  if (target <= 0) {
    while (k < last && (y[k + 1] as number) <= 0) k++;
    return Math.exp(x[k] as number);
  }
  // At a knot value the inverse is the knot itself (the pieces are strictly monotone or constant).
  if (k === 0 || (y[k] as number) <= target) return Math.exp(x[k] as number);
  const u = solveIncreasing(
    (value) => tableAt(knots, value, false) - target,
    x[k - 1] as number,
    x[k] as number,
    1e-13 * Math.max(1, Math.abs(x[k] as number)),
    (value) => tableAt(knots, value, true),
    (x[k - 1] as number) +
      (((x[k] as number) - (x[k - 1] as number)) * (target - (y[k - 1] as number))) /
        ((y[k] as number) - (y[k - 1] as number)),
  );
  return Math.exp(u);
}

/**
 * Widest pore D_max (m) of the distribution: for a table the smallest diameter where F reaches 1
 * (after the extension), for the log-normal and van Genuchten forms F^-1(1 - 1e-6)
 * (`UNBOUNDED_TOP_FRACTION`, our assumption). Sets the air-entry pressure.
 */
export function maxPoreDiameterM(psd: PoreSizeDistribution): number {
  return poreDiameterAtFractionM(psd, psd.kind === 'table' ? 1 : UNBOUNDED_TOP_FRACTION);
}

/**
 * Diameter (m) at a volume percentile: percentile/100 of the pore volume lies in narrower pores.
 * The risk figures use the 99th percentile for the critical suction of the fresh mix
 * (physics.md section 7). Percentile in 0..100; outside that range or NaN gives NaN.
 */
export function poreDiameterAtPercentileM(psd: PoreSizeDistribution, percentile: number): number {
  if (!(percentile >= 0 && percentile <= 100)) return Number.NaN;
  return poreDiameterAtFractionM(psd, percentile / 100);
}
