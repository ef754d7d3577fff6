/**
 * The scripted weather of a scenario at an instant: a daily cycle of air temperature, humidity
 * and sun, plus the scripted events (a dry wind rising, a shower). Deterministic: the station
 * adds its own noise and gusts on top, and the hidden truth sees these mean values.
 */
import type { ScenarioWeather } from './scenarioSchema.ts';

/** Mean weather at one instant, at the station's mast. */
export interface ScriptedWeather {
  airTemperatureC: number;
  relativeHumidityPercent: number;
  /** Mean wind at mast height (before gusts), m/s. */
  windMS: number;
  solarWm2: number;
  rainMmH: number;
}

const MS_PER_HOUR = 3_600_000;
/** Time after a shower over which temperature and humidity return to the cycle, h (our assumption). */
const SHOWER_RECOVERY_H = 0.5;
/** Fraction of the sun left under a shower's cloud (our assumption). */
const SHOWER_SUN_FRACTION = 0.2;

/**
 * Local hour of day, 0..24, of an instant.
 *
 * @param timeMs - ms since the Unix epoch
 * @param utcOffsetMin - local offset from UTC, min
 */
export function localHourOfDay(timeMs: number, utcOffsetMin: number): number {
  const hours = (timeMs / MS_PER_HOUR + utcOffsetMin / 60) % 24;
  return hours < 0 ? hours + 24 : hours;
}

/**
 * Fraction of the daily air-temperature swing, 0 at the coolest hour and 1 at the warmest:
 * half-cosine rise from coolest to warmest, half-cosine fall to the next coolest hour.
 * A common two-part cosine shape of the diurnal cycle (common practice). Equal coolest and
 * warmest hours give 0.
 */
export function diurnalFraction(hour: number, coolestAtH: number, warmestAtH: number): number {
  const rise = (((warmestAtH - coolestAtH) % 24) + 24) % 24;
  if (rise === 0) return 0;
  const sinceCoolest = (((hour - coolestAtH) % 24) + 24) % 24;
  if (sinceCoolest <= rise) return (1 - Math.cos((Math.PI * sinceCoolest) / rise)) / 2;
  const fall = 24 - rise;
  return (1 + Math.cos((Math.PI * (sinceCoolest - rise)) / fall)) / 2;
}

/** Strength 0..1 of an event with linear ramps of `rampMs` at both ends. */
function rampedStrength(timeMs: number, startMs: number, endMs: number, rampMs: number): number {
  if (timeMs <= startMs || timeMs >= endMs + rampMs) return 0;
  if (rampMs <= 0) return timeMs < endMs ? 1 : 0;
  if (timeMs < startMs + rampMs) return (timeMs - startMs) / rampMs;
  if (timeMs <= endMs) return 1;
  return 1 - (timeMs - endMs) / rampMs;
}

/**
 * The scripted weather at `timeMs`.
 *
 * Daily cycle: T = Tmin + f (Tmax - Tmin) and RH = RHcool + f (RHwarm - RHcool) with f from
 * {@link diurnalFraction}; sun S = S0 sin(pi (h - sunrise) / (sunset - sunrise)) between
 * sunrise and sunset, 0 otherwise (clear sky, our assumption). A dry wind blends the wind up to
 * its strength and lowers RH / raises T, ramped at both ends; a shower rains, raises RH to its
 * humidity, cools the air and dims the sun, with the air recovering over half an hour.
 * RH is kept within 1..100 %; wind, sun and rain are never negative.
 *
 * @param weather - the scenario's weather block
 * @param timeMs - event time, ms since the Unix epoch
 * @param utcOffsetMin - local offset from UTC of the scenario, min
 */
export function scriptedWeatherAt(
  weather: ScenarioWeather,
  timeMs: number,
  utcOffsetMin: number,
): ScriptedWeather {
  const hour = localHourOfDay(timeMs, utcOffsetMin);
  const fraction = diurnalFraction(hour, weather.coolestAtH, weather.warmestAtH);
  let airTemperatureC =
    weather.airTemperatureMinC +
    fraction * (weather.airTemperatureMaxC - weather.airTemperatureMinC);
  let relativeHumidityPercent =
    weather.humidityAtCoolestPercent +
    fraction * (weather.humidityAtWarmestPercent - weather.humidityAtCoolestPercent);
  let windMS = weather.windMS;
  const daylight = weather.sunsetH - weather.sunriseH;
  let solarWm2 =
    daylight > 0 && hour > weather.sunriseH && hour < weather.sunsetH
      ? weather.solarNoonWm2 * Math.sin((Math.PI * (hour - weather.sunriseH)) / daylight)
      : 0;
  let rainMmH = 0;
  for (const event of weather.events) {
    const startMs = Date.parse(event.startAt);
    const endMs = Date.parse(event.endAt);
    if (event.kind === 'dry-wind') {
      const strength = rampedStrength(timeMs, startMs, endMs, event.rampMin * 60_000);
      windMS += strength * Math.max(0, event.windMS - windMS);
      relativeHumidityPercent -= strength * event.humidityDropPercent;
      airTemperatureC += strength * event.temperatureRiseK;
    } else {
      const raining = timeMs >= startMs && timeMs < endMs;
      const recoveryMs = SHOWER_RECOVERY_H * MS_PER_HOUR;
      const recovery =
        timeMs < startMs || timeMs >= endMs + recoveryMs
          ? 0
          : raining
            ? 1
            : 1 - (timeMs - endMs) / recoveryMs;
      if (raining) {
        rainMmH += event.rainMmH;
        solarWm2 *= SHOWER_SUN_FRACTION;
      }
      relativeHumidityPercent +=
        recovery * Math.max(0, event.humidityPercent - relativeHumidityPercent);
      airTemperatureC -= recovery * event.temperatureDropK;
    }
  }
  return {
    airTemperatureC,
    relativeHumidityPercent: Math.min(100, Math.max(1, relativeHumidityPercent)),
    windMS: Math.max(0, windMS),
    solarWm2: Math.max(0, solarWm2),
    rainMmH: Math.max(0, rainMmH),
  };
}
