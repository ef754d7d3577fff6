/**
 * Unit conversion at the edge: a reading arrives in some unit and is stored in its quantity's
 * canonical SenML unit (quantities.ts). Only units whose conversion is exact are accepted.
 *
 * Unit names: SenML registered units (RFC 8428 section 12.1: `Cel`, `K`, `%RH`, `/`, `m/s`,
 * `W/m2`, `m`) and secondary units of RFC 8798 (`km/h`, `mm`; from memory). `degF` is not a
 * SenML unit; it is accepted because devices send it (our assumption).
 */
import { QUANTITIES } from './quantities.ts';
import type { Quantity } from './quantities.ts';

type Converter = (value: number) => number;

const TO_CANONICAL: Readonly<Record<string, Readonly<Record<string, Converter>>>> = {
  Cel: {
    Cel: (v) => v,
    K: (v) => v - 273.15, // ITS-90 ice point, SI Brochure
    degF: (v) => ((v - 32) * 5) / 9, // definition of the Fahrenheit scale
  },
  '%RH': {
    '%RH': (v) => v,
    '/': (v) => v * 100, // SenML ratio unit: 1 = 100 %
  },
  'm/s': {
    'm/s': (v) => v,
    'km/h': (v) => v / 3.6, // 1 km/h = 1000 m / 3600 s
  },
  'W/m2': { 'W/m2': (v) => v },
  mm: {
    mm: (v) => v,
    m: (v) => v * 1000,
  },
};

/**
 * Converts `value` in `unit` to the canonical unit of `quantity`.
 *
 * @param value - the number received; NaN stays NaN (callers reject non-finite values first)
 * @param unit - the unit received, or null when the device sent none: then the canonical unit
 * @returns the value in the canonical unit, or null when `unit` does not measure `quantity`
 */
export function toCanonicalUnit(
  value: number,
  unit: string | null,
  quantity: Quantity,
): number | null {
  const canonical = QUANTITIES[quantity].unit;
  const converter = TO_CANONICAL[canonical]?.[unit ?? canonical];
  return converter === undefined ? null : converter(value);
}

/** Units accepted for `quantity`, canonical first. */
export function acceptedUnits(quantity: Quantity): string[] {
  return Object.keys(TO_CANONICAL[QUANTITIES[quantity].unit] ?? {});
}
