/**
 * Degree of hydration of the cement and what follows from it: the ultimate degree from w/c,
 * the capillary porosity of the paste, and the slowing of hydration where the pores dry.
 * See physics.md sections 2 and 6.
 */

/** Parameters of the Schindler-Folliard hydration curve (mix-specific; no generic default). */
export interface SchindlerFolliardParameters {
  /** Ultimate degree of hydration alpha_u, 0..1 (e.g. from {@link millsUltimateDegreeOfHydration}). */
  ultimateDegree: number;
  /** Hydration time parameter tau, s (equivalent age at 20 degC; Schindler and Folliard fit it per cement). */
  tauS: number;
  /** Hydration shape parameter beta, dimensionless, > 0. */
  beta: number;
}

/**
 * Degree of hydration at equivalent age te:
 *   alpha(te) = alpha_u exp( -(tau / te)^beta )
 * Units: te and tau in s (any one time unit for both), alpha dimensionless 0..alpha_u.
 * Edge cases: te <= 0 returns 0 (nothing hydrated at placement); te -> infinity tends to alpha_u;
 * NaN in any argument gives NaN.
 * Source: Schindler, A. K. and Folliard, K. J. (2005), "Heat of hydration models for
 * cementitious materials", ACI Materials Journal 102(1), 24-33.
 */
export function schindlerFolliardDegreeOfHydration(
  equivalentAgeS: number,
  parameters: SchindlerFolliardParameters,
): number {
  const { ultimateDegree, tauS, beta } = parameters;
  if ([equivalentAgeS, ultimateDegree, tauS, beta].some(Number.isNaN)) return Number.NaN;
  if (equivalentAgeS <= 0) return 0;
  return ultimateDegree * Math.exp(-((tauS / equivalentAgeS) ** beta));
}

/**
 * Ultimate degree of hydration from the water-cement ratio:
 *   alpha_u = 1.031 w/c / (0.194 + w/c), capped at 1
 * Units: w/c by mass, dimensionless. Fitted for Portland cement pastes roughly 0.2 <= w/c <= 0.8;
 * the cap applies above w/c of about 6 (never in practice). w/c <= 0 returns 0; NaN gives NaN.
 * Supplementary materials raise it (Schindler and Folliard 2005 add terms for fly ash and slag,
 * not modelled here). Source: Mills, R. H. (1966), "Factors influencing cessation of hydration
 * in water cured cement pastes", Highway Research Board Special Report 90, 406-424.
 */
export function millsUltimateDegreeOfHydration(waterCementRatio: number): number {
  if (Number.isNaN(waterCementRatio)) return Number.NaN;
  if (waterCementRatio <= 0) return 0;
  return Math.min(1, (1.031 * waterCementRatio) / (0.194 + waterCementRatio));
}

/**
 * Capillary porosity of cement paste (volume fraction of the paste) by the Powers-Brownyard model:
 *   phi_cap = (w/c - 0.36 alpha) / (w/c + 0.32), floored at 0
 * 0.32 is the specific volume of cement (1 / 3.15 g/cm3, in cm3/g); 0.36 per unit alpha is the
 * capillary space the hydration products fill, net of chemical shrinkage (Hansen's volume
 * fractions: 1.12 x 0.32). The capillary space includes the pores emptied by chemical shrinkage,
 * so the same formula holds for sealed and for water curing.
 * Units: w/c by mass, alpha 0..1, result dimensionless 0..1. Known points: alpha = 0 gives
 * w/c / (w/c + 0.32); w/c = 0.36 at alpha = 1 gives 0. A negative value (a low w/c cannot reach
 * that alpha) is returned as 0. NaN gives NaN.
 * Source: Powers, T. C. and Brownyard, T. L. (1947), "Studies of the physical properties of
 * hardened Portland cement paste", Journal of the ACI 43; in the form of Hansen, T. C. (1986),
 * "Physical structure of hardened cement paste. A classical approach", Materials and
 * Structures 19(114), 423-436.
 */
export function powersCapillaryPorosity(
  waterCementRatio: number,
  degreeOfHydration: number,
): number {
  if (Number.isNaN(waterCementRatio) || Number.isNaN(degreeOfHydration)) return Number.NaN;
  return Math.max(0, (waterCementRatio - 0.36 * degreeOfHydration) / (waterCementRatio + 0.32));
}

/** Options of {@link hydrationHumidityFactor}. */
export interface HydrationHumidityOptions {
  /** Steepness a of the humidity factor, dimensionless. Default 7.5 (Bazant and Prasannan 1989). */
  steepness?: number;
}

/**
 * Factor on the hydration (equivalent-age) rate for the pore relative humidity h:
 *   beta_h = 1 / (1 + (a - a h)^4),  a = 7.5 by default
 * It is 1 at saturation, about 0.76 at 90 % RH, 0.16 at 80 % and 0.04 at 70 %: hydration
 * practically stops once the pores dry below about 80 % RH.
 * Units: h fraction 0..1 (not percent). h >= 1 returns 1; h < 0 is treated as 0; NaN gives NaN.
 * Source: Bazant, Z. P. and Prasannan, S. (1989), "Solidification theory for concrete creep",
 * Journal of Engineering Mechanics 115(8) (the same form is used with a = 7.5 in later
 * hygro-thermo-chemical models); the link of the hydration rate to pore humidity goes back to
 * Powers (1947) and Bazant and Najjar (1972). Citation and constant from memory: check against
 * the papers before relying on the exact shape.
 */
export function hydrationHumidityFactor(
  relativeHumidity: number,
  options: HydrationHumidityOptions = {},
): number {
  const steepness = options.steepness ?? 7.5;
  if (Number.isNaN(relativeHumidity) || Number.isNaN(steepness)) return Number.NaN;
  const humidity = Math.min(1, Math.max(0, relativeHumidity));
  return 1 / (1 + (steepness - steepness * humidity) ** 4);
}
