/**
 * The outlook's forecast inputs and output times (physics.md 9): a supplied forecast point
 * overrides persistence from its time on, field by field; wind at the mast goes to 0.5 m by the
 * log profile (physics/windProfile.ts); the measure log acts at each step.
 */
import { describe, expect, it } from 'vitest';
import { createRunModel } from '../../server/src/live/runModel.ts';
import { forecastInputs, outlookOffsetsS } from '../../server/src/live/outlook.ts';
import type { OutlookRequest } from '../../server/src/live/outlook.ts';
import { parseRunConfig } from '../../server/src/config/index.ts';
import { windSpeedAtUnoHeight } from '../../server/src/physics/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const folder = loadScenarioFolder('level3-topping');
const request: OutlookRequest = {
  model: createRunModel(parseRunConfig(folder.runConfigInput), 10).model,
  members: [],
  placedMs: 0,
  startMs: 1_000_000,
  horizonS: 3600,
  stepS: 600,
  persistence: {
    airTemperatureK: 300,
    relativeHumidity: 0.4,
    windMS: 2,
    surfaceTemperatureK: 302,
  },
  forecast: [
    { timeMs: 1_600_000, relativeHumidityPercent: 80 },
    { timeMs: 2_200_000, windSpeedMs: 8, airTemperatureC: 20 },
  ],
  mastHeightM: 2,
  measures: [{ kind: 'windbreak', startMs: 1_500_000 }],
  thresholds: [1],
};

describe('forecastInputs()', () => {
  it.each([
    { atMs: 1_000_000, air: 300, rh: 0.4, wind: 2, measures: 0 },
    { atMs: 1_600_000, air: 300, rh: 0.8, wind: 2, measures: 1 },
    { atMs: 2_500_000, air: 293.15, rh: 0.4, wind: windSpeedAtUnoHeight(8, 2), measures: 1 },
  ])('at $atMs ms: air $air K, RH $rh, wind $wind m/s', ({ atMs, air, rh, wind, measures }) => {
    const inputs = forecastInputs(request, atMs);
    expect(inputs.airTemperatureK).toBeCloseTo(air, 10);
    expect(inputs.relativeHumidity).toBeCloseTo(rh, 12);
    expect(inputs.windMS).toBeCloseTo(wind, 12);
    expect(inputs.surfaceTemperatureK).toBe(302);
    expect(inputs.activeMeasures?.length ?? 0).toBe(measures);
  });
});

describe('outlookOffsetsS()', () => {
  it.each([
    { horizonS: 3600, stepS: 600, count: 7, last: 3600 },
    { horizonS: 1000, stepS: 600, count: 3, last: 1000 },
  ])('$horizonS s in steps of $stepS s ends at the horizon', ({ horizonS, stepS, count, last }) => {
    const offsets = outlookOffsetsS(horizonS, stepS);
    expect(offsets[0]).toBe(0);
    expect(offsets).toHaveLength(count);
    expect(offsets.at(-1)).toBe(last);
  });
});
