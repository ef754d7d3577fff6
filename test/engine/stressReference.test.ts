import { describe, expect, it } from 'vitest';
import { elementMaterialFromPreset } from '../../server/src/engine/elementMaterial.ts';
import { evaluateElement } from '../../server/src/engine/elementFigures.ts';
import type { ElementModel } from '../../server/src/engine/elementModel.ts';
import type { ElementState } from '../../server/src/engine/elementState.ts';
import { loadMaterialPreset } from '../../server/src/engine/materialPreset.ts';
import { surfaceHasSet } from '../../server/src/engine/stressReference.ts';
import { dryingStressFromEquivalentPressure } from '../../server/src/physics/dryingStress.ts';
import { HOUR_S, measure, modelOf, run, steadyWeather } from './_scenarios.ts';

// An invented site: a 50 mm fine mortar topping placed at 30 degC, 40 % RH, 18 km/h of wind.
const INPUTS = {
  airTemperatureK: 303.15,
  relativeHumidity: 0.4,
  windMS: 5,
  surfaceTemperatureK: 303.15,
};
const DAY_S = 86400;

/** Advances in 10 s intervals until the state has recorded its stress reference. */
function advanceToSet(model: ElementModel, state: ElementState, limitS: number): void {
  while (state.stressReferencePa === null && state.transport.timeS < limitS) {
    model.advanceTo(state, state.transport.timeS + 10, INPUTS);
  }
}

const maxAbs = (values: readonly number[]): number =>
  values.reduce((largest, value) => Math.max(largest, Math.abs(value)), 0);

describe('surfaceHasSet()', () => {
  const mortar = elementMaterialFromPreset(loadMaterialPreset('cement-mortar-fine'));
  const stone = elementMaterialFromPreset(loadMaterialPreset('building-stone-coarse'));
  const finalSetS = (mortar.mix?.setting.finalSetEquivalentAgeDays ?? Number.NaN) * DAY_S;

  it.each([
    ['a mix before final set', mortar, 0.5 * finalSetS, false],
    ['a mix exactly at final set (the phase is still plastic)', mortar, finalSetS, false],
    ['a mix after final set', mortar, 1.01 * finalSetS, true],
    ['a mix at NaN age', mortar, Number.NaN, false],
    ['a material without a mix, at placement', stone, 0, true],
  ] as const)('%s: %s', (_label, material, ageS, expected) => {
    expect(surfaceHasSet(material, ageS)).toBe(expected);
  });
});

describe('drying stress counted from final set (the default reference)', () => {
  const model = modelOf('cement-mortar-fine', 0.05);

  it('is zero at every depth before final set, while the plastic-phase suction grows', () => {
    const state = model.initialState(303.15);
    model.advanceTo(state, 2 * HOUR_S, INPUTS);
    const figures = evaluateElement(model, state);
    expect(figures.phase).toBe('plastic');
    expect(figures.surfaceLiquidPressurePa).toBeLessThan(-1e5);
    expect(maxAbs(figures.profiles.stressPa)).toBe(0);
    expect(figures.stressReferenceTimeS).toBeNaN();
  });

  it('is zero at every depth at the moment of set and grows with the drying after it', () => {
    const state = model.initialState(303.15);
    advanceToSet(model, state, 8 * HOUR_S);
    const atSet = evaluateElement(model, state);
    expect(atSet.phase).toBe('hardening');
    expect(atSet.stressReference).toBe('final-set');
    // Recorded within the last 10 s interval.
    expect(atSet.stressReferenceTimeS).toBeGreaterThan(state.transport.timeS - 10 - 1e-9);
    expect(atSet.stressReferenceTimeS).toBeLessThanOrEqual(state.transport.timeS);
    const setS = state.transport.timeS;
    const later = [0.25, 0.5, 1].map((hours) => {
      model.advanceTo(state, setS + hours * HOUR_S, INPUTS);
      return evaluateElement(model, state).surfaceStressPa;
    });
    // Tolerance: at most 10 s of drying since the record, against an hour of it (our choice).
    expect(maxAbs(atSet.profiles.stressPa)).toBeLessThan(1e-2 * (later[2] ?? Number.NaN));
    for (let k = 1; k < later.length; k += 1) {
      expect(later[k]).toBeGreaterThan(later[k - 1] ?? Number.NaN);
    }
    expect(later[0]).toBeGreaterThan(0);
  });

  it('after set is the stress of the increment pi - pi_set (linear in pi: S[pi] - S[pi_set])', () => {
    const state = model.initialState(303.15);
    advanceToSet(model, state, 8 * HOUR_S);
    const reference = Array.from(state.stressReferencePa ?? []);
    model.advanceTo(state, state.transport.timeS + HOUR_S, INPUTS);
    const figures = evaluateElement(model, state);
    const options = {
      mode: 'flat' as const,
      restraintDegree: 1,
      biotCoefficient: model.material.biotCoefficient,
      poissonRatio: model.material.poissonRatio,
      relaxationFactor: model.material.relaxationFactor,
    };
    const profile = { depthsM: figures.profiles.depthM, weightsM: Array.from(model.grid.widthsM) };
    const now = dryingStressFromEquivalentPressure(
      profile,
      figures.profiles.equivalentPorePressurePa,
      options,
    ).stressesPa;
    const atSet = dryingStressFromEquivalentPressure(profile, reference, options).stressesPa;
    const scale = maxAbs(now);
    figures.profiles.stressPa.forEach((stress, i) => {
      expect(Math.abs(stress - ((now[i] as number) - (atSet[i] as number)))).toBeLessThan(
        1e-12 * scale,
      );
    });
  });
});

describe('the placement reference reproduces the stress counted from placement', () => {
  it('placement: the stress is the section 5 function of the current pi profile, exactly', () => {
    const model = modelOf('normal-concrete', 0.1, 'one-face', {}, { stressReference: 'placement' });
    const result = run(model, steadyWeather(30, 0.4, 5), 8, [], [2, 5, 8]);
    expect(result.profiles.length).toBe(3);
    for (const { profiles } of result.profiles) {
      const expected = dryingStressFromEquivalentPressure(
        { depthsM: profiles.depthM, weightsM: Array.from(model.grid.widthsM) },
        profiles.equivalentPorePressurePa,
        {
          mode: 'flat',
          restraintDegree: 1,
          biotCoefficient: model.material.biotCoefficient,
          poissonRatio: model.material.poissonRatio,
          relaxationFactor: model.material.relaxationFactor,
        },
      );
      expect(profiles.stressPa).toEqual(expected.stressesPa);
    }
  });

  it('the reference changes the stress only: moisture, strength and phase are the same', () => {
    const runWith = (stressReference: 'final-set' | 'placement') =>
      run(
        modelOf('normal-concrete', 0.1, 'one-face', {}, { stressReference }),
        steadyWeather(30, 0.4, 5),
        8,
      );
    const fromSet = runWith('final-set');
    const fromPlacement = runWith('placement');
    expect(fromSet.waterLossKgM2).toBe(fromPlacement.waterLossKgM2);
    expect(
      fromSet.series.map((f) => [f.phase, f.surfaceSaturation, f.surfaceTensileStrengthPa]),
    ).toEqual(
      fromPlacement.series.map((f) => [f.phase, f.surfaceSaturation, f.surfaceTensileStrengthPa]),
    );
    // The plastic-phase utilization (suction) does not depend on the reference either.
    const plastic = (result: typeof fromSet) =>
      result.series.filter((f) => f.phase === 'plastic').map((f) => f.utilization);
    expect(plastic(fromSet)).toEqual(plastic(fromPlacement));
  });

  it.each([
    ['a material without a mix (stone) carries stress from placement', 'building-stone-coarse', []],
    [
      'a surface held wet until after set has pi_set = 0 (saturated)',
      'cement-mortar-fine',
      [measure('wet-covering', 0, 6)],
    ],
  ] as const)('both references agree when %s', (_label, presetId, measures) => {
    const runWith = (stressReference: 'final-set' | 'placement') =>
      run(
        modelOf(presetId, 0.05, 'one-face', {}, { stressReference }),
        steadyWeather(35, 0.3, 8),
        12,
        measures,
      );
    const fromSet = runWith('final-set').series.map((f) => f.surfaceStressPa);
    const fromPlacement = runWith('placement').series.map((f) => f.surfaceStressPa);
    expect(Math.max(...fromPlacement)).toBeGreaterThan(0);
    fromSet.forEach((stress, i) => {
      expect(Math.abs(stress - (fromPlacement[i] as number))).toBeLessThanOrEqual(
        1e-9 * Math.max(...fromPlacement),
      );
    });
  });
});
