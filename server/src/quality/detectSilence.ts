/**
 * Silence of a sensor or device: gaps in its readings longer than it promised. The interval a
 * reading promises is its SenML `ut` (RFC 8428 section 4.5.3: the longest time before the sensor
 * reports again), else the configured interval, else the median spacing of the series.
 */

/** One reading's timing, as the archive stores it. */
export interface TimedReading {
  /** Event time, ms since the Unix epoch. */
  eventAtMs: number;
  /** SenML `ut`, s; null when not sent. */
  updateIntervalS: number | null;
}

/** Options of {@link detectSilence}. */
export interface SilenceOptions {
  /** Judge the gap after the last reading up to this time, ms since the epoch; absent: only gaps between readings. */
  nowMs?: number;
  /** Interval to expect when a reading carries no `ut`, s; absent: the median spacing of the series. */
  configuredIntervalS?: number;
  /**
   * A gap counts as silence when longer than `graceFactor` times the expected interval:
   * default 2.5 (our assumption: one lost pack is a dropout, not silence; two in a row plus some
   * clock drift is).
   */
  graceFactor?: number;
}

/** One silence. */
export interface Silence {
  /** Event time of the last reading before the gap, ms. */
  fromMs: number;
  /** Event time of the first reading after it, ms; null when still silent at `nowMs`. */
  toMs: number | null;
  /** Length of the gap, s (to `nowMs` when still silent). */
  gapS: number;
  /** The interval that was expected, s. */
  expectedIntervalS: number;
}

/**
 * Finds the silences of one series.
 *
 * Rule: a gap between consecutive event times t_i < t_(i+1) (or from the last t_n to nowMs) is a
 * silence when gap > graceFactor * I, where I is reading i's `ut` if positive, else
 * `configuredIntervalS`, else the median of positive spacings.
 *
 * @param readings - one sensor's or device's readings, any order (sorted here); equal event times
 *   count once
 * @returns silences in time order; empty for fewer than two readings with no `nowMs`, or when no
 *   interval can be found (no `ut`, no configured interval, a single reading); NaN event times
 *   are ignored
 */
export function detectSilence(
  readings: readonly TimedReading[],
  options: SilenceOptions = {},
): Silence[] {
  const graceFactor = options.graceFactor ?? 2.5;
  const sorted = readings
    .filter((reading) => Number.isFinite(reading.eventAtMs))
    .slice()
    .sort((a, b) => a.eventAtMs - b.eventAtMs);
  const spacingsS: number[] = [];
  for (let index = 1; index < sorted.length; index += 1) {
    const spacing =
      ((sorted[index] as TimedReading).eventAtMs - (sorted[index - 1] as TimedReading).eventAtMs) /
      1000;
    if (spacing > 0) spacingsS.push(spacing);
  }
  const fallbackS = options.configuredIntervalS ?? median(spacingsS);
  const expectedAfter = (reading: TimedReading): number =>
    reading.updateIntervalS !== null && reading.updateIntervalS > 0
      ? reading.updateIntervalS
      : fallbackS;
  const silences: Silence[] = [];
  for (let index = 0; index < sorted.length; index += 1) {
    const reading = sorted[index] as TimedReading;
    const next = sorted[index + 1];
    const expectedS = expectedAfter(reading);
    if (!(expectedS > 0)) continue;
    if (next !== undefined) {
      const gapS = (next.eventAtMs - reading.eventAtMs) / 1000;
      if (gapS > graceFactor * expectedS) {
        silences.push({
          fromMs: reading.eventAtMs,
          toMs: next.eventAtMs,
          gapS,
          expectedIntervalS: expectedS,
        });
      }
    } else if (options.nowMs !== undefined) {
      const gapS = (options.nowMs - reading.eventAtMs) / 1000;
      if (gapS > graceFactor * expectedS) {
        silences.push({
          fromMs: reading.eventAtMs,
          toMs: null,
          gapS,
          expectedIntervalS: expectedS,
        });
      }
    }
  }
  return silences;
}

/** Median of a list; NaN when empty. */
function median(values: readonly number[]): number {
  if (values.length === 0) return Number.NaN;
  const sorted = values.slice().sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1
    ? (sorted[middle] as number)
    : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
}
