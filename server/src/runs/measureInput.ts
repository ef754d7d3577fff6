/**
 * Validation of measure-log bodies (POST /api/runs/:id/measures and .../measures/:measureId/end).
 * Every error names the field, the rule and the value received (formatIssues).
 */
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { MeasureKind } from '../live/types.ts';

/** Curing measures the log takes (terms of the trade, physics.md 4). */
export const MEASURE_KINDS = [
  'wet-covering',
  'ponding',
  'curing-compound',
  'fogging',
  'windbreak',
] as const satisfies readonly MeasureKind[];

const isoTime = z.iso.datetime({
  offset: true,
  error: 'must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T13:40:00+02:00',
});
const person = z
  .string({ error: 'must be the name of who logged it' })
  .trim()
  .min(1, { error: 'must not be empty' })
  .max(100, { error: 'must be at most 100 characters' });

const fraction = z
  .number({ error: 'must be a number from 0 to 1' })
  .min(0, { error: 'must be at least 0' })
  .max(1, { error: 'must be at most 1' });

const startSchema = z.strictObject({
  kind: z.enum(MEASURE_KINDS, { error: `must be one of ${MEASURE_KINDS.join(', ')}` }),
  /** Start of the measure; the server's time when absent. */
  startAt: isoTime.optional(),
  /** End, when logged after the fact; absent or null while applied. */
  endAt: isoTime.nullable().optional(),
  loggedBy: person,
  /** Curing compound efficiency 0..1 (the product's own figure). */
  efficiency: fraction.optional(),
  /** Fogging: relative humidity held over the surface, fraction 0..1. */
  relativeHumidity: fraction.optional(),
  /** Windbreak: sheltered over open wind speed, 0..1. */
  windFactor: fraction.optional(),
  note: z.string().max(500, { error: 'must be at most 500 characters' }).optional(),
});

const endSchema = z.strictObject({
  /** End of the measure; the server's time when absent. */
  endAt: isoTime.optional(),
  endedBy: person,
});

/** A validated new measure, times in ms since the epoch. */
export interface MeasureStart {
  kind: MeasureKind;
  startMs: number;
  endMs: number | null;
  loggedBy: string;
  efficiency?: number;
  relativeHumidity?: number;
  windFactor?: number;
  note?: string;
}

/**
 * Validates a new measure.
 *
 * @param body - parsed JSON body
 * @param nowMs - server time for an absent startAt, ms since the epoch
 * @throws ValidationError naming each bad field; also when endAt is before startAt, or a
 *   figure is given for another kind (efficiency: curing-compound, relativeHumidity: fogging,
 *   windFactor: windbreak)
 */
export function parseMeasureStart(body: unknown, nowMs: number): MeasureStart {
  const parsed = startSchema.safeParse(body);
  if (!parsed.success)
    throw new ValidationError('measure', formatIssues(parsed.error.issues, body));
  const { kind, startAt, endAt, loggedBy, efficiency, relativeHumidity, windFactor, note } =
    parsed.data;
  const startMs = startAt === undefined ? nowMs : Date.parse(startAt);
  const endMs = endAt === undefined || endAt === null ? null : Date.parse(endAt);
  const issues: string[] = [];
  if (endMs !== null && endMs < startMs)
    issues.push(
      `endAt must not be before startAt (${new Date(startMs).toISOString()}): got ${endAt}`,
    );
  for (const [field, value, only] of [
    ['efficiency', efficiency, 'curing-compound'],
    ['relativeHumidity', relativeHumidity, 'fogging'],
    ['windFactor', windFactor, 'windbreak'],
  ] as const) {
    if (value !== undefined && kind !== only)
      issues.push(`${field} applies to ${only} only: got it for ${kind}`);
  }
  if (issues.length > 0) throw new ValidationError('measure', issues);
  return {
    kind,
    startMs,
    endMs,
    loggedBy,
    ...(efficiency === undefined ? {} : { efficiency }),
    ...(relativeHumidity === undefined ? {} : { relativeHumidity }),
    ...(windFactor === undefined ? {} : { windFactor }),
    ...(note === undefined ? {} : { note }),
  };
}

/**
 * Validates the end of a measure.
 *
 * @param body - parsed JSON body
 * @param nowMs - server time for an absent endAt, ms since the epoch
 * @throws ValidationError naming each bad field
 */
export function parseMeasureEnd(body: unknown, nowMs: number): { endMs: number; endedBy: string } {
  const parsed = endSchema.safeParse(body);
  if (!parsed.success)
    throw new ValidationError('measure end', formatIssues(parsed.error.issues, body));
  return {
    endMs: parsed.data.endAt === undefined ? nowMs : Date.parse(parsed.data.endAt),
    endedBy: parsed.data.endedBy,
  };
}
