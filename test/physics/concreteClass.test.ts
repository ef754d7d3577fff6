import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  CONCRETE_CLASS_NAMES,
  concretePropertiesFromFck,
  meanCompressiveStrengthMPa,
  meanTensileStrengthMPa,
  parseConcreteClass,
  secantModulusGPa,
  UnknownConcreteClassError,
} from '../../server/src/physics/concreteClass.ts';

// EN 1992-1-1:2004 Table 3.1 as printed (values rounded by the standard: fctm and fctk to
// 0.1 MPa, Ecm to 1 GPa). Transcribed from memory and cross-checked against a published
// secondary transcription of the table.
const TABLE_3_1 = [
  // name, fck, fck,cube, fcm, fctm, fctk0.05, fctk0.95, Ecm
  ['C12/15', 12, 15, 20, 1.6, 1.1, 2.0, 27],
  ['C16/20', 16, 20, 24, 1.9, 1.3, 2.5, 29],
  ['C20/25', 20, 25, 28, 2.2, 1.5, 2.9, 30],
  ['C25/30', 25, 30, 33, 2.6, 1.8, 3.3, 31],
  ['C30/37', 30, 37, 38, 2.9, 2.0, 3.8, 33],
  ['C35/45', 35, 45, 43, 3.2, 2.2, 4.2, 34],
  ['C40/50', 40, 50, 48, 3.5, 2.5, 4.6, 35],
  ['C45/55', 45, 55, 53, 3.8, 2.7, 4.9, 36],
  ['C50/60', 50, 60, 58, 4.1, 2.9, 5.3, 37],
  ['C55/67', 55, 67, 63, 4.2, 3.0, 5.5, 38],
  ['C60/75', 60, 75, 68, 4.4, 3.1, 5.7, 39],
  ['C70/85', 70, 85, 78, 4.6, 3.2, 6.0, 41],
  ['C80/95', 80, 95, 88, 4.8, 3.4, 6.3, 42],
  ['C90/105', 90, 105, 98, 5.0, 3.5, 6.6, 44],
] as const;

// Tolerances match the table's rounding: half a unit of the last printed digit, plus 1e-9
// for floating point.
const HALF_TENTH_MPA = 0.05 + 1e-9;
const HALF_GPA = 0.5 + 1e-9;
// The fractiles are printed as 0.7 and 1.3 times the already rounded fctm, then rounded again
// (C60/75: 0.7 x 4.4 = 3.08 -> 3.1, whereas 0.7 x 4.355 = 3.05): factor x 0.05 + 0.05.
const FCTK005_TOLERANCE_MPA = 0.7 * 0.05 + 0.05 + 1e-9;
const FCTK095_TOLERANCE_MPA = 1.3 * 0.05 + 0.05 + 1e-9;

interface ClassFixture {
  name: string;
  fckMPa: number;
  fcmMPa: number;
  fctmMPa: number;
  ecmGPa: number;
}
// Independent Python implementation of the Table 3.1 formulas: test/physics/fixtures/strength.py.
const fixture = JSON.parse(
  readFileSync(new URL('./fixtures/strength.json', import.meta.url), 'utf8'),
) as { classes: ClassFixture[] };

describe('parseConcreteClass()', () => {
  it.each(TABLE_3_1)(
    '%s matches EN 1992-1-1 Table 3.1 within its rounding',
    (name, fck, fckCube, fcm, fctm, fctk005, fctk095, ecm) => {
      const properties = parseConcreteClass(name);
      expect(properties.name).toBe(name);
      expect(properties.fckMPa).toBe(fck);
      expect(properties.fckCubeMPa).toBe(fckCube);
      expect(properties.fcmMPa).toBe(fcm);
      expect(Math.abs(properties.fctmMPa - fctm)).toBeLessThanOrEqual(HALF_TENTH_MPA);
      expect(Math.abs(properties.fctk005MPa - fctk005)).toBeLessThanOrEqual(FCTK005_TOLERANCE_MPA);
      expect(Math.abs(properties.fctk095MPa - fctk095)).toBeLessThanOrEqual(FCTK095_TOLERANCE_MPA);
      expect(Math.abs(properties.ecmGPa - ecm)).toBeLessThanOrEqual(HALF_GPA);
    },
  );

  it('lists the fourteen classes of Table 3.1 from C12/15 to C90/105', () => {
    expect(CONCRETE_CLASS_NAMES).toEqual(TABLE_3_1.map((row) => row[0]));
  });

  it.each(['c30/37', ' C30/37 ', 'C30/37'])('accepts %j', (text) => {
    expect(parseConcreteClass(text).fckMPa).toBe(30);
  });

  it.each(['C30/40', 'C30', 'C100/115', '', 'B25', '30/37', 'C 30/37'])(
    'rejects %j with an UnknownConcreteClassError naming the field and the value',
    (text) => {
      let caught: unknown;
      try {
        parseConcreteClass(text, '--class');
      } catch (error) {
        caught = error;
      }
      expect(caught).toBeInstanceOf(UnknownConcreteClassError);
      const error = caught as UnknownConcreteClassError;
      expect(error.field).toBe('--class');
      expect(error.received).toBe(text);
      expect(error.message).toContain('--class must be one of C12/15');
      expect(error.message).toContain(`got ${JSON.stringify(text)}`);
    },
  );
});

describe('Table 3.1 formulas against an independent implementation', () => {
  // Source: EN 1992-1-1:2004 Table 3.1 expressions; fixture from test/physics/fixtures/strength.py.
  // Tolerance 1e-12 relative (same closed forms, double precision); the issue asks for 0.5 %.
  it.each(fixture.classes)('$name', (row) => {
    expect(meanCompressiveStrengthMPa(row.fckMPa)).toBe(row.fcmMPa);
    expect(meanTensileStrengthMPa(row.fckMPa)).toBeCloseTo(row.fctmMPa, 12);
    expect(secantModulusGPa(row.fcmMPa)).toBeCloseTo(row.ecmGPa, 11);
  });
});

describe('meanTensileStrengthMPa()', () => {
  it('switches formula above C50/60 (EN 1992-1-1 Table 3.1) and stays close at the switch', () => {
    // 0.30 * 50^(2/3) = 4.07 and 2.12 ln(1 + 6.0) = 4.13 just above: a small step, as in the code.
    expect(meanTensileStrengthMPa(50)).toBeCloseTo(0.3 * Math.pow(50, 2 / 3), 12);
    expect(meanTensileStrengthMPa(50.000001)).toBeCloseTo(2.12 * Math.log(1 + 5.8000001), 6);
  });

  it('returns NaN for negative or NaN fck and 0 for 0', () => {
    expect(meanTensileStrengthMPa(-1)).toBeNaN();
    expect(meanTensileStrengthMPa(Number.NaN)).toBeNaN();
    expect(meanTensileStrengthMPa(0)).toBe(0);
    expect(secantModulusGPa(-5)).toBeNaN();
  });

  it('gives an unnamed, untabulated strength a NaN cube strength', () => {
    const properties = concretePropertiesFromFck(32);
    expect(properties.fckCubeMPa).toBeNaN();
    expect(properties.fcmMPa).toBe(40);
  });
});
