import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  equivalentPorePressureCurve,
  equivalentPorePressurePa,
} from '../../server/src/physics/equivalentPorePressure.ts';
import { retentionFromPoreSizes } from '../../server/src/physics/retention.ts';
import type { PoreSizeDistribution } from '../../server/src/physics/retentionCurve.ts';
import { poreStructureFixture } from './fixtures/poreStructureFixture.ts';

const { distributions, surfaceTensionNPerM: gamma } = poreStructureFixture;
const names = Object.keys(distributions) as (keyof typeof distributions)[];

// Coussy (2004), Poromechanics, Wiley: pi(S) = S p(S) + integral_S^1 p(s) ds. Reference values from
// test/physics/fixtures/poreStructure.py, integrating that definition directly in s (mpmath
// tanh-sinh at 30 digits, single log-normal mode), against the density in ln D (scipy quad:
// mixture, table), or with the incomplete beta function (van Genuchten, n > 2).
// Tolerances over S in 0..1: accurate form 1e-6 relative, fast form 1e-5 relative (the issue asks 0.5 %).
describe.each(names)('equivalentPorePressurePa() for %s', (name) => {
  const fixture = distributions[name];
  const curve = equivalentPorePressureCurve(retentionFromPoreSizes(fixture.psd, gamma));
  it.each(fixture.pi)(
    'pi(S = %s) agrees with the independent quadrature',
    (saturation, expectedPa) => {
      expect(
        Math.abs(equivalentPorePressurePa(fixture.psd, saturation, gamma) / expectedPa - 1),
      ).toBeLessThan(1e-6);
      expect(Math.abs(curve.fromSaturation(saturation) / expectedPa - 1)).toBeLessThan(1e-5);
    },
  );
});

describe('equivalentPorePressureCurve() fast form', () => {
  it.each(names)('stays within 1e-7 of the accurate form for %s (stated accuracy)', (name) => {
    const psd = distributions[name].psd;
    const curve = equivalentPorePressureCurve(retentionFromPoreSizes(psd, gamma));
    for (let i = 1; i < 400; i++) {
      const saturation = (i / 400) ** 1.5;
      const accuratePa = equivalentPorePressurePa(psd, saturation, gamma);
      expect(Math.abs(curve.fromSaturation(saturation) / accuratePa - 1)).toBeLessThan(1e-7);
    }
  });
});

describe('equivalentPorePressurePa() closed forms and limits', () => {
  // Single pore size D0 (a log-normal mode with gsd -> 1): F is a step at D0, so p(s) = p0 =
  // -4 gamma / D0 for every s in (0, 1] and pi(S) = S p0 + (1 - S) p0 = p0, whatever S.
  // With gsd = 1.001 the spread of ln D is 1e-3, so |pi / p0 - 1| stays below 0.5 %.
  it.each([0.05, 0.3, 0.7, 0.99])(
    'is the Young-Laplace pressure of the single pore size at S = %s',
    (saturation) => {
      const psd: PoreSizeDistribution = {
        kind: 'lognormal',
        modes: [{ medianDiameterM: 5e-8, geometricSd: 1.001, volumeFraction: 1 }],
      };
      const singleSizePa = (-4 * gamma) / 5e-8;
      const curve = equivalentPorePressureCurve(retentionFromPoreSizes(psd, gamma));
      expect(
        Math.abs(equivalentPorePressurePa(psd, saturation, gamma) / singleSizePa - 1),
      ).toBeLessThan(0.005);
      expect(Math.abs(curve.fromSaturation(saturation) / singleSizePa - 1)).toBeLessThan(0.005);
    },
  );

  it('is -Infinity at S = 0 for van Genuchten with n <= 2 (integral of p diverges), finite for n > 2', () => {
    expect(equivalentPorePressurePa(distributions.vanGenuchtenFlat.psd, 0, gamma)).toBe(
      Number.NEGATIVE_INFINITY,
    );
    expect(
      Number.isFinite(equivalentPorePressurePa(distributions.vanGenuchtenSteep.psd, 0, gamma)),
    ).toBe(true);
  });

  it('equals the liquid pressure while saturated and is NaN for NaN', () => {
    const retention = retentionFromPoreSizes(distributions.mortarLogNormal.psd, gamma);
    const curve = equivalentPorePressureCurve(retention);
    expect(curve.fromLiquidPressure(-1000)).toBe(-1000);
    expect(curve.fromLiquidPressure(2e4)).toBe(2e4);
    expect(curve.fromSaturation(1)).toBe(retention.airEntryPressurePa);
    expect(curve.fromSaturation(Number.NaN)).toBeNaN();
    expect(curve.fromLiquidPressure(Number.NaN)).toBeNaN();
    expect(
      equivalentPorePressurePa(distributions.mortarLogNormal.psd, Number.NaN, gamma),
    ).toBeNaN();
  });

  // dpi/dp = S(p): differentiate pi = S p + integral_S^1 p ds along the curve (Coussy 2004).
  it.each(names)('has dpi/dp = S(p) for %s (central difference, 1e-5)', (name) => {
    const retention = retentionFromPoreSizes(distributions[name].psd, gamma);
    const curve = equivalentPorePressureCurve(retention);
    for (const saturation of [0.1, 0.4, 0.7, 0.95]) {
      const pressurePa = retention.liquidPressure(saturation);
      const delta = 1e-4 * -pressurePa;
      const slope =
        (curve.fromLiquidPressure(pressurePa + delta) -
          curve.fromLiquidPressure(pressurePa - delta)) /
        (2 * delta);
      expect(Math.abs(slope - saturation)).toBeLessThan(1e-5);
    }
  });
});

describe('equivalent pore pressure properties (fast-check)', () => {
  const curves = names.map((name) =>
    equivalentPorePressureCurve(retentionFromPoreSizes(distributions[name].psd, gamma)),
  );

  // Monotone to rounding: 1e-12 relative (the values carry about 16 digits).
  const atMost = (first: number, second: number): boolean =>
    first <= second || first <= second + 1e-12 * Math.abs(second);

  it('pi(S) is non-decreasing in S and never positive', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...curves),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (curve, first, second) => {
          const [low, high] = first <= second ? [first, second] : [second, first];
          return (
            atMost(curve.fromSaturation(low), curve.fromSaturation(high)) &&
            curve.fromSaturation(high) <= 0
          );
        },
      ),
    );
  });

  it('pi(p) is non-decreasing in p', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...curves),
        fc.double({ min: 1, max: 9, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (curve, logSuction, step) =>
          atMost(
            curve.fromLiquidPressure(-(10 ** (logSuction + step))),
            curve.fromLiquidPressure(-(10 ** logSuction)),
          ),
      ),
    );
  });
});
