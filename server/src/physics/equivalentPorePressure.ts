/**
 * Equivalent pore pressure of an unsaturated porous solid with the gas at zero gauge pressure,
 * Coussy (2004), Poromechanics, Wiley, chapter 6 (physics.md section 5):
 *
 *   pi(S) = S p(S) + integral_S^1 p(s) ds      (<= 0, non-decreasing in S, pi(1) = p_ae)
 *
 * With p(s) = -A / D(s), A = 4 gamma cos(theta), integration by parts in u = ln D gives the form
 * used here, free of the singularity of p at s -> 0:
 *
 *   pi = p_ae - A integral_{u_S}^{u_max} Fhat(u) e^{-u} du,   dpi/dp = S(p),
 *
 * and, for a log-normal mixture (weights w_i, mu_i = ln D50_i, sigma_i = ln sg_i), the closed form
 *
 *   integral_S^1 p ds = -(A / F_top) sum_i w_i e^{-mu_i + sigma_i^2/2}
 *                         [Phi(-(z_i(u_S) + sigma_i)) - Phi(-(z_i(u_max) + sigma_i))],
 *
 * z_i(u) = (u - mu_i) / sigma_i (complete the square in e^{-u} phi(z_i) / sigma_i).
 * While saturated (p >= p_ae) the equivalent pore pressure is the liquid pressure itself.
 */
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import type { PoreSizeDistribution } from './retentionCurve.ts';
import {
  buildPoreGrid,
  exactFraction,
  exactLogDiameter,
  gridIntegralAt,
  integratePanel,
  type PoreGrid,
} from './_poreGrid.ts';
import { integrateAdaptive, limitSlopesMonotone } from './_poreNumerics.ts';
import type { PoreRetentionCurve } from './retention.ts';

/** integral_{u}^{u_max} Fhat(u') e^{-u'} du' by quadrature (table and van Genuchten forms). */
function tailIntegral(grid: PoreGrid, fromU: number, toU: number): number {
  const integrand = (u: number): number => exactFraction(grid, u) * Math.exp(-u);
  let start = fromU;
  let sum = 0;
  if (grid.psd.kind === 'van-genuchten' && !(start > grid.logMinDiameter)) {
    // Below the grid F ~ (4 gamma alpha)^(1-n) e^{(n-1)u}: the tail integrates to F e^{-u} / (n - 2).
    const n = grid.psd.n;
    if (n <= 2) return Number.POSITIVE_INFINITY;
    start = grid.logMinDiameter;
    if (Number.isFinite(fromU)) sum += integrateAdaptive(integrand, fromU, start);
    else sum += integrand(start) / (n - 2);
  }
  const cuts = [start, ...grid.breakpoints.filter((u) => u > start && u < toU), toU];
  for (let k = 0; k < cuts.length - 1; k++)
    sum += integrateAdaptive(integrand, cuts[k] as number, cuts[k + 1] as number);
  return sum;
}

function lognormalPi(grid: PoreGrid, laplaceN: number, u: number, saturation: number): number {
  if (grid.psd.kind !== 'lognormal') return Number.NaN;
  const modes = grid.psd.modes;
  const total = modes.reduce((sum, mode) => sum + mode.volumeFraction, 0);
  let drained = 0;
  for (const mode of modes) {
    const mu = Math.log(mode.medianDiameterM);
    const sigma = Math.log(mode.geometricSd);
    if (!(sigma > 0)) {
      drained += u < mu && mu <= grid.logMaxDiameter ? mode.volumeFraction * Math.exp(-mu) : 0;
      continue;
    }
    const upper = normalCdf(-((u - mu) / sigma + sigma), 0, 1);
    const lower = normalCdf(-((grid.logMaxDiameter - mu) / sigma + sigma), 0, 1);
    drained += mode.volumeFraction * Math.exp(-mu + 0.5 * sigma * sigma) * (upper - lower);
  }
  const filledTerm = saturation > 0 ? -laplaceN * saturation * Math.exp(-u) : 0;
  return filledTerm - (laplaceN / (grid.topFraction * total)) * drained;
}

function exactPiAtLogDiameter(grid: PoreGrid, laplaceN: number, u: number): number {
  const airEntryPa = -laplaceN * Math.exp(-grid.logMaxDiameter);
  if (u >= grid.logMaxDiameter) return airEntryPa;
  if (grid.psd.kind === 'lognormal') return lognormalPi(grid, laplaceN, u, exactFraction(grid, u));
  const from = Math.max(u, grid.logSupportBottom);
  return airEntryPa - laplaceN * tailIntegral(grid, from, grid.logMaxDiameter);
}

/**
 * Equivalent pore pressure pi(S), Pa, computed accurately (closed form for log-normal mixtures,
 * adaptive Gauss-Legendre in ln D to about 1e-10 for tables and van Genuchten).
 *
 * @param psd the distribution; @param saturation S in 0..1; @param surfaceTensionNPerM gamma, N/m;
 * @param contactAngleRad theta, rad (default 0, our assumption).
 * @returns pi <= 0; S >= 1 gives p_ae; S <= 0 gives integral_0^1 p ds (finite for log-normal and
 *   table forms, -Infinity for van Genuchten with n <= 2); NaN gives NaN. Source: Coussy (2004).
 */
export function equivalentPorePressurePa(
  psd: PoreSizeDistribution,
  saturation: number,
  surfaceTensionNPerM: number,
  contactAngleRad = 0,
): number {
  if (Number.isNaN(saturation)) return Number.NaN;
  const grid = buildPoreGrid(psd, false);
  const laplaceN = 4 * surfaceTensionNPerM * Math.cos(contactAngleRad);
  return exactPiAtLogDiameter(grid, laplaceN, exactLogDiameter(grid, Math.min(1, saturation)));
}

/** Tabulated pi for the element model. */
export interface EquivalentPorePressureCurve {
  /** pi(S), Pa: p_ae for S >= 1; the S -> 0 limit for S <= 0; NaN for NaN. */
  fromSaturation(saturation: number): number;
  /** pi(p), Pa: p itself for p >= p_ae (saturated), else pi(S(p)); NaN for NaN. */
  fromLiquidPressure(liquidPressurePa: number): number;
}

/**
 * Fast form of pi on the retention curve's grid in ln D: node values exact (closed form, or
 * Gauss-Legendre panels), cubic Hermite pieces on the exact slopes dpi/du = A Fhat e^{-u} (tables:
 * node value plus a Gauss-Legendre panel); the tests measure the error against the accurate form
 * below 1e-7 relative. Cost about 0.1 us from p and 0.3 us from S (tables: a few us).
 *
 * @param retention a curve from `retentionFromPoreSizes` (its surface tension and contact angle
 *   are used). Source: Coussy (2004), Poromechanics, Wiley.
 */
export function equivalentPorePressureCurve(
  retention: PoreRetentionCurve,
): EquivalentPorePressureCurve {
  const grid = retention.grid;
  const laplaceN = 4 * retention.surfaceTensionNPerM * Math.cos(retention.contactAngleRad);
  const logLaplace = Math.log(laplaceN);
  const u = grid.logDiameters;
  const values = new Array<number>(u.length);
  const slope = (x: number): number => laplaceN * exactFraction(grid, x) * Math.exp(-x); // dpi/du
  const slopes = u.map((node, i) => laplaceN * (grid.fractions[i] as number) * Math.exp(-node));
  if (grid.psd.kind === 'lognormal') {
    for (let i = 0; i < u.length; i++)
      values[i] = lognormalPi(grid, laplaceN, u[i] as number, grid.fractions[i] as number);
  } else {
    values[u.length - 1] = retention.airEntryPressurePa;
    for (let i = u.length - 2; i >= 0; i--) {
      values[i] =
        (values[i + 1] as number) - integratePanel(grid, slope, u[i] as number, u[i + 1] as number);
    }
  }
  limitSlopesMonotone(u, values, slopes);
  // Tables start the grid at their support bottom: take pi(0) from the grid so it joins exactly.
  const bottomPa =
    grid.psd.kind === 'table'
      ? (values[0] as number)
      : exactPiAtLogDiameter(grid, laplaceN, grid.logSupportBottom);
  const atLogDiameter = (logDiameter: number): number => {
    if (logDiameter >= grid.logMaxDiameter) return retention.airEntryPressurePa;
    if (logDiameter < grid.logMinDiameter) return exactPiAtLogDiameter(grid, laplaceN, logDiameter);
    return gridIntegralAt(grid, values, slopes, slope, logDiameter);
  };
  return {
    fromSaturation(saturation: number): number {
      if (Number.isNaN(saturation)) return Number.NaN;
      if (saturation >= 1) return retention.airEntryPressurePa;
      if (saturation <= 0) return bottomPa;
      return atLogDiameter(Math.log(retention.poreDiameterAtSaturationM(saturation)));
    },
    fromLiquidPressure(liquidPressurePa: number): number {
      if (Number.isNaN(liquidPressurePa)) return Number.NaN;
      if (liquidPressurePa >= retention.airEntryPressurePa) return liquidPressurePa;
      return atLogDiameter(logLaplace - Math.log(-liquidPressurePa));
    },
  };
}
