/**
 * Flag validation: the words of each kind of range, and FlagReader's handling of missing,
 * empty and case-varied values. Messages follow style.md: field, rule, value received.
 */
import { describe, expect, it } from 'vitest';
import {
  describeNumberRule,
  FlagReader,
  flagKey,
  parseNumberText,
  type NumberRule,
} from '../../server/src/cli/flags.ts';
import { UsageError } from '../../server/src/cli/usageError.ts';

describe('describeNumberRule()', () => {
  it.each<[NumberRule, string]>([
    [{ unit: 'percent', min: 0, max: 100 }, 'between 0 and 100 (percent)'],
    [{ unit: 'm', min: 0, max: 100, minExclusive: true }, 'greater than 0 and at most 100 (m)'],
    [{ unit: '-', min: 0, max: 0.5, maxExclusive: true }, 'at least 0 and less than 0.5 (-)'],
    [{ unit: 'h', min: 0, minExclusive: true }, 'greater than 0 (h)'],
    [{ unit: 'degC', max: 60 }, 'at most 60 (degC)'],
    [{ unit: 'degC' }, 'a number (degC)'],
  ])('words %o as "%s"', (rule, words) => {
    expect(describeNumberRule(rule)).toBe(words);
  });
});

describe('parseNumberText()', () => {
  const rule: NumberRule = { unit: 'km/h', min: 0, max: 150 };
  it.each([
    ['12', 12],
    [' 12.5 ', 12.5],
    ['+3', 3],
    ['.5', 0.5],
    ['1e2', 100],
    ['0', 0],
    ['150', 150],
  ])('reads "%s" as %s', (text, value) => {
    expect(parseNumberText(text, '--wind', rule)).toBe(value);
  });

  it.each([
    ['', '--wind must be a number (km/h): got ""'],
    ['12 km/h', '--wind must be a number (km/h): got "12 km/h"'],
    ['0,5', '--wind must be a number (km/h): got "0,5"'],
    ['Infinity', '--wind must be a number (km/h): got "Infinity"'],
    ['1e400', '--wind must be between 0 and 150 (km/h): got 1e400'],
    ['150.01', '--wind must be between 0 and 150 (km/h): got 150.01'],
    ['-0.1', '--wind must be between 0 and 150 (km/h): got -0.1'],
  ])('refuses "%s" with a UsageError: %s', (text, message) => {
    expect(() => parseNumberText(text, '--wind', rule)).toThrow(UsageError);
    expect(() => parseNumberText(text, '--wind', rule)).toThrow(message);
  });
});

describe('FlagReader', () => {
  const flags = new FlagReader({ airTemp: '21', mode: 'CURL', empty: ' ', json: true });

  it('finds flags by their typed name', () => {
    expect(flagKey('--air-temp')).toBe('airTemp');
    expect(flags.number('--air-temp', { unit: 'degC' })).toBe(21);
    expect(flags.has('--air-temp')).toBe(true);
    expect(flags.switch('--json')).toBe(true);
    expect(flags.switch('--sensitive-mix')).toBe(false);
  });

  it('reads choices case-blind and returns the canonical spelling', () => {
    expect(flags.choice('--mode', ['flat', 'curl'])).toBe('curl');
    expect(flags.choice('--method', ['arrhenius', 'nurse-saul'], 'arrhenius')).toBe('arrhenius');
  });

  it.each([
    ['a missing required value', () => flags.string('--csv'), '--csv is required'],
    ['a blank value', () => flags.string('--empty'), '--empty must not be empty: got ""'],
    [
      'a missing required choice',
      () => flags.choice('--cement', ['R', 'N', 'S']),
      '--cement is required',
    ],
  ])('refuses %s', (_case, read, message) => {
    expect(read).toThrow(message);
  });

  it('leaves optional numbers undefined when not given', () => {
    expect(flags.optionalNumber('--wind-height', { unit: 'm' })).toBeUndefined();
  });
});
