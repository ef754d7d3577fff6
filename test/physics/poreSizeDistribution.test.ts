import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  maxPoreDiameterM,
  poreCumulativeFraction,
  poreDiameterAtFractionM,
  poreDiameterAtPercentileM,
  poreVolumeDensityPerLogDiameter,
} from '../../server/src/physics/poreSizeDistribution.ts';
import type { PoreSizeDistribution } from '../../server/src/physics/retentionCurve.ts';
import { poreStructureFixture } from './fixtures/poreStructureFixture.ts';

const { distributions } = poreStructureFixture;
const mortar: PoreSizeDistribution = {
  kind: 'lognormal',
  modes: [{ medianDiameterM: 3e-8, geometricSd: 2.5, volumeFraction: 1 }],
};

describe('poreCumulativeFraction() of a log-normal mode', () => {
  // Standard normal CDF values: Phi(0) = 0.5, Phi(1) = 0.8413447461, Phi(-1) = 0.1586552539,
  // Phi(2) = 0.9772498681 (Abramowitz and Stegun 1964, Table 26.1).
  it.each([
    ['the median', 3e-8, 0.5],
    ['median x gsd', 3e-8 * 2.5, 0.8413447461],
    ['median / gsd', 3e-8 / 2.5, 0.1586552539],
    ['median x gsd^2', 3e-8 * 6.25, 0.9772498681],
  ])('is Phi(z) at %s', (_label, diameterM, expected) => {
    expect(poreCumulativeFraction(mortar, diameterM)).toBeCloseTo(expected, 9);
  });

  it('inverts to the median and to median x gsd (Abramowitz and Stegun Table 26.1)', () => {
    expect(poreDiameterAtFractionM(mortar, 0.5) / 3e-8).toBeCloseTo(1, 12);
    expect(poreDiameterAtFractionM(mortar, 0.8413447460685429) / 7.5e-8).toBeCloseTo(1, 10);
  });

  it('puts the 99th volume percentile at median x gsd^2.3263479 (z_0.99, Abramowitz and Stegun Table 26.5)', () => {
    expect(poreDiameterAtPercentileM(mortar, 99) / (3e-8 * 2.5 ** 2.3263479)).toBeCloseTo(1, 6);
  });

  it('has the edge values documented: 0 at D <= 0, 1 at +Infinity, NaN for NaN', () => {
    expect(poreCumulativeFraction(mortar, 0)).toBe(0);
    expect(poreCumulativeFraction(mortar, -1)).toBe(0);
    expect(poreCumulativeFraction(mortar, Number.POSITIVE_INFINITY)).toBe(1);
    expect(poreCumulativeFraction(mortar, Number.NaN)).toBeNaN();
    expect(poreDiameterAtFractionM(mortar, 0)).toBe(0);
    expect(poreDiameterAtFractionM(mortar, 1)).toBe(Number.POSITIVE_INFINITY);
    expect(poreDiameterAtFractionM(mortar, Number.NaN)).toBeNaN();
    expect(poreDiameterAtPercentileM(mortar, 101)).toBeNaN();
  });
});

// Independent implementation: scipy.stats.norm and brentq (log-normal), scipy PchipInterpolator
// in ln D (tables), in test/physics/fixtures/poreStructure.py. Tolerance 1e-9 absolute in F and
// 1e-9 relative in D over the fixture's range (1 nm .. 1 mm, F 0.02 .. 0.99).
describe.each(['mortarLogNormal', 'mixtureLogNormal', 'porosimetryTable'] as const)(
  'poreCumulativeFraction() and its inverse for %s agree with scipy',
  (name) => {
    const fixture = distributions[name];
    it.each(fixture.cumulativeFraction ?? [])('F(%s m)', (diameterM, expected) => {
      expect(Math.abs(poreCumulativeFraction(fixture.psd, diameterM) - expected)).toBeLessThan(
        1e-9,
      );
    });
    it.each((fixture.diameterAtFraction ?? []).filter(([fraction]) => fraction > 0))(
      'D(F = %s)',
      (fraction, expected) => {
        expect(poreDiameterAtFractionM(fixture.psd, fraction) / expected - 1).toBeCloseTo(0, 9);
      },
    );
    it('D_max', () => {
      expect(maxPoreDiameterM(fixture.psd) / (fixture.maxDiameterM ?? Number.NaN) - 1).toBeCloseTo(
        0,
        9,
      );
    });
  },
);

describe('poreCumulativeFraction() of a porosimetry table', () => {
  const points = [
    { diameterM: 1e-6, cumulativeFraction: 0.9 },
    { diameterM: 1e-8, cumulativeFraction: 0.2 },
    { diameterM: 1e-7, cumulativeFraction: 0.6 },
  ];
  const table: PoreSizeDistribution = { kind: 'table', points };

  it('passes through every given point, in any order', () => {
    for (const point of points) {
      expect(poreCumulativeFraction(table, point.diameterM)).toBeCloseTo(
        point.cumulativeFraction,
        14,
      );
    }
  });

  it('spreads the unresolved fine fraction over one decade below the first point (our assumption)', () => {
    expect(poreCumulativeFraction(table, 1e-9)).toBeCloseTo(0, 14);
    expect(poreCumulativeFraction(table, 5e-10)).toBe(0);
    const middle = poreCumulativeFraction(table, 3e-9);
    expect(middle).toBeGreaterThan(0);
    expect(middle).toBeLessThan(0.2);
    expect(poreDiameterAtFractionM(table, 0)).toBeCloseTo(1e-9, 20);
  });

  it('puts the missing coarse fraction within one decade above the last point (our assumption)', () => {
    expect(poreCumulativeFraction(table, 1e-5)).toBe(1);
    expect(poreCumulativeFraction(table, 3e-6)).toBeGreaterThan(0.9);
    expect(maxPoreDiameterM(table) / 1e-5).toBeCloseTo(1, 12);
  });

  it('takes the narrowest diameter on a flat stretch as the inverse', () => {
    const flat: PoreSizeDistribution = {
      kind: 'table',
      points: [
        { diameterM: 1e-8, cumulativeFraction: 0 },
        { diameterM: 1e-7, cumulativeFraction: 0.5 },
        { diameterM: 1e-6, cumulativeFraction: 0.5 },
        { diameterM: 1e-5, cumulativeFraction: 1 },
      ],
    };
    expect(poreDiameterAtFractionM(flat, 0.5) / 1e-7).toBeCloseTo(1, 9);
  });
});

describe('poreCumulativeFraction() of a van Genuchten distribution', () => {
  // van Genuchten (1980): S = [1 + (alpha |p|)^n]^-m; at alpha |p| = 1, S = 2^-m.
  // Young-Laplace: |p| = 4 gamma / D, so alpha |p| = 1 at D = 4 gamma alpha.
  it.each([1.5, 2, 3])('is 2^-m at D = 4 gamma alpha for n = %s', (n) => {
    const psd: PoreSizeDistribution = {
      kind: 'van-genuchten',
      alphaPerPa: 1e-6,
      n,
      surfaceTensionNPerM: 0.072,
    };
    const diameterM = 4 * 0.072 * 1e-6;
    expect(poreCumulativeFraction(psd, diameterM)).toBeCloseTo(2 ** -(1 - 1 / n), 12);
    expect(poreDiameterAtFractionM(psd, 2 ** -(1 - 1 / n)) / diameterM).toBeCloseTo(1, 10);
  });
});

describe('pore-size distribution properties (fast-check)', () => {
  const modeArbitrary = fc.record({
    medianDiameterM: fc.double({ min: 1e-9, max: 1e-4, noNaN: true }),
    geometricSd: fc.double({ min: 1.1, max: 5, noNaN: true }),
    volumeFraction: fc.double({ min: 0.05, max: 1, noNaN: true }),
  });
  const mixtureArbitrary = fc
    .array(modeArbitrary, { minLength: 1, maxLength: 3 })
    .map((modes): PoreSizeDistribution => ({ kind: 'lognormal', modes }));

  it('F(D) is non-decreasing in D and its density is non-negative', () => {
    fc.assert(
      fc.property(
        mixtureArbitrary,
        fc.double({ min: -25, max: -6, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (psd, logDiameter, step) => {
          const narrow = poreCumulativeFraction(psd, Math.exp(logDiameter));
          const wide = poreCumulativeFraction(psd, Math.exp(logDiameter + step));
          return wide >= narrow && poreVolumeDensityPerLogDiameter(psd, Math.exp(logDiameter)) >= 0;
        },
      ),
    );
  });

  it('F(F^-1(s)) = s for s in (1e-6, 1 - 1e-6), to 1e-9', () => {
    fc.assert(
      fc.property(
        mixtureArbitrary,
        fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }),
        (psd, fraction) => {
          const diameterM = poreDiameterAtFractionM(psd, fraction);
          return Math.abs(poreCumulativeFraction(psd, diameterM) - fraction) < 1e-9;
        },
      ),
    );
  });
});
