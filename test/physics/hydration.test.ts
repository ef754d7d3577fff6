import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  hydrationHumidityFactor,
  millsUltimateDegreeOfHydration,
  powersCapillaryPorosity,
  schindlerFolliardDegreeOfHydration,
} from '../../server/src/physics/hydration.ts';

const HOUR_S = 3600;

describe('schindlerFolliardDegreeOfHydration()', () => {
  // Schindler and Folliard (2005), ACI Materials Journal 102(1): alpha = alpha_u exp(-(tau/te)^beta).
  // Parameters of an invented Portland cement mix (tau 15 h, beta 0.9, alpha_u 0.7); values
  // computed by hand from the closed form.
  const parameters = { ultimateDegree: 0.7, tauS: 15 * HOUR_S, beta: 0.9 };
  it.each([
    { ageH: 15, expected: 0.7 * Math.exp(-1) },
    { ageH: 30, expected: 0.7 * Math.exp(-(0.5 ** 0.9)) },
    { ageH: 5, expected: 0.7 * Math.exp(-(3 ** 0.9)) },
    { ageH: 672, expected: 0.7 * Math.exp(-((15 / 672) ** 0.9)) },
  ])('at te = $ageH h gives $expected (closed form)', ({ ageH, expected }) => {
    expect(schindlerFolliardDegreeOfHydration(ageH * HOUR_S, parameters)).toBeCloseTo(expected, 12);
  });

  it('equals alpha_u / e at te = tau (Schindler and Folliard 2005 closed form)', () => {
    expect(schindlerFolliardDegreeOfHydration(15 * HOUR_S, parameters)).toBeCloseTo(0.2575, 4);
  });

  it('is 0 at placement, tends to alpha_u, and rises with age (property)', () => {
    expect(schindlerFolliardDegreeOfHydration(0, parameters)).toBe(0);
    expect(schindlerFolliardDegreeOfHydration(-5, parameters)).toBe(0);
    expect(schindlerFolliardDegreeOfHydration(1e12, parameters)).toBeCloseTo(0.7, 4);
    expect(schindlerFolliardDegreeOfHydration(Number.NaN, parameters)).toBeNaN();
    fc.assert(
      fc.property(
        fc.double({ min: 60, max: 1e7, noNaN: true }),
        fc.double({ min: 1.01, max: 10, noNaN: true }),
        (ageS, ratio) => {
          const earlier = schindlerFolliardDegreeOfHydration(ageS, parameters);
          const later = schindlerFolliardDegreeOfHydration(ageS * ratio, parameters);
          expect(later).toBeGreaterThanOrEqual(earlier);
          expect(later).toBeLessThanOrEqual(0.7);
        },
      ),
    );
  });
});

describe('millsUltimateDegreeOfHydration()', () => {
  // Mills (1966): alpha_u = 1.031 w/c / (0.194 + w/c); hand-computed values.
  it.each([
    { waterCementRatio: 0.3, expected: 0.3093 / 0.494 },
    { waterCementRatio: 0.4, expected: 0.4124 / 0.594 },
    { waterCementRatio: 0.5, expected: 0.5155 / 0.694 },
    { waterCementRatio: 0.6, expected: 0.6186 / 0.794 },
  ])(
    'at w/c = $waterCementRatio gives $expected (Mills 1966)',
    ({ waterCementRatio, expected }) => {
      expect(millsUltimateDegreeOfHydration(waterCementRatio)).toBeCloseTo(expected, 12);
    },
  );

  it('is about 0.74 at w/c 0.5 (Mills 1966, hand computation)', () => {
    expect(millsUltimateDegreeOfHydration(0.5)).toBeCloseTo(0.743, 3);
  });

  it('is capped at 1 and 0 for w/c <= 0; NaN gives NaN', () => {
    expect(millsUltimateDegreeOfHydration(10)).toBe(1);
    expect(millsUltimateDegreeOfHydration(0)).toBe(0);
    expect(millsUltimateDegreeOfHydration(Number.NaN)).toBeNaN();
  });
});

describe('powersCapillaryPorosity()', () => {
  // Powers and Brownyard (1947) in Hansen's (1986) form: (w/c - 0.36 alpha) / (w/c + 0.32).
  it.each([
    {
      waterCementRatio: 0.5,
      alpha: 0,
      expected: 0.5 / 0.82,
      source: 'fresh paste: w/c / (w/c + 0.32)',
    },
    {
      waterCementRatio: 0.36,
      alpha: 1,
      expected: 0,
      source: 'w/c 0.36 fully hydrated: no capillary pores',
    },
    {
      waterCementRatio: 0.5,
      alpha: 1,
      expected: 0.14 / 0.82,
      source: 'w/c 0.5 fully hydrated: 0.171',
    },
    {
      waterCementRatio: 0.4,
      alpha: 0.5,
      expected: 0.22 / 0.72,
      source: 'w/c 0.4 half hydrated: 0.306',
    },
    {
      waterCementRatio: 0.3,
      alpha: 1,
      expected: 0,
      source: 'w/c 0.3 cannot reach alpha 1: floored at 0',
    },
  ])(
    'is $expected at w/c $waterCementRatio, alpha $alpha ($source)',
    ({ waterCementRatio, alpha, expected }) => {
      expect(powersCapillaryPorosity(waterCementRatio, alpha)).toBeCloseTo(expected, 12);
    },
  );

  it('falls as hydration proceeds (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.25, max: 0.8, noNaN: true }),
        fc.double({ min: 0, max: 0.9, noNaN: true }),
        fc.double({ min: 0.01, max: 0.1, noNaN: true }),
        (waterCementRatio, alpha, extra) => {
          expect(powersCapillaryPorosity(waterCementRatio, alpha + extra)).toBeLessThanOrEqual(
            powersCapillaryPorosity(waterCementRatio, alpha),
          );
        },
      ),
    );
  });
});

describe('hydrationHumidityFactor()', () => {
  // beta_h = 1 / (1 + (7.5 - 7.5 h)^4), Bazant and Prasannan (1989) form (citation from memory);
  // hand-computed values.
  it.each([
    { humidity: 1, expected: 1 },
    { humidity: 0.9, expected: 1 / (1 + 0.75 ** 4) },
    { humidity: 0.8, expected: 1 / (1 + 1.5 ** 4) },
    { humidity: 0.7, expected: 1 / (1 + 2.25 ** 4) },
    { humidity: 0, expected: 1 / (1 + 7.5 ** 4) },
  ])('at h = $humidity gives $expected', ({ humidity, expected }) => {
    expect(hydrationHumidityFactor(humidity)).toBeCloseTo(expected, 12);
  });

  it('falls from 1 towards 0 below about 80 % RH (physics.md section 6)', () => {
    expect(hydrationHumidityFactor(0.95)).toBeGreaterThan(0.95);
    expect(hydrationHumidityFactor(0.8)).toBeCloseTo(0.165, 3);
    expect(hydrationHumidityFactor(0.6)).toBeLessThan(0.02);
  });

  it('clamps h to 0..1, honours the steepness option, and gives NaN for NaN', () => {
    expect(hydrationHumidityFactor(1.2)).toBe(1);
    expect(hydrationHumidityFactor(-0.5)).toBe(hydrationHumidityFactor(0));
    expect(hydrationHumidityFactor(0.8, { steepness: 5 })).toBeCloseTo(1 / (1 + 1), 12);
    expect(hydrationHumidityFactor(Number.NaN)).toBeNaN();
  });

  it('rises with humidity (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        fc.double({ min: 0.001, max: 0.2, noNaN: true }),
        (h, extra) => {
          expect(hydrationHumidityFactor(Math.min(1, h + extra))).toBeGreaterThan(
            hydrationHumidityFactor(h),
          );
        },
      ),
    );
  });
});
