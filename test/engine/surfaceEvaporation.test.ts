import { describe, expect, it } from 'vitest';
import { surfaceEvaporation } from '../../server/src/engine/surfaceEvaporation.ts';
import { unoEvaporationRateKgM2h } from '../../server/src/physics/evaporation.ts';
import type { CuringMeasure } from '../../server/src/physics/curingMeasures.ts';

const inputs = {
  airTemperatureK: 303.15,
  relativeHumidity: 0.4,
  windMS: 5,
  surfaceTemperatureK: 306.15,
};
const PER_HOUR = 3600;
const active = (measure: Omit<CuringMeasure, 'startMs'>): CuringMeasure[] => [
  { startMs: 0, ...measure },
];

// Uno (1998), ACI Materials Journal 95(4), metric form, evaluated through the physics library.
const unoKgM2h = (surfaceHumidity: number): number =>
  unoEvaporationRateKgM2h(
    { airTemperatureC: 30, concreteTemperatureC: 33, relativeHumidity: 0.4, windKmH: 18 },
    { surfacePoreHumidity: surfaceHumidity },
  );

describe('surfaceEvaporation()', () => {
  it.each([1, 0.95, 0.8, 0.5])(
    'equals Uno with the falling-rate extension at surface humidity %s',
    (humidity) => {
      const rate = surfaceEvaporation(inputs).rateKgM2s(humidity) * PER_HOUR;
      expect(rate).toBeCloseTo(unoKgM2h(humidity), 10);
    },
  );

  it('falls as the surface pores dry and stops at the humidity of the air (no condensation)', () => {
    const evaporation = surfaceEvaporation(inputs);
    expect(evaporation.rateKgM2s(0.7)).toBeLessThan(evaporation.rateKgM2s(0.9));
    expect(evaporation.rateKgM2s(0.1)).toBe(0);
  });

  it('a measured rate replaces the wet-surface estimate and keeps the falling-rate shape', () => {
    const measured = 0.5 / PER_HOUR;
    const evaporation = surfaceEvaporation({ ...inputs, measuredEvaporationKgM2s: measured });
    expect(evaporation.potentialKgM2s).toBeCloseTo(measured, 15);
    expect(evaporation.rateKgM2s(0.8) / evaporation.rateKgM2s(1)).toBeCloseTo(
      unoKgM2h(0.8) / unoKgM2h(1),
      12,
    );
  });

  it.each([
    [
      'a curing compound of efficiency 0.7 passes 30 %',
      active({ kind: 'curing-compound', efficiency: 0.7 }),
      0.3,
    ],
    [
      'two coats of 0.5 pass 25 % (in series)',
      [
        ...active({ kind: 'curing-compound', efficiency: 0.5 }),
        ...active({ kind: 'curing-compound', efficiency: 0.5 }),
      ],
      0.25,
    ],
  ])('%s', (_label, measures, fraction) => {
    const open = surfaceEvaporation(inputs).potentialKgM2s;
    expect(surfaceEvaporation({ ...inputs, activeMeasures: measures }).potentialKgM2s).toBeCloseTo(
      fraction * open,
      15,
    );
  });

  it('wet covering holds the surface saturated with no evaporation; fogging and a windbreak lower it', () => {
    const open = surfaceEvaporation(inputs).potentialKgM2s;
    const covered = surfaceEvaporation({
      ...inputs,
      activeMeasures: active({ kind: 'wet-covering' }),
    });
    expect(covered.heldSaturated).toBe(true);
    expect(covered.potentialKgM2s).toBe(0);
    expect(
      surfaceEvaporation({
        ...inputs,
        activeMeasures: active({ kind: 'fogging', relativeHumidity: 0.9 }),
      }).potentialKgM2s,
    ).toBeLessThan(open);
    expect(
      surfaceEvaporation({
        ...inputs,
        activeMeasures: active({ kind: 'windbreak', windFactor: 0.5 }),
      }).potentialKgM2s,
    ).toBeLessThan(open);
  });
});
