import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gaspariCohn } from '../../server/src/calibration/gaspariCohn.ts';

// Gaspari and Cohn (1999), QJRMS 125, eq. (4.10) (number from memory): values at z = r / c worked by hand from the
// two polynomial branches (both give 5/24 at z = 1, and 0 at z = 2).
describe('gaspariCohn()', () => {
  it.each([
    [0, 1],
    [0.5, -0.03125 / 4 + 0.0625 / 2 + (5 * 0.125) / 8 - (5 * 0.25) / 3 + 1],
    [1, 5 / 24],
    [1.5, 7.59375 / 12 - 5.0625 / 2 + (5 * 3.375) / 8 + (5 * 2.25) / 3 - 7.5 + 4 - 2 / 4.5],
    [2, 0],
    [3, 0],
  ])('at z = %s gives %s', (z, expected) => {
    expect(gaspariCohn(z * 0.02, 0.02)).toBeCloseTo(expected, 12);
  });

  it('is symmetric, within [0, 1] and non-increasing in distance', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 0.1, noNaN: true }),
        (a, b) => {
          const [near, far] = a <= b ? [a, b] : [b, a];
          const wNear = gaspariCohn(near, 0.02);
          const wFar = gaspariCohn(-far, 0.02);
          return wNear >= wFar - 1e-15 && wFar >= 0 && wNear <= 1;
        },
      ),
    );
  });

  it('is continuous at the branch point z = 1 and at the support edge z = 2', () => {
    const c = 0.03;
    expect(Math.abs(gaspariCohn(c * (1 - 1e-9), c) - gaspariCohn(c * (1 + 1e-9), c))).toBeLessThan(
      1e-8,
    );
    expect(gaspariCohn(c * (2 - 1e-9), c)).toBeLessThan(1e-8);
  });

  it('does not localise an entry without a position (NaN distance gives 1)', () => {
    expect(gaspariCohn(Number.NaN, 0.02)).toBe(1);
  });
});
