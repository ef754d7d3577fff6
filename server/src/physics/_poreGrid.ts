/**
 * Tabulation of a pore-size distribution on a uniform grid in u = ln D, shared by the fast forms
 * of retention, equivalent pore pressure and capillary-bundle permeability. The grid holds the
 * truncated, renormalised distribution Fhat(u) = F(e^u) / F(D_max) (1 above D_max) and its exact
 * derivative; values between nodes come from cubic Hermite pieces with those slopes, limited to
 * stay monotone (Fritsch and Carlson 1980).
 */
import type { PoreSizeDistribution } from './retentionCurve.ts';
import {
  maxPoreDiameterM,
  poreCumulativeFraction,
  poreDiameterAtFractionM,
  poreTableKnots,
  poreVolumeDensityPerLogDiameter,
} from './poreSizeDistribution.ts';
import {
  gaussLegendre5,
  hermiteDerivative,
  hermiteValue,
  limitSlopesMonotone,
  lowerIndex,
} from './_poreNumerics.ts';

/** Fraction below which the unbounded forms leave the grid and use the exact functions. */
const GRID_BOTTOM_FRACTION = 1e-10;
const MAX_NODES = 60_000;

export interface PoreGrid {
  readonly psd: PoreSizeDistribution;
  /** F(D_max) before renormalisation. */
  readonly topFraction: number;
  /** ln D_max. */
  readonly logMaxDiameter: number;
  /** ln D of the first node. */
  readonly logMinDiameter: number;
  /** Lower end of the support in ln D (-Infinity for the unbounded forms). */
  readonly logSupportBottom: number;
  readonly step: number;
  /** Node positions u_i, Fhat_i and dFhat/du_i (limited). */
  readonly logDiameters: number[];
  readonly fractions: number[];
  readonly slopes: number[];
  /** Breakpoints of the distribution in u (table knots) for quadrature. */
  readonly breakpoints: number[];
}

/** Exact truncated, renormalised cumulative fraction at u = ln D. */
export function exactFraction(grid: PoreGrid, u: number): number {
  if (u >= grid.logMaxDiameter) return 1;
  return poreCumulativeFraction(grid.psd, Math.exp(u)) / grid.topFraction;
}

/** Exact ln D at which the truncated, renormalised fraction equals `fraction` (0..1). */
export function exactLogDiameter(grid: PoreGrid, fraction: number): number {
  if (fraction >= 1) return grid.logMaxDiameter;
  if (fraction <= 0) return grid.logSupportBottom;
  return Math.log(poreDiameterAtFractionM(grid.psd, fraction * grid.topFraction));
}

function gridStep(psd: PoreSizeDistribution): number {
  switch (psd.kind) {
    case 'lognormal':
      return Math.min(0.01, ...psd.modes.map((mode) => Math.log(mode.geometricSd) / 20));
    case 'table': {
      const knots = poreTableKnots(psd.points).logDiameters;
      let smallest = 0.01;
      for (let k = 1; k < knots.length; k++)
        smallest = Math.min(smallest, ((knots[k] as number) - (knots[k - 1] as number)) / 4);
      return smallest;
    }
    case 'van-genuchten':
      return Math.min(0.01, 0.2 / psd.n);
  }
}

/**
 * Builds the grid for `psd` (cost: a few thousand evaluations of F). With `withNodes` false only
 * the ends are computed (enough for the exact functions).
 */
export function buildPoreGrid(psd: PoreSizeDistribution, withNodes = true): PoreGrid {
  const maxDiameterM = maxPoreDiameterM(psd);
  const logMaxDiameter = Math.log(maxDiameterM);
  const topFraction = poreCumulativeFraction(psd, maxDiameterM);
  const breakpoints = psd.kind === 'table' ? [...poreTableKnots(psd.points).logDiameters] : [];
  const logSupportBottom =
    psd.kind === 'table' ? Math.log(poreDiameterAtFractionM(psd, 0)) : Number.NEGATIVE_INFINITY;
  const logMinDiameter =
    psd.kind === 'table'
      ? logSupportBottom
      : Math.log(poreDiameterAtFractionM(psd, GRID_BOTTOM_FRACTION * topFraction));
  let step = gridStep(psd);
  let intervals = Math.ceil((logMaxDiameter - logMinDiameter) / step);
  if (!(intervals >= 1)) intervals = 1;
  if (intervals > MAX_NODES) intervals = MAX_NODES;
  step = (logMaxDiameter - logMinDiameter) / intervals;
  const logDiameters: number[] = [];
  const fractions: number[] = [];
  const slopes: number[] = [];
  for (let i = 0; i <= (withNodes ? intervals : -1); i++) {
    const u = i === intervals ? logMaxDiameter : logMinDiameter + i * step;
    const diameterM = Math.exp(u);
    logDiameters.push(u);
    fractions.push(
      i === intervals ? 1 : Math.min(1, poreCumulativeFraction(psd, diameterM) / topFraction),
    );
    slopes.push(poreVolumeDensityPerLogDiameter(psd, diameterM) / topFraction);
  }
  limitSlopesMonotone(logDiameters, fractions, slopes);
  return {
    psd,
    topFraction,
    logMaxDiameter,
    logMinDiameter,
    logSupportBottom,
    step,
    logDiameters,
    fractions,
    slopes,
    breakpoints,
  };
}

/** Node interval index and local coordinate of u on the uniform grid (u inside the grid). */
export function gridLocate(grid: PoreGrid, u: number): { index: number; t: number } {
  const last = grid.logDiameters.length - 2;
  const index = Math.min(last, Math.max(0, Math.floor((u - grid.logMinDiameter) / grid.step)));
  const start = grid.logDiameters[index] as number;
  const width = (grid.logDiameters[index + 1] as number) - start;
  return { index, t: (u - start) / width };
}

/** Hermite interpolation of node values/slopes at u (u inside the grid). */
export function gridInterpolate(
  grid: PoreGrid,
  values: readonly number[],
  slopes: readonly number[],
  u: number,
): number {
  const { index, t } = gridLocate(grid, u);
  const width = (grid.logDiameters[index + 1] as number) - (grid.logDiameters[index] as number);
  return hermiteValue(
    t,
    width,
    values[index] as number,
    values[index + 1] as number,
    slopes[index] as number,
    slopes[index + 1] as number,
  );
}

/**
 * Fast Fhat(u): grid inside, exact outside. Tables use their own PCHIP directly (already a
 * cheap piecewise cubic, and re-interpolating it would blur its knots).
 */
export function gridFraction(grid: PoreGrid, u: number): number {
  if (u >= grid.logMaxDiameter) return 1;
  if (grid.psd.kind === 'table') return exactFraction(grid, u);
  if (u < grid.logMinDiameter) return exactFraction(grid, u);
  return gridInterpolate(grid, grid.fractions, grid.slopes, u);
}

/** Fast dFhat/du: derivative of the Hermite piece inside the grid, exact outside. */
export function gridDensity(grid: PoreGrid, u: number): number {
  if (u >= grid.logMaxDiameter) return 0;
  if (grid.psd.kind === 'table') return poreVolumeDensityPerLogDiameter(grid.psd, Math.exp(u));
  if (u < grid.logMinDiameter) {
    return poreVolumeDensityPerLogDiameter(grid.psd, Math.exp(u)) / grid.topFraction;
  }
  const { index, t } = gridLocate(grid, u);
  const width = (grid.logDiameters[index + 1] as number) - (grid.logDiameters[index] as number);
  const f = grid.fractions;
  const d = grid.slopes;
  return hermiteDerivative(
    t,
    width,
    f[index] as number,
    f[index + 1] as number,
    d[index] as number,
    d[index + 1] as number,
  );
}

/** Fast inverse: ln D with Fhat = fraction (0 < fraction < 1), smallest such u on flat parts. */
export function gridLogDiameter(grid: PoreGrid, fraction: number): number {
  const f = grid.fractions;
  if (grid.psd.kind === 'table' || fraction < (f[0] as number) || fraction <= 0) {
    return exactLogDiameter(grid, fraction);
  }
  if (fraction >= 1) return grid.logMaxDiameter;
  // first node with f >= fraction
  let index = lowerIndex(f, fraction);
  while (index > 0 && (f[index] as number) >= fraction) index--;
  while (index < f.length - 1 && (f[index + 1] as number) < fraction) index++;
  const low = grid.logDiameters[index] as number;
  if (index >= f.length - 1 || (f[index] as number) >= fraction) return low;
  const h = (grid.logDiameters[index + 1] as number) - low;
  const y0 = f[index] as number;
  const y1 = f[index + 1] as number;
  const d0 = grid.slopes[index] as number;
  const d1 = grid.slopes[index + 1] as number;
  // Safeguarded Newton on the monotone Hermite piece in t = (u - low) / h, from the linear guess.
  let a = 0;
  let b = 1;
  let t = (fraction - y0) / (y1 - y0);
  for (let iteration = 0; iteration < 60; iteration++) {
    const residual = hermiteValue(t, h, y0, y1, d0, d1) - fraction;
    if (residual >= 0) b = t;
    else a = t;
    const slope = hermiteDerivative(t, h, y0, y1, d0, d1) * h;
    let next = slope > 0 ? t - residual / slope : Number.NaN;
    if (!(next >= a && next <= b)) next = 0.5 * (a + b);
    const converged = Math.abs(next - t) < 1e-13;
    t = next;
    if (converged || b - a < 1e-13) break;
  }
  return low + t * h;
}

/**
 * integral_a^b f(u) du by five-point Gauss-Legendre on [a, b] split at the distribution's
 * breakpoints (table knots), for a <= b no wider than a grid interval or two: the pieces are
 * smooth there, so the rule is accurate to rounding.
 */
export function integratePanel(
  grid: PoreGrid,
  f: (u: number) => number,
  a: number,
  b: number,
): number {
  if (!(b > a)) return 0;
  let sum = 0;
  let start = a;
  for (const breakpoint of grid.breakpoints) {
    if (breakpoint <= start) continue;
    if (breakpoint >= b) break;
    sum += gaussLegendre5(f, start, breakpoint);
    start = breakpoint;
  }
  return sum + gaussLegendre5(f, start, b);
}

/**
 * Fast evaluation of a tabulated integral at u: Hermite on the grid for smooth distributions;
 * for tables the node value below u plus `integratePanel` of its derivative (their knots would
 * otherwise cost accuracy). u must lie inside the grid.
 */
export function gridIntegralAt(
  grid: PoreGrid,
  values: readonly number[],
  slopes: readonly number[],
  derivative: (u: number) => number,
  u: number,
): number {
  if (grid.psd.kind !== 'table') return gridInterpolate(grid, values, slopes, u);
  const { index } = gridLocate(grid, u);
  const start = grid.logDiameters[index] as number;
  return (values[index] as number) + integratePanel(grid, derivative, start, u);
}
