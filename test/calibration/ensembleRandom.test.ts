import { describe, expect, it } from 'vitest';
import {
  createEnsembleRandom,
  restoreEnsembleRandom,
} from '../../server/src/calibration/ensembleRandom.ts';

function draws(random: ReturnType<typeof createEnsembleRandom>, count: number): number[] {
  return Array.from({ length: count }, (_, i) =>
    i % 3 === 2 ? random.uniform() : random.normal(),
  );
}

describe('createEnsembleRandom()', () => {
  it('gives the same sequence for the same seed and a different one for another seed', () => {
    expect(draws(createEnsembleRandom(123), 50)).toEqual(draws(createEnsembleRandom(123), 50));
    expect(draws(createEnsembleRandom(124), 50)).not.toEqual(draws(createEnsembleRandom(123), 50));
  });

  it.each([0, -5, Number.NaN, 2 ** 40 + 3])(
    'accepts the out-of-range seed %s without throwing',
    (seed) => {
      const values = draws(createEnsembleRandom(seed), 5);
      expect(values.every(Number.isFinite)).toBe(true);
    },
  );

  it('draws standard normals: mean and variance within 5 standard errors over 20000 draws', () => {
    // Standard errors: 1/sqrt(n) for the mean, sqrt(2/n) for the variance of a normal sample.
    const random = createEnsembleRandom(5);
    const n = 20000;
    const values = Array.from({ length: n }, () => random.normal());
    const mean = values.reduce((sum, v) => sum + v, 0) / n;
    const variance = values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (n - 1);
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });

  it('draws uniforms in [0, 1)', () => {
    const random = createEnsembleRandom(6);
    const values = Array.from({ length: 10000 }, () => random.uniform());
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThan(1);
  });
});

describe('restoreEnsembleRandom()', () => {
  it('resumes from a snapshot taken mid-sequence, through JSON, exactly', () => {
    const original = createEnsembleRandom(77);
    draws(original, 17);
    const snapshot = JSON.parse(JSON.stringify(original.snapshot())) as ReturnType<
      typeof original.snapshot
    >;
    const restored = restoreEnsembleRandom(snapshot);
    expect(draws(restored, 40)).toEqual(draws(original, 40));
  });

  it('does not share state with the generator it was taken from', () => {
    const original = createEnsembleRandom(8);
    const restored = restoreEnsembleRandom(original.snapshot());
    draws(original, 10);
    expect(draws(restored, 10)).toEqual(
      draws(restoreEnsembleRandom(createEnsembleRandom(8).snapshot()), 10),
    );
  });

  it.each([
    [
      { generator: 'other', state: [1, 2] },
      /generator must be "mt19937-improved-ziggurat": got "other"/,
    ],
    [{ generator: 'mt19937-improved-ziggurat', state: [1, -2] }, /unsigned 32-bit integers/],
  ])('rejects a corrupt snapshot %j', (snapshot, message) => {
    expect(() => restoreEnsembleRandom(snapshot as never)).toThrow(message);
  });
});
