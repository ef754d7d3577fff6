import { describe, expect, it } from 'vitest';
import {
  curingBoundaryInputs,
  curingMeasuresActiveAt,
  type CuringMeasure,
} from '../../server/src/physics/curingMeasures.ts';

// The combination rules are our assumption, documented in curingMeasures.ts and physics.md
// section 4; these tests pin that documented behaviour.
const weather = { windKmH: 20, relativeHumidity: 0.4 };
const at = (measure: Omit<CuringMeasure, 'startMs'>): CuringMeasure => ({ startMs: 0, ...measure });

describe('curingBoundaryInputs()', () => {
  const cases: {
    name: string;
    measures: CuringMeasure[];
    expected: {
      windKmH: number;
      relativeHumidity: number;
      fluxMultiplier: number;
      heldSaturated: boolean;
    };
  }[] = [
    {
      name: 'no measure leaves the weather unchanged',
      measures: [],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 1, heldSaturated: false },
    },
    {
      name: 'wet covering holds the surface saturated with no flux',
      measures: [at({ kind: 'wet-covering' })],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 0, heldSaturated: true },
    },
    {
      name: 'ponding holds the surface saturated with no flux',
      measures: [at({ kind: 'ponding' })],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 0, heldSaturated: true },
    },
    {
      name: 'a curing compound at the default efficiency 0.8 passes 0.2 of the flux',
      measures: [at({ kind: 'curing-compound' })],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 0.2, heldSaturated: false },
    },
    {
      name: 'two coats multiply: (1 - 0.5) (1 - 0.6) = 0.2',
      measures: [
        at({ kind: 'curing-compound', efficiency: 0.5 }),
        at({ kind: 'curing-compound', efficiency: 0.6 }),
      ],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 0.2, heldSaturated: false },
    },
    {
      name: 'fogging raises the humidity to the default 0.9',
      measures: [at({ kind: 'fogging' })],
      expected: { windKmH: 20, relativeHumidity: 0.9, fluxMultiplier: 1, heldSaturated: false },
    },
    {
      name: 'a windbreak halves the wind by default; the stronger of two governs',
      measures: [at({ kind: 'windbreak' }), at({ kind: 'windbreak', windFactor: 0.7 })],
      expected: { windKmH: 10, relativeHumidity: 0.4, fluxMultiplier: 1, heldSaturated: false },
    },
    {
      name: 'wet covering overrides a curing compound',
      measures: [at({ kind: 'curing-compound' }), at({ kind: 'wet-covering' })],
      expected: { windKmH: 20, relativeHumidity: 0.4, fluxMultiplier: 0, heldSaturated: true },
    },
    {
      name: 'out-of-range figures are clamped to 0..1',
      measures: [
        at({ kind: 'curing-compound', efficiency: 1.5 }),
        at({ kind: 'windbreak', windFactor: -1 }),
      ],
      expected: { windKmH: 0, relativeHumidity: 0.4, fluxMultiplier: 0, heldSaturated: false },
    },
  ];
  it.each(cases)('$name (our assumption)', ({ measures, expected }) => {
    const result = curingBoundaryInputs(measures, weather);
    expect(result.heldSaturated).toBe(expected.heldSaturated);
    expect(result.windKmH).toBeCloseTo(expected.windKmH, 12);
    expect(result.relativeHumidity).toBeCloseTo(expected.relativeHumidity, 12);
    expect(result.fluxMultiplier).toBeCloseTo(expected.fluxMultiplier, 12);
  });

  it('never lowers a humidity that is already above the fogging figure', () => {
    const result = curingBoundaryInputs([at({ kind: 'fogging' })], {
      windKmH: 5,
      relativeHumidity: 0.95,
    });
    expect(result.relativeHumidity).toBe(0.95);
  });

  it('uses the option defaults when given', () => {
    const result = curingBoundaryInputs(
      [at({ kind: 'curing-compound' }), at({ kind: 'fogging' }), at({ kind: 'windbreak' })],
      weather,
      { curingCompoundEfficiency: 0.9, foggingRelativeHumidity: 0.8, windbreakWindFactor: 0.25 },
    );
    expect(result.fluxMultiplier).toBeCloseTo(0.1, 12);
    expect(result.relativeHumidity).toBe(0.8);
    expect(result.windKmH).toBe(5);
  });
});

describe('curingMeasuresActiveAt()', () => {
  const log: CuringMeasure[] = [
    { kind: 'fogging', startMs: 1000, endMs: 2000 },
    { kind: 'curing-compound', startMs: 1500 },
  ];
  it.each([
    { timeMs: 999, kinds: [] },
    { timeMs: 1000, kinds: ['fogging'] },
    { timeMs: 1500, kinds: ['fogging', 'curing-compound'] },
    { timeMs: 2000, kinds: ['curing-compound'] },
    { timeMs: Number.NaN, kinds: [] },
  ])('at $timeMs ms gives $kinds (start inclusive, end exclusive)', ({ timeMs, kinds }) => {
    expect(curingMeasuresActiveAt(log, timeMs).map((measure) => measure.kind)).toEqual(kinds);
  });

  it('restores exposure when a measure is removed', () => {
    const wet: CuringMeasure[] = [{ kind: 'wet-covering', startMs: 0, endMs: 3_600_000 }];
    expect(curingBoundaryInputs(curingMeasuresActiveAt(wet, 1_000), weather).heldSaturated).toBe(
      true,
    );
    expect(curingBoundaryInputs(curingMeasuresActiveAt(wet, 3_600_000), weather)).toEqual({
      ...weather,
      fluxMultiplier: 1,
      heldSaturated: false,
    });
  });
});
