import { describe, expect, it } from 'vitest';
import {
  CONCRETE_THERMAL_DIFFUSIVITY_M2S,
  ThermalField,
  interpolate,
} from '../../simulators/src/thermalField.ts';

/** A field at 20 degC whose air jumps to 30 degC (no sun), stepped `seconds` in 1-s steps. */
function afterStepChange(seconds: number, surfaceLagS = 1800): ThermalField {
  const field = new ThermalField({
    depthsMm: [5, 40],
    initialTemperatureC: 20,
    solarGainKPerKWm2: 0,
    surfaceLagS,
  });
  for (let s = 0; s < seconds; s += 1) field.step(1, 30, 0);
  return field;
}

describe('ThermalField', () => {
  it('the surface follows the air with its first-order lag (exact exponential update)', () => {
    const field = afterStepChange(1800);
    expect(field.temperatureCAt(0)).toBeCloseTo(30 - 10 * Math.exp(-1), 6);
  });

  it('a 5 mm depth follows the surface within a few diffusion times d^2/alpha (36 s; Carslaw and Jaeger 1959, 2.4), not with the surface lag added', () => {
    const diffusionTimeS = 0.005 ** 2 / CONCRETE_THERMAL_DIFFUSIVITY_M2S;
    expect(diffusionTimeS).toBeCloseTo(35.7, 1);
    // With a slow surface (30 min lag) the 5 mm reading trails it by about rate x 36 s.
    const field = afterStepChange(3600);
    const surface = field.temperatureCAt(0);
    const surfaceRateKPerS = (30 - surface) / 1800;
    expect(surface - field.temperatureCAt(5)).toBeGreaterThan(0);
    expect(surface - field.temperatureCAt(5)).toBeLessThan(2 * surfaceRateKPerS * diffusionTimeS);
  });

  it('deeper lags more: 40 mm trails the surface by far more than 5 mm', () => {
    const field = afterStepChange(1800, 600);
    const surface = field.temperatureCAt(0);
    expect(surface - field.temperatureCAt(40)).toBeGreaterThan(
      5 * (surface - field.temperatureCAt(5)),
    );
  });

  it('interpolate() is linear between tracked depths and constant beyond them', () => {
    expect(interpolate([0, 10], [20, 30], 2.5)).toBe(22.5);
    expect(interpolate([0, 10], [20, 30], 50)).toBe(30);
    expect(interpolate([], [], 1)).toBeNaN();
  });
});
