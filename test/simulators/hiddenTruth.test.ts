/**
 * One suite over both implementations of HiddenTruth (the engine truth and the stand-in): the
 * contract the probe strings rely on. Cases that only the engine can meet are in
 * engineTruth.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { createEngineTruth } from '../../simulators/src/engineTruth.ts';
import type { HiddenTruth, TruthWeather } from '../../simulators/src/hiddenTruth.ts';
import { probeDepthsMm } from '../../simulators/src/playScenario.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { createStandInTruth } from '../../simulators/src/standInTruth.ts';

const { scenario } = loadScenarioFolder('level3-topping');
const placedMs = Date.parse(scenario.truth.placedAt);
const dryWindyAfternoon: TruthWeather = {
  airTemperatureC: 33,
  relativeHumidityPercent: 25,
  windAtMastMS: 7,
  mastHeightM: 2,
  solarWm2: 800,
  rainMmH: 0,
};
const IMPLEMENTATIONS: [string, () => HiddenTruth][] = [
  ['engine truth', () => createEngineTruth(scenario.truth, probeDepthsMm(scenario))],
  ['stand-in truth', () => createStandInTruth(scenario.truth, probeDepthsMm(scenario))],
];

describe.each(IMPLEMENTATIONS)('%s', (_name, create) => {
  it('starts saturated at placement, at the placement temperature', () => {
    const truth = create();
    expect(truth.timeMs).toBe(placedMs);
    for (const depthMm of [0, 5, 35]) {
      expect(truth.relativeHumidityPercentAt(depthMm)).toBeCloseTo(100, 6);
      expect(truth.temperatureCAt(depthMm)).toBeCloseTo(scenario.truth.placementTemperatureC, 9);
    }
  });

  it('advances to the time asked and ignores a time in its past', () => {
    const truth = create();
    truth.advanceTo(placedMs + 3_600_000, dryWindyAfternoon, []);
    expect(truth.timeMs).toBe(placedMs + 3_600_000);
    const before = truth.relativeHumidityPercentAt(0);
    truth.advanceTo(placedMs, dryWindyAfternoon, []);
    expect(truth.timeMs).toBe(placedMs + 3_600_000);
    expect(truth.relativeHumidityPercentAt(0)).toBe(before);
  });

  it('keeps RH within 0..100 %, dries from the surface down, and evaporates under a dry wind', () => {
    const truth = create();
    truth.advanceTo(placedMs + 4 * 3_600_000, dryWindyAfternoon, []);
    const profile = [0, 5, 15, 35].map((depthMm) => truth.relativeHumidityPercentAt(depthMm));
    for (const rh of profile) {
      expect(rh).toBeGreaterThanOrEqual(0);
      expect(rh).toBeLessThanOrEqual(100);
    }
    for (let index = 1; index < profile.length; index += 1) {
      expect(profile[index]).toBeGreaterThanOrEqual((profile[index - 1] as number) - 1e-9);
    }
    expect(truth.evaporationKgM2h()).toBeGreaterThan(0);
  });

  it('warms towards the air plus the sun: surface first, depth later', () => {
    const truth = create();
    truth.advanceTo(placedMs + 20 * 60_000, dryWindyAfternoon, []);
    const surface = truth.temperatureCAt(0);
    expect(surface).toBeGreaterThan(scenario.truth.placementTemperatureC);
    expect(truth.temperatureCAt(35)).toBeLessThan(surface);
  });

  it('a wet covering stops the evaporation', () => {
    const truth = create();
    truth.advanceTo(placedMs + 3_600_000, dryWindyAfternoon, [
      { kind: 'wet-covering', startMs: placedMs },
    ]);
    expect(truth.evaporationKgM2h()).toBe(0);
  });
});
