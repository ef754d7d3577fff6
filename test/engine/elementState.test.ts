import { describe, expect, it } from 'vitest';
import {
  cloneElementState,
  deserialiseElementState,
  serialiseElementState,
  SnapshotError,
} from '../../server/src/engine/elementState.ts';
import { HOUR_S, modelOf } from './_scenarios.ts';

const inputs = {
  airTemperatureK: 303.15,
  relativeHumidity: 0.4,
  windMS: 4,
  surfaceTemperatureK: 305.15,
};

describe('element state', () => {
  const model = modelOf('normal-concrete', 0.1);

  it('cloneElementState() gives an independent copy (ensemble members do not share arrays)', () => {
    const original = model.initialState();
    model.advanceTo(original, 2 * HOUR_S, inputs);
    const copy = cloneElementState(original);
    const before = Array.from(original.transport.pressurePa);
    model.advanceTo(copy, 4 * HOUR_S, inputs);
    expect(Array.from(original.transport.pressurePa)).toEqual(before);
    expect(original.transport.timeS).toBe(2 * HOUR_S);
    expect(copy.transport.timeS).toBe(4 * HOUR_S);
  });

  it('a JSON snapshot restores a state that continues exactly like the uninterrupted run', () => {
    const straight = model.initialState();
    model.advanceTo(straight, 3 * HOUR_S, inputs);
    const text = JSON.stringify(serialiseElementState(straight));
    const restored = deserialiseElementState(JSON.parse(text), model.grid.cellCount);
    model.advanceTo(straight, 6 * HOUR_S, inputs);
    model.advanceTo(restored, 6 * HOUR_S, inputs);
    expect(Array.from(restored.transport.pressurePa)).toEqual(
      Array.from(straight.transport.pressurePa),
    );
    expect(restored.evaporatedKgM2).toBe(straight.evaporatedKgM2);
    expect(Array.from(restored.equivalentAgeS)).toEqual(Array.from(straight.equivalentAgeS));
  });

  it.each([
    ['another version', { version: 99 }, /snapshot version must be 1: got 99/],
    [
      'arrays of the wrong length',
      { equivalentAgeS: [0, 1] },
      /equivalentAgeS must have 60 values: got 2/,
    ],
  ])('refuses a snapshot with %s', (_label, change, message) => {
    const snapshot = { ...serialiseElementState(model.initialState()), ...change };
    expect(() => deserialiseElementState(snapshot, 60)).toThrow(SnapshotError);
    expect(() => deserialiseElementState(snapshot, 60)).toThrow(message);
  });
});

describe('per-member parameters (physics.md section 8: the ensemble varies them)', () => {
  const model = modelOf('cement-mortar-fine', 0.05);
  const advance = (overrides: Parameters<typeof model.initialState>[1], measures = false) => {
    const state = model.initialState(303.15, overrides);
    const activeMeasures = measures
      ? [{ kind: 'curing-compound' as const, startMs: 0, efficiency: 0.2 }]
      : undefined;
    model.advanceTo(state, 3 * HOUR_S, {
      ...inputs,
      ...(activeMeasures ? { activeMeasures } : {}),
    });
    return state;
  };

  it('members of one model differ by their own permeability multiplier', () => {
    const tight = advance({ permeabilityMultiplier: 0.01 });
    const open = advance({ permeabilityMultiplier: 100 });
    // Lower permeability: the surface dries more against a wetter interior.
    const surfaceGap = (state: typeof tight) =>
      (state.transport.pressurePa[59] ?? 0) - (state.transport.pressurePa[0] ?? 0);
    expect(surfaceGap(tight)).toBeGreaterThan(surfaceGap(open));
  });

  it('the exposure multiplier scales evaporation and a curing efficiency overrides the measure', () => {
    expect(advance({ exposureMultiplier: 0 }).evaporatedKgM2).toBe(0);
    const logged = advance({}, true).evaporatedKgM2;
    const calibrated = advance({ curingEfficiency: 0.9 }, true).evaporatedKgM2;
    expect(calibrated).toBeLessThan(0.5 * logged);
  });

  it('clones and snapshots carry the parameters', () => {
    const state = model.initialState(293.15, { permeabilityMultiplier: 3, curingEfficiency: 0.5 });
    expect(cloneElementState(state).parameters).toEqual(state.parameters);
    const restored = deserialiseElementState(
      JSON.parse(JSON.stringify(serialiseElementState(state))),
      model.grid.cellCount,
    );
    expect(restored.parameters).toEqual({
      permeabilityMultiplier: 3,
      exposureMultiplier: 1,
      curingEfficiency: 0.5,
    });
  });
});
