import { describe, expect, it } from 'vitest';
import { toCanonicalUnit } from '../../server/src/ingest/units.ts';

describe('toCanonicalUnit()', () => {
  // Exact definitions: degF (Fahrenheit scale), K (0 degC = 273.15 K), km/h (1000 m / 3600 s).
  const cases = [
    { value: 212, unit: 'degF', quantity: 'temperature', expected: 100 },
    { value: 32, unit: 'degF', quantity: 'airTemperature', expected: 0 },
    { value: -40, unit: 'degF', quantity: 'temperature', expected: -40 },
    { value: 293.15, unit: 'K', quantity: 'temperature', expected: 20 },
    { value: 21.5, unit: 'Cel', quantity: 'temperature', expected: 21.5 },
    { value: 21.5, unit: null, quantity: 'temperature', expected: 21.5 },
    { value: 36, unit: 'km/h', quantity: 'windSpeed', expected: 10 },
    { value: 0.97, unit: '/', quantity: 'rh', expected: 97 },
    { value: 0.0012, unit: 'm', quantity: 'rain', expected: 1.2 },
  ] as const;
  it.each(cases)(
    'converts $value $unit of $quantity to $expected',
    ({ value, unit, quantity, expected }) => {
      expect(toCanonicalUnit(value, unit, quantity)).toBeCloseTo(expected, 10);
    },
  );

  const mismatches = [
    { unit: '%RH', quantity: 'temperature' },
    { unit: 'Cel', quantity: 'rh' },
    { unit: 'km/h', quantity: 'airTemperature' },
    { unit: 'furlong/fortnight', quantity: 'windSpeed' },
    { unit: 'cel', quantity: 'temperature' },
  ] as const;
  it.each(mismatches)('returns null for $unit on $quantity', ({ unit, quantity }) => {
    expect(toCanonicalUnit(1, unit, quantity)).toBeNull();
  });
});
