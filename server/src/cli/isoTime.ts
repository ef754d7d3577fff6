/**
 * Parsing ISO 8601 date-times typed in files: `2026-06-14T07:30:00+02:00`, `2026-06-14T07:30Z`,
 * `2026-06-14 07:30:00`. A time without an offset is read as UTC (our choice: only differences
 * between samples matter for maturity, and reading it as local time would shift at daylight-saving
 * changes).
 */

const ISO_DATE_TIME =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

/**
 * Milliseconds since the Unix epoch of an ISO 8601 date-time, or NaN when the text is not one
 * (wrong layout, month 13, 30 February, hour 25).
 */
export function parseIsoTimeMs(text: string): number {
  const match = ISO_DATE_TIME.exec(text.trim());
  if (match === null) return Number.NaN;
  const [, year, month, day, hour, minute, second = '0', fraction = '0', zone = 'Z'] = match;
  const utcMs = Date.UTC(
    Number(year),
    Number(month) - 1,
    Number(day),
    Number(hour),
    Number(minute),
    Number(second),
    Number(`0.${fraction}`) * 1000,
  );
  const check = new Date(utcMs);
  if (
    check.getUTCFullYear() !== Number(year) ||
    check.getUTCMonth() !== Number(month) - 1 ||
    check.getUTCDate() !== Number(day) ||
    check.getUTCHours() !== Number(hour) ||
    Number(minute) > 59 ||
    Number(second) > 59
  ) {
    return Number.NaN;
  }
  return utcMs - offsetMinutes(zone) * 60_000;
}

function offsetMinutes(zone: string): number {
  if (zone.toUpperCase() === 'Z') return 0;
  const sign = zone.startsWith('-') ? -1 : 1;
  const digits = zone.slice(1).replace(':', '');
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4) || '0'));
}
