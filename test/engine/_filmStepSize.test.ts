import { describe, expect, it } from 'vitest';
import { nextFilmTrialS } from '../../server/src/engine/_filmStepSize.ts';

// A film step's water follows need = c t^alpha; the search must land on the target in one trial
// when two trials pin the power law down, and stay inside the bracket it has found otherwise.
const powerLaw = (coefficient: number, exponent: number) => (stepS: number) => ({
  stepS,
  needKgM2: coefficient * stepS ** exponent,
});

describe('nextFilmTrialS()', () => {
  it.each([
    ['square-root sorption', 0.013, 0.5],
    ['linear start', 2, 1],
    ['faster than linear', 3, 1.2],
  ])('finds the step of an exact power law (%s) from a short and a long trial', (_l, c, a) => {
    const need = powerLaw(c, a);
    const targetKgM2 = 1e-3;
    const exactS = (targetKgM2 / c) ** (1 / a);
    const stepS = nextFilmTrialS(need(exactS / 7), need(exactS * 30), null, targetKgM2);
    expect(Math.abs(stepS / exactS - 1)).toBeLessThan(1e-12);
  });

  it('finds it from two long trials when no short one is known', () => {
    const need = powerLaw(0.013, 0.5);
    const exactS = (1e-3 / 0.013) ** 2;
    const stepS = nextFilmTrialS(need(0), need(exactS * 10), need(exactS * 600), 1e-3);
    expect(Math.abs(stepS / exactS - 1)).toBeLessThan(1e-12);
  });

  it('from one long trial assumes an exponent of 0.75 (our assumption)', () => {
    const stepS = nextFilmTrialS(
      { stepS: 0, needKgM2: 0 },
      { stepS: 600, needKgM2: 6 },
      null,
      6e-3,
    );
    expect(Math.abs(stepS / (600 * 1e-3 ** (1 / 0.75)) - 1)).toBeLessThan(1e-12);
  });

  it('stays inside the bracket when the interpolation leaves it', () => {
    // Need falling with step length (bleeding outpacing evaporation): the fit points outside.
    const short = { stepS: 1, needKgM2: 2e-3 };
    const long = { stepS: 4, needKgM2: 1e-3 };
    expect(nextFilmTrialS(short, long, null, 1.5e-3)).toBeCloseTo(2, 12);
    expect(nextFilmTrialS({ stepS: 0, needKgM2: 0 }, long, null, 5e-3)).toBeCloseTo(0.4, 12);
  });
});
