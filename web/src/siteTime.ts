/**
 * Times as the site reads them: in the run's own UTC offset (the one its placedAt was written
 * with), whatever zone the tablet is set to, with the offset written out. Pure functions.
 */
import { NBSP, NO_VALUE, formatDurationH } from './format.ts';

/**
 * The UTC offset an ISO 8601 time was written with, in minutes east of UTC:
 * "2026-07-16T11:15:00+02:00" -> 120, "...Z" -> 0, "...-05:30" -> -330. A time without an
 * offset (the server never stores one) -> 0.
 */
export function siteOffsetMin(isoTime: string): number {
  const match = /([+-])(\d{2}):?(\d{2})$/.exec(isoTime);
  if (match === null) return 0;
  const [, sign, hours, minutes] = match;
  const total = Number(hours) * 60 + Number(minutes);
  return sign === '-' ? -total : total;
}

/** An offset as "UTC+02:00" ("UTC" alone for 0). */
export function formatUtcOffset(offsetMin: number): string {
  if (offsetMin === 0) return 'UTC';
  const sign = offsetMin < 0 ? '-' : '+';
  const abs = Math.abs(offsetMin);
  const hh = String(Math.floor(abs / 60)).padStart(2, '0');
  const mm = String(abs % 60).padStart(2, '0');
  return `UTC${sign}${hh}:${mm}`;
}

/** "2026-07-16 14:05" at the site's offset; missing -> NO_VALUE. */
export function formatSiteDateTime(timeMs: number | null | undefined, offsetMin: number): string {
  if (timeMs === null || timeMs === undefined || !Number.isFinite(timeMs)) return NO_VALUE;
  return new Date(timeMs + offsetMin * 60_000).toISOString().slice(0, 16).replace('T', ' ');
}

/** "14:05" at the site's offset; missing -> NO_VALUE. */
export function formatSiteTime(timeMs: number | null | undefined, offsetMin: number): string {
  const text = formatSiteDateTime(timeMs, offsetMin);
  return text === NO_VALUE ? text : text.slice(11);
}

/**
 * How far a time lies from a reference, in words: "in 1 h 10 min", "25 min ago", "now" (within
 * half a minute). Missing -> NO_VALUE.
 */
export function formatFromNow(
  timeMs: number | null | undefined,
  referenceMs: number | null | undefined,
): string {
  if (
    timeMs === null ||
    timeMs === undefined ||
    referenceMs === null ||
    referenceMs === undefined ||
    !Number.isFinite(timeMs) ||
    !Number.isFinite(referenceMs)
  )
    return NO_VALUE;
  const deltaH = (timeMs - referenceMs) / 3_600_000;
  if (Math.abs(deltaH) < 0.5 / 60) return 'now';
  const span = formatDurationH(Math.abs(deltaH));
  return deltaH > 0 ? `in${NBSP}${span}` : `${span} ago`;
}

/**
 * A Date whose local-time fields read the site's clock, for chart axes that format with the
 * browser's local zone (uPlot's `tzDate`): shifts by the site offset and by the browser's own
 * offset at that instant. Only the fields are meaningful, not the instant.
 */
export function siteClockDate(unixS: number, offsetMin: number): Date {
  const shifted = new Date(unixS * 1000 + offsetMin * 60_000);
  return new Date(shifted.getTime() + shifted.getTimezoneOffset() * 60_000);
}
