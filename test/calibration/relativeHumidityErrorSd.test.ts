import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  RH_CLASS_2_PERCENT,
  RH_CLASS_3_PERCENT,
  relativeHumidityErrorSd,
} from '../../server/src/calibration/relativeHumidityErrorSd.ts';

// Expected values written out from the stated rule (our assumption, see the source file):
// sd = sqrt((a + e * clamp((h - 0.9) / 0.1, 0, 1))^2 + q^2 / 12), q = 0.001.
const quantisationVariance = 0.001 ** 2 / 12;

describe('relativeHumidityErrorSd()', () => {
  it.each([
    [0.5, RH_CLASS_2_PERCENT, Math.sqrt(0.02 ** 2 + quantisationVariance)],
    [0.9, RH_CLASS_2_PERCENT, Math.sqrt(0.02 ** 2 + quantisationVariance)],
    [0.95, RH_CLASS_2_PERCENT, Math.sqrt(0.03 ** 2 + quantisationVariance)],
    [1.0, RH_CLASS_2_PERCENT, Math.sqrt(0.04 ** 2 + quantisationVariance)],
    [1.04, RH_CLASS_2_PERCENT, Math.sqrt(0.04 ** 2 + quantisationVariance)],
    [0.3, RH_CLASS_3_PERCENT, Math.sqrt(0.03 ** 2 + quantisationVariance)],
    [0.975, RH_CLASS_3_PERCENT, Math.sqrt(0.045 ** 2 + quantisationVariance)],
  ])('at h = %s gives the class value', (h, sensorClass, expected) => {
    expect(relativeHumidityErrorSd(h, sensorClass)).toBeCloseTo(expected, 12);
  });

  it('never falls as humidity rises (widened near saturation)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -0.1, max: 1.1, noNaN: true }),
        fc.double({ min: -0.1, max: 1.1, noNaN: true }),
        (a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          return relativeHumidityErrorSd(low) <= relativeHumidityErrorSd(high);
        },
      ),
    );
  });

  it('returns NaN for a missing reading', () => {
    expect(relativeHumidityErrorSd(Number.NaN)).toBeNaN();
  });
});
