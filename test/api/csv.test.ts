import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { csvField, csvLine } from '../../server/src/api/csv.ts';

describe('csvField()', () => {
  // RFC 4180 section 2, rules 6 and 7.
  const cases = [
    { value: 'plain', expected: 'plain' },
    { value: 'a,b', expected: '"a,b"' },
    { value: 'say "hi"', expected: '"say ""hi"""' },
    { value: 'two\nlines', expected: '"two\nlines"' },
    { value: 24.5, expected: '24.5' },
    { value: null, expected: '' },
  ];
  it.each(cases)('writes $value as $expected', ({ value, expected }) => {
    expect(csvField(value)).toBe(expected);
  });

  it('round-trips through an independent CSV parser (csv-parse)', () => {
    const fields = ['x,y', '"q"', 'line\r\nbreak', '', 'ü'];
    expect(parse(csvLine(fields) + csvLine(fields))).toEqual([fields, fields]);
  });
});
