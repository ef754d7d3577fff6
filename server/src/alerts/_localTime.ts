/**
 * Local clock times of a run: event times are shown in the UTC offset of the run's `placedAt`
 * (the site's own clock at placement), as a crew lead reads a watch.
 */

/**
 * The UTC offset written in an ISO 8601 time, min (`+02:00` -> 120, `Z` -> 0); 0 when absent.
 */
export function offsetMinOf(isoTime: string): number {
  const match = /([+-])(\d{2}):?(\d{2})$/.exec(isoTime);
  if (match === null) return 0;
  const minutes = Number(match[2]) * 60 + Number(match[3]);
  return match[1] === '-' ? -minutes : minutes;
}

/** `15:40`: the clock time of `timeMs` at an offset of `offsetMin` from UTC. */
export function localClock(timeMs: number, offsetMin: number): string {
  return new Date(timeMs + offsetMin * 60_000).toISOString().slice(11, 16);
}

/** `2026-07-16 15:40 (UTC+02:00)`: date, clock time and the offset. */
export function localDateTime(timeMs: number, offsetMin: number): string {
  const text = new Date(timeMs + offsetMin * 60_000).toISOString().slice(0, 16).replace('T', ' ');
  const sign = offsetMin < 0 ? '-' : '+';
  const abs = Math.abs(offsetMin);
  const hh = String(Math.floor(abs / 60)).padStart(2, '0');
  const mm = String(abs % 60).padStart(2, '0');
  return `${text} (UTC${sign}${hh}:${mm})`;
}

/** `1 h 20 min`, `45 min`, `2 h` (rounded to the minute; negative counts as 0). */
export function formatDuration(ms: number): string {
  const minutes = Math.max(0, Math.round(ms / 60_000));
  if (minutes < 60) return `${minutes} min`;
  const rest = minutes % 60;
  const hours = Math.floor(minutes / 60);
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}

/** A figure with two decimals, without a minus sign on a rounded zero (`-0.001` -> `0.00`). */
export function fixed2(value: number): string {
  const text = value.toFixed(2);
  return text === '-0.00' ? '0.00' : text;
}
