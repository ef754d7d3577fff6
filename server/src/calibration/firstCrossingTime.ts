/**
 * The first time a sampled trajectory reaches a threshold: the first sample k with
 * `value_k >= threshold`; if k = 0 the crossing is at the first time (already reached),
 * otherwise it is interpolated linearly between samples k-1 and k,
 * `t = t_(k-1) + (threshold - v_(k-1)) / (v_k - v_(k-1)) (t_k - t_(k-1))`.
 * Linear interpolation between output times is our choice (the model is sampled, not solved for
 * the crossing); its error is below one output interval.
 *
 * @param timesS - sample times, s, ascending (same length as values).
 * @param values - the trajectory (e.g. utilization, dimensionless); NaN samples never cross, and
 *   a crossing right after a NaN sample is placed at that sample's time.
 * @param threshold - the level; NaN never crossed.
 * @returns the crossing time in s, or null when the trajectory stays below within the samples.
 */
export function firstCrossingTimeS(
  timesS: readonly number[],
  values: readonly number[],
  threshold: number,
): number | null {
  const n = Math.min(timesS.length, values.length);
  for (let k = 0; k < n; k++) {
    const value = values[k] ?? Number.NaN;
    if (!(value >= threshold)) continue;
    const time = timesS[k] ?? Number.NaN;
    if (k === 0) return time;
    const previous = values[k - 1] ?? Number.NaN;
    const previousTime = timesS[k - 1] ?? Number.NaN;
    if (!Number.isFinite(previous) || value === previous) return time;
    return previousTime + ((threshold - previous) / (value - previous)) * (time - previousTime);
  }
  return null;
}
