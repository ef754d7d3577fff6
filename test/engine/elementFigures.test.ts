import { describe, expect, it } from 'vitest';
import { evaluateElement, evaluateRisk } from '../../server/src/engine/elementFigures.ts';
import { cloneElementState } from '../../server/src/engine/elementState.ts';
import { HOUR_S, dailyWeather, modelOf } from './_scenarios.ts';
import { simulateElement } from '../../server/src/engine/simulateElement.ts';

describe('evaluateRisk()', () => {
  // Presets with and without a mix, both stress references, before and after final set, and
  // an ensemble member's state evaluated on a model another state used last.
  const cases = [
    { presetId: 'normal-concrete', thicknessM: 0.15, config: {} },
    { presetId: 'normal-concrete', thicknessM: 0.15, config: { stressReference: 'placement' } },
    { presetId: 'cement-mortar-fine', thicknessM: 0.03, config: {} },
    { presetId: 'building-stone-coarse', thicknessM: 0.05, config: {} },
  ] as const;

  it.each(cases)(
    'gives the utilization, margin, surface stress and strength of evaluateElement() to the bit ($presetId, $config)',
    ({ presetId, thicknessM, config }) => {
      const model = modelOf(presetId, thicknessM, 'one-face', {}, config);
      const states = [];
      const state = model.initialState();
      for (const hours of [0.5, 3, 7, 12, 20]) {
        simulateElement({
          model,
          initialState: state,
          weather: dailyWeather(1),
          durationS: hours * HOUR_S - state.transport.timeS,
          outputIntervalS: HOUR_S,
        });
        states.push(cloneElementState(state));
      }
      const phases = new Set<string>();
      for (const snapshot of states.reverse()) {
        const risk = evaluateRisk(model, snapshot);
        const figures = evaluateElement(model, snapshot);
        phases.add(risk.phase);
        expect(risk.phase).toBe(figures.phase);
        expect(risk.utilization).toBe(figures.utilization);
        expect(risk.marginPa).toBe(figures.marginPa);
        expect(risk.surfaceStressPa).toBe(figures.surfaceStressPa);
        expect(risk.surfaceTensileStrengthPa).toBe(figures.surfaceTensileStrengthPa);
      }
      if (presetId !== 'building-stone-coarse')
        expect(phases).toEqual(new Set(['plastic', 'hardening']));
    },
  );
});
