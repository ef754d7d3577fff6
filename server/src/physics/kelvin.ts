/**
 * Kelvin equation: the liquid pressure of pore water in equilibrium with vapour at relative
 * humidity h, p = (rho_w R T / M_w) ln h (about 135 MPa * ln h at 20 degC).
 * It assumes an incompressible liquid and ideal vapour, with p the liquid pressure relative to
 * the gas (negative: suction). Source: Thomson (1871), Phil. Mag. 42; in this form e.g. Coussy,
 * Poromechanics (2004). See physics.md section 2.
 */
import { GAS_CONSTANT_J_PER_MOL_K, WATER_MOLAR_MASS_KG_PER_MOL } from './units.ts';
import { waterDensityKgPerM3 } from './waterDensity.ts';

/**
 * Kelvin coefficient rho_w R T / M_w in Pa: the liquid pressure per unit of ln h.
 *
 * @param temperatureK T in K (253.15 to 623.15 with the default density).
 * @param liquidDensityKgPerM3 rho_w in kg/m3; default waterDensityKgPerM3(T) at 101325 Pa
 *   (IAPWS-IF97 region 1).
 * @returns Pa; about 135.05 MPa at 20 degC. NaN for NaN input or T out of the density range.
 * Source: the Kelvin equation (Thomson 1871) with R from CODATA 2018 and M_w from IAPWS-95.
 */
export function kelvinCoefficientPa(
  temperatureK: number,
  liquidDensityKgPerM3: number = waterDensityKgPerM3(temperatureK),
): number {
  return (
    (liquidDensityKgPerM3 * GAS_CONSTANT_J_PER_MOL_K * temperatureK) / WATER_MOLAR_MASS_KG_PER_MOL
  );
}

/**
 * Liquid pressure of pore water (Pa, relative to the gas) in equilibrium with relative humidity h:
 * p = (rho_w R T / M_w) ln h.
 *
 * @param relativeHumidity h as a fraction, 0..1. h = 1 gives p = 0; h > 1 (supersaturation or a
 *   probe reading past 100 %) gives p > 0, which callers at the edge usually clamp; h = 0 gives
 *   -Infinity; h < 0 or NaN gives NaN.
 * @param temperatureK T in K.
 * @param liquidDensityKgPerM3 rho_w in kg/m3; default waterDensityKgPerM3(T) at 101325 Pa, which
 *   is NaN outside 253.15..623.15 K (so is the result then, unless a density is given). The
 *   density at atmospheric pressure stands for the liquid under tension too (incompressible
 *   liquid, as the Kelvin equation assumes; our estimate of the error is about 1 % at -50 MPa,
 *   half the density change that the compressibility of water, about 4.5e-10 1/Pa, gives there).
 * @returns p in Pa (h = 0.9 at 20 degC: about -14.2 MPa).
 * Source: Kelvin equation, Thomson (1871); physics.md section 2.
 */
export function kelvinLiquidPressurePa(
  relativeHumidity: number,
  temperatureK: number,
  liquidDensityKgPerM3: number = waterDensityKgPerM3(temperatureK),
): number {
  if (!(relativeHumidity >= 0)) return Number.NaN;
  return kelvinCoefficientPa(temperatureK, liquidDensityKgPerM3) * Math.log(relativeHumidity);
}

/**
 * Relative humidity in equilibrium with pore water at liquid pressure p, the inverse of
 * kelvinLiquidPressurePa(): h = exp(p M_w / (rho_w R T)).
 *
 * @param liquidPressurePa p in Pa relative to the gas. p = 0 gives 1, p > 0 gives h > 1 (not
 *   clamped), p = -Infinity gives 0; NaN gives NaN.
 * @param temperatureK T in K.
 * @param liquidDensityKgPerM3 rho_w in kg/m3; default waterDensityKgPerM3(T) at 101325 Pa.
 * @returns h as a fraction.
 * Source: Kelvin equation, Thomson (1871); physics.md section 2.
 */
export function kelvinRelativeHumidity(
  liquidPressurePa: number,
  temperatureK: number,
  liquidDensityKgPerM3: number = waterDensityKgPerM3(temperatureK),
): number {
  return Math.exp(liquidPressurePa / kelvinCoefficientPa(temperatureK, liquidDensityKgPerM3));
}
