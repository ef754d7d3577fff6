import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analysisVariableSlope,
  fromAnalysisVariable,
  toAnalysisVariable,
  type VariableTransform,
} from '../../server/src/calibration/variableTransform.ts';

const transforms: { name: string; transform: VariableTransform; values: number[] }[] = [
  { name: 'identity', transform: { kind: 'identity' }, values: [-3, 0, 0.25, 1e6] },
  { name: 'log', transform: { kind: 'log' }, values: [1e-9, 0.5, 1, 40] },
  {
    name: 'logit (0, 1)',
    transform: { kind: 'logit', lower: 0, upper: 1 },
    values: [1e-6, 0.3, 0.7, 0.999],
  },
  {
    name: 'logit (0, 2) kg/m2',
    transform: { kind: 'logit', lower: 0, upper: 2 },
    values: [0.01, 0.2, 1.9],
  },
  {
    name: 'logit (-0.1, 0.1)',
    transform: { kind: 'logit', lower: -0.1, upper: 0.1 },
    values: [-0.05, 0, 0.09],
  },
];

describe.each(transforms)(
  'toAnalysisVariable() / fromAnalysisVariable() ($name)',
  ({ transform, values }) => {
    it.each(values)('round-trips %s to 1e-12 relative', (value) => {
      const back = fromAnalysisVariable(transform, toAnalysisVariable(transform, value));
      expect(Math.abs(back - value)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(value)));
    });

    it.each(values)('has the slope of a central difference at %s (1e-6 relative)', (value) => {
      const step = 1e-6 * (Math.abs(value) || 1e-3);
      const difference =
        (toAnalysisVariable(transform, value + step) -
          toAnalysisVariable(transform, value - step)) /
        (2 * step);
      const slope = analysisVariableSlope(transform, value);
      expect(Math.abs(difference - slope)).toBeLessThan(1e-6 * Math.abs(slope));
    });
  },
);

describe('fromAnalysisVariable() keeps values physical for any analysis variable', () => {
  it('log: positive and finite', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true }), (z) => {
        const x = fromAnalysisVariable({ kind: 'log' }, z);
        return x > 0 && Number.isFinite(x);
      }),
    );
  });

  it('shifted-log: finite and not below -offset', () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true }),
        fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
        (z, offset) => {
          const x = fromAnalysisVariable({ kind: 'shifted-log', offset }, z);
          return Number.isFinite(x) && x >= -offset;
        },
      ),
    );
  });

  it('logit: strictly inside (lower, upper)', () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true }),
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: 1e-6, max: 1e3, noNaN: true }),
        (z, lower, width) => {
          const upper = lower + width;
          fc.pre(upper > lower);
          const x = fromAnalysisVariable({ kind: 'logit', lower, upper }, z);
          return x > lower && x < upper;
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('leaves NaN as NaN (identity and log)', () => {
    expect(fromAnalysisVariable({ kind: 'identity' }, Number.NaN)).toBeNaN();
    expect(fromAnalysisVariable({ kind: 'log' }, Number.NaN)).toBeNaN();
  });
});
