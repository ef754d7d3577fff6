/**
 * nowFigures: quantile bands (Hyndman and Fan definition 7, as the calibration core) and the
 * time to a target strength (inverse of the setting-shifted EN 1992-1-1 eq. 3.2 law through
 * ageForInPlaceCompressiveStrengthDays).
 */
import { describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/index.ts';
import { bandPoint, meanAndSd, timeToTargetStrengthH } from '../../server/src/live/nowFigures.ts';
import { createRunModel } from '../../server/src/live/runModel.ts';
import { ageForInPlaceCompressiveStrengthDays } from '../../server/src/physics/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const { model } = createRunModel(
  parseRunConfig(loadScenarioFolder('level3-topping').runConfigInput),
  10,
);

describe('bandPoint()', () => {
  it.each([
    { values: [1, 2, 3, 4, 5], p05: 1.2, p50: 3, p95: 4.8 },
    { values: [Number.NaN, 2, 2], p05: 2, p50: 2, p95: 2 },
  ])('$values', ({ values, p05, p50, p95 }) => {
    const band = bandPoint(values);
    expect(band.p05).toBeCloseTo(p05, 12);
    expect(band.p50).toBeCloseTo(p50, 12);
    expect(band.p95).toBeCloseTo(p95, 12);
  });

  it('is NaN without finite values', () => {
    expect(bandPoint([Number.NaN]).p50).toBeNaN();
  });
});

describe('meanAndSd()', () => {
  it('gives the sample standard deviation (n - 1)', () => {
    const { mean, sd } = meanAndSd([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(mean).toBe(5);
    expect(sd).toBeCloseTo(Math.sqrt(32 / 7), 12);
  });
});

describe('timeToTargetStrengthH()', () => {
  const mix = model.material.mix;
  if (mix === undefined) throw new Error('the normal-concrete preset has a mix');
  const targetAgeS = ageForInPlaceCompressiveStrengthDays(20, mix.strength, mix.setting) * 86_400;

  it.each([
    { ageS: 0, rate: 2, hours: targetAgeS / 2 / 3600 },
    { ageS: targetAgeS / 2, rate: 1, hours: targetAgeS / 2 / 3600 },
    { ageS: targetAgeS * 1.1, rate: 1, hours: 0 },
  ])('from age $ageS s at rate $rate', ({ ageS, rate, hours }) => {
    expect(timeToTargetStrengthH(model, ageS, rate, 20)).toBeCloseTo(hours, 9);
  });

  it('is null when maturity does not progress or the target is never reached', () => {
    expect(timeToTargetStrengthH(model, 0, 0, 20)).toBeNull();
    expect(timeToTargetStrengthH(model, 0, 1, 1e6)).toBeNull();
  });
});
