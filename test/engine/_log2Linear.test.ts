import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  exp2Linear,
  log2Linear,
  log2LinearOfAny,
  log2LinearSlopeFactor,
} from '../../server/src/engine/_log2Linear.ts';

describe('log2Linear()', () => {
  it('equals log2 at every normal power of two', () => {
    for (let exponent = -1022; exponent <= 1023; exponent += 1) {
      expect(log2Linear(2 ** exponent)).toBe(exponent);
    }
  });

  it('is linear in x between powers of two: e + (m - 1)', () => {
    expect(log2Linear(3)).toBe(1.5);
    expect(log2Linear(0.75)).toBe(-0.5);
    expect(log2Linear(1e6)).toBeCloseTo(19 + (1e6 / 2 ** 19 - 1), 14);
  });

  it('stays within 0 and 0.0861 below log2 (max of log2(m) - (m - 1) at m = 1 / ln 2)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-300, max: 1e300, noNaN: true }), (x) => {
        const gap = Math.log2(x) - log2Linear(x);
        expect(gap).toBeGreaterThanOrEqual(-1e-12);
        expect(gap).toBeLessThanOrEqual(0.0861);
      }),
    );
  });

  it('never decreases (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-300, max: 1e300, noNaN: true }),
        fc.double({ min: 1e-300, max: 1e300, noNaN: true }),
        (a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          expect(log2Linear(low)).toBeLessThanOrEqual(log2Linear(high));
        },
      ),
    );
  });

  it('exp2Linear() inverts it to 1e-13 relative over the normal range (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-300, max: 1e300, noNaN: true }), (x) => {
        expect(Math.abs(exp2Linear(log2Linear(x)) / x - 1)).toBeLessThan(1e-13);
      }),
    );
  });

  it('log2LinearSlopeFactor() is d log2Linear / d ln x (centred difference)', () => {
    for (const x of [1.1, 1.9, 3, 1e-3, 4.2e5, 7.7e8]) {
      const h = 1e-7;
      const slope = (log2Linear(x * Math.exp(h)) - log2Linear(x * Math.exp(-h))) / (2 * h);
      expect(log2LinearSlopeFactor(log2Linear(x))).toBeCloseTo(slope, 5);
    }
  });

  it('log2LinearOfAny() answers NaN, 0, subnormals and Infinity', () => {
    expect(log2LinearOfAny(Number.NaN)).toBeNaN();
    expect(log2LinearOfAny(-1)).toBeNaN();
    expect(log2LinearOfAny(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(log2LinearOfAny(5e-324)).toBe(Number.NEGATIVE_INFINITY);
    expect(log2LinearOfAny(Number.POSITIVE_INFINITY)).toBe(Number.POSITIVE_INFINITY);
    expect(log2LinearOfAny(8)).toBe(3);
  });
});
