import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  kelvinCoefficientPa,
  kelvinLiquidPressurePa,
  kelvinRelativeHumidity,
} from '../../server/src/physics/kelvin.ts';

interface KelvinRow {
  temperatureK: number;
  relativeHumidity: number;
  densityKgPerM3: number;
  liquidPressurePa: number;
}

// Kelvin equation p = rho R T / M ln h evaluated in test/physics/fixtures/water.py with the
// IAPWS-95 density at 101325 Pa (python3-iapws), R = 8.314462618 J/(mol K), M = 18.015268 g/mol.
const fixture = JSON.parse(
  readFileSync(new URL('./fixtures/water.json', import.meta.url), 'utf8'),
) as { kelvin: { ambient: KelvinRow[] } };

const relativeError = (actual: number, expected: number): number => Math.abs(actual / expected - 1);

describe('kelvinLiquidPressurePa()', () => {
  it.each([
    { densitySource: 'the fixture (IAPWS-95)', useFixtureDensity: true, tolerance: 1e-12 },
    { densitySource: 'its default (IF97 region 1)', useFixtureDensity: false, tolerance: 2e-5 },
  ])(
    'matches the fixture (0..40 degC, h 0.3..0.999) within $tolerance with the density from $densitySource',
    ({ useFixtureDensity, tolerance }) => {
      const rows = fixture.kelvin.ambient;
      expect(rows.length).toBeGreaterThan(20);
      for (const row of rows) {
        const pressurePa = useFixtureDensity
          ? kelvinLiquidPressurePa(row.relativeHumidity, row.temperatureK, row.densityKgPerM3)
          : kelvinLiquidPressurePa(row.relativeHumidity, row.temperatureK);
        expect(relativeError(pressurePa, row.liquidPressurePa)).toBeLessThan(tolerance);
      }
    },
  );

  // physics.md section 2: about 135 MPa * ln h at 20 degC. Hand evaluation with rho = 998.2 kg/m3:
  // 998.2 * 8.3145 * 293.15 / 0.018015 = 135.05 MPa; ln 0.9 = -0.10536, ln 0.5 = -0.69315.
  it.each([
    { relativeHumidity: 0.9, pressureMPa: -14.23 },
    { relativeHumidity: 0.75, pressureMPa: -38.85 },
    { relativeHumidity: 0.5, pressureMPa: -93.61 },
  ])(
    'gives about $pressureMPa MPa at h = $relativeHumidity and 20 degC (Kelvin magnitude, hand evaluation)',
    ({ relativeHumidity, pressureMPa }) => {
      const pressurePa = kelvinLiquidPressurePa(relativeHumidity, 293.15);
      expect(Math.abs(pressurePa / 1e6 - pressureMPa)).toBeLessThan(0.02);
    },
  );

  it('has a coefficient of about 135 MPa at 20 degC (physics.md section 2)', () => {
    expect(kelvinCoefficientPa(293.15) / 1e6).toBeCloseTo(135.05, 1);
  });

  it('is 0 at h = 1, positive for h > 1, -Infinity at h = 0 and NaN for h < 0 or NaN (documented edges)', () => {
    expect(kelvinLiquidPressurePa(1, 293.15)).toBe(0);
    expect(kelvinLiquidPressurePa(1.01, 293.15)).toBeGreaterThan(0);
    expect(kelvinLiquidPressurePa(0, 293.15)).toBe(Number.NEGATIVE_INFINITY);
    expect(kelvinLiquidPressurePa(-0.1, 293.15)).toBeNaN();
    expect(kelvinLiquidPressurePa(Number.NaN, 293.15)).toBeNaN();
    expect(kelvinLiquidPressurePa(0.9, Number.NaN)).toBeNaN();
  });

  it('rises with relative humidity (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.double({ min: 1e-6, max: 0.5, noNaN: true }),
        fc.double({ min: 263.15, max: 333.15, noNaN: true }),
        (relativeHumidity, step, temperatureK) => {
          expect(kelvinLiquidPressurePa(relativeHumidity + step, temperatureK)).toBeGreaterThan(
            kelvinLiquidPressurePa(relativeHumidity, temperatureK),
          );
        },
      ),
    );
  });
});

describe('kelvinRelativeHumidity()', () => {
  it('round-trips kelvinLiquidPressurePa() to 1e-12 (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1.05, noNaN: true }),
        fc.double({ min: 253.15, max: 353.15, noNaN: true }),
        (relativeHumidity, temperatureK) => {
          const pressurePa = kelvinLiquidPressurePa(relativeHumidity, temperatureK);
          const back = kelvinRelativeHumidity(pressurePa, temperatureK);
          expect(Math.abs(back - relativeHumidity)).toBeLessThan(1e-12);
        },
      ),
    );
  });

  it('gives 1 at p = 0, above 1 for p > 0, 0 at -Infinity and NaN for NaN (documented edges)', () => {
    expect(kelvinRelativeHumidity(0, 293.15)).toBe(1);
    expect(kelvinRelativeHumidity(1e6, 293.15)).toBeGreaterThan(1);
    expect(kelvinRelativeHumidity(Number.NEGATIVE_INFINITY, 293.15)).toBe(0);
    expect(kelvinRelativeHumidity(Number.NaN, 293.15)).toBeNaN();
  });

  it('gives about 0.9 at -14.23 MPa and 20 degC (Kelvin magnitude, hand evaluation)', () => {
    expect(kelvinRelativeHumidity(-14.23e6, 293.15)).toBeCloseTo(0.9, 3);
  });
});
