import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  logProfileWindSpeed,
  OPEN_TERRAIN_ROUGHNESS_LENGTH_M,
  windSpeedAtUnoHeight,
} from '../../server/src/physics/windProfile.ts';

describe('logProfileWindSpeed()', () => {
  // Closed form of the logarithmic surface-layer profile, u2 = u1 ln(z2/z0) / ln(z1/z0),
  // evaluated by hand here; tolerance 1e-12 relative (same arithmetic, different expression).
  const cases = [
    {
      speed: 10,
      fromM: 10,
      toM: 0.5,
      z0M: 0.03,
      expected: (10 * Math.log(0.5 / 0.03)) / Math.log(10 / 0.03),
    },
    {
      speed: 4,
      fromM: 2,
      toM: 0.5,
      z0M: 0.03,
      expected: (4 * Math.log(0.5 / 0.03)) / Math.log(2 / 0.03),
    },
    {
      speed: 6,
      fromM: 10,
      toM: 2,
      z0M: 0.1,
      expected: (6 * Math.log(2 / 0.1)) / Math.log(10 / 0.1),
    },
    {
      speed: 3,
      fromM: 0.5,
      toM: 10,
      z0M: 0.0002,
      expected: (3 * Math.log(10 / 0.0002)) / Math.log(0.5 / 0.0002),
    },
  ];
  it.each(cases)(
    'gives the closed form for $speed at $fromM m -> $toM m, z0 $z0M m (log law)',
    ({ speed, fromM, toM, z0M, expected }) => {
      const actual = logProfileWindSpeed(speed, fromM, toM, { roughnessLengthM: z0M });
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-12 * expected);
    },
  );

  it('uses z0 = 0.03 m by default (open terrain, WMO-No. 8 / Wieringa 1992)', () => {
    expect(OPEN_TERRAIN_ROUGHNESS_LENGTH_M).toBe(0.03);
    expect(logProfileWindSpeed(10, 10, 0.5)).toBe(
      logProfileWindSpeed(10, 10, 0.5, { roughnessLengthM: 0.03 }),
    );
  });

  it('scales a 10 m reading by 0.484 to 0.5 m over open terrain (log law, hand computation)', () => {
    // ln(0.5/0.03) / ln(10/0.03) = 2.8134 / 5.8091 = 0.4843
    expect(logProfileWindSpeed(1, 10, 0.5)).toBeCloseTo(0.4843, 4);
  });

  it('returns the same speed at the same height and is the identity under round trip', () => {
    expect(logProfileWindSpeed(7.3, 2, 2)).toBeCloseTo(7.3, 12);
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.double({ min: 0.1, max: 50, noNaN: true }),
        fc.double({ min: 0.1, max: 50, noNaN: true }),
        (speed, fromM, toM) => {
          const there = logProfileWindSpeed(speed, fromM, toM);
          const back = logProfileWindSpeed(there, toM, fromM);
          expect(back).toBeCloseTo(speed, 9);
        },
      ),
    );
  });

  it('handles the documented edge cases (target <= z0 -> 0; measured <= z0, z0 <= 0, NaN -> NaN)', () => {
    expect(logProfileWindSpeed(5, 10, 0.03)).toBe(0);
    expect(logProfileWindSpeed(5, 10, 0.01)).toBe(0);
    expect(logProfileWindSpeed(5, 0.03, 0.5)).toBeNaN();
    expect(logProfileWindSpeed(5, 10, 0.5, { roughnessLengthM: 0 })).toBeNaN();
    expect(logProfileWindSpeed(Number.NaN, 10, 0.5)).toBeNaN();
    expect(logProfileWindSpeed(5, 10, Number.NaN)).toBeNaN();
  });

  it('rises with height above z0 (property of the log law)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 30, noNaN: true }),
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        (speed, lowM, extraM) => {
          expect(logProfileWindSpeed(speed, 10, lowM + extraM)).toBeGreaterThan(
            logProfileWindSpeed(speed, 10, lowM),
          );
        },
      ),
    );
  });
});

describe('windSpeedAtUnoHeight()', () => {
  it('converts to 0.5 m, the height of Uno (1998)', () => {
    expect(windSpeedAtUnoHeight(12, 10)).toBe(logProfileWindSpeed(12, 10, 0.5));
    expect(windSpeedAtUnoHeight(12, 10, { roughnessLengthM: 0.25 })).toBe(
      logProfileWindSpeed(12, 10, 0.5, { roughnessLengthM: 0.25 }),
    );
  });
});
