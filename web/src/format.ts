/**
 * Numbers as the dashboard shows them: fixed decimals, the unit always beside the number, and a
 * written "no value" instead of a blank when a figure is not defined. Pure functions.
 */

/** Non-breaking space: a number and its unit never split over two lines. */
export const NBSP = '\u00a0';

/** What a missing figure reads as (a dash alone is easy to miss outdoors). */
export const NO_VALUE = 'no value';

/**
 * A figure with `decimals` decimals and its unit, e.g. `formatFigure(0.8234, 2, 'MPa')` ->
 * "0.82 MPa". A rounded negative zero reads "0.00"; null, undefined, NaN and infinities read
 * NO_VALUE. An empty unit gives the number alone (utilization is a ratio).
 */
export function formatFigure(
  value: number | null | undefined,
  decimals: number,
  unit: string,
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  let text = value.toFixed(decimals);
  if (/^-0(\.0+)?$/.test(text)) text = text.slice(1);
  return unit === '' ? text : `${text}${NBSP}${unit}`;
}

/** A fraction 0..1 as a whole percentage: 0.624 -> "62 %"; missing -> NO_VALUE. */
export function formatPercent(fraction: number | null | undefined): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return NO_VALUE;
  return `${Math.round(fraction * 100)}${NBSP}%`;
}

/**
 * A 5-95 % range as "0.35 to 0.50 MPa" (unit once, after the upper value); NO_VALUE when either
 * end is missing.
 */
export function formatRange(
  low: number | null | undefined,
  high: number | null | undefined,
  decimals: number,
  unit: string,
): string {
  const lowText = formatFigure(low, decimals, '');
  const highText = formatFigure(high, decimals, unit);
  if (lowText === NO_VALUE || highText === NO_VALUE) return NO_VALUE;
  return `${lowText} to ${highText}`;
}

/**
 * A duration in hours as people say it: 0.4 -> "24 min", 1.25 -> "1 h 15 min", 30 -> "30 h".
 * Rounded to the minute (to the hour from 10 h). Negative or missing -> NO_VALUE.
 */
export function formatDurationH(hours: number | null | undefined): string {
  if (hours === null || hours === undefined || !Number.isFinite(hours) || hours < 0)
    return NO_VALUE;
  if (hours >= 10) return `${Math.round(hours)}${NBSP}h`;
  const totalMin = Math.round(hours * 60);
  const wholeH = Math.floor(totalMin / 60);
  const min = totalMin % 60;
  if (wholeH === 0) return `${min}${NBSP}min`;
  return min === 0 ? `${wholeH}${NBSP}h` : `${wholeH}${NBSP}h ${min}${NBSP}min`;
}
