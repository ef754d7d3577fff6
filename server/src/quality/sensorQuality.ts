/**
 * The data-quality findings of a run's readings, sensor by sensor: silences (detectSilence) and
 * stuck stretches (detectStuck). A device is silent when all its sensors are; here each sensor
 * is judged on its own, which also catches a device that keeps one sensor reporting.
 */
import { detectSilence } from './detectSilence.ts';
import type { Silence, SilenceOptions } from './detectSilence.ts';
import { detectStuck } from './detectStuck.ts';
import type { StuckOptions, StuckStretch } from './detectStuck.ts';

/** A stored reading as far as quality needs it (StoredReading has these fields). */
export interface QualityReading {
  device: string;
  sensor: string;
  eventAtMs: number;
  value: number;
  updateIntervalS: number | null;
}

/** Findings of one sensor. */
export interface SensorQuality {
  device: string;
  sensor: string;
  readings: number;
  silences: Silence[];
  stuck: StuckStretch[];
}

export interface SensorQualityOptions {
  /** Options of detectSilence (nowMs, configured interval, grace factor). */
  silence?: SilenceOptions;
  /** Options of detectStuck (window, fewest readings, tolerance). */
  stuck?: StuckOptions;
}

/**
 * Groups `readings` by device and sensor and runs both detectors on each series.
 *
 * @param readings - any order, any number of sensors
 * @returns one entry per sensor, sorted by device then sensor; an empty input gives none
 */
export function sensorQuality(
  readings: readonly QualityReading[],
  options: SensorQualityOptions = {},
): SensorQuality[] {
  const series = new Map<string, QualityReading[]>();
  for (const reading of readings) {
    const key = `${reading.device}\u0000${reading.sensor}`;
    const list = series.get(key);
    if (list === undefined) series.set(key, [reading]);
    else list.push(reading);
  }
  return [...series.values()]
    .map((list) => {
      const first = list[0] as QualityReading;
      return {
        device: first.device,
        sensor: first.sensor,
        readings: list.length,
        silences: detectSilence(list, options.silence ?? {}),
        stuck: detectStuck(list, options.stuck ?? {}),
      };
    })
    .sort((a, b) =>
      a.device === b.device ? a.sensor.localeCompare(b.sensor) : a.device.localeCompare(b.device),
    );
}
