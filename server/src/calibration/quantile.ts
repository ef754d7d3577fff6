/**
 * Sample quantile by linear interpolation between order statistics: Hyndman and Fan (1996),
 * The American Statistician 50(4), definition 7 (the default of R and NumPy):
 * `Q(p) = x_(j) + g (x_(j+1) - x_(j))` with `h = (n - 1) p`, `j = floor(h)` (0-based), `g = h - j`.
 *
 * @param sortedValues - finite values in ascending order.
 * @param probability - p in [0, 1]; clamped; NaN gives NaN.
 * @returns NaN for an empty sample; the only value for a sample of one.
 */
export function quantileOfSorted(sortedValues: readonly number[], probability: number): number {
  const n = sortedValues.length;
  if (n === 0 || Number.isNaN(probability)) return Number.NaN;
  const h = (n - 1) * Math.min(1, Math.max(0, probability));
  const j = Math.floor(h);
  const lower = sortedValues[j] ?? Number.NaN;
  const upper = sortedValues[Math.min(n - 1, j + 1)] ?? lower;
  return lower + (h - j) * (upper - lower);
}

/** The finite values of a sample, sorted ascending (NaN and infinities dropped). */
export function sortedFinite(values: Iterable<number>): number[] {
  return Array.from(values)
    .filter((value) => Number.isFinite(value))
    .sort((a, b) => a - b);
}
