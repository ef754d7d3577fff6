/**
 * parseIsoTimeMs(): the ISO 8601 date-times the maturity CSV accepts (ISO 8601-1:2019 extended
 * format, RFC 3339 profile with its space separator), and the ones it refuses.
 */
import { describe, expect, it } from 'vitest';
import { parseIsoTimeMs } from '../../server/src/cli/isoTime.ts';

describe('parseIsoTimeMs()', () => {
  it.each([
    ['2026-06-14T07:30:00+02:00', '2026-06-14T05:30:00.000Z'],
    ['2026-06-14T07:30:00Z', '2026-06-14T07:30:00.000Z'],
    ['2026-06-14t07:30:00z', '2026-06-14T07:30:00.000Z'],
    ['2026-06-14T07:30Z', '2026-06-14T07:30:00.000Z'],
    ['2026-06-14 07:30:00', '2026-06-14T07:30:00.000Z'], // no offset: read as UTC (our choice)
    ['2026-06-14T07:30:00.25-03:30', '2026-06-14T11:00:00.250Z'],
    ['2026-06-14T07:30:00+0530', '2026-06-14T02:00:00.000Z'],
    ['2026-06-14T07:30:00-05', '2026-06-14T12:30:00.000Z'],
    ['2024-02-29T00:00:00Z', '2024-02-29T00:00:00.000Z'], // leap day
  ])('reads %s as %s', (text, iso) => {
    expect(new Date(parseIsoTimeMs(text)).toISOString()).toBe(iso);
  });

  it.each([
    ['day-first layout', '14/06/2026 07:30'],
    ['date only', '2026-06-14'],
    ['month 13', '2026-13-01T00:00:00Z'],
    ['30 February', '2026-02-30T00:00:00Z'],
    ['29 February of a common year', '2026-02-29T00:00:00Z'],
    ['hour 25', '2026-06-14T25:00:00Z'],
    ['minute 60', '2026-06-14T07:60:00Z'],
    ['epoch milliseconds', '1781422200000'],
    ['empty text', ''],
  ])('refuses a %s (%s) with NaN', (_case, text) => {
    expect(parseIsoTimeMs(text)).toBeNaN();
  });
});
