/**
 * Site times (web/src/siteTime.ts): shown at the run's own UTC offset whatever the browser's
 * zone. The expected texts are written out by hand.
 */
import { describe, expect, it } from 'vitest';
import {
  formatFromNow,
  formatSiteDateTime,
  formatSiteTime,
  formatUtcOffset,
  siteClockDate,
  siteOffsetMin,
} from '../../web/src/siteTime.ts';

const NBSP = '\u00a0';

describe('siteOffsetMin()', () => {
  it.each([
    ['2026-07-16T11:15:00+02:00', 120],
    ['2026-07-16T11:15:00.000Z', 0],
    ['2026-01-10T08:00:00-05:30', -330],
    ['2026-01-10T08:00:00+0545', 345],
    ['2026-01-10T08:00:00', 0],
  ])('siteOffsetMin(%j) is %i min', (iso, expected) => {
    expect(siteOffsetMin(iso)).toBe(expected);
  });
});

describe('formatUtcOffset()', () => {
  it.each([
    [120, 'UTC+02:00'],
    [-330, 'UTC-05:30'],
    [0, 'UTC'],
  ])('formatUtcOffset(%i) is %j', (offset, expected) => {
    expect(formatUtcOffset(offset)).toBe(expected);
  });
});

describe('formatSiteDateTime() and formatSiteTime()', () => {
  const placedMs = Date.parse('2026-07-16T11:15:00+02:00');

  it('shows a time at the site offset, not UTC', () => {
    expect(formatSiteDateTime(placedMs, 120)).toBe('2026-07-16 11:15');
    expect(formatSiteTime(placedMs, 120)).toBe('11:15');
    expect(formatSiteTime(placedMs, 0)).toBe('09:15');
  });

  it('rolls the date over at the site midnight', () => {
    expect(formatSiteDateTime(Date.parse('2026-07-16T23:30:00Z'), 120)).toBe('2026-07-17 01:30');
  });

  it('writes "no value" for a missing time', () => {
    expect(formatSiteTime(null, 120)).toBe('no value');
  });
});

describe('formatFromNow()', () => {
  const nowMs = Date.parse('2026-07-16T13:00:00Z');
  it.each([
    [nowMs + 70 * 60_000, `in${NBSP}1${NBSP}h 10${NBSP}min`],
    [nowMs - 25 * 60_000, `25${NBSP}min ago`],
    [nowMs + 10_000, 'now'],
  ])('formatFromNow(%i) says %j', (timeMs, expected) => {
    expect(formatFromNow(timeMs, nowMs)).toBe(expected);
  });
});

describe('siteClockDate()', () => {
  it("gives a Date whose local fields read the site's clock", () => {
    const date = siteClockDate(Date.parse('2026-07-16T12:40:00Z') / 1000, 120);
    expect([date.getHours(), date.getMinutes(), date.getDate()]).toEqual([14, 40, 16]);
  });
});
