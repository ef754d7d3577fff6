/**
 * A stuck sensor: one that keeps reporting the same value, or values with (near) zero variance,
 * over a window in which a working sensor would move at least by its noise. A sensor pegged at
 * a bound (an RH sensor at saturation, reading exactly its ceiling) also looks stuck: callers
 * judge such cases with what they know of the sensor.
 */

/** One reading's time and value. */
export interface ValuedReading {
  /** Event time, ms since the Unix epoch. */
  eventAtMs: number;
  value: number;
}

/** Options of {@link detectStuck}. */
export interface StuckOptions {
  /** Shortest span of unchanging readings that counts, s: default 1800 (our assumption: half an hour). */
  windowS?: number;
  /** Fewest readings in that span, default 5 (our assumption: a few intervals, so two equal readings by chance do not count). */
  minReadings?: number;
  /**
   * Largest spread (max - min) of the values that still counts as unchanging, in the readings'
   * unit: default 0, exactly the same value (a stuck digital sensor repeats its last value).
   * A positive figure catches a sensor whose values barely move (standard deviation at most
   * half the spread).
   */
  tolerance?: number;
}

/** One stuck stretch. */
export interface StuckStretch {
  fromMs: number;
  toMs: number;
  readings: number;
  /** The value it stuck at (the first of the stretch). */
  value: number;
  /** Population variance of the stretch's values. */
  variance: number;
}

/**
 * Finds the stretches where a series stays within `tolerance` of itself for at least `windowS`
 * and `minReadings` readings.
 *
 * Rule: scan readings in time order; grow a stretch while max - min <= tolerance (to a relative
 * rounding of 1e-9); a stretch that
 * spans >= windowS with >= minReadings readings is reported whole (maximal), and the scan goes
 * on after it; otherwise the scan restarts at the next reading.
 *
 * @param readings - one sensor's readings, any order (sorted here)
 * @returns stretches in time order; NaN values break a stretch and never start one; an empty or
 *   short series gives none
 */
export function detectStuck(
  readings: readonly ValuedReading[],
  options: StuckOptions = {},
): StuckStretch[] {
  const windowMs = (options.windowS ?? 1800) * 1000;
  const minReadings = options.minReadings ?? 5;
  const tolerance = options.tolerance ?? 0;
  const sorted = readings.slice().sort((a, b) => a.eventAtMs - b.eventAtMs);
  const stretches: StuckStretch[] = [];
  let start = 0;
  while (start < sorted.length) {
    const first = sorted[start] as ValuedReading;
    if (!Number.isFinite(first.value)) {
      start += 1;
      continue;
    }
    let min = first.value;
    let max = first.value;
    let end = start + 1;
    while (end < sorted.length) {
      const value = (sorted[end] as ValuedReading).value;
      if (!Number.isFinite(value)) break;
      const nextMin = Math.min(min, value);
      const nextMax = Math.max(max, value);
      // Compared to rounding, so 50.1 - 50.0 stays within a tolerance of 0.1.
      if (nextMax - nextMin > tolerance + 1e-9 * Math.max(1, Math.abs(nextMax))) break;
      min = nextMin;
      max = nextMax;
      end += 1;
    }
    const stretch = sorted.slice(start, end);
    const last = stretch[stretch.length - 1] as ValuedReading;
    if (stretch.length >= minReadings && last.eventAtMs - first.eventAtMs >= windowMs) {
      const mean = stretch.reduce((sum, reading) => sum + reading.value, 0) / stretch.length;
      const variance =
        stretch.reduce((sum, reading) => sum + (reading.value - mean) ** 2, 0) / stretch.length;
      stretches.push({
        fromMs: first.eventAtMs,
        toMs: last.eventAtMs,
        readings: stretch.length,
        value: first.value,
        variance,
      });
      start = end;
    } else start = tolerance === 0 ? end : start + 1;
  }
  return stretches;
}
