import { describe, expect, it } from 'vitest';
import {
  LOG_SUCTION,
  transformObservation,
  transformObservationErrorSd,
} from '../../server/src/calibration/observationTransform.ts';

// Kelvin equation: suction s = -(rho_w R T / M_w) ln h, so ln s = const + ln(-ln h)
// (physics.md section 2). Expected values written out by hand from ln(-ln h).
describe('transformObservation()', () => {
  it.each([
    [0.8, Math.log(-Math.log(0.8))],
    [0.5, Math.log(Math.log(2))],
    [0.995, Math.log(-Math.log(0.995))],
    [0.999, Math.log(-Math.log(0.995))], // capped
    [1.02, Math.log(-Math.log(0.995))], // condensation reading, capped
    [0.001, Math.log(-Math.log(0.01))], // floored
  ])('log suction of h = %s', (h, expected) => {
    expect(transformObservation(LOG_SUCTION, h)).toBeCloseTo(expected, 12);
  });

  it('orders like suction: drier pores, larger log suction', () => {
    expect(transformObservation(LOG_SUCTION, 0.7)).toBeGreaterThan(
      transformObservation(LOG_SUCTION, 0.9),
    );
  });

  it('leaves relative humidity as it is', () => {
    expect(transformObservation({ kind: 'relative-humidity' }, 0.83)).toBe(0.83);
  });
});

describe('transformObservationErrorSd()', () => {
  it.each([0.6, 0.85, 0.97])(
    'equals the delta method with a central difference slope at h = %s',
    (h) => {
      const step = 1e-6;
      const slope =
        (transformObservation(LOG_SUCTION, h + step) -
          transformObservation(LOG_SUCTION, h - step)) /
        (2 * step);
      expect(transformObservationErrorSd(LOG_SUCTION, h, 0.02)).toBeCloseTo(
        0.02 * Math.abs(slope),
        6,
      );
    },
  );

  it('is large near saturation (a saturated reading says little about suction)', () => {
    expect(transformObservationErrorSd(LOG_SUCTION, 1, 0.02)).toBeGreaterThan(3);
  });
});
