/**
 * Dew point over liquid water from air temperature and relative humidity.
 *
 * Td solves ps(Td) = RH * ps(Ta), with ps the IAPWS-IF97 saturation pressure over liquid water
 * (saturationVapourPressurePa). The IF97 backward equation gives the starting value and Newton
 * steps on ln ps polish it to the forward equation's own inverse.
 * Source: IAPWS R7-97(2012), eqs. 30 and 31. Relative humidity is taken over liquid water at every
 * temperature, the WMO convention (WMO-No. 8, humidity chapter; from memory).
 */
import {
  SATURATION_PRESSURE_MIN_TEMPERATURE_K,
  saturationTemperatureK,
  saturationVapourPressurePa,
} from './saturationVapourPressure.ts';

/** Newton steps after the backward-equation start; the start is already within about 1e-9 K. */
const NEWTON_STEPS = 3;
/** Half-width (K) of the central difference used for d ln ps / dT. */
const DERIVATIVE_STEP_K = 1e-3;

/**
 * Dew point over liquid water: the temperature Td at which the air's vapour pressure
 * e = RH ps(Ta) saturates, ps(Td) = e.
 *
 * Below 0 degC this is the dew point over supercooled water, not the frost point (over ice the
 * saturation pressure is lower, see iceSublimationPressurePa, so frost forms first).
 *
 * @param airTemperatureK Ta in K, 233.15 K to 647.096 K.
 * @param relativeHumidity RH as a fraction over liquid water, in (0, 1]. RH = 1 returns Ta.
 *   RH > 1 (supersaturation, or a probe reading past 100 %) returns a dew point above Ta; clamp
 *   at the edge if that is not wanted.
 * @returns Td in K. NaN for RH <= 0 (no vapour, no dew point), for NaN, for Ta outside the range,
 *   or when Td would fall below 233.15 K (very dry, cold air).
 * Source: IAPWS R7-97(2012), eqs. 30 and 31.
 */
export function dewPointK(airTemperatureK: number, relativeHumidity: number): number {
  if (!(relativeHumidity > 0)) return Number.NaN;
  const vapourPressurePa = relativeHumidity * saturationVapourPressurePa(airTemperatureK);
  let dewPoint = saturationTemperatureK(vapourPressurePa);
  if (Number.isNaN(dewPoint)) return Number.NaN;
  if (relativeHumidity === 1) return airTemperatureK;
  const targetLog = Math.log(vapourPressurePa);
  for (let step = 0; step < NEWTON_STEPS; step += 1) {
    const low = Math.max(dewPoint - DERIVATIVE_STEP_K, SATURATION_PRESSURE_MIN_TEMPERATURE_K);
    const high = low + 2 * DERIVATIVE_STEP_K;
    const slope =
      (Math.log(saturationVapourPressurePa(high)) - Math.log(saturationVapourPressurePa(low))) /
      (high - low);
    const residual = Math.log(saturationVapourPressurePa(dewPoint)) - targetLog;
    if (!Number.isFinite(residual) || !Number.isFinite(slope)) break;
    dewPoint -= residual / slope;
  }
  // Round-off must not lift the dew point of unsaturated air above the air temperature.
  return relativeHumidity < 1 ? Math.min(dewPoint, airTemperatureK) : dewPoint;
}
