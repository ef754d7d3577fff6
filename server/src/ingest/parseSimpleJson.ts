/**
 * Parses the simple JSON form, ours, for devices that cannot send SenML:
 *
 * ```json
 * { "time": "2026-06-14T13:40:00+02:00",
 *   "readings": { "rh-10": 97.5, "t-10": { "value": 71.6, "unit": "degF" } },
 *   "ut": 60 }
 * ```
 *
 * - `time` (required): ISO 8601 with an offset (or `Z`), or seconds since the Unix epoch.
 * - `readings` (required, at least one): sensor name to a number in the sensor's canonical unit,
 *   or to `{ value, unit }` with any accepted unit (units.ts).
 * - `ut` (optional): the longest time, s, before the device reports again (as SenML `ut`).
 * - Other fields are ignored.
 */
import type { ParsedPayload, PayloadReading } from './payloadReading.ts';
import { reject, shown } from './reasons.ts';
import type { Rejection } from './reasons.ts';

const ISO_WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:\d{2})$/;

/**
 * @param body - parsed JSON, a plain object
 * @returns readings in key order, or the first problem as a Rejection
 */
export function parseSimpleJson(body: unknown): ParsedPayload | Rejection {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    return reject('wrong-type', `simple form must be a JSON object: got ${shown(body)}`);
  }
  const fields = body as Record<string, unknown>;
  const eventAtMs = parseTime(fields.time);
  if (typeof eventAtMs !== 'number') return eventAtMs;
  let updateIntervalS: number | null = null;
  if (Object.hasOwn(fields, 'ut')) {
    const ut = fields.ut;
    if (typeof ut !== 'number' || ut < 0)
      return reject('wrong-type', `ut must be a number of s >= 0: got ${shown(ut)}`);
    updateIntervalS = ut;
  }
  const map = fields.readings;
  if (map === null || typeof map !== 'object' || Array.isArray(map)) {
    return reject(
      'wrong-type',
      `readings must be an object of sensor name to value: got ${shown(map)}`,
    );
  }
  const readings: PayloadReading[] = [];
  for (const [name, entry] of Object.entries(map as Record<string, unknown>)) {
    let value: unknown = entry;
    let unit: unknown = null;
    if (entry !== null && typeof entry === 'object' && !Array.isArray(entry)) {
      value = (entry as Record<string, unknown>).value;
      unit = (entry as Record<string, unknown>).unit ?? null;
    }
    if (typeof value !== 'number')
      return reject('wrong-type', `readings.${name} must be a number: got ${shown(value)}`);
    if (unit !== null && typeof unit !== 'string') {
      return reject('wrong-type', `readings.${name}.unit must be a string: got ${shown(unit)}`);
    }
    if (!Number.isFinite(value))
      return reject('not-finite', `readings.${name} must be finite: got ${value}`);
    readings.push({ name, eventAtMs, value, unit, updateIntervalS });
  }
  if (readings.length === 0)
    return reject('wrong-type', 'readings must hold at least one sensor: got none');
  return { ok: true, form: 'simple', readings };
}

function parseTime(time: unknown): number | Rejection {
  if (typeof time === 'number') {
    if (!Number.isFinite(time)) return reject('not-finite', `time must be finite: got ${time}`);
    return Math.round(time * 1000);
  }
  if (typeof time === 'string' && ISO_WITH_OFFSET.test(time)) {
    const ms = Date.parse(time);
    if (Number.isFinite(ms)) return ms;
  }
  return reject(
    'wrong-type',
    `time must be ISO 8601 with an offset or seconds since the epoch: got ${shown(time)}`,
  );
}
