/**
 * Resolves a SenML pack (RFC 8428, JSON representation) into readings.
 *
 * - Base fields `bn`, `bt`, `bu`, `bv`, `bs`, `bver` apply to their record and every later one
 *   until changed (section 4.1); the name is `bn + n`, the value `bv + v` (or `bs + s` for a sum),
 *   the time `bt + t` (4.5).
 * - A time below 2^28 s is relative to now (the receive time); larger ones are seconds since the
 *   Unix epoch (4.5.3).
 * - Unknown fields are ignored; a field whose name ends in `_` must be understood and is rejected
 *   (4.4); `bver` above 10 is rejected (4.4).
 * - `ut` is kept per reading for silence detection.
 * - Only numeric values are accepted (`v` or `s`): the run's sensors report numbers.
 * - A record with base fields only and no name or value just sets the bases.
 */
import type { ParsedPayload, PayloadReading } from './payloadReading.ts';
import { reject, shown } from './reasons.ts';
import type { Rejection } from './reasons.ts';

/** Times below this many seconds are relative to now (RFC 8428 section 4.5.3). */
export const SENML_RELATIVE_TIME_LIMIT_S = 2 ** 28;
const SENML_VERSION = 10;
const NAME = /^[A-Za-z0-9][A-Za-z0-9\-:./_]*$/;

const NUMBER_FIELDS = ['bt', 'bv', 'bs', 'bver', 'v', 's', 't', 'ut'] as const;
const STRING_FIELDS = ['bn', 'bu', 'n', 'u', 'vs', 'vd'] as const;

/**
 * @param pack - parsed JSON; must be an array of objects
 * @param receivedAtMs - receive time, ms since the epoch, the origin of relative times
 * @returns the readings in pack order, or the first problem as a Rejection
 */
export function parseSenml(pack: unknown, receivedAtMs: number): ParsedPayload | Rejection {
  if (!Array.isArray(pack))
    return reject('wrong-type', `SenML pack must be a JSON array: got ${shown(pack)}`);
  if (pack.length === 0)
    return reject('wrong-type', 'SenML pack must hold at least one record: got an empty list');
  let baseName = '';
  let baseTimeS = 0;
  let baseUnit: string | null = null;
  let baseValue = 0;
  let baseSum = 0;
  const readings: PayloadReading[] = [];
  for (let index = 0; index < pack.length; index += 1) {
    const record: unknown = pack[index];
    const at = `record ${index}`;
    if (record === null || typeof record !== 'object' || Array.isArray(record)) {
      return reject('wrong-type', `${at} must be a JSON object: got ${shown(record)}`);
    }
    const fields = record as Record<string, unknown>;
    for (const key of Object.keys(fields)) {
      if (key.endsWith('_')) {
        return reject(
          'unsupported-field',
          `${at} field ${shown(key)} must be understood (ends in "_") and is not`,
        );
      }
    }
    for (const key of NUMBER_FIELDS) {
      if (Object.hasOwn(fields, key)) {
        const value = fields[key];
        if (typeof value !== 'number')
          return reject('wrong-type', `${at} ${key} must be a number: got ${shown(value)}`);
        if (!Number.isFinite(value))
          return reject('not-finite', `${at} ${key} must be finite: got ${value}`);
      }
    }
    for (const key of STRING_FIELDS) {
      if (Object.hasOwn(fields, key) && typeof fields[key] !== 'string') {
        return reject('wrong-type', `${at} ${key} must be a string: got ${shown(fields[key])}`);
      }
    }
    if (Object.hasOwn(fields, 'vb') && typeof fields.vb !== 'boolean') {
      return reject('wrong-type', `${at} vb must be true or false: got ${shown(fields.vb)}`);
    }
    const num = (key: string) => fields[key] as number | undefined;
    const str = (key: string) => fields[key] as string | undefined;
    const version = num('bver');
    if (version !== undefined && version > SENML_VERSION) {
      return reject(
        'unsupported-field',
        `${at} bver must be at most ${SENML_VERSION}: got ${version}`,
      );
    }
    baseName = str('bn') ?? baseName;
    baseTimeS = num('bt') ?? baseTimeS;
    baseUnit = str('bu') ?? baseUnit;
    baseValue = num('bv') ?? baseValue;
    baseSum = num('bs') ?? baseSum;

    const hasValue = ['v', 's', 'vs', 'vb', 'vd'].some((key) => Object.hasOwn(fields, key));
    if (!hasValue && !Object.hasOwn(fields, 'n')) continue; // bases only
    if (['vs', 'vb', 'vd'].some((key) => Object.hasOwn(fields, key))) {
      return reject(
        'wrong-type',
        `${at} must carry a number (v or s): got a string, boolean or data value`,
      );
    }
    const name = baseName + (str('n') ?? '');
    if (!NAME.test(name))
      return reject('wrong-type', `${at} name must match RFC 8428 4.5.1: got ${shown(name)}`);
    const v = num('v');
    const s = num('s');
    if (v === undefined && s === undefined)
      return reject('wrong-type', `${at} (${name}) has no value (v or s)`);
    const value = v !== undefined ? baseValue + v : baseSum + (s ?? 0);
    const timeS = baseTimeS + (num('t') ?? 0);
    if (!Number.isFinite(value) || !Number.isFinite(timeS)) {
      return reject(
        'not-finite',
        `${at} (${name}) value and time must be finite: got ${value} at ${timeS}`,
      );
    }
    const ut = num('ut');
    if (ut !== undefined && ut < 0)
      return reject('wrong-type', `${at} (${name}) ut must be at least 0 s: got ${ut}`);
    const eventAtMs =
      timeS < SENML_RELATIVE_TIME_LIMIT_S
        ? receivedAtMs + Math.round(timeS * 1000)
        : Math.round(timeS * 1000);
    readings.push({
      name,
      eventAtMs,
      value,
      unit: str('u') ?? baseUnit,
      updateIntervalS: ut ?? null,
    });
  }
  if (readings.length === 0)
    return reject('wrong-type', 'SenML pack must hold at least one value: got none');
  return { ok: true, form: 'senml', readings };
}
