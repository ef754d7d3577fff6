import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkUtilizationThresholds,
  classifyUtilization,
  DEFAULT_UTILIZATION_THRESHOLDS,
  hardeningUtilization,
  plasticUtilization,
  riskFigures,
  type UtilizationState,
} from '../../server/src/physics/utilization.ts';

describe('plasticUtilization()', () => {
  it.each([
    // suction over critical suction (physics.md 7): 15 kPa of 30 kPa is half way.
    [-15_000, 30_000, 0.5],
    [-30_000, 30_000, 1],
    [0, 30_000, 0],
    [2_000, 30_000, -2_000 / 30_000],
  ])('p = %d Pa with p_crit %d Pa gives %f', (pressure, critical, expected) => {
    expect(plasticUtilization(pressure, critical)).toBeCloseTo(expected, 14);
  });

  it('is NaN for a non-positive or NaN critical suction', () => {
    expect(plasticUtilization(-1000, 0)).toBeNaN();
    expect(plasticUtilization(-1000, -5)).toBeNaN();
    expect(plasticUtilization(-1000, Number.NaN)).toBeNaN();
    expect(plasticUtilization(Number.NaN, 20_000)).toBeNaN();
  });

  it('rises with suction (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e7, max: 0, noNaN: true }),
        fc.double({ min: -1e7, max: 0, noNaN: true }),
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        (a, b, critical) => {
          const [wetter, drier] = a >= b ? [a, b] : [b, a];
          expect(plasticUtilization(wetter, critical)).toBeLessThanOrEqual(
            plasticUtilization(drier, critical),
          );
        },
      ),
    );
  });
});

describe('hardeningUtilization()', () => {
  it.each([
    // sigma_s, fct, U, margin (physics.md 7; hand-computed)
    [1.5e6, 3e6, 0.5, 1.5e6],
    [3e6, 3e6, 1, 0],
    [4e6, 2e6, 2, -2e6],
    [-1e6, 2e6, -0.5, 3e6],
  ])('sigma %d Pa over fct %d Pa gives U %f, margin %d Pa', (stress, strength, u, margin) => {
    const result = hardeningUtilization(stress, strength);
    expect(result.utilization).toBeCloseTo(u, 14);
    expect(result.marginPa).toBeCloseTo(margin, 6);
  });

  it('is NaN for a non-positive strength', () => {
    expect(hardeningUtilization(1e6, 0).utilization).toBeNaN();
    expect(hardeningUtilization(1e6, -1).utilization).toBeNaN();
  });

  it('rises with stress and the margin falls (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e7, max: 1e7, noNaN: true }),
        fc.double({ min: -1e7, max: 1e7, noNaN: true }),
        fc.double({ min: 1e3, max: 1e8, noNaN: true }),
        (a, b, strength) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          const lower = hardeningUtilization(low, strength);
          const higher = hardeningUtilization(high, strength);
          expect(lower.utilization).toBeLessThanOrEqual(higher.utilization);
          expect(lower.marginPa).toBeGreaterThanOrEqual(higher.marginPa);
        },
      ),
    );
  });
});

describe('classifyUtilization()', () => {
  // Defaults 0.57, 0.69, 1.0: cracking index 1.75, 1.45, 1.0 (JCI guideline, from memory).
  it('has defaults that are the reciprocals of cracking indices 1.75 and 1.45, rounded to 0.01', () => {
    expect(DEFAULT_UTILIZATION_THRESHOLDS.firstUtilization).toBeCloseTo(1 / 1.75, 2);
    expect(DEFAULT_UTILIZATION_THRESHOLDS.secondUtilization).toBeCloseTo(1 / 1.45, 2);
    expect(DEFAULT_UTILIZATION_THRESHOLDS.crackingUtilization).toBe(1);
  });

  it.each([
    [-0.3, 'below-first-threshold'],
    [0, 'below-first-threshold'],
    [0.5699, 'below-first-threshold'],
    [0.57, 'first-threshold-reached'],
    [0.6899, 'first-threshold-reached'],
    [0.69, 'second-threshold-reached'],
    [0.9999, 'second-threshold-reached'],
    [1, 'cracking-threshold-reached'],
    [7, 'cracking-threshold-reached'],
    [Number.POSITIVE_INFINITY, 'cracking-threshold-reached'],
    [Number.NaN, 'unknown'],
  ] as [number, UtilizationState][])('U = %f is %s', (u, state) => {
    expect(classifyUtilization(u)).toBe(state);
  });

  it('uses configured thresholds', () => {
    const thresholds = { firstUtilization: 0.4, secondUtilization: 0.6, crackingUtilization: 0.9 };
    expect(classifyUtilization(0.5, thresholds)).toBe('first-threshold-reached');
    expect(classifyUtilization(0.95, thresholds)).toBe('cracking-threshold-reached');
  });

  it('never moves down as U rises (property)', () => {
    const order: UtilizationState[] = [
      'below-first-threshold',
      'first-threshold-reached',
      'second-threshold-reached',
      'cracking-threshold-reached',
    ];
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        (a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          expect(order.indexOf(classifyUtilization(low))).toBeLessThanOrEqual(
            order.indexOf(classifyUtilization(high)),
          );
        },
      ),
    );
  });
});

describe('checkUtilizationThresholds()', () => {
  it('accepts the defaults', () => {
    expect(checkUtilizationThresholds(DEFAULT_UTILIZATION_THRESHOLDS)).toEqual([]);
  });

  it('names the field, the rule and the value', () => {
    expect(
      checkUtilizationThresholds({
        firstUtilization: 0.7,
        secondUtilization: 0.6,
        crackingUtilization: Number.NaN,
      }),
    ).toEqual([
      'thresholds crackingUtilization must be a finite number above 0: got NaN',
      'thresholds secondUtilization must be above firstUtilization (0.7): got 0.6',
      'thresholds crackingUtilization must be above secondUtilization (0.6): got NaN',
    ]);
  });
});

describe('riskFigures()', () => {
  it('reports the plastic phase with a NaN margin', () => {
    const figures = riskFigures({
      phase: 'plastic',
      surfacePressurePa: -24_000,
      criticalSuctionPa: 30_000,
    });
    expect(figures.phase).toBe('plastic');
    expect(figures.utilization).toBeCloseTo(0.8, 14);
    expect(figures.marginPa).toBeNaN();
    expect(figures.state).toBe('second-threshold-reached');
  });

  it('reports the hardening phase with its margin', () => {
    const figures = riskFigures({
      phase: 'hardening',
      surfaceStressPa: 0.5e6,
      tensileStrengthPa: 1e6,
    });
    expect(figures).toEqual({
      phase: 'hardening',
      utilization: 0.5,
      marginPa: 0.5e6,
      state: 'below-first-threshold',
    });
  });
});
