/** Query parameters of GET /api/runs/:id/readings, validated with messages that name the field. */
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { ReadingFilter } from '../store/archiveQueries.ts';

const time = z.iso.datetime({
  offset: true,
  error: 'must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T11:20:00+02:00',
});

const querySchema = z.object({
  sensor: z.string().min(1).max(130).optional(),
  from: time.optional(),
  to: time.optional(),
  limit: z.coerce
    .number({ error: 'must be a number' })
    .int({ error: 'must be a whole number' })
    .min(1, { error: 'must be between 1 and 1000000' })
    .max(1_000_000, { error: 'must be between 1 and 1000000' })
    .optional(),
});

/**
 * @param query - express's `request.query`
 * @returns the archive filter: `sensor` (name or `device/name`), `from` inclusive, `to` exclusive
 * @throws ValidationError naming the parameter, rule and value
 */
export function parseReadingsQuery(query: unknown): ReadingFilter {
  const parsed = querySchema.safeParse(query);
  if (!parsed.success)
    throw new ValidationError('readings query', formatIssues(parsed.error.issues, query));
  const filter: ReadingFilter = {};
  if (parsed.data.sensor !== undefined) filter.sensor = parsed.data.sensor;
  if (parsed.data.from !== undefined) filter.fromMs = Date.parse(parsed.data.from);
  if (parsed.data.to !== undefined) filter.toMs = Date.parse(parsed.data.to);
  if (parsed.data.limit !== undefined) filter.limit = parsed.data.limit;
  return filter;
}
