/**
 * A simulated weather station on a mast: air temperature, relative humidity, wind with gusts,
 * solar radiation and rain, one SenML pack per interval, reading the scripted weather. Noise and
 * resolution are those of common site stations (our assumption): air temperature 0.1 degC
 * (sd 0.1), RH 0.1 % (sd 0.8), wind 0.1 m/s, sun 1 W/m2 (sd 2 %), rain by a 0.2 mm tipping
 * bucket (common practice).
 *
 * Gusts: the wind reported is the mean times (1 + g (G - 1) / 3), g an AR(1) series of unit
 * variance with lag-one correlation 0.7 per interval (our assumption), G the scenario's gust
 * factor, so peaks near 3 sd reach about G times the mean; never below 0.
 */
import type { ScenarioWeather } from './scenarioSchema.ts';
import { seededRandom } from './seededRandom.ts';
import type { SeededRandom } from './seededRandom.ts';
import { quantise, senmlPack } from './senmlPack.ts';
import type { Measurement, SenmlRecord } from './senmlPack.ts';
import type { ScriptedWeather } from './weatherScript.ts';

/** Depth of water per tip of the rain gauge's bucket, mm (common practice). */
export const RAIN_TIP_MM = 0.2;
const GUST_CORRELATION = 0.7;

export class WeatherStationSimulator {
  readonly device: string;
  readonly intervalS: number;
  readonly #weather: ScenarioWeather;
  readonly #random: SeededRandom;
  #gust = 0;
  #rainCollectedMm = 0;
  #lastSampleMs: number | null = null;

  constructor(weather: ScenarioWeather, seed: number) {
    this.device = weather.device;
    this.intervalS = weather.intervalS;
    this.#weather = weather;
    this.#random = seededRandom(seed, weather.device);
  }

  /**
   * One pack at event time `timeMs` from the mean weather then. Rain is the depth tipped since
   * the last sample (whole tips; the rest stays in the bucket).
   */
  sample(timeMs: number, weather: ScriptedWeather): SenmlRecord[] {
    const random = this.#random;
    const sinceS =
      this.#lastSampleMs === null ? this.intervalS : (timeMs - this.#lastSampleMs) / 1000;
    this.#lastSampleMs = timeMs;
    this.#gust =
      GUST_CORRELATION * this.#gust + Math.sqrt(1 - GUST_CORRELATION ** 2) * random.normal(0, 1);
    const windMS = Math.max(
      0,
      weather.windMS * (1 + (this.#gust * (this.#weather.gustFactor - 1)) / 3),
    );
    this.#rainCollectedMm += (weather.rainMmH * Math.max(0, sinceS)) / 3600;
    const tips = Math.floor(this.#rainCollectedMm / RAIN_TIP_MM + 1e-9);
    this.#rainCollectedMm -= tips * RAIN_TIP_MM;
    const sensors = this.#weather.sensors;
    const measurements: Measurement[] = [
      {
        sensor: sensors.airTemperature,
        unit: 'Cel',
        value: quantise(random.normal(weather.airTemperatureC, 0.1), 0.1),
      },
      {
        sensor: sensors.relativeHumidity,
        unit: '%RH',
        value: quantise(
          Math.min(100, Math.max(0, random.normal(weather.relativeHumidityPercent, 0.8))),
          0.1,
        ),
      },
      { sensor: sensors.windSpeed, unit: 'm/s', value: quantise(windMS, 0.1) },
    ];
    const sun = Math.max(0, random.normal(weather.solarWm2, 0.02 * weather.solarWm2));
    if (sensors.solarRadiation !== undefined) {
      measurements.push({ sensor: sensors.solarRadiation, unit: 'W/m2', value: Math.round(sun) });
    }
    if (sensors.rain !== undefined) {
      measurements.push({
        sensor: sensors.rain,
        unit: 'mm',
        value: quantise(tips * RAIN_TIP_MM, 0.1),
      });
    }
    return senmlPack(this.device, timeMs, measurements, this.intervalS);
  }
}
