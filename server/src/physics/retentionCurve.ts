/**
 * The contracts between the pore-structure functions and their users (drying stress, the
 * element model, the risk figures). Implementations live in poreSizeDistribution.ts and
 * retention.ts; the element model depends only on these interfaces.
 *
 * Sign convention (physics.md section 2): `p` is the liquid pressure relative to the gas in Pa,
 * <= 0 once menisci form; capillary suction is -p. `S` is the fraction of the pore volume filled
 * with liquid, 0..1.
 */

/** One log-normal mode of a pore-size distribution (volume-weighted, by diameter). */
export interface LogNormalPoreMode {
  /** Median pore diameter of the mode, m (> 0). */
  medianDiameterM: number;
  /** Geometric standard deviation of the diameter, dimensionless (> 1). */
  geometricSd: number;
  /** Share of the pore volume in this mode, 0..1; the shares of all modes sum to 1. */
  volumeFraction: number;
}

/** One point of a cumulative pore-size table (e.g. from mercury intrusion porosimetry). */
export interface PoreTablePoint {
  /** Pore diameter, m (> 0). */
  diameterM: number;
  /** Fraction of the pore volume in pores narrower than `diameterM`, 0..1. */
  cumulativeFraction: number;
}

/**
 * A pore-size distribution in one of the forms physics.md section 2 accepts. Porosimetry data
 * given as intrusion pressure is converted to diameters with the Washburn equation at the edge.
 */
export type PoreSizeDistribution =
  | { kind: 'lognormal'; modes: LogNormalPoreMode[] }
  | { kind: 'table'; points: PoreTablePoint[] }
  | {
      kind: 'van-genuchten';
      /** van Genuchten (1980) alpha, 1/Pa (> 0). */
      alphaPerPa: number;
      /** van Genuchten n, dimensionless (> 1); m = 1 - 1/n. */
      n: number;
      /** Surface tension at which alpha was fitted, N/m (to scale with temperature). */
      surfaceTensionNPerM: number;
    };

/**
 * A retention curve: liquid pressure against saturation at one surface tension. Users that
 * change temperature rescale pressure by gamma(T) / gamma_curve (Young-Laplace is linear in
 * gamma at fixed pore geometry).
 */
export interface RetentionCurve {
  /** Surface tension the curve was built with, N/m. */
  readonly surfaceTensionNPerM: number;
  /** Air-entry pressure p_ae, Pa (< 0): the pressure at which the widest pores start to drain. */
  readonly airEntryPressurePa: number;
  /** Saturation S(p), 0..1; 1 for p >= p_ae. Monotone non-decreasing in p. */
  saturation(liquidPressurePa: number): number;
  /** Liquid pressure p(S), Pa; for S >= 1 returns p_ae; for S -> 0 tends to -Infinity. */
  liquidPressure(saturation: number): number;
}
