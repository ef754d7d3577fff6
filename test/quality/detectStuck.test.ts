import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectStuck } from '../../server/src/quality/detectStuck.ts';
import type { ValuedReading } from '../../server/src/quality/detectStuck.ts';

const T0 = Date.parse('2026-07-16T09:15:00Z');
const minutes = (values: number[]): ValuedReading[] =>
  values.map((value, index) => ({ eventAtMs: T0 + index * 60_000, value }));
/** A working sensor: a slow drift with quantised wiggle, never two equal values in a row for long. */
const working = (count: number): number[] =>
  Array.from(
    { length: count },
    (_, index) => Math.round((30 + index * 0.05 + ((index * 7) % 3) * 0.1) * 10) / 10,
  );

describe('detectStuck()', () => {
  it.each([
    { what: 'a working sensor is not stuck', values: working(120), options: {}, expected: [] },
    {
      what: 'a sensor repeating one value for an hour is stuck from its first repeat',
      values: [...working(30), ...Array<number>(61).fill(35.5)],
      options: {},
      expected: [
        {
          fromMs: T0 + 30 * 60_000,
          toMs: T0 + 90 * 60_000,
          readings: 61,
          value: 35.5,
          variance: 0,
        },
      ],
    },
    {
      what: 'a repeat shorter than the window is not stuck',
      values: [...working(30), ...Array<number>(20).fill(35.5), ...working(30)],
      options: {},
      expected: [],
    },
    {
      what: 'a positive tolerance catches values that barely move',
      values: [
        ...working(10),
        ...Array.from({ length: 40 }, (_, index) => (index % 2 === 0 ? 50.0 : 50.1)),
      ],
      options: { tolerance: 0.1, windowS: 1800 },
      expected: [
        {
          fromMs: T0 + 10 * 60_000,
          toMs: T0 + 49 * 60_000,
          readings: 40,
          value: 50,
          variance: expect.closeTo(0.0025, 9),
        },
      ],
    },
    {
      what: 'too few readings over the window do not count',
      values: [5, 5, 5],
      options: { windowS: 60, minReadings: 5 },
      expected: [],
    },
  ])('$what', ({ values, options, expected }) => {
    expect(detectStuck(minutes(values), options)).toEqual(expected);
  });

  it('a NaN breaks a stretch', () => {
    const values = [...Array<number>(20).fill(4), Number.NaN, ...Array<number>(20).fill(4)];
    expect(detectStuck(minutes(values), { windowS: 1500 })).toEqual([]);
  });

  it('finds every stretch of a constant series longer than the window (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 31, max: 300 }),
        fc.double({ min: -40, max: 90, noNaN: true }),
        (count, value) => {
          const found = detectStuck(minutes(Array<number>(count).fill(value)));
          return found.length === 1 && found[0]?.readings === count;
        },
      ),
    );
  });
});
