import { describe, expect, it } from 'vitest';
import { evaluateElement } from '../../server/src/engine/elementFigures.ts';
import {
  cloneElementState,
  deserialiseElementState,
  serialiseElementState,
  SnapshotError,
  type ElementState,
  type ElementStateSnapshot,
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
    ['another version', { version: 99 }, /snapshot version must be 1 or 2: got 99/],
    [
      'a stress reference of the wrong length',
      { stressReferencePa: [0, 1] },
      /stressReferencePa must have 60 values: got 2/,
    ],
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

describe('stress reference in clones and snapshots (version 2; version 1 still read)', () => {
  const model = modelOf('normal-concrete', 0.1);
  const finalSetS = (model.material.mix?.setting.finalSetEquivalentAgeDays ?? Number.NaN) * 86400;
  // At 30 degC the equivalent age runs ahead of time: the surface sets before finalSetS.
  const beforeSetS = 0.25 * finalSetS;
  const afterSetS = 1.2 * finalSetS;

  /** A version 1 snapshot as the engine wrote it before the stress reference existed. */
  const versionOne = (state: ElementState): ElementStateSnapshot => {
    const snapshot: Partial<ElementStateSnapshot> = { ...serialiseElementState(state), version: 1 };
    delete snapshot.stressReferencePa;
    delete snapshot.stressReferenceTimeS;
    return JSON.parse(JSON.stringify(snapshot)) as ElementStateSnapshot;
  };

  it('serialises as version 2 with the reference, which restores and is copied independently', () => {
    const state = model.initialState();
    model.advanceTo(state, afterSetS, inputs);
    expect(state.stressReferencePa).not.toBeNull();
    const snapshot = JSON.parse(JSON.stringify(serialiseElementState(state)));
    expect(snapshot.version).toBe(2);
    const restored = deserialiseElementState(snapshot, model.grid.cellCount);
    expect(Array.from(restored.stressReferencePa ?? [])).toEqual(
      Array.from(state.stressReferencePa ?? []),
    );
    expect(restored.stressReferenceTimeS).toBe(state.stressReferenceTimeS);
    const copy = cloneElementState(state);
    copy.stressReferencePa?.fill(-1);
    expect(state.stressReferencePa?.[0]).not.toBe(-1);
  });

  it('a version 2 snapshot before set keeps the reference unrecorded (null, NaN time)', () => {
    const state = model.initialState();
    model.advanceTo(state, beforeSetS, inputs);
    const restored = deserialiseElementState(
      JSON.parse(JSON.stringify(serialiseElementState(state))),
      model.grid.cellCount,
    );
    expect(restored.stressReferencePa).toBeNull();
    expect(restored.stressReferenceTimeS).toBeNaN();
  });

  it('a version 1 snapshot taken before set continues exactly like the uninterrupted run', () => {
    const straight = model.initialState();
    model.advanceTo(straight, beforeSetS, inputs);
    const restored = deserialiseElementState(versionOne(straight), model.grid.cellCount);
    expect(restored.stressReferencePa).toBeNull();
    model.advanceTo(straight, afterSetS, inputs);
    model.advanceTo(restored, afterSetS, inputs);
    expect(restored.stressReferenceTimeS).toBe(straight.stressReferenceTimeS);
    expect(evaluateElement(model, restored).profiles.stressPa).toEqual(
      evaluateElement(model, straight).profiles.stressPa,
    );
  });

  it('a version 1 snapshot taken after set counts its stress from placement (reference unknown)', () => {
    const placementModel = modelOf(
      'normal-concrete',
      0.1,
      'one-face',
      {},
      {
        stressReference: 'placement',
      },
    );
    const state = model.initialState();
    model.advanceTo(state, afterSetS, inputs);
    const restored = deserialiseElementState(versionOne(state), model.grid.cellCount);
    expect(restored.stressReferencePa).toBeNull();
    // Before it is advanced, and after: the figures it was computing before the upgrade.
    expect(evaluateElement(model, restored).profiles.stressPa).toEqual(
      evaluateElement(placementModel, restored).profiles.stressPa,
    );
    model.advanceTo(restored, afterSetS + 3600, inputs);
    expect(restored.stressReferenceTimeS).toBeNaN();
    expect(Array.from(restored.stressReferencePa ?? [1])).toEqual(
      new Array(model.grid.cellCount).fill(0),
    );
    const figures = evaluateElement(model, restored);
    expect(figures.surfaceStressPa).toBeCloseTo(
      evaluateElement(placementModel, restored).surfaceStressPa,
      6,
    );
    expect(figures.surfaceStressPa).not.toBe(0);
  });
});
