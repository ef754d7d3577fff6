/**
 * Saturation vapour pressure of water: over liquid water by IAPWS-IF97 region 4 (the saturation
 * line, its forward equation and its backward saturation-temperature equation), and over ice Ih
 * by the IAPWS 2011 sublimation-pressure equation.
 *
 * Below 0 degC the liquid-water functions continue the IF97 equation into supercooled water
 * (relative humidity is stated over liquid water at every temperature, as the WMO convention
 * and most humidity probes do). Over ice the pressure is lower: use iceSublimationPressurePa()
 * when frost rather than dew is the question.
 *
 * Sources: IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the
 * Thermodynamic Properties of Water and Steam, eqs. 30 and 31, Table 34; IAPWS R14-08(2011),
 * Revised Release on the Pressure along the Melting and Sublimation Curves of Ordinary Water
 * Substance, eq. 6.
 */

/** Critical temperature of water Tc in K (IAPWS-95 and IF97). */
export const WATER_CRITICAL_TEMPERATURE_K = 647.096;

/** Critical pressure of water pc in Pa (IAPWS-95 and IF97). */
export const WATER_CRITICAL_PRESSURE_PA = 22.064e6;

/**
 * Lowest temperature (K, -40 degC) at which saturationVapourPressurePa() answers. The IF97
 * equation is stated from 273.15 K; below it we use its extrapolation, which stays within 0.06 %
 * of Murphy and Koop (2005) for supercooled water down to 243.15 K and within 0.3 % at 233.15 K
 * (checked in test/physics/saturationVapourPressure.test.ts).
 */
export const SATURATION_PRESSURE_MIN_TEMPERATURE_K = 233.15;

/** IF97 region 4 coefficients n1..n10 (IAPWS R7-97(2012), Table 34). */
const N = [
  0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.1202082470247e5,
  -0.32325550322333e7, 0.1491510861353e2, -0.48232657361591e4, 0.40511340542057e6,
  -0.23855557567849, 0.65017534844798e3,
] as const;
const [N1, N2, N3, N4, N5, N6, N7, N8, N9, N10] = N;

/** Reference pressure p* of the IF97 saturation equations, Pa (1 MPa). */
const REFERENCE_PRESSURE_PA = 1e6;

/**
 * Saturation vapour pressure over liquid water, IAPWS-IF97 region 4 (eq. 30):
 * theta = T + n9 / (T - n10); A = theta^2 + n1 theta + n2; B = n3 theta^2 + n4 theta + n5;
 * C = n6 theta^2 + n7 theta + n8; ps = 1 MPa * [2C / (-B + sqrt(B^2 - 4AC))]^4.
 *
 * @param temperatureK T in K. Stated range 273.15 K to 647.096 K; 233.15 K to 273.15 K is the
 *   supercooled extrapolation (see SATURATION_PRESSURE_MIN_TEMPERATURE_K).
 * @returns ps in Pa (611.213 Pa at 0 degC, 2339.2 Pa at 20 degC). NaN outside
 *   [233.15 K, 647.096 K] or for NaN.
 * Source: IAPWS R7-97(2012), eq. 30.
 */
export function saturationVapourPressurePa(temperatureK: number): number {
  if (
    !(temperatureK >= SATURATION_PRESSURE_MIN_TEMPERATURE_K) ||
    !(temperatureK <= WATER_CRITICAL_TEMPERATURE_K)
  ) {
    return Number.NaN;
  }
  const theta = temperatureK + N9 / (temperatureK - N10);
  const a = theta * theta + N1 * theta + N2;
  const b = N3 * theta * theta + N4 * theta + N5;
  const c = N6 * theta * theta + N7 * theta + N8;
  const ratio = (2 * c) / (-b + Math.sqrt(b * b - 4 * a * c));
  return REFERENCE_PRESSURE_PA * ratio ** 4;
}

/**
 * Saturation temperature of water at pressure p, the IF97 backward equation (eq. 31), which is the
 * exact algebraic inverse of saturationVapourPressurePa():
 * beta = (p / 1 MPa)^0.25; E = beta^2 + n3 beta + n6; F = n1 beta^2 + n4 beta + n7;
 * G = n2 beta^2 + n5 beta + n8; D = 2G / (-F - sqrt(F^2 - 4EG));
 * Ts = [n10 + D - sqrt((n10 + D)^2 - 4 (n9 + n10 D))] / 2.
 *
 * @param pressurePa p in Pa, between ps(233.15 K) (about 12.8 Pa) and the critical pressure
 *   22.064 MPa; outside that range, or NaN, it returns NaN.
 * @returns Ts in K, over liquid water (supercooled below 273.15 K).
 * Source: IAPWS R7-97(2012), eq. 31.
 */
export function saturationTemperatureK(pressurePa: number): number {
  const lowestPa = saturationVapourPressurePa(SATURATION_PRESSURE_MIN_TEMPERATURE_K);
  if (!(pressurePa >= lowestPa) || !(pressurePa <= WATER_CRITICAL_PRESSURE_PA)) return Number.NaN;
  const beta = (pressurePa / REFERENCE_PRESSURE_PA) ** 0.25;
  const e = beta * beta + N3 * beta + N6;
  const f = N1 * beta * beta + N4 * beta + N7;
  const g = N2 * beta * beta + N5 * beta + N8;
  const d = (2 * g) / (-f - Math.sqrt(f * f - 4 * e * g));
  const temperatureK = (N10 + d - Math.sqrt((N10 + d) ** 2 - 4 * (N9 + N10 * d))) / 2;
  // Round-off can put the ends a hair outside the forward range; keep the answer inside it.
  return Math.min(
    Math.max(temperatureK, SATURATION_PRESSURE_MIN_TEMPERATURE_K),
    WATER_CRITICAL_TEMPERATURE_K,
  );
}

/** Triple-point temperature of water, K (IAPWS R14-08(2011)). */
const TRIPLE_POINT_K = 273.16;
/** Triple-point pressure of water, Pa (IAPWS R14-08(2011)). */
const TRIPLE_POINT_PA = 611.657;
/** Lowest temperature of the sublimation equation's range, K. */
const SUBLIMATION_MIN_TEMPERATURE_K = 50;
/** Coefficients a_i and exponents b_i of the sublimation equation (IAPWS R14-08(2011), Table 3). */
const SUBLIMATION_TERMS = [
  { a: -0.212144006e2, b: 0.333333333e-2 },
  { a: 0.273203819e2, b: 0.120666667e1 },
  { a: -0.61059813e1, b: 0.170333333e1 },
] as const;

/**
 * Sublimation (saturation) pressure of water vapour over ice Ih:
 * ln(p / pt) = theta^-1 sum_i a_i theta^b_i, theta = T / Tt, Tt = 273.16 K, pt = 611.657 Pa.
 *
 * @param temperatureK T in K, 50 K to 273.16 K; outside that range, or NaN, it returns NaN.
 * @returns p in Pa (259.9 Pa at -10 degC, against 286.4 Pa over supercooled water).
 * Source: IAPWS R14-08(2011), eq. 6.
 */
export function iceSublimationPressurePa(temperatureK: number): number {
  if (!(temperatureK >= SUBLIMATION_MIN_TEMPERATURE_K) || !(temperatureK <= TRIPLE_POINT_K)) {
    return Number.NaN;
  }
  const theta = temperatureK / TRIPLE_POINT_K;
  let sum = 0;
  for (const term of SUBLIMATION_TERMS) sum += term.a * theta ** term.b;
  return TRIPLE_POINT_PA * Math.exp(sum / theta);
}
