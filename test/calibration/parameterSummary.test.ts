import { describe, expect, it } from 'vitest';
import { logNormalPrior, biasPrior } from '../../server/src/calibration/parameterPrior.ts';
import { summariseParameters } from '../../server/src/calibration/parameterSummary.ts';

// Hand-made members; expected values worked out by hand (quantiles by Hyndman and Fan 1996,
// definition 7: h = (n - 1) p over the sorted finite values).
const specs = [
  logNormalPrior('permeabilityMultiplier', 1, 4, 'test'),
  biasPrior('rhBias:P1', 0.02, 'test'),
];
const members = [
  [1, 0.01],
  [Math.E, -0.01],
  [Math.E ** 2, 0.03],
  [Math.E ** 3, Number.NaN],
  [Math.E ** 4, 0.01],
].map(([k = NaN, b = NaN]) => ({
  state: new Float64Array(0),
  parameters: Float64Array.of(k, b),
  carried: null,
}));

describe('summariseParameters()', () => {
  const [multiplier, bias] = summariseParameters(members, specs);

  it('gives the statistics of a log parameter in physical and analysis space', () => {
    // ln values 0..4: mean 2, sd sqrt(10/4); physical median e^2; p05 at h = 0.2: 1 + 0.2 (e - 1).
    expect(multiplier?.analysisMean).toBeCloseTo(2, 12);
    expect(multiplier?.analysisSd).toBeCloseTo(Math.sqrt(2.5), 12);
    expect(multiplier?.median).toBeCloseTo(Math.E ** 2, 12);
    expect(multiplier?.p05).toBeCloseTo(1 + 0.2 * (Math.E - 1), 12);
    expect(multiplier?.mean).toBeCloseTo(
      (1 + Math.E + Math.E ** 2 + Math.E ** 3 + Math.E ** 4) / 5,
      12,
    );
    expect(multiplier?.priorSd).toBeCloseTo(Math.log(4), 12);
  });

  it('leaves out a missing value', () => {
    // Finite biases sorted: -0.01, 0.01, 0.01, 0.03: mean 0.01, median 0.01, p95 at h = 2.85.
    expect(bias?.memberCount).toBe(4);
    expect(bias?.mean).toBeCloseTo(0.01, 12);
    expect(bias?.median).toBeCloseTo(0.01, 12);
    expect(bias?.p95).toBeCloseTo(0.01 + 0.85 * 0.02, 12);
  });

  it('gives NaN statistics when no member has a value', () => {
    const [summary] = summariseParameters(
      [{ state: new Float64Array(0), parameters: Float64Array.of(NaN), carried: null }],
      specs.slice(0, 1),
    );
    expect(summary?.mean).toBeNaN();
    expect(summary?.analysisSd).toBeNaN();
  });
});
