/**
 * Retention curves (liquid pressure against saturation) from a pore-size distribution, and the
 * van Genuchten (1980) closed form. physics.md section 2.
 *
 * Drainage empties the widest pores first; Young-Laplace gives the widest pore still full at
 * pressure p, D*(p) = 4 gamma cos(theta) / (-p), so S(p) = F(D*(p)) and
 * p(S) = -4 gamma cos(theta) / F^-1(S). The distribution is truncated at D_max
 * (`maxPoreDiameterM`) and renormalised, S = F(D*) / F(D_max), so S reaches 1 exactly at the
 * air-entry pressure p_ae = -4 gamma cos(theta) / D_max (a change of at most 1e-6 in S for the
 * unbounded forms).
 */
import type { PoreSizeDistribution, RetentionCurve } from './retentionCurve.ts';
import {
  buildPoreGrid,
  exactFraction,
  exactLogDiameter,
  gridDensity,
  gridFraction,
  gridLogDiameter,
  type PoreGrid,
} from './_poreGrid.ts';

/**
 * van Genuchten (1980) saturation: S = [1 + (alpha |p|)^n]^-m, m = 1 - 1/n (Soil Sci. Soc. Am. J.
 * 44(5), eq. 3 with the Mualem restriction).
 *
 * @param liquidPressurePa p in Pa; p >= 0 gives 1; NaN gives NaN.
 * @param alphaPerPa alpha in 1/Pa, > 0. @param n dimensionless, > 1.
 */
export function vanGenuchtenSaturation(
  liquidPressurePa: number,
  alphaPerPa: number,
  n: number,
): number {
  if (Number.isNaN(liquidPressurePa)) return Number.NaN;
  if (liquidPressurePa >= 0) return 1;
  return Math.pow(1 + Math.pow(alphaPerPa * -liquidPressurePa, n), -(1 - 1 / n));
}

/**
 * Inverse of the van Genuchten (1980) curve: p = -(S^(-1/m) - 1)^(1/n) / alpha, Pa.
 * S >= 1 gives 0 (no air entry in this form), S <= 0 gives -Infinity, NaN gives NaN.
 */
export function vanGenuchtenLiquidPressurePa(
  saturation: number,
  alphaPerPa: number,
  n: number,
): number {
  if (Number.isNaN(saturation)) return Number.NaN;
  if (saturation >= 1) return 0;
  if (saturation <= 0) return Number.NEGATIVE_INFINITY;
  const m = 1 - 1 / n;
  return -Math.pow(Math.pow(saturation, -1 / m) - 1, 1 / n) / alphaPerPa;
}

/** Options of `retentionFromPoreSizes`. */
export interface RetentionOptions {
  /**
   * Use the tabulated fast form (default true, our choice for the element model). false
   * evaluates the distribution itself on every call (reference, slower).
   */
  tabulated?: boolean;
}

/** A retention curve built from a pore-size distribution, with the extras the model uses. */
export interface PoreRetentionCurve extends RetentionCurve {
  /** Contact angle the curve was built with, rad. */
  readonly contactAngleRad: number;
  /** Widest pore D_max, m (sets the air entry). */
  readonly maxPoreDiameterM: number;
  /** Specific moisture capacity dS/dp, 1/Pa (>= 0; 0 for p >= p_ae). */
  capacityPerPa(liquidPressurePa: number): number;
  /** Diameter of the widest filled pore at saturation S, m: F^-1(S), truncated at D_max. */
  poreDiameterAtSaturationM(saturation: number): number;
  /** The tabulation the curve uses (shared with the pi(S) and k(S) fast forms). */
  readonly grid: PoreGrid;
}

/**
 * Retention curve of a pore-size distribution at one surface tension and contact angle.
 *
 * S(p) = F(D*(p)) / F(D_max), D*(p) = 4 gamma cos(theta) / (-p); p(S) = -4 gamma cos(theta) / D(S).
 * For a van Genuchten distribution this reproduces [1 + (alpha |p| gamma_fit / gamma)^n]^-m.
 *
 * Fast form (default): F tabulated on a uniform grid in ln D (step <= 0.01, finer for narrow
 * modes) with cubic Hermite pieces on the exact slopes; the tests measure its error against the
 * exact form below 1e-6 in S and 1e-6 relative in p (measured: about 1e-9). Cost on this kind of
 * machine: S(p) and dS/dp about 0.1 us, p(S) about 0.3 us (a safeguarded Newton on one piece).
 * Tables use their own monotone cubic directly (exact; S(p) about 0.5 us, p(S) a few us).
 * Outside the grid (S below 1e-10 for unbounded forms) the exact functions are used.
 *
 * @param psd the distribution. @param surfaceTensionNPerM gamma, N/m (> 0; water 0.0727 at 20 degC).
 * @param contactAngleRad theta in rad, 0 <= theta < pi/2; default 0 (perfect wetting, our
 *   assumption following common practice for cement paste).
 * @returns saturation(p): 1 for p >= p_ae, NaN for NaN; liquidPressure(S): p_ae for S >= 1, the
 *   suction of the finest pore (or -Infinity) for S <= 0, NaN for NaN. Source: Young-Laplace;
 *   capillary-bundle drainage as in physics.md section 2.
 */
export function retentionFromPoreSizes(
  psd: PoreSizeDistribution,
  surfaceTensionNPerM: number,
  contactAngleRad = 0,
  options: RetentionOptions = {},
): PoreRetentionCurve {
  const grid = buildPoreGrid(psd);
  const tabulated = options.tabulated ?? true;
  const laplaceN = 4 * surfaceTensionNPerM * Math.cos(contactAngleRad); // p = -laplaceN / D
  const logLaplace = Math.log(laplaceN);
  const maxDiameterM = Math.exp(grid.logMaxDiameter);
  const airEntryPressurePa = -laplaceN / maxDiameterM;
  const fraction = tabulated
    ? (u: number) => gridFraction(grid, u)
    : (u: number) => exactFraction(grid, u);
  const logDiameter = tabulated
    ? (s: number) => gridLogDiameter(grid, s)
    : (s: number) => exactLogDiameter(grid, s);
  return {
    surfaceTensionNPerM,
    contactAngleRad,
    airEntryPressurePa,
    maxPoreDiameterM: maxDiameterM,
    grid,
    saturation(liquidPressurePa: number): number {
      if (Number.isNaN(liquidPressurePa)) return Number.NaN;
      if (liquidPressurePa >= airEntryPressurePa) return 1;
      return fraction(logLaplace - Math.log(-liquidPressurePa));
    },
    liquidPressure(saturation: number): number {
      if (Number.isNaN(saturation)) return Number.NaN;
      if (saturation >= 1) return airEntryPressurePa;
      return -laplaceN * Math.exp(-logDiameter(saturation));
    },
    capacityPerPa(liquidPressurePa: number): number {
      if (Number.isNaN(liquidPressurePa)) return Number.NaN;
      if (liquidPressurePa >= airEntryPressurePa) return 0;
      const u = logLaplace - Math.log(-liquidPressurePa);
      // dS/dp = dFhat/du * du/dp, u = ln(laplaceN) - ln(-p): du/dp = -1/p
      return gridDensity(grid, u) / -liquidPressurePa;
    },
    poreDiameterAtSaturationM(saturation: number): number {
      if (Number.isNaN(saturation)) return Number.NaN;
      return Math.exp(logDiameter(Math.min(1, saturation)));
    },
  };
}
