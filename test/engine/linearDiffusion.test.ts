import { describe, expect, it } from 'vitest';
import crank from './fixtures/crankPlaneSheet.json' with { type: 'json' };
import { buildDepthGrid } from '../../server/src/engine/grid.ts';
import { linearDiffusionHydraulics } from '../../server/src/engine/linearDiffusion.ts';
import { createWorkspace } from '../../server/src/engine/implicitStep.ts';
import { advanceTransport, type TransportState } from '../../server/src/engine/stepController.ts';

// Plane sheet of half-thickness l wetted from C0 = 0 to C1 = 1 at both faces: the two-face
// element (half thickness, symmetry plane) in linear mode with S standing for C.
// Reference: Crank (1975), The Mathematics of Diffusion, 2nd ed., ch. 4, eqs. 4.17 (profile) and
// 4.18 (uptake), evaluated by test/engine/fixtures/crankPlaneSheet.py with 20000 terms.
const halfThicknessM = 0.05;
const diffusivityM2s = 2.5e-7;
const timeScaleS = (halfThicknessM * halfThicknessM) / diffusivityM2s;

function runSheet(cellCount: number, firstCellM: number, maxStepS: number) {
  const grid = buildDepthGrid(halfThicknessM, { cellCount, firstCellM });
  const hydraulics = linearDiffusionHydraulics({ diffusivityM2s, cellCount });
  const workspace = createWorkspace(cellCount);
  const state: TransportState = {
    timeS: 0,
    pressurePa: new Float64Array(cellCount).fill(hydraulics.pressureFromSaturation(0)),
    nextStepS: 1e-3,
    surfaceInflowM: 0,
    storageWaterM: 0,
    massDefectM: 0,
    acceptedSteps: 0,
    rejectedSteps: 0,
  };
  const scratch = new Float64Array(cellCount);
  const results = crank.cases.map((reference) => {
    advanceTransport(
      grid,
      hydraulics,
      workspace,
      state,
      reference.dimensionlessTime * timeScaleS,
      () => ({ kind: 'pressure', pressurePa: 0 }),
      { maxStepS, minStepS: 1e-6, maxStepFractionOfElapsed: 0.005 },
    );
    const saturation = new Float64Array(cellCount);
    hydraulics.evaluate(state.pressurePa, saturation, scratch, scratch.slice());
    saturation.forEach(
      (water, i) => (saturation[i] = hydraulics.saturationFromWaterContent(water)),
    );
    let held = 0;
    for (let i = 0; i < cellCount; i += 1) held += (grid.widthsM[i] ?? 0) * (saturation[i] ?? 0);
    const profileAt = (depthM: number): number => {
      const centres = grid.centresM;
      if (depthM <= (centres[0] ?? 0)) return saturation[0] ?? Number.NaN;
      for (let i = 1; i < cellCount; i += 1) {
        const right = centres[i] ?? 0;
        if (depthM <= right) {
          const left = centres[i - 1] ?? 0;
          const weight = (depthM - left) / (right - left);
          return (1 - weight) * (saturation[i - 1] ?? 0) + weight * (saturation[i] ?? 0);
        }
      }
      return saturation[cellCount - 1] ?? Number.NaN;
    };
    return {
      reference,
      uptake: held / halfThicknessM,
      inflowUptake: state.surfaceInflowM / halfThicknessM,
      profileAt,
    };
  });
  return results;
}

describe('linear-diffusion mode against Crank plane sheet (eqs. 4.17, 4.18)', () => {
  const results = runSheet(160, 2e-5, 60);
  it.each(results.map((result, index) => [result.reference.dimensionlessTime, index] as const))(
    'uptake at Dt/l^2 = %s agrees to 0.5 %%',
    (_time, index) => {
      const result = results[index];
      if (result === undefined) throw new Error(`no result ${index}`);
      const expected = result.reference.relativeUptake;
      expect(Math.abs(result.uptake - expected) / expected).toBeLessThan(0.005);
      expect(Math.abs(result.inflowUptake - expected) / expected).toBeLessThan(0.005);
    },
  );
  it.each(results.map((result, index) => [result.reference.dimensionlessTime, index] as const))(
    'profile at Dt/l^2 = %s agrees to 0.5 %% of C1 - C0',
    (_time, index) => {
      const result = results[index];
      if (result === undefined) throw new Error(`no result ${index}`);
      for (const point of result.reference.profile) {
        const modelValue = result.profileAt(point.depthOverHalfThickness * halfThicknessM);
        expect(
          Math.abs(modelValue - point.relativeConcentration),
          `z/l ${point.depthOverHalfThickness}`,
        ).toBeLessThan(0.005);
      }
    },
  );
});
