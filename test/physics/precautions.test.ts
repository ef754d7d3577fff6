import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  ACI301_MAX_CORE_SURFACE_DIFFERENCE_K,
  ACI305R_EVAPORATION_THRESHOLD_INCH_POUND_KG_M2H,
  bleedFilmRemainingHours,
  coreSurfaceTemperatureCheck,
  DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
  evaporationAgainstBleeding,
  evaporationPrecautionVerdict,
} from '../../server/src/physics/precautions.ts';

describe('evaporationPrecautionVerdict() (ACI 305R)', () => {
  it('states the inch-pound threshold 0.2 lb/ft2/h as 0.98 kg/m2/h (exact unit conversion)', () => {
    // 1 lb = 0.45359237 kg and 1 ft = 0.3048 m exactly (international yard and pound, 1959).
    expect(ACI305R_EVAPORATION_THRESHOLD_INCH_POUND_KG_M2H).toBeCloseTo(0.9765, 4);
    expect(ACI305R_EVAPORATION_THRESHOLD_INCH_POUND_KG_M2H).toBeCloseTo(
      (0.2 * 0.45359237) / (0.3048 * 0.3048),
      14,
    );
  });

  it.each([
    [0.5, false, 1.0, 'below-precaution-threshold'],
    [0.99, false, 1.0, 'below-precaution-threshold'],
    [1.0, false, 1.0, 'precautions-needed'],
    [1.6, false, 1.0, 'precautions-needed'],
    // silica fume / low w/c: about half the threshold (ACI 305R, from memory)
    [0.49, true, 0.5, 'below-precaution-threshold'],
    [0.6, true, 0.5, 'precautions-needed'],
    [Number.NaN, false, 1.0, 'unknown'],
  ] as const)(
    'E = %f kg/m2/h, sensitive mix %s: threshold %f, %s',
    (rate, sensitive, limit, verdict) => {
      const result = evaporationPrecautionVerdict(rate, {
        ...DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
        sensitiveMix: sensitive,
      });
      expect(result.thresholdKgM2h).toBeCloseTo(limit, 14);
      expect(result.verdict).toBe(verdict);
    },
  );

  it('accepts the inch-pound threshold as an option', () => {
    const options = {
      ...DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
      thresholdKgM2h: ACI305R_EVAPORATION_THRESHOLD_INCH_POUND_KG_M2H,
    };
    expect(evaporationPrecautionVerdict(0.98, options).verdict).toBe('precautions-needed');
    expect(evaporationPrecautionVerdict(0.98).verdict).toBe('below-precaution-threshold');
  });
});

describe('evaporationAgainstBleeding()', () => {
  it.each([
    [0.3, 0.5, 0.6, 'bleeding-keeps-up'],
    [0.5, 0.5, 1, 'bleeding-keeps-up'],
    [0.8, 0.4, 2, 'evaporation-exceeds-bleeding'],
    [0.2, 0, Number.POSITIVE_INFINITY, 'evaporation-exceeds-bleeding'],
    [0, 0, 0, 'bleeding-keeps-up'],
    [0.2, -0.1, Number.NaN, 'unknown'],
    [Number.NaN, 0.1, Number.NaN, 'unknown'],
  ])('E %f against B %f: ratio %f, %s', (evaporation, bleed, ratio, verdict) => {
    const result = evaporationAgainstBleeding(evaporation, bleed);
    if (Number.isNaN(ratio)) expect(result.ratio).toBeNaN();
    else expect(result.ratio).toBe(ratio);
    expect(result.verdict).toBe(verdict);
  });
});

describe('bleedFilmRemainingHours()', () => {
  it.each([
    // film / (E - B), water balance (physics.md 4), hand-computed
    [0.3, 0.8, 0.2, 0.5],
    [1, 0.5, 0.5, Number.POSITIVE_INFINITY],
    [1, 0.2, 0.5, Number.POSITIVE_INFINITY],
    [0, 0.8, 0.2, 0],
  ])('film %f kg/m2, E %f, B %f: %f h', (film, evaporation, bleed, hours) => {
    expect(bleedFilmRemainingHours(film, evaporation, bleed)).toBeCloseTo(hours, 12);
  });

  it('is NaN for NaN input', () => {
    expect(bleedFilmRemainingHours(Number.NaN, 1, 0)).toBeNaN();
    expect(bleedFilmRemainingHours(1, Number.NaN, 0)).toBeNaN();
  });

  it('shortens as evaporation rises (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (film, a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          expect(bleedFilmRemainingHours(film, high, 0.1)).toBeLessThanOrEqual(
            bleedFilmRemainingHours(film, low, 0.1),
          );
        },
      ),
    );
  });
});

describe('coreSurfaceTemperatureCheck() (ACI 301, 35 degF)', () => {
  it('defaults to 35 degF expressed in kelvin, 19.44 K', () => {
    expect(ACI301_MAX_CORE_SURFACE_DIFFERENCE_K).toBeCloseTo(19.444444, 5);
  });

  it.each([
    [318.15, 303.15, 15, 'within-limit'],
    [318.15, 298.15, 20, 'exceeds-limit'],
    [300, 319.4, -19.4, 'within-limit'],
    [290, 312, -22, 'exceeds-limit'],
    [Number.NaN, 300, Number.NaN, 'unknown'],
  ])('core %f K, surface %f K: difference %f K, %s', (core, surface, difference, verdict) => {
    const result = coreSurfaceTemperatureCheck(core, surface);
    if (Number.isNaN(difference)) expect(result.differenceK).toBeNaN();
    else expect(result.differenceK).toBeCloseTo(difference, 9);
    expect(result.verdict).toBe(verdict);
  });

  it('uses a configured limit, e.g. the metric 19 degC', () => {
    expect(coreSurfaceTemperatureCheck(319.3, 300, 19).verdict).toBe('exceeds-limit');
    expect(coreSurfaceTemperatureCheck(319.3, 300).verdict).toBe('within-limit');
  });
});
