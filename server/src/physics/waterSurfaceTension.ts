/**
 * Surface tension of ordinary water against its vapour, IAPWS R1-76(2014):
 * sigma = B tau^mu (1 + b tau), tau = 1 - T / Tc.
 * Source: IAPWS R1-76(2014), Revised Release on Surface Tension of Ordinary Water Substance.
 * The release states the equation from the triple point to the critical point and says it gives
 * reasonable values extrapolated into supercooled water down to at least -25 degC.
 */
import { WATER_CRITICAL_TEMPERATURE_K } from './saturationVapourPressure.ts';

/** B of IAPWS R1-76(2014), N/m. */
const B_N_PER_M = 235.8e-3;
/** b of IAPWS R1-76(2014), dimensionless. */
const SMALL_B = -0.625;
/** mu of IAPWS R1-76(2014), dimensionless exponent. */
const MU = 1.256;

/** Lowest temperature (K, -25 degC) of the supercooled extrapolation IAPWS R1-76(2014) endorses. */
export const SURFACE_TENSION_MIN_TEMPERATURE_K = 248.15;

/**
 * Surface tension of water in equilibrium with its vapour: sigma = B tau^mu (1 + b tau),
 * tau = 1 - T / Tc, with B = 235.8 mN/m, b = -0.625, mu = 1.256, Tc = 647.096 K.
 *
 * In air at atmospheric pressure the value differs from the one against pure vapour by far less
 * than the release's uncertainty, so it serves for pore water in concrete (common practice).
 *
 * @param temperatureK T in K. Valid from 248.15 K (-25 degC, supercooled extrapolation) to the
 *   critical temperature 647.096 K, where it is 0.
 * @returns sigma in N/m (0.07274 at 20 degC, 0.07197 at 25 degC). NaN below 248.15 K, above
 *   647.096 K (no liquid-vapour interface) or for NaN.
 * Source: IAPWS R1-76(2014), eq. 1.
 */
export function waterSurfaceTensionNPerM(temperatureK: number): number {
  if (
    !(temperatureK >= SURFACE_TENSION_MIN_TEMPERATURE_K) ||
    !(temperatureK <= WATER_CRITICAL_TEMPERATURE_K)
  ) {
    return Number.NaN;
  }
  const tau = 1 - temperatureK / WATER_CRITICAL_TEMPERATURE_K;
  return B_N_PER_M * tau ** MU * (1 + SMALL_B * tau);
}
