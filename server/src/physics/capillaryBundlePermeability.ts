/**
 * Permeability of a bundle of cylindrical capillaries (physics.md section 3): Hagen-Poiseuille flow
 * in the filled, narrowest pores,
 *
 *   k(S) = (phi / (32 tau)) integral_0^S D(s)^2 ds,   D(s) = F^-1(s) (truncated at D_max),
 *
 * since one tube of diameter D carries a flux equal to that of a medium of permeability D^2 / 32
 * over its own cross-section (Hagen-Poiseuille; the capillary-bundle model of Purcell 1949 and
 * Burdine 1953). In u = ln D, integral_0^S D^2 ds = integral_{-inf}^{u_S} e^{2u} dFhat(u); for a
 * log-normal mixture (w_i, mu_i = ln D50_i, sigma_i = ln sg_i) completing the square gives
 *
 *   integral_0^S D^2 ds = (1 / F_top) sum_i w_i e^{2 mu_i + 2 sigma_i^2} Phi(z_i(u_S) - 2 sigma_i).
 *
 * The integral converges at S -> 1 only because of the truncation at D_max: for van Genuchten
 * with n <= 2 it is dominated by it, so give a measured saturated permeability there.
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
import { poreVolumeDensityPerLogDiameter } from './poreSizeDistribution.ts';
import { integrateAdaptive, limitSlopesMonotone } from './_poreNumerics.ts';
import type { PoreRetentionCurve } from './retention.ts';

/** integral_{-inf}^{u} e^{2u'} dFhat(u') = e^{2u} Fhat(u) - 2 integral_{-inf}^{u} e^{2u'} Fhat du'. */
function squaredDiameterIntegral(grid: PoreGrid, u: number): number {
  const top = Math.min(u, grid.logMaxDiameter);
  if (grid.psd.kind === 'lognormal') {
    const modes = grid.psd.modes;
    const total = modes.reduce((sum, mode) => sum + mode.volumeFraction, 0);
    let sum = 0;
    for (const mode of modes) {
      const mu = Math.log(mode.medianDiameterM);
      const sigma = Math.log(mode.geometricSd);
      const below = sigma > 0 ? normalCdf((top - mu) / sigma - 2 * sigma, 0, 1) : mu <= top ? 1 : 0;
      sum += mode.volumeFraction * Math.exp(2 * mu + 2 * sigma * sigma) * below;
    }
    return sum / (total * grid.topFraction);
  }
  const bottom = Number.isFinite(grid.logSupportBottom)
    ? grid.logSupportBottom
    : grid.logMinDiameter;
  if (!(top > bottom)) return 0;
  const integrand = (x: number): number => Math.exp(2 * x) * exactFraction(grid, x);
  const cuts = [bottom, ...grid.breakpoints.filter((x) => x > bottom && x < top), top];
  // van Genuchten below the grid: Fhat ~ c e^{(n-1)u}, so the neglected part is Fhat e^{2u} / (n + 1).
  let area = grid.psd.kind === 'van-genuchten' ? integrand(bottom) / (grid.psd.n + 1) : 0;
  for (let k = 0; k < cuts.length - 1; k++)
    area += integrateAdaptive(integrand, cuts[k] as number, cuts[k + 1] as number);
  return Math.exp(2 * top) * exactFraction(grid, top) - 2 * area;
}

/** squaredDiameterIntegral at every grid node, accumulating panel by panel. */
function nodeIntegrals(grid: PoreGrid): number[] {
  const u = grid.logDiameters;
  if (grid.psd.kind === 'lognormal') return u.map((node) => squaredDiameterIntegral(grid, node));
  const integrand = (x: number): number => Math.exp(2 * x) * exactFraction(grid, x);
  const results: number[] = [];
  let area = squaredDiameterIntegral(grid, u[0] as number);
  let fractionTerm = Math.exp(2 * (u[0] as number)) * (grid.fractions[0] as number);
  area = (fractionTerm - area) / 2; // recover integral_{-inf}^{u_0} e^{2u} Fhat du
  for (let i = 0; i < u.length; i++) {
    if (i > 0) area += integratePanel(grid, integrand, u[i - 1] as number, u[i] as number);
    fractionTerm = Math.exp(2 * (u[i] as number)) * (grid.fractions[i] as number);
    results.push(fractionTerm - 2 * area);
  }
  return results;
}

/**
 * integral_0^S D(s)^2 ds in m^2, computed accurately (closed form for log-normal mixtures,
 * adaptive quadrature otherwise). S >= 1 gives the full integral, S <= 0 gives 0, NaN gives NaN.
 */
export function squaredPoreDiameterIntegralM2(
  psd: PoreSizeDistribution,
  saturation: number,
): number {
  if (Number.isNaN(saturation)) return Number.NaN;
  if (saturation <= 0) return 0;
  const grid = buildPoreGrid(psd, false);
  return squaredDiameterIntegral(grid, exactLogDiameter(grid, Math.min(1, saturation)));
}

/** Options of `capillaryBundlePermeability`. */
export interface CapillaryBundleOptions {
  /** Porosity phi (pore volume over total volume), 0..1. Required: no default. */
  porosity: number;
  /**
   * Tortuosity tau >= 1 (path length over straight length), default 1: straight tubes, the upper
   * bound of the bundle (our assumption; the calibration adjusts a log multiplier on k).
   */
  tortuosity?: number;
  /**
   * Measured saturated permeability, m^2. When given, k(S) = k_measured * k_r(S) (physics.md
   * section 3); default: none, the bundle's own k(1).
   */
  saturatedPermeabilityM2?: number;
}

/** Permeability curve of a capillary bundle. */
export interface CapillaryBundlePermeability {
  /** Saturated permeability used, m^2 (measured, or the bundle's k(1)). */
  readonly saturatedPermeabilityM2: number;
  /** The bundle's own k(1) before any rescaling, m^2. */
  readonly bundleSaturatedPermeabilityM2: number;
  /** k(S), m^2: 0 for S <= 0, k_sat for S >= 1, NaN for NaN. Non-decreasing. */
  permeabilityM2(saturation: number): number;
  /** k_r(S) = k(S) / k(1), 0..1. */
  relativePermeability(saturation: number): number;
  /** k at liquid pressure p (through S(p)), m^2; k_sat for p >= p_ae. */
  permeabilityAtPressureM2(liquidPressurePa: number): number;
}

/**
 * Capillary-bundle permeability k(S) = (phi / (32 tau)) integral_0^S D(s)^2 ds, rescaled to a
 * measured saturated permeability when one is given. Fast form on the retention curve's grid in
 * ln D (exact node values, cubic Hermite on the exact slopes e^{2u} dFhat/du; tables: node value
 * plus a Gauss-Legendre panel); the tests measure the relative error of k_r against the accurate
 * form below 1e-6 for S >= 0.01. Cost about 0.1 us from p and 0.4 us from S (tables: a few us).
 *
 * @param retention a curve from `retentionFromPoreSizes` (its pore-size grid is used).
 * @param options porosity (required), tortuosity (default 1), saturatedPermeabilityM2 (optional).
 * Source: Hagen-Poiseuille; capillary bundle (Purcell 1949, J. Petrol. Technol. 1(2)).
 */
export function capillaryBundlePermeability(
  retention: PoreRetentionCurve,
  options: CapillaryBundleOptions,
): CapillaryBundlePermeability {
  const grid = retention.grid;
  const tortuosity = options.tortuosity ?? 1;
  const prefactor = options.porosity / (32 * tortuosity);
  const full = squaredDiameterIntegral(grid, grid.logMaxDiameter);
  const bundleSaturated = prefactor * full;
  const saturated = options.saturatedPermeabilityM2 ?? bundleSaturated;
  const u = grid.logDiameters;
  const values = nodeIntegrals(grid).map((value) => value / full);
  const slopes = u.map((node, i) => (Math.exp(2 * node) * (grid.slopes[i] as number)) / full);
  limitSlopesMonotone(u, values, slopes);
  const relativeSlope = (x: number): number =>
    (Math.exp(2 * x) * poreVolumeDensityPerLogDiameter(grid.psd, Math.exp(x))) /
    (grid.topFraction * full);
  const relativeAtLog = (logDiameter: number): number => {
    if (logDiameter >= grid.logMaxDiameter) return 1;
    if (logDiameter < grid.logMinDiameter) return squaredDiameterIntegral(grid, logDiameter) / full;
    const value = gridIntegralAt(grid, values, slopes, relativeSlope, logDiameter);
    return Math.min(1, Math.max(0, value));
  };
  const relativePermeability = (saturation: number): number => {
    if (Number.isNaN(saturation)) return Number.NaN;
    if (saturation >= 1) return 1;
    if (saturation <= 0) return 0;
    return relativeAtLog(Math.log(retention.poreDiameterAtSaturationM(saturation)));
  };
  const laplaceN = 4 * retention.surfaceTensionNPerM * Math.cos(retention.contactAngleRad);
  return {
    saturatedPermeabilityM2: saturated,
    bundleSaturatedPermeabilityM2: bundleSaturated,
    relativePermeability,
    permeabilityM2: (saturation) => saturated * relativePermeability(saturation),
    permeabilityAtPressureM2(liquidPressurePa: number): number {
      if (Number.isNaN(liquidPressurePa)) return Number.NaN;
      if (liquidPressurePa >= retention.airEntryPressurePa) return saturated;
      return saturated * relativeAtLog(Math.log(laplaceN / -liquidPressurePa));
    },
  };
}
