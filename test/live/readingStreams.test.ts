/**
 * readingStreams: ordered insertion, window statistics, held values and pruning (pure
 * bookkeeping, no physics source needed).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  emptyStream,
  insertReading,
  latestAtOrBefore,
  pruneStream,
  windowMean,
  windowSum,
} from '../../server/src/live/readingStreams.ts';

describe('insertReading()', () => {
  it('gives the same buffer whatever the arrival order (duplicates keep the larger value)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 50 }), fc.integer({ min: -100, max: 100 })), {
          maxLength: 40,
        }),
        (pairs) => {
          const forward = emptyStream();
          const backward = emptyStream();
          for (const [t, v] of pairs) insertReading(forward, t, v);
          for (const [t, v] of [...pairs].reverse()) insertReading(backward, t, v);
          expect(backward).toEqual(forward);
          expect([...forward.timesMs].sort((a, b) => a - b)).toEqual(forward.timesMs);
        },
      ),
    );
  });

  it('ignores non-finite times and values', () => {
    const stream = emptyStream();
    insertReading(stream, Number.NaN, 1);
    insertReading(stream, 5, Number.POSITIVE_INFINITY);
    expect(stream.timesMs).toEqual([]);
    expect(stream.lastSeenMs).toBe(Number.NEGATIVE_INFINITY);
  });
});

describe('window statistics', () => {
  const stream = emptyStream();
  for (const [t, v] of [
    [0, 1],
    [10, 2],
    [20, 4],
    [30, 8],
  ] as const) {
    insertReading(stream, t, v);
  }
  it.each([
    { from: 0, to: 20, mean: 3, sum: 6 },
    { from: -1, to: 30, mean: 15 / 4, sum: 15 },
    { from: 30, to: 40, mean: Number.NaN, sum: 0 },
  ])('windowMean() and windowSum() over ($from, $to]', ({ from, to, mean, sum }) => {
    expect(windowMean(stream, from, to)).toBe(mean);
    expect(windowSum(stream, from, to)).toBe(sum);
  });

  it('latestAtOrBefore() returns the held value, null before the first reading', () => {
    expect(latestAtOrBefore(stream, 25)).toEqual({ timeMs: 20, value: 4 });
    expect(latestAtOrBefore(stream, -1)).toBeNull();
  });

  it('pruneStream() keeps the last reading before the cut as the held value', () => {
    const copy = structuredClone(stream);
    pruneStream(copy, 25);
    expect(copy.timesMs).toEqual([20, 30]);
    expect(latestAtOrBefore(copy, 25)).toEqual(latestAtOrBefore(stream, 25));
  });
});
