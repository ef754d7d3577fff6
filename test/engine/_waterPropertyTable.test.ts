import { describe, expect, it } from 'vitest';
import {
  waterPropertiesAt,
  type WaterProperties,
} from '../../server/src/engine/_waterPropertyTable.ts';
import { kelvinCoefficientPa } from '../../server/src/physics/kelvin.ts';
import { saturationVapourPressurePa } from '../../server/src/physics/saturationVapourPressure.ts';
import { waterDensityKgPerM3 } from '../../server/src/physics/waterDensity.ts';
import { waterSurfaceTensionNPerM } from '../../server/src/physics/waterSurfaceTension.ts';
import { waterViscosityPaS } from '../../server/src/physics/waterViscosity.ts';

// The functions under the table: IAPWS releases through the physics library (see each file).
const exact = (temperatureK: number): WaterProperties => {
  const densityKgPerM3 = waterDensityKgPerM3(temperatureK);
  return {
    surfaceTensionNPerM: waterSurfaceTensionNPerM(temperatureK),
    viscosityPaS: waterViscosityPaS(temperatureK, densityKgPerM3),
    densityKgPerM3,
    kelvinCoefficientPa: kelvinCoefficientPa(temperatureK, densityKgPerM3),
    saturationVapourPressurePa: saturationVapourPressurePa(temperatureK),
  };
};
const blank = (): WaterProperties => ({
  surfaceTensionNPerM: 0,
  viscosityPaS: 0,
  densityKgPerM3: 0,
  kelvinCoefficientPa: 0,
  saturationVapourPressurePa: 0,
});

describe('waterPropertiesAt()', () => {
  it('follows the physics functions within 1e-7 of each value from 0 to 100 degC', () => {
    const out = blank();
    let worst = 0;
    // Off-node temperatures (0.00731 K apart) across the tabulated range.
    for (let temperatureK = 273.153; temperatureK < 373.14; temperatureK += 0.00731) {
      waterPropertiesAt(temperatureK, out);
      const reference = exact(temperatureK);
      for (const key of Object.keys(reference) as (keyof WaterProperties)[]) {
        worst = Math.max(worst, Math.abs(out[key] / reference[key] - 1));
      }
    }
    expect(worst).toBeLessThan(1e-7);
    expect(worst).toBeGreaterThan(0); // an interpolation, not the functions themselves
  });

  it.each([250, 373.15, 400, Number.NaN])(
    'is the physics functions themselves at %s K',
    (temperatureK) => {
      const out = blank();
      waterPropertiesAt(temperatureK, out);
      expect(out).toEqual(exact(temperatureK));
    },
  );
});
