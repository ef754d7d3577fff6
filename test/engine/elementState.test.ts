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
