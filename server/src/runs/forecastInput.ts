/**
 * Validation of a supplied weather forecast series: the body of POST /api/runs/:id/forecast and
 * the payload of the MQTT topic `meniscus/<site>/forecast` (same JSON).
 */
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { ForecastPoint } from '../live/types.ts';

/** Most points in one series: 1000 (our assumption: a week at 10 minutes). */
export const MAX_FORECAST_POINTS = 1000;

const between = (min: number, max: number, unit: string) =>
  z
    .number({ error: `must be a number in ${unit}` })
    .min(min, { error: `must be at least ${min} ${unit}` })
    .max(max, { error: `must be at most ${max} ${unit}` })
    .optional();

const pointSchema = z.strictObject({
  time: z.iso.datetime({
    offset: true,
    error: 'must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T15:00:00+02:00',
  }),
  // Ranges as ingest accepts for the same quantities (server/src/ingest/README.md).
  airTemperatureC: between(-40, 90, 'degC'),
  relativeHumidityPercent: between(0, 100, '%'),
  windSpeedMs: between(0, 100, 'm/s'),
  solarWm2: between(0, 1500, 'W/m2'),
});

const seriesSchema = z.strictObject({
  points: z
    .array(pointSchema)
    .max(MAX_FORECAST_POINTS, { error: `must hold at most ${MAX_FORECAST_POINTS} points` }),
});

/**
 * Validates a forecast series: `{ points: [{ time, airTemperatureC?, relativeHumidityPercent?,
 * windSpeedMs?, solarWm2? }] }`, times strictly increasing, each point with at least one
 * quantity. An empty list returns the run to persistence of the recent weather.
 *
 * @param body - parsed JSON
 * @returns the points with times in ms since the epoch
 * @throws ValidationError naming each bad field
 */
export function parseForecast(body: unknown): ForecastPoint[] {
  const parsed = seriesSchema.safeParse(body);
  if (!parsed.success)
    throw new ValidationError('forecast', formatIssues(parsed.error.issues, body));
  const issues: string[] = [];
  const points = parsed.data.points.map(({ time, ...given }, index): ForecastPoint => {
    // Drop absent keys (exactOptionalPropertyTypes: absent, never undefined).
    const values = Object.fromEntries(
      Object.entries(given).filter(([, value]) => value !== undefined),
    ) as Omit<ForecastPoint, 'timeMs'>;
    const timeMs = Date.parse(time);
    const previous = parsed.data.points[index - 1];
    if (previous !== undefined && Date.parse(previous.time) >= timeMs)
      issues.push(`points[${index}].time must be after points[${index - 1}].time: got ${time}`);
    if (Object.keys(values).length === 0)
      issues.push(`points[${index}] must give at least one quantity: got only a time`);
    return { timeMs, ...values };
  });
  if (issues.length > 0) throw new ValidationError('forecast', issues);
  return points;
}
