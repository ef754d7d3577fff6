import { describe, expect, it } from 'vitest';
import { createCellWaterCoefficients } from '../../server/src/engine/_cellWaterCoefficients.ts';
import { kelvinCoefficientPa } from '../../server/src/physics/kelvin.ts';
import { waterDensityKgPerM3 } from '../../server/src/physics/waterDensity.ts';
import { waterSurfaceTensionNPerM } from '../../server/src/physics/waterSurfaceTension.ts';
import { waterViscosityPaS } from '../../server/src/physics/waterViscosity.ts';

const make = (temperatures: number[], vapourDiffusion = true) => {
  const temperatureK = Float64Array.from(temperatures);
  const coefficients = createCellWaterCoefficients({
    temperatureK,
    referenceTensionNPerM: waterSurfaceTensionNPerM(293.15),
    vapourDiffusion,
    vapourDiffusivityM2s: 2.5e-5,
    tortuosity: 3,
    porosity: 0.15,
    liquidDensityKgPerM3: 998.2,
  });
  for (let i = 0; i < temperatures.length; i += 1) coefficients.refreshCell(i);
  return { temperatureK, coefficients };
};

describe('createCellWaterCoefficients()', () => {
  it('gives each cell the IAPWS properties at its temperature (through the table, within 1e-6)', () => {
    const { coefficients } = make([283.15, 293.15, 308.15]);
    for (const [cell, temperature] of [283.15, 293.15, 308.15].entries()) {
      const density = waterDensityKgPerM3(temperature);
      const tensionRatio = waterSurfaceTensionNPerM(293.15) / waterSurfaceTensionNPerM(temperature);
      const checks: [number, number][] = [
        [coefficients.tensionRatio[cell] as number, tensionRatio],
        [
          coefficients.inverseViscosity[cell] as number,
          1 / waterViscosityPaS(temperature, density),
        ],
        [
          coefficients.inverseKelvinPerPa[cell] as number,
          1 / kelvinCoefficientPa(temperature, density),
        ],
      ];
      for (const [value, expected] of checks) {
        expect(Math.abs(value / expected - 1)).toBeLessThan(1e-6);
      }
    }
    // At the reference temperature the ratio is 1; warmer water has less tension: above 1.
    expect(Math.abs((coefficients.tensionRatio[1] as number) - 1)).toBeLessThan(1e-6);
    expect(coefficients.tensionRatio[2]).toBeGreaterThan(1);
  });

  it('a cell at its neighbour temperature has its coefficients to the bit; a changed temperature is read on refresh', () => {
    const { temperatureK, coefficients } = make([300.15, 300.15, 290.15]);
    expect(coefficients.vapourFactor[1]).toBe(coefficients.vapourFactor[0]);
    expect(coefficients.vapourFactor[2]).not.toBe(coefficients.vapourFactor[0]);
    const before = coefficients.inverseViscosity[2] as number;
    temperatureK[2] = 300.15;
    coefficients.refreshCell(2);
    expect(coefficients.inverseViscosity[2]).not.toBe(before);
    expect(coefficients.inverseViscosity[2]).toBe(coefficients.inverseViscosity[1]);
  });

  it('the vapour factor is positive with vapour diffusion, 0 without, and grows with temperature (p_sat)', () => {
    const on = make([283.15, 303.15]).coefficients;
    expect(on.vapourFactor[0]).toBeGreaterThan(0);
    expect(on.vapourFactor[1]).toBeGreaterThan(on.vapourFactor[0] as number);
    const off = make([283.15, 303.15], false).coefficients;
    expect(Array.from(off.vapourFactor)).toEqual([0, 0]);
  });
});
