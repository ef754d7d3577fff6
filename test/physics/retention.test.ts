import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  retentionFromPoreSizes,
  vanGenuchtenLiquidPressurePa,
  vanGenuchtenSaturation,
} from '../../server/src/physics/retention.ts';
import type { PoreSizeDistribution } from '../../server/src/physics/retentionCurve.ts';
import { poreStructureFixture } from './fixtures/poreStructureFixture.ts';

const { distributions, surfaceTensionNPerM: gamma } = poreStructureFixture;
const names = Object.keys(distributions) as (keyof typeof distributions)[];

describe('vanGenuchtenSaturation()', () => {
  // van Genuchten (1980), Soil Sci. Soc. Am. J. 44(5), eq. 3 with m = 1 - 1/n, evaluated by hand:
  // alpha |p| = 1 gives 2^-m; n = 2, alpha |p| = 3 gives 10^-0.5; n = 3, alpha |p| = 2 gives 9^-(2/3).
  it.each([
    [-1e6, 1e-6, 2, Math.SQRT1_2],
    [-1e6, 1e-6, 1.5, 2 ** (-1 / 3)],
    [-3e6, 1e-6, 2, 10 ** -0.5],
    [-2e5, 1e-5, 3, 9 ** (-2 / 3)],
  ])('S(p = %s Pa, alpha = %s /Pa, n = %s) = %s', (pressurePa, alphaPerPa, n, expected) => {
    expect(vanGenuchtenSaturation(pressurePa, alphaPerPa, n)).toBeCloseTo(expected, 13);
    expect(vanGenuchtenLiquidPressurePa(expected, alphaPerPa, n) / pressurePa).toBeCloseTo(1, 12);
  });

  it('is 1 at and above zero pressure, NaN for NaN, and its inverse has the documented ends', () => {
    expect(vanGenuchtenSaturation(0, 1e-6, 2)).toBe(1);
    expect(vanGenuchtenSaturation(1e5, 1e-6, 2)).toBe(1);
    expect(vanGenuchtenSaturation(Number.NaN, 1e-6, 2)).toBeNaN();
    expect(vanGenuchtenLiquidPressurePa(1, 1e-6, 2)).toBe(0);
    expect(vanGenuchtenLiquidPressurePa(0, 1e-6, 2)).toBe(Number.NEGATIVE_INFINITY);
  });
});

describe('retentionFromPoreSizes()', () => {
  // van Genuchten (1980) closed form at the fit's surface tension, renormalised by F(D_max) = 1 - 1e-6
  // (our documented truncation), computed by test/physics/fixtures/poreStructure.py. Tolerance 1e-8 in S.
  it.each(['vanGenuchtenSteep', 'vanGenuchtenFlat'] as const)(
    'reproduces the van Genuchten closed form for %s',
    (name) => {
      const fixture = distributions[name];
      const curve = retentionFromPoreSizes(fixture.psd, gamma);
      for (const [pressurePa, expected] of fixture.saturationAtPressure ?? []) {
        expect(Math.abs(curve.saturation(pressurePa) - expected)).toBeLessThan(1e-8);
      }
    },
  );

  // Air entry p_ae = -4 gamma / D_max (Young-Laplace), D_max from the Python fixture; 1e-9 relative.
  it.each(names)('has the air-entry pressure of the fixture for %s', (name) => {
    const fixture = distributions[name];
    const curve = retentionFromPoreSizes(fixture.psd, gamma);
    expect(curve.airEntryPressurePa / fixture.airEntryPressurePa - 1).toBeCloseTo(0, 9);
    expect(curve.saturation(curve.airEntryPressurePa)).toBe(1);
    expect(curve.saturation(curve.airEntryPressurePa * 1.001)).toBeLessThan(1);
    expect(curve.liquidPressure(1)).toBe(curve.airEntryPressurePa);
  });

  // Young-Laplace p = -4 gamma / D at the diameters of the Python fixture (scipy); 1e-8 relative.
  it.each(['mortarLogNormal', 'mixtureLogNormal', 'porosimetryTable'] as const)(
    'gives p(S) = -4 gamma / D(S) for %s',
    (name) => {
      const fixture = distributions[name];
      const top = fixture.psd.kind === 'table' ? 1 : 1 - 1e-6;
      const curve = retentionFromPoreSizes(fixture.psd, gamma);
      for (const [fraction, diameterM] of (fixture.diameterAtFraction ?? []).filter(
        ([f]) => f > 0,
      )) {
        expect(curve.liquidPressure(fraction / top) / ((-4 * gamma) / diameterM) - 1).toBeCloseTo(
          0,
          8,
        );
      }
    },
  );

  it.each(names)(
    'round-trips S(p(S)) = S for %s, exact form to 1e-10 and fast form to 1e-8',
    (name) => {
      const psd = distributions[name].psd;
      const fast = retentionFromPoreSizes(psd, gamma);
      const exact = retentionFromPoreSizes(psd, gamma, 0, { tabulated: false });
      for (let i = 1; i < 1000; i++) {
        const saturation = i / 1000;
        expect(
          Math.abs(exact.saturation(exact.liquidPressure(saturation)) - saturation),
        ).toBeLessThan(1e-10);
        expect(
          Math.abs(fast.saturation(fast.liquidPressure(saturation)) - saturation),
        ).toBeLessThan(1e-8);
      }
    },
  );

  it.each(names)(
    'fast form stays within 1e-6 of the exact form for %s (stated accuracy)',
    (name) => {
      const psd = distributions[name].psd;
      const fast = retentionFromPoreSizes(psd, gamma);
      const exact = retentionFromPoreSizes(psd, gamma, 0, { tabulated: false });
      for (let i = 1; i < 2000; i++) {
        const saturation = (i / 2000) ** 2;
        const pressurePa = exact.liquidPressure(saturation);
        expect(Math.abs(fast.saturation(pressurePa) - saturation)).toBeLessThan(1e-6);
        expect(Math.abs(fast.liquidPressure(saturation) / pressurePa - 1)).toBeLessThan(1e-6);
      }
    },
  );

  it.each(names)('capacity dS/dp matches a central difference of S(p) for %s', (name) => {
    const psd = distributions[name].psd;
    const curve = retentionFromPoreSizes(psd, gamma);
    for (const saturation of [0.1, 0.3, 0.5, 0.8, 0.95]) {
      const pressurePa = curve.liquidPressure(saturation);
      const delta = 1e-4 * -pressurePa;
      const difference =
        (curve.saturation(pressurePa + delta) - curve.saturation(pressurePa - delta)) / (2 * delta);
      expect(curve.capacityPerPa(pressurePa) / difference - 1).toBeCloseTo(0, 4);
    }
    expect(curve.capacityPerPa(0)).toBe(0);
  });

  it('scales pressure with surface tension: S at gamma_2 and p gamma_2 / gamma_1 equals S at gamma_1 and p (Young-Laplace)', () => {
    const psd = distributions.mixtureLogNormal.psd;
    const cold = retentionFromPoreSizes(psd, 0.0756);
    const warm = retentionFromPoreSizes(psd, 0.0679);
    for (const pressurePa of [-1e5, -1e6, -1e7]) {
      expect(warm.saturation((pressurePa * 0.0679) / 0.0756)).toBeCloseTo(
        cold.saturation(pressurePa),
        9,
      );
    }
  });

  it('has the documented edge values', () => {
    const lognormal = retentionFromPoreSizes(distributions.mortarLogNormal.psd, gamma);
    const table = retentionFromPoreSizes(distributions.porosimetryTable.psd, gamma);
    expect(lognormal.saturation(Number.NaN)).toBeNaN();
    expect(lognormal.liquidPressure(Number.NaN)).toBeNaN();
    expect(lognormal.liquidPressure(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(lognormal.saturation(-1e15)).toBeCloseTo(0, 12);
    // Table: the finest pore is the first extension knot, 0.5 nm (one decade below 5 nm).
    expect(table.liquidPressure(0) / ((-4 * gamma) / 5e-10) - 1).toBeCloseTo(0, 9);
    expect(lognormal.saturation(5e4)).toBe(1);
  });
});

describe('retention properties (fast-check)', () => {
  const psdArbitrary = fc.constantFrom<PoreSizeDistribution>(
    ...names.map((name) => distributions[name].psd),
  );
  const curves = new Map(
    names.map((name) => [
      distributions[name].psd,
      retentionFromPoreSizes(distributions[name].psd, gamma),
    ]),
  );

  it('S(p) is non-decreasing in p', () => {
    fc.assert(
      fc.property(
        psdArbitrary,
        fc.double({ min: 2, max: 9, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (psd, logSuction, step) => {
          const curve = curves.get(psd);
          if (curve === undefined) return false;
          return (
            curve.saturation(-(10 ** logSuction)) >= curve.saturation(-(10 ** (logSuction + step)))
          );
        },
      ),
    );
  });

  it('p(S) is non-decreasing in S', () => {
    fc.assert(
      fc.property(
        psdArbitrary,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (psd, first, second) => {
          const curve = curves.get(psd);
          if (curve === undefined) return false;
          const [low, high] = first <= second ? [first, second] : [second, first];
          return curve.liquidPressure(low) <= curve.liquidPressure(high);
        },
      ),
    );
  });
});
