import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  youngLaplaceDiameterM,
  youngLaplacePressurePa,
} from '../../server/src/physics/youngLaplace.ts';

describe('youngLaplacePressurePa()', () => {
  // Young-Laplace magnitudes for a cylindrical pore, hand evaluation of p = -4 gamma cos(theta) / D.
  it.each([
    { diameterUm: 0.1, surfaceTensionNPerM: 0.0728, pressureMPa: -2.912 },
    { diameterUm: 1, surfaceTensionNPerM: 0.0728, pressureMPa: -0.2912 },
    { diameterUm: 0.01, surfaceTensionNPerM: 0.0728, pressureMPa: -29.12 },
  ])(
    'gives $pressureMPa MPa for D = $diameterUm um and gamma = $surfaceTensionNPerM N/m (hand evaluation)',
    ({ diameterUm, surfaceTensionNPerM, pressureMPa }) => {
      const pressurePa = youngLaplacePressurePa(diameterUm * 1e-6, surfaceTensionNPerM);
      expect(pressurePa / 1e6).toBeCloseTo(pressureMPa, 6);
    },
  );

  it('scales with cos(theta): zero suction at 90 deg (Young-Laplace)', () => {
    expect(youngLaplacePressurePa(1e-7, 0.0728, Math.PI / 3) / 1e6).toBeCloseTo(-1.456, 6);
    expect(Math.abs(youngLaplacePressurePa(1e-7, 0.0728, Math.PI / 2))).toBeLessThan(1e-6);
  });

  it('is NaN for D <= 0 or NaN (documented edges)', () => {
    expect(youngLaplacePressurePa(0, 0.0728)).toBeNaN();
    expect(youngLaplacePressurePa(-1e-7, 0.0728)).toBeNaN();
    expect(youngLaplacePressurePa(Number.NaN, 0.0728)).toBeNaN();
  });
});

describe('youngLaplaceDiameterM()', () => {
  it('gives 0.1 um at -2.912 MPa with gamma = 0.0728 N/m (hand evaluation)', () => {
    expect(youngLaplaceDiameterM(-2.912e6, 0.0728) / 1e-6).toBeCloseTo(0.1, 9);
  });

  it('is +Infinity for p >= 0 and NaN for NaN (documented edges)', () => {
    expect(youngLaplaceDiameterM(0, 0.0728)).toBe(Number.POSITIVE_INFINITY);
    expect(youngLaplaceDiameterM(1e3, 0.0728)).toBe(Number.POSITIVE_INFINITY);
    expect(youngLaplaceDiameterM(Number.NaN, 0.0728)).toBeNaN();
  });

  it('inverts youngLaplacePressurePa() (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1e-3, noNaN: true }),
        fc.double({ min: 0.05, max: 0.08, noNaN: true }),
        fc.double({ min: 0, max: 1.5, noNaN: true }),
        (diameterM, surfaceTensionNPerM, contactAngleRad) => {
          const pressurePa = youngLaplacePressurePa(
            diameterM,
            surfaceTensionNPerM,
            contactAngleRad,
          );
          const back = youngLaplaceDiameterM(pressurePa, surfaceTensionNPerM, contactAngleRad);
          expect(Math.abs(back / diameterM - 1)).toBeLessThan(1e-12);
        },
      ),
    );
  });
});
