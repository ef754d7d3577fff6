/**
 * forecastModel(): the forecast step of a live member, and its model error (the random walk of
 * the exposure multiplier, engineOptions.ts). Real element model (20 cells, the level3-topping
 * run configuration) and the real seeded generator; one 5-minute interval of hot dry weather.
 */
import { describe, expect, it } from 'vitest';
import { createEnsembleRandom } from '../../server/src/calibration/index.ts';
import type { BoundaryInputs } from '../../server/src/engine/index.ts';
import {
  PARAMETER_INDEX,
  forecastModel,
  initialMemberFactory,
} from '../../server/src/live/memberModel.ts';
import { createRunModel } from '../../server/src/live/runModel.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const { model } = createRunModel(loadScenarioFolder('level3-topping').runConfig, 20);
const inputs: BoundaryInputs = {
  airTemperatureK: 305,
  relativeHumidity: 0.35,
  windMS: 3,
  surfaceTemperatureK: 306,
};
// permeability, exposure, curing efficiency, initial bleed film, one RH bias
const PARAMETERS = Float64Array.from([1, 1.2, 0.7, 0.2, 0]);
const member = () => initialMemberFactory(model, 300)(0, PARAMETERS, createEnsembleRandom(1));
const STEP_S = 300;

describe('forecastModel()', () => {
  it('without a walk keeps every parameter and draws nothing from the generator', () => {
    const random = createEnsembleRandom(7);
    const advanced = forecastModel(model, () => inputs).advance(member(), 0, STEP_S, random);
    expect(Array.from(advanced.parameters)).toEqual(Array.from(PARAMETERS));
    expect(random.normal()).toBe(createEnsembleRandom(7).normal());
  });

  it('leaves the member it was given unchanged', () => {
    const start = member();
    const before = JSON.stringify({ p: Array.from(start.parameters), s: Array.from(start.state) });
    forecastModel(model, () => inputs, 0.1).advance(start, 0, STEP_S, createEnsembleRandom(3));
    expect(JSON.stringify({ p: Array.from(start.parameters), s: Array.from(start.state) })).toBe(
      before,
    );
  });

  it.each([
    { perSqrtH: 0.1, stepS: 300 },
    { perSqrtH: 0.3, stepS: 900 },
  ])(
    'with a walk of $perSqrtH per sqrt(h) steps ln(exposure) by sd s sqrt(dt / 1 h) ($stepS s), other parameters kept',
    ({ perSqrtH, stepS }) => {
      const random = createEnsembleRandom(11);
      const step = forecastModel(model, () => inputs, perSqrtH);
      const start = member();
      const logSteps: number[] = [];
      // 400 draws: the sample sd of normal steps lies within 10 % of the true sd with
      // probability above 0.95 (chi-square with 399 degrees of freedom); the seed is fixed.
      for (let k = 0; k < 400; k += 1) {
        const advanced = step.advance(start, 0, stepS, random);
        const exposure = advanced.parameters[PARAMETER_INDEX.exposureMultiplier] as number;
        expect(advanced.carried.parameters.exposureMultiplier).toBe(exposure);
        expect(advanced.parameters[PARAMETER_INDEX.permeabilityMultiplier]).toBe(1);
        logSteps.push(Math.log(exposure / 1.2));
      }
      const mean = logSteps.reduce((sum, x) => sum + x, 0) / logSteps.length;
      const sd = Math.sqrt(
        logSteps.reduce((sum, x) => sum + (x - mean) ** 2, 0) / (logSteps.length - 1),
      );
      const expectedSd = perSqrtH * Math.sqrt(stepS / 3600);
      expect(Math.abs(mean)).toBeLessThan((3 * expectedSd) / Math.sqrt(logSteps.length));
      expect(sd / expectedSd).toBeGreaterThan(0.9);
      expect(sd / expectedSd).toBeLessThan(1.1);
    },
  );

  it('a walked member dries at its new exposure: a higher multiplier loses more water', () => {
    const random = createEnsembleRandom(5);
    const step = forecastModel(model, () => inputs, 0.5);
    const start = member();
    const runs = Array.from({ length: 6 }, () => step.advance(start, 0, 600, random));
    const byExposure = runs
      .map((run) => ({
        exposure: run.parameters[PARAMETER_INDEX.exposureMultiplier] as number,
        film: run.carried.bleedFilmKgM2,
      }))
      .sort((a, b) => a.exposure - b.exposure);
    for (let i = 1; i < byExposure.length; i += 1) {
      expect(byExposure[i]?.film).toBeLessThanOrEqual(byExposure[i - 1]?.film as number);
    }
    expect(byExposure.at(-1)?.film).toBeLessThan(byExposure[0]?.film as number);
  });
});
