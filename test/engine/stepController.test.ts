import { describe, expect, it } from 'vitest';
import { createWorkspace } from '../../server/src/engine/implicitStep.ts';
import { advanceTransport } from '../../server/src/engine/stepController.ts';
import { HOUR_S, modelOf } from './_scenarios.ts';

// The mixed form of physics.md section 3 conserves the water each cell holds; when a cell's
// curves change between steps (hydration refines its pores), the next step's balance must count
// from the water the cell held, not from the water its old pressure gives on the new curves.
describe('advanceTransport() hooks.heldWater', () => {
  /** A drying mortar, then half its cells refined by 5 % before 10 min more of drying. */
  const refinedRun = (withHeldWater: boolean) => {
    const model = modelOf('cement-mortar-fine', 0.05);
    const state = model.initialState(293.15);
    model.advanceTo(state, HOUR_S, {
      airTemperatureK: 303.15,
      relativeHumidity: 0.4,
      windMS: 4,
      surfaceTemperatureK: 303.15,
    });
    model.applyState(state);
    const { grid, hydraulics } = model;
    const n = grid.cellCount;
    const held = new Float64Array(n);
    hydraulics.waterContents(state.transport.pressurePa, held);
    const heldBeforeM = held.reduce((sum, theta, i) => sum + theta * (grid.widthsM[i] ?? 0), 0);
    for (let i = 0; i < n; i += 2) {
      hydraulics.rescaleCell(
        i,
        0.95 * (hydraulics.diameterScale[i] ?? 1),
        hydraulics.specificStoragePerPa[i] ?? 0,
      );
    }
    const transport = { ...state.transport, pressurePa: state.transport.pressurePa.slice() };
    const inflowBeforeM = transport.surfaceInflowM;
    advanceTransport(
      grid,
      hydraulics,
      createWorkspace(n),
      transport,
      HOUR_S + 600,
      () => ({ kind: 'outflow', volumeFluxMs: () => 1e-7 }),
      {},
      withHeldWater ? { heldWater: held } : {},
    );
    let heldAfterM = 0;
    for (let i = 0; i < n; i += 1) {
      heldAfterM +=
        (grid.widthsM[i] ?? 0) * hydraulics.waterContentAt(i, transport.pressurePa[i] ?? 0);
    }
    const crossedM = transport.surfaceInflowM - inflowBeforeM;
    const lastStepWater = new Float64Array(n);
    hydraulics.waterContents(transport.pressurePa, lastStepWater);
    return {
      defect: Math.abs(heldAfterM - heldBeforeM - crossedM) / Math.abs(crossedM),
      held,
      lastStepWater,
    };
  };

  it('keeps the water the cells held through a change of their curves (balance to 1e-8 of the water crossed)', () => {
    expect(refinedRun(true).defect).toBeLessThan(1e-8);
  });

  it('without it, the change of curves shows as water gained or lost (the hook is what keeps it)', () => {
    expect(refinedRun(false).defect).toBeGreaterThan(1e-3);
  });

  it('leaves in heldWater the water of the last accepted step, on its curves', () => {
    const { held, lastStepWater } = refinedRun(true);
    expect(Array.from(held)).toEqual(Array.from(lastStepWater));
  });
});
