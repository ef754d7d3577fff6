/** Number formatting of the dashboard (web/src/format.ts): units always beside the number. */
import { describe, expect, it } from 'vitest';
import {
  formatDurationH,
  formatFigure,
  formatPercent,
  formatRange,
  NO_VALUE,
} from '../../web/src/format.ts';

const NBSP = '\u00a0';

describe('formatFigure()', () => {
  it.each([
    [0.8234, 2, 'MPa', `0.82${NBSP}MPa`],
    [1.005, 1, 'kg/m²/h', `1.0${NBSP}kg/m²/h`],
    [-0.001, 2, 'MPa', `0.00${NBSP}MPa`],
    [-0.25, 2, 'MPa', `-0.25${NBSP}MPa`],
    [0.57, 2, '', '0.57'],
    [120, 0, 'mm', `120${NBSP}mm`],
  ])('formatFigure(%s, %s, %j) writes %j', (value, decimals, unit, expected) => {
    expect(formatFigure(value, decimals, unit)).toBe(expected);
  });

  it.each([[null], [undefined], [Number.NaN], [Number.POSITIVE_INFINITY]])(
    'formatFigure() writes "no value" for %s rather than a blank or NaN',
    (value) => {
      expect(formatFigure(value, 2, 'MPa')).toBe(NO_VALUE);
    },
  );
});

describe('formatPercent() and formatRange()', () => {
  it.each([
    [0.624, `62${NBSP}%`],
    [1, `100${NBSP}%`],
    [0, `0${NBSP}%`],
    [null, NO_VALUE],
  ])('formatPercent(%s) writes %j', (fraction, expected) => {
    expect(formatPercent(fraction)).toBe(expected);
  });

  it('formatRange() writes the unit once, after the upper end', () => {
    expect(formatRange(0.351, 0.5, 2, 'MPa')).toBe(`0.35 to 0.50${NBSP}MPa`);
  });

  it('formatRange() writes "no value" when either end is missing', () => {
    expect(formatRange(null, 0.5, 2, 'MPa')).toBe(NO_VALUE);
    expect(formatRange(0.1, Number.NaN, 2, 'MPa')).toBe(NO_VALUE);
  });
});

describe('formatDurationH()', () => {
  it.each([
    [0.4, `24${NBSP}min`],
    [1, `1${NBSP}h`],
    [1.25, `1${NBSP}h 15${NBSP}min`],
    [9.999, `10${NBSP}h`],
    [30.4, `30${NBSP}h`],
    [0, `0${NBSP}min`],
  ])('formatDurationH(%s) says %j', (hours, expected) => {
    expect(formatDurationH(hours)).toBe(expected);
  });

  it.each([[-0.5], [null], [Number.NaN]])('formatDurationH(%s) writes "no value"', (hours) => {
    expect(formatDurationH(hours)).toBe(NO_VALUE);
  });
});
