/**
 * The normal-concrete preset over its first day on a hot summer day (the shared scenario
 * `dailyWeather`: placed at 08:00, air 14 to 30 degC with the concrete 2 degC warmer, 35 to
 * 75 % RH, wind 2 to 7 m/s at 0.5 m; Uno's wet-surface rate peaks near 1.7 kg/m2/h and stays
 * above the ACI 305R precaution threshold of 1.0 kg/m2/h for about 6 h around midday: a harsh
 * day for a pour), 150 mm slab on grade, no curing.
 */
import { describe, expect, it } from 'vitest';
import { dailyWeather, modelOf, run } from '../_scenarios.ts';

const thicknessM = 0.15;
const model = modelOf('normal-concrete', thicknessM);
const result = run(model, dailyWeather(1), 24, [], [24]);
const mixWaterKgM2 = model.material.porosity * thicknessM * model.liquidDensityKgPerM3;
// run() reports every 600 s and simulateElement holds the weather constant between reports, so
// the last step's wet-surface rate of each report is the rate of its whole interval.
const potentialKgM2 = result.series
  .slice(1)
  .reduce((sum, figures) => sum + figures.potentialEvaporationKgM2s * 600, 0);

describe('normal-concrete preset: water lost in the first day (150 mm, hot day, no curing)', () => {
  it('loses no more than the wet-surface evaporation of the day, and less than its mix water (mass bounds)', () => {
    expect(result.waterLossKgM2).toBeGreaterThan(0);
    expect(result.waterLossKgM2).toBeLessThanOrEqual(potentialKgM2 * 1.0001);
    expect(result.waterLossKgM2).toBeLessThan(mixWaterKgM2);
  });

  // KNOWN GAP, kept as a failing expectation (it.fails) so that it turns red, and is then made a
  // plain test, the day the model meets it. Common practice (no published source): a fresh slab's
  // bleeding and surface drying reach the top millimetres to centimetres in its first hours; the
  // concrete below stays practically saturated for days, which is why slabs take weeks to months
  // to dry for floor coverings and why in-slab humidity is measured at 40 % of the depth
  // (ASTM F2170, from memory). Bounds: at most a quarter of the mix water lost in 24 h, and a
  // saturation of at least 0.9 at 40 % of the depth.
  // Today the model loses about the whole wet-surface evaporation of the day (some 14 kg/m2 of
  // the 25 kg/m2 of mix water) and drains the slab almost evenly through its depth (S about 0.5
  // at 60 mm). Why, within physics.md: the fresh saturated permeability (about 1e-14 m2, inside
  // the published range for fresh pastes and consistent with the bleed rate, see the preset)
  // gives a hydraulic diffusivity of some 1e-6 to 1e-5 m2/s near saturation in the plastic
  // phase (k / eta times dp/dtheta), so the whole 150 mm feeds the surface within an hour or
  // so; the capillary bundle keeps the liquid path continuous down to low saturation, so the
  // surface never dries out while the depth holds water; and pore refinement comes after the
  // water is gone. What the model lacks is outside
  // physics.md: a loss of liquid connectivity as the pores drain (a relative permeability that
  // falls faster than the bundle's), the water hydration binds, and a skeleton that keeps
  // consolidating after air entry.
  // Measured (engine of 2 Dec 2026, 60 cells, this scenario): the model loses 14.1 of the 25.5
  // kg/m2 of mix water (0.55) with S = 0.47 at 40 % of the depth. A Mualem (1976) connectivity
  // factor S^L on the bundle's relative permeability (tried by scaling the tabulated k(S); not in
  // the engine) does not close the gap at any plausible L: L = 0.5 (van Genuchten 1980) 14.1
  // kg/m2 and S = 0.48; L = 2: 13.2 and 0.52; L = 5: 9.5 (0.37) and 0.67; L = 10: 6.7 (0.26) and
  // 0.77; even L = 20 leaves S = 0.85 at 40 % (loss 4.6 kg/m2, 0.18) and dries the surface to
  // S = 0 within the day. The water hydration binds (self-desiccation) would lower the saturation
  // at depth further, not raise it, so the remaining gap is the high diffusivity between air entry
  // and moderate saturation of the fresh pores, not the connectivity of the liquid alone.
  it.fails(
    'KNOWN GAP: loses at most a quarter of its mix water and stays practically saturated at 40 % of its depth (common practice)',
    () => {
      expect(result.waterLossKgM2).toBeLessThanOrEqual(0.25 * mixWaterKgM2);
      const profile = result.profiles[0]?.profiles;
      const index = profile?.depthM.findIndex((depthM) => depthM >= 0.4 * thicknessM) ?? -1;
      expect(profile?.saturation[index]).toBeGreaterThanOrEqual(0.9);
    },
  );
});
