/**
 * Physical constants and unit conversions used across the physics library.
 * Inside the library every quantity is SI (Pa, m, s, kg, K); these helpers convert at the edges.
 */

/** Molar gas constant R in J/(mol K). CODATA 2018 exact value. */
export const GAS_CONSTANT_J_PER_MOL_K = 8.314462618;

/** Molar mass of water M_w in kg/mol. IAPWS-95 (Wagner and Pruss 2002), 18.015268 g/mol. */
export const WATER_MOLAR_MASS_KG_PER_MOL = 0.018015268;

/** Offset between the Celsius and Kelvin scales, K. */
export const ZERO_CELSIUS_K = 273.15;

/** Standard atmospheric pressure in Pa (ISO 2533). */
export const STANDARD_ATMOSPHERE_PA = 101_325;

/** Converts a temperature in degC to K. */
export function celsiusToKelvin(temperatureC: number): number {
  return temperatureC + ZERO_CELSIUS_K;
}

/** Converts a temperature in K to degC. */
export function kelvinToCelsius(temperatureK: number): number {
  return temperatureK - ZERO_CELSIUS_K;
}

/** Converts degF to degC: (F - 32) * 5/9. */
export function fahrenheitToCelsius(temperatureF: number): number {
  return ((temperatureF - 32) * 5) / 9;
}

/** Converts a speed in km/h to m/s (divides by 3.6). */
export function kmhToMs(speedKmH: number): number {
  return speedKmH / 3.6;
}

/** Converts a speed in m/s to km/h (multiplies by 3.6). */
export function msToKmh(speedMs: number): number {
  return speedMs * 3.6;
}

/** Converts a mass flux in kg/(m2 h) to kg/(m2 s). */
export function perHourToPerSecond(valuePerHour: number): number {
  return valuePerHour / 3600;
}

/** Converts a mass flux in kg/(m2 s) to kg/(m2 h). */
export function perSecondToPerHour(valuePerSecond: number): number {
  return valuePerSecond * 3600;
}

/** Seconds in one hour. */
export const SECONDS_PER_HOUR = 3600;

/** Seconds in one day. */
export const SECONDS_PER_DAY = 86_400;

/** Pascals in one megapascal. */
export const PA_PER_MPA = 1e6;

/** Metres in one millimetre. */
export const M_PER_MM = 1e-3;

/** Metres in one micrometre. */
export const M_PER_UM = 1e-6;
