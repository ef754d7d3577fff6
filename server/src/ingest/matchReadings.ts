/**
 * Matches a payload's readings to one run's sensors and checks them against the physics and the
 * clock: sensor known, unit convertible to the sensor's quantity, value possible, event time
 * neither far in the future nor before the run. The whole message is accepted or rejected: the
 * first bad reading names the reason.
 */
import type { DeviceBinding, ReadingToStore } from '../store/types.ts';
import type { PayloadReading } from './payloadReading.ts';
import { QUANTITIES } from './quantities.ts';
import { reject, shown } from './reasons.ts';
import type { Rejection } from './reasons.ts';
import { acceptedUnits, toCanonicalUnit } from './units.ts';

export interface TimeLimits {
  /** How far past the receive time an event time may lie, ms: 5 min (our assumption: device clocks drift). */
  futureToleranceMs: number;
  /** How long before placement a reading is still kept, ms: 1 h (our assumption: sensors start before the pour). */
  beforePlacementMs: number;
}

/** 5 min ahead of receipt, 1 h before placement (our assumptions, see TimeLimits). */
export const DEFAULT_TIME_LIMITS: TimeLimits = {
  futureToleranceMs: 5 * 60_000,
  beforePlacementMs: 60 * 60_000,
};

/**
 * The sensor name of a reading: its name, less a leading `<device>/` or `<device>:` (a SenML
 * base name that names the device).
 */
export function sensorNameOf(readingName: string, device: string): string {
  for (const separator of ['/', ':']) {
    const prefix = device + separator;
    if (readingName.startsWith(prefix) && readingName.length > prefix.length)
      return readingName.slice(prefix.length);
  }
  return readingName;
}

/**
 * @param readings - as parsed from the payload
 * @param device - device id from the topic
 * @param binding - the run's sensors on that device
 * @param receivedAtMs - receive time, ms since the epoch
 * @param limits - time tolerances (DEFAULT_TIME_LIMITS)
 * @returns readings in canonical units, or the first rejection
 */
export function matchReadings(
  readings: readonly PayloadReading[],
  device: string,
  binding: DeviceBinding,
  receivedAtMs: number,
  limits: TimeLimits = DEFAULT_TIME_LIMITS,
): { ok: true; readings: ReadingToStore[] } | Rejection {
  const matched: ReadingToStore[] = [];
  for (const reading of readings) {
    const name = sensorNameOf(reading.name, device);
    const sensor = binding.sensors.get(name);
    if (sensor === undefined) {
      return reject(
        'unknown-sensor',
        `sensor ${shown(name)} of device ${device} is not in the run's configuration`,
      );
    }
    const spec = QUANTITIES[sensor.quantity];
    const value = toCanonicalUnit(reading.value, reading.unit, sensor.quantity);
    if (value === null) {
      return reject(
        'unit-mismatch',
        `${name} measures ${sensor.quantity} and must be in ${acceptedUnits(sensor.quantity).join(', ')}: got ${shown(reading.unit)}`,
      );
    }
    if (!(value >= spec.min && value <= spec.max)) {
      return reject(
        'impossible-value',
        `${name} (${sensor.quantity}) must be between ${spec.min} and ${spec.max} ${spec.unit}: got ${round(value)}`,
      );
    }
    if (reading.eventAtMs > receivedAtMs + limits.futureToleranceMs) {
      return reject(
        'time-in-future',
        `${name} event time must be at most ${limits.futureToleranceMs / 1000} s after receipt: got ${isoOrRaw(reading.eventAtMs)}`,
      );
    }
    if (reading.eventAtMs < binding.placedAtMs - limits.beforePlacementMs) {
      return reject(
        'time-before-run',
        `${name} event time must be at most ${limits.beforePlacementMs / 1000} s before placement (${isoOrRaw(binding.placedAtMs)}): got ${isoOrRaw(reading.eventAtMs)}`,
      );
    }
    matched.push({
      sensorId: sensor.sensorId,
      eventAtMs: reading.eventAtMs,
      value,
      unit: spec.unit,
      updateIntervalS: reading.updateIntervalS,
    });
  }
  return { ok: true, readings: matched };
}

function round(value: number): string {
  return Number.isFinite(value) ? String(Math.round(value * 1000) / 1000) : String(value);
}

function isoOrRaw(ms: number): string {
  const date = new Date(ms);
  return Number.isNaN(date.getTime()) ? `${ms} ms` : date.toISOString();
}
