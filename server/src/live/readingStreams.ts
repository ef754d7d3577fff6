/**
 * Buffered readings per stream (one device and sensor), in event-time order: what the watermark,
 * the window means, the held values and the persistence forecast are computed from. Pure data
 * (arrays of numbers), so it goes into a snapshot as JSON.
 */

/** One stream's readings, sorted by time (ms); duplicates at one time keep the larger value. */
export interface StreamBuffer {
  timesMs: number[];
  values: number[];
  /** Latest event time ever seen on the stream, ms (-Infinity: never). */
  lastSeenMs: number;
}

/** An empty stream. */
export function emptyStream(): StreamBuffer {
  return { timesMs: [], values: [], lastSeenMs: Number.NEGATIVE_INFINITY };
}

/**
 * Inserts one reading in time order (binary search). A second reading at the same time keeps
 * the larger value, so the result does not depend on arrival order. Non-finite values and times
 * are ignored.
 */
export function insertReading(stream: StreamBuffer, timeMs: number, value: number): void {
  if (!Number.isFinite(timeMs) || !Number.isFinite(value)) return;
  const times = stream.timesMs;
  let low = 0;
  let high = times.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if ((times[middle] as number) < timeMs) low = middle + 1;
    else high = middle;
  }
  if (times[low] === timeMs) {
    stream.values[low] = Math.max(stream.values[low] as number, value);
  } else {
    times.splice(low, 0, timeMs);
    stream.values.splice(low, 0, value);
  }
  if (timeMs > stream.lastSeenMs) stream.lastSeenMs = timeMs;
}

/** Mean of the readings in (fromMs, toMs]; NaN when there is none. Summed in time order. */
export function windowMean(stream: StreamBuffer, fromMs: number, toMs: number): number {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < stream.timesMs.length; i += 1) {
    const t = stream.timesMs[i] as number;
    if (t > toMs) break;
    if (t > fromMs) {
      sum += stream.values[i] as number;
      count += 1;
    }
  }
  return count === 0 ? Number.NaN : sum / count;
}

/** Sum of the readings in (fromMs, toMs] (e.g. rain depths); 0 when there is none. */
export function windowSum(stream: StreamBuffer, fromMs: number, toMs: number): number {
  let sum = 0;
  for (let i = 0; i < stream.timesMs.length; i += 1) {
    const t = stream.timesMs[i] as number;
    if (t > toMs) break;
    if (t > fromMs) sum += stream.values[i] as number;
  }
  return sum;
}

/** The latest reading at or before `atMs`, or null. */
export function latestAtOrBefore(
  stream: StreamBuffer,
  atMs: number,
): { timeMs: number; value: number } | null {
  for (let i = stream.timesMs.length - 1; i >= 0; i -= 1) {
    const t = stream.timesMs[i] as number;
    if (t <= atMs) return { timeMs: t, value: stream.values[i] as number };
  }
  return null;
}

/** Drops readings before `keepFromMs` but keeps the latest one before it (the held value). */
export function pruneStream(stream: StreamBuffer, keepFromMs: number): void {
  let first = 0;
  while (first < stream.timesMs.length && (stream.timesMs[first] as number) < keepFromMs) {
    first += 1;
  }
  const cut = Math.max(0, first - 1);
  if (cut > 0) {
    stream.timesMs.splice(0, cut);
    stream.values.splice(0, cut);
  }
}
