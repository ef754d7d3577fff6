import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectSilence } from '../../server/src/quality/detectSilence.ts';
import type { TimedReading } from '../../server/src/quality/detectSilence.ts';

const T0 = Date.parse('2026-07-16T09:15:00Z');
/** Readings every `intervalS` at the given indices, each promising `ut`. */
const series = (indices: number[], intervalS: number, ut: number | null): TimedReading[] =>
  indices.map((index) => ({ eventAtMs: T0 + index * intervalS * 1000, updateIntervalS: ut }));
const range = (from: number, to: number) =>
  Array.from({ length: to - from }, (_, index) => from + index);

describe('detectSilence()', () => {
  it.each([
    {
      what: 'a steady series has no silence',
      readings: series(range(0, 30), 60, 60),
      options: {},
      expected: [],
    },
    {
      what: 'one lost pack (gap of 2 intervals) is a dropout, not silence',
      readings: series([...range(0, 10), ...range(11, 20)], 60, 60),
      options: {},
      expected: [],
    },
    {
      what: 'a half-hour gap in a 60 s series is silence, judged from ut',
      readings: series([...range(0, 10), ...range(40, 50)], 60, 60),
      options: {},
      expected: [
        { fromMs: T0 + 9 * 60_000, toMs: T0 + 40 * 60_000, gapS: 31 * 60, expectedIntervalS: 60 },
      ],
    },
    {
      what: 'a long ut (the device promised 3600 s) excuses the same gap',
      readings: series([...range(0, 10), ...range(40, 50)], 60, 3600),
      options: {},
      expected: [],
    },
    {
      what: 'without ut the configured interval is used',
      readings: series([0, 1, 2, 10], 60, null),
      options: { configuredIntervalS: 120 },
      expected: [
        { fromMs: T0 + 2 * 60_000, toMs: T0 + 10 * 60_000, gapS: 480, expectedIntervalS: 120 },
      ],
    },
    {
      what: 'without ut or configuration the median spacing is used',
      readings: series([0, 1, 2, 3, 10], 60, null),
      options: {},
      expected: [
        { fromMs: T0 + 3 * 60_000, toMs: T0 + 10 * 60_000, gapS: 420, expectedIntervalS: 60 },
      ],
    },
    {
      what: 'a sensor still silent at nowMs is reported open-ended',
      readings: series(range(0, 5), 60, 60),
      options: { nowMs: T0 + 20 * 60_000 },
      expected: [{ fromMs: T0 + 4 * 60_000, toMs: null, gapS: 16 * 60, expectedIntervalS: 60 }],
    },
    {
      what: 'a single reading without ut or configuration cannot be judged',
      readings: series([0], 60, null),
      options: { nowMs: T0 + 3_600_000 },
      expected: [],
    },
  ])('$what', ({ readings, options, expected }) => {
    expect(detectSilence(readings, options)).toEqual(expected);
  });

  it('ignores the order of its input', () => {
    const readings = series([...range(0, 10), ...range(40, 50)], 60, 60);
    expect(detectSilence(readings.slice().reverse())).toEqual(detectSilence(readings));
  });

  it('finds no silence in a series whose gaps are all within the grace factor (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 150 }), { minLength: 1, maxLength: 60 }),
        (gapsS) => {
          let at = T0;
          const readings: TimedReading[] = [{ eventAtMs: at, updateIntervalS: 60 }];
          for (const gapS of gapsS) {
            at += gapS * 1000;
            readings.push({ eventAtMs: at, updateIntervalS: 60 });
          }
          return detectSilence(readings).length === 0;
        },
      ),
    );
  });
});
