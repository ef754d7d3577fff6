/**
 * Gaspari-Cohn localisation weight: a compactly supported, fifth-order piecewise rational
 * correlation function that tapers spurious long-range ensemble covariances to zero.
 * Gaspari and Cohn (1999), Quarterly Journal of the Royal Meteorological Society 125,
 * eq. (4.10) (equation number from memory; the tests check the polynomial by hand: 5/24 at
 * z = 1 from both branches, 0 at z = 2).
 *
 * With z = |distance| / c:
 * - 0 <= z <= 1: `-z^5/4 + z^4/2 + 5 z^3/8 - 5 z^2/3 + 1`
 * - 1 <  z <= 2: `z^5/12 - z^4/2 + 5 z^3/8 + 5 z^2/3 - 5 z + 4 - 2 / (3 z)`
 * - z > 2: 0
 *
 * @param distanceM - separation, m (sign ignored).
 * @param halfWidthM - c, m: the weight is about 0.21 at c and reaches 0 at 2c. c <= 0 gives 1 at
 *   zero distance and 0 elsewhere.
 * @returns weight in [0, 1]; NaN distance gives 1 (an entry without a position is not localised).
 */
export function gaspariCohn(distanceM: number, halfWidthM: number): number {
  if (Number.isNaN(distanceM)) return 1;
  const r = Math.abs(distanceM);
  if (!(halfWidthM > 0)) return r === 0 ? 1 : 0;
  const z = r / halfWidthM;
  if (z <= 1) {
    return (((-0.25 * z + 0.5) * z + 0.625) * z - 5 / 3) * z * z + 1;
  }
  if (z <= 2) {
    return ((((z / 12 - 0.5) * z + 0.625) * z + 5 / 3) * z - 5) * z + 4 - 2 / (3 * z);
  }
  return 0;
}
