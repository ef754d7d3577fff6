/**
 * Evaporation from a fresh concrete surface: Uno's closed form of the evaporation chart of
 * ACI 305R, with our falling-rate extension for a surface whose pores have begun to drain.
 *
 * Source: Uno, P. J. (1998), "Plastic shrinkage cracking and evaporation formulas",
 * ACI Materials Journal 95(4), 365-375: metric form
 *   E = 5 [ (Tc + 18)^2.5 - r (Ta + 18)^2.5 ] (V + 4) 1e-6   kg/(m2 h)
 * with Tc the concrete surface temperature and Ta the air temperature (degC), r the relative
 * humidity of the air (0..1) and V the wind speed (km/h) about 0.5 m above the surface.
 * Only the metric form is used: the inch-pound form is not an exact conversion of it (about 4 %
 * apart), and the Menzel variant that mixes km/h and mph coefficients is deliberately not used.
 * See physics.md section 4.
 */
import { kelvinToCelsius, msToKmh, SECONDS_PER_HOUR } from './units.ts';

/**
 * Relative uncertainty (fraction) of chart or formula estimates of concrete evaporation against
 * measured evaporation: roughly +-40 %. Source: Hover, K. C. (2006), "Evaporation of water from
 * concrete surfaces", ACI Materials Journal 103(5), 384-389. Show it beside every estimate.
 */
export const EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY = 0.4;

/** Height above the surface (m) at which Uno's formula takes the wind speed: about 0.5 m. */
export const UNO_WIND_HEIGHT_M = 0.5;

/** Weather and surface state for Uno's formula, in the formula's native units. */
export interface UnoEvaporationInput {
  /** Air temperature Ta, degC. */
  airTemperatureC: number;
  /** Concrete surface temperature Tc, degC. */
  concreteTemperatureC: number;
  /** Relative humidity of the air r, fraction 0..1 (not percent). */
  relativeHumidity: number;
  /** Wind speed V about 0.5 m above the surface, km/h (convert mast readings with windProfile.ts). */
  windKmH: number;
}

/** Options of the evaporation estimate. */
export interface UnoEvaporationOptions {
  /**
   * Pore relative humidity at the surface h_s, fraction 0..1. Default 1: the surface is wet
   * (bleed film or saturated pores), which is Uno's formula as published. Values below 1 apply the
   * falling-rate extension (our extension, physics.md section 4): the first term becomes
   * h_s (Tc + 18)^2.5, with h_s from the Kelvin equation at the surface liquid pressure.
   */
  surfacePoreHumidity?: number;
  /**
   * Allow negative results (condensation onto the surface). Default false: a negative estimate is
   * clamped to 0 (our assumption: the formula was fitted for evaporation, not dew).
   */
  allowCondensation?: boolean;
}

/**
 * Evaporation rate from a concrete surface, kg/(m2 h), by Uno's (1998) metric formula with the
 * falling-rate extension:
 *   E = 5 [ h_s (Tc + 18)^2.5 - r (Ta + 18)^2.5 ] (V + 4) 1e-6
 * h_s = 1 (default) is the published formula.
 *
 * Units: temperatures degC, r and h_s fractions 0..1, V km/h at about 0.5 m height.
 * Valid range: the range of the ACI 305R chart the formula reproduces, roughly 0 to 40 degC
 * air and concrete temperature, wind 0 to 40 km/h (chart range from memory); outside it the value
 * is an extrapolation. Accuracy of any such estimate: +-40 %
 * (EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY, Hover 2006).
 * Edge cases: inputs are evaluated as given (validate at the edge); a temperature below -18 degC
 * or any NaN input gives NaN; a negative result is returned as 0 unless `allowCondensation`.
 * Source: Uno (1998), ACI Materials Journal 95(4).
 */
export function unoEvaporationRateKgM2h(
  input: UnoEvaporationInput,
  options: UnoEvaporationOptions = {},
): number {
  const surfacePoreHumidity = options.surfacePoreHumidity ?? 1;
  const surfaceTerm = surfacePoreHumidity * (input.concreteTemperatureC + 18) ** 2.5;
  const airTerm = input.relativeHumidity * (input.airTemperatureC + 18) ** 2.5;
  const rate = 5 * (surfaceTerm - airTerm) * (input.windKmH + 4) * 1e-6;
  if (Number.isNaN(rate)) return Number.NaN;
  if (rate < 0 && options.allowCondensation !== true) return 0;
  return rate;
}

/** Weather and surface state in SI units for {@link evaporationFluxKgM2s}. */
export interface EvaporationInputSI {
  /** Air temperature, K. */
  airTemperatureK: number;
  /** Concrete surface temperature, K. */
  concreteTemperatureK: number;
  /** Relative humidity of the air, fraction 0..1. */
  relativeHumidity: number;
  /** Wind speed about 0.5 m above the surface, m/s. */
  windMS: number;
}

/**
 * Evaporation flux out of a concrete surface, kg/(m2 s): the SI wrapper of
 * {@link unoEvaporationRateKgM2h}. Converts K to degC and m/s to km/h, evaluates Uno's metric
 * formula (with the falling-rate extension when `surfacePoreHumidity` < 1) and divides by 3600.
 * Same range, edge cases and +-40 % uncertainty as the native function.
 * Source: Uno (1998), ACI Materials Journal 95(4).
 */
export function evaporationFluxKgM2s(
  input: EvaporationInputSI,
  options: UnoEvaporationOptions = {},
): number {
  const ratePerHour = unoEvaporationRateKgM2h(
    {
      airTemperatureC: kelvinToCelsius(input.airTemperatureK),
      concreteTemperatureC: kelvinToCelsius(input.concreteTemperatureK),
      relativeHumidity: input.relativeHumidity,
      windKmH: msToKmh(input.windMS),
    },
    options,
  );
  return ratePerHour / SECONDS_PER_HOUR;
}

/**
 * Band of the actual evaporation rate implied by an estimate and its +-40 % uncertainty
 * (Hover 2006): [E (1 - 0.4), E (1 + 0.4)], same unit as the estimate. NaN gives NaN bounds.
 */
export function evaporationEstimateBand(estimate: number): { low: number; high: number } {
  return {
    low: estimate * (1 - EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY),
    high: estimate * (1 + EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY),
  };
}
