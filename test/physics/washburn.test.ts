import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  MERCURY_CONTACT_ANGLE_RAD,
  MERCURY_SURFACE_TENSION_N_PER_M,
  washburnDiameterM,
} from '../../server/src/physics/washburn.ts';

describe('washburnDiameterM()', () => {
  // ASTM D4404 magnitudes: the top of a 414 MPa (60,000 psia) porosimeter reaches pores of about
  // 3 nm; hand evaluation of D = -4 * 0.485 * cos(130 deg) / P = 1.2470 N/m / P.
  it.each([
    { pressureMPa: 414, diameterNm: 3.012 },
    { pressureMPa: 100, diameterNm: 12.47 },
    { pressureMPa: 0.1, diameterNm: 12470 },
  ])(
    'gives about $diameterNm nm at $pressureMPa MPa with gamma 0.485 N/m, theta 130 deg (ASTM D4404, hand evaluation)',
    ({ pressureMPa, diameterNm }) => {
      const diameterM = washburnDiameterM(pressureMPa * 1e6);
      expect(Math.abs((diameterM * 1e9) / diameterNm - 1)).toBeLessThan(1e-3);
    },
  );

  it('uses the ASTM D4404 / ISO 15901-1 defaults 0.485 N/m and 130 deg', () => {
    expect(MERCURY_SURFACE_TENSION_N_PER_M).toBe(0.485);
    expect((MERCURY_CONTACT_ANGLE_RAD * 180) / Math.PI).toBeCloseTo(130, 12);
    expect(washburnDiameterM(414e6)).toBe(washburnDiameterM(414e6, 0.485, (130 * Math.PI) / 180));
  });

  it('is NaN for P <= 0 or NaN (documented edges)', () => {
    expect(washburnDiameterM(0)).toBeNaN();
    expect(washburnDiameterM(-1e6)).toBeNaN();
    expect(washburnDiameterM(Number.NaN)).toBeNaN();
  });

  it('falls as the intrusion pressure rises (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e3, max: 400e6, noNaN: true }),
        fc.double({ min: 1, max: 1e8, noNaN: true }),
        (pressurePa, stepPa) => {
          expect(washburnDiameterM(pressurePa + stepPa)).toBeLessThan(
            washburnDiameterM(pressurePa),
          );
        },
      ),
    );
  });
});
