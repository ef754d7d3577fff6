import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  arrheniusAgeFactor,
  maturityOfSeries,
  nurseSaulAgeFactor,
  nurseSaulTemperatureExcessK,
  trapezoidAgeIncrement,
  type TemperatureSample,
} from '../../server/src/physics/maturity.ts';

const R = 8.314462618; // J/(mol K), CODATA 2018
const HOUR_MS = 3_600_000;
const T0_MS = Date.UTC(2026, 5, 15, 8, 0, 0);

const constantRecord = (
  temperatureC: number,
  hours: number,
  stepMin: number,
): TemperatureSample[] =>
  Array.from({ length: (hours * 60) / stepMin + 1 }, (_, i) => ({
    time: T0_MS + i * stepMin * 60_000,
    temperatureC,
  }));

interface MaturityFixture {
  realAgeS: number;
  gapsOverOneHour: { fromIndex: number; toIndex: number; durationS: number }[];
  cases: {
    activationEnergyJMol: number;
    referenceTemperatureC: number;
    datumTemperatureC: number;
    arrheniusEquivalentAgeS: number;
    nurseSaulTemperatureTimeFactorKS: number;
    nurseSaulEquivalentAgeS: number;
  }[];
  samples: { timeMs: number; temperatureC: number }[];
}
// Independent evaluation of the ASTM C1074 sums (trapezoid on the rate factors) by
// test/physics/fixtures/maturity.py over an invented irregular 3-day record with one 3 h gap.
const fixture = JSON.parse(
  readFileSync(new URL('./fixtures/maturity.json', import.meta.url), 'utf8'),
) as MaturityFixture;

describe('arrheniusAgeFactor()', () => {
  it.each([
    { temperatureC: 20, energy: 40_000, expected: 1 },
    {
      temperatureC: 30,
      energy: 40_000,
      expected: Math.exp((-40_000 / R) * (1 / 303.15 - 1 / 293.15)),
    },
    {
      temperatureC: 5,
      energy: 40_000,
      expected: Math.exp((-40_000 / R) * (1 / 278.15 - 1 / 293.15)),
    },
    {
      temperatureC: 30,
      energy: 33_500,
      expected: Math.exp((-33_500 / R) * (1 / 303.15 - 1 / 293.15)),
    },
  ])(
    'is exp(-E/R (1/T - 1/Tr)) at $temperatureC degC, E = $energy J/mol (ASTM C1074)',
    ({ temperatureC, energy, expected }) => {
      expect(arrheniusAgeFactor(temperatureC, { activationEnergyJMol: energy })).toBeCloseTo(
        expected,
        12,
      );
    },
  );

  it('is about 1.71 at 30 degC with 40 kJ/mol (ASTM C1074 closed form, hand computation)', () => {
    // 40000 / 8.3145 * (1/293.15 - 1/303.15) = 0.5414; exp(0.5414) = 1.718
    expect(arrheniusAgeFactor(30)).toBeCloseTo(1.718, 3);
  });

  it('returns NaN at or below absolute zero and for NaN', () => {
    expect(arrheniusAgeFactor(-273.15)).toBeNaN();
    expect(arrheniusAgeFactor(Number.NaN)).toBeNaN();
  });
});

describe('nurseSaulAgeFactor() and nurseSaulTemperatureExcessK()', () => {
  it.each([
    { temperatureC: 20, datumC: 0, excess: 20, factor: 1 },
    { temperatureC: 30, datumC: 0, excess: 30, factor: 1.5 },
    { temperatureC: 10, datumC: -10, excess: 20, factor: 20 / 30 },
    { temperatureC: -5, datumC: 0, excess: 0, factor: 0 },
  ])(
    'at $temperatureC degC, datum $datumC degC: (T - T0) = $excess, factor $factor (ASTM C1074)',
    ({ temperatureC, datumC, excess, factor }) => {
      expect(nurseSaulTemperatureExcessK(temperatureC, { datumTemperatureC: datumC })).toBeCloseTo(
        excess,
        12,
      );
      expect(nurseSaulAgeFactor(temperatureC, { datumTemperatureC: datumC })).toBeCloseTo(
        factor,
        12,
      );
    },
  );

  it('has no equivalent age when the reference is not above the datum', () => {
    expect(nurseSaulAgeFactor(20, { datumTemperatureC: 20 })).toBeNaN();
  });
});

describe('maturityOfSeries()', () => {
  it('gives equivalent age equal to real age at a constant 20 degC (ASTM C1074, both functions)', () => {
    const result = maturityOfSeries(constantRecord(20, 48, 15));
    expect(result.realAgeS).toBe(48 * 3600);
    expect(result.arrheniusEquivalentAgeS).toBeCloseTo(48 * 3600, 6);
    expect(result.nurseSaulEquivalentAgeS).toBeCloseTo(48 * 3600, 6);
    // Nurse-Saul closed form: M = (T - T0) t = 20 K x 48 h
    expect(result.nurseSaulTemperatureTimeFactorKS).toBeCloseTo(20 * 48 * 3600, 6);
    expect(result.gaps).toEqual([]);
    expect(result.issues).toEqual([]);
  });

  it('scales real age by exp(-E/R (1/303.15 - 1/293.15)) at a constant 30 degC, 40 kJ/mol (ASTM C1074)', () => {
    const result = maturityOfSeries(constantRecord(30, 24, 10));
    const factor = Math.exp((-40_000 / R) * (1 / 303.15 - 1 / 293.15));
    expect(result.arrheniusEquivalentAgeS / (24 * 3600)).toBeCloseTo(factor, 10);
    // Nurse-Saul closed form, datum 0 degC: te = (30 - 0) / (20 - 0) t
    expect(result.nurseSaulEquivalentAgeS / (24 * 3600)).toBeCloseTo(1.5, 10);
  });

  it('integrates a linear ramp exactly for Nurse-Saul (trapezoid on a linear rate, closed form)', () => {
    // T rises 10 -> 30 degC over 10 h at irregular times: M = mean excess 20 K x 10 h.
    const timesH = [0, 0.3, 1.7, 2, 4.9, 7.25, 10];
    const samples = timesH.map((h) => ({
      time: new Date(T0_MS + h * HOUR_MS),
      temperatureC: 10 + 2 * h,
    }));
    const result = maturityOfSeries(samples);
    expect(result.nurseSaulTemperatureTimeFactorKS).toBeCloseTo(20 * 10 * 3600, 6);
  });

  it('averages the rate factors at the ends of an interval, not the factor of the mean temperature (documented choice)', () => {
    // 0 degC then 40 degC one hour apart: (f(0) + f(40)) / 2 = 1.577, while f(20) = 1.
    const result = maturityOfSeries([
      { time: T0_MS, temperatureC: 0 },
      { time: T0_MS + HOUR_MS, temperatureC: 40 },
    ]);
    const expected = ((arrheniusAgeFactor(0) + arrheniusAgeFactor(40)) / 2) * 3600;
    expect(result.arrheniusEquivalentAgeS).toBeCloseTo(expected, 8);
    expect(result.arrheniusEquivalentAgeS / 3600).toBeCloseTo(1.577, 2);
  });

  it.each(fixture.cases)(
    'agrees with maturity.py on an irregular record (E $activationEnergyJMol, Tr $referenceTemperatureC, T0 $datumTemperatureC; 0.5 %)',
    (reference) => {
      const options = {
        activationEnergyJMol: reference.activationEnergyJMol,
        referenceTemperatureC: reference.referenceTemperatureC,
        datumTemperatureC: reference.datumTemperatureC,
      };
      const fromMs = maturityOfSeries(
        fixture.samples.map((sample) => ({
          time: sample.timeMs,
          temperatureC: sample.temperatureC,
        })),
        options,
      );
      const fromDates = maturityOfSeries(
        fixture.samples.map((sample) => ({
          time: new Date(sample.timeMs),
          temperatureC: sample.temperatureC,
        })),
        options,
      );
      const within = (actual: number, expected: number): void =>
        expect(Math.abs(actual / expected - 1)).toBeLessThan(0.005);
      for (const result of [fromMs, fromDates]) {
        expect(result.realAgeS).toBe(fixture.realAgeS);
        within(result.arrheniusEquivalentAgeS, reference.arrheniusEquivalentAgeS);
        within(result.nurseSaulTemperatureTimeFactorKS, reference.nurseSaulTemperatureTimeFactorKS);
        within(result.nurseSaulEquivalentAgeS, reference.nurseSaulEquivalentAgeS);
        expect(result.samplesUsed).toBe(fixture.samples.length);
      }
    },
  );

  it('flags the 3 h logger outage as a gap longer than 1 h (maturity.py record)', () => {
    const result = maturityOfSeries(
      fixture.samples.map((sample) => ({ time: sample.timeMs, temperatureC: sample.temperatureC })),
    );
    expect(
      result.gaps.map(({ fromIndex, toIndex, durationS }) => ({ fromIndex, toIndex, durationS })),
    ).toEqual(fixture.gapsOverOneHour);
    expect(maturityOfSeries(constantRecord(20, 6, 90), { maxGapS: 2 * 3600 }).gaps).toEqual([]);
    expect(maturityOfSeries(constantRecord(20, 6, 90)).gaps).toHaveLength(4);
  });

  it('skips and reports non-increasing, duplicate and invalid samples with field, rule and value', () => {
    const samples: TemperatureSample[] = [
      { time: T0_MS, temperatureC: 20 },
      { time: T0_MS + HOUR_MS, temperatureC: 20 },
      { time: T0_MS + HOUR_MS, temperatureC: 25 },
      { time: T0_MS + 0.5 * HOUR_MS, temperatureC: 25 },
      { time: new Date(Number.NaN), temperatureC: 20 },
      { time: T0_MS + 1.5 * HOUR_MS, temperatureC: Number.NaN },
      { time: T0_MS + 2 * HOUR_MS, temperatureC: 20 },
    ];
    const result = maturityOfSeries(samples);
    expect(result.samplesUsed).toBe(3);
    expect(result.realAgeS).toBe(7200);
    expect(result.arrheniusEquivalentAgeS).toBeCloseTo(7200, 6);
    expect(result.issues.map(({ index, field }) => ({ index, field }))).toEqual([
      { index: 2, field: 'time' },
      { index: 3, field: 'time' },
      { index: 4, field: 'time' },
      { index: 5, field: 'temperatureC' },
    ]);
    expect(result.issues[1]?.message).toBe(
      'sample 3 time must be later than the previous accepted sample (2026-06-15T09:00:00.000Z): got 2026-06-15T08:30:00.000Z',
    );
    expect(result.issues[3]?.message).toBe(
      'sample 5 temperatureC must be a finite number: got NaN',
    );
  });

  it('gives zero ages for fewer than two samples', () => {
    expect(maturityOfSeries([]).arrheniusEquivalentAgeS).toBe(0);
    expect(maturityOfSeries([{ time: T0_MS, temperatureC: 30 }]).nurseSaulEquivalentAgeS).toBe(0);
  });

  const temperatureRecord = fc
    .array(
      fc.record({
        stepMin: fc.integer({ min: 1, max: 120 }),
        temperatureC: fc.double({ min: -10, max: 60, noNaN: true }),
      }),
      { minLength: 2, maxLength: 60 },
    )
    .map((steps) => {
      let timeMs = T0_MS;
      return steps.map(({ stepMin, temperatureC }) => {
        timeMs += stepMin * 60_000;
        return { time: timeMs, temperatureC };
      });
    });

  it('equals real age at the reference temperature for any reference and timing (property, ASTM C1074)', () => {
    fc.assert(
      fc.property(
        temperatureRecord,
        fc.double({ min: 5, max: 40, noNaN: true }),
        (record, referenceTemperatureC) => {
          const atReference = record.map((sample) => ({
            ...sample,
            temperatureC: referenceTemperatureC,
          }));
          const result = maturityOfSeries(atReference, { referenceTemperatureC });
          expect(result.arrheniusEquivalentAgeS).toBeCloseTo(result.realAgeS, 6);
          expect(result.nurseSaulEquivalentAgeS).toBeCloseTo(result.realAgeS, 6);
        },
      ),
    );
  });

  it('is additive over records concatenated at a shared sample (property of the trapezoid sum)', () => {
    fc.assert(
      fc.property(temperatureRecord, fc.nat(), (record, splitSeed) => {
        const split = 1 + (splitSeed % (record.length - 1));
        const whole = maturityOfSeries(record);
        const first = maturityOfSeries(record.slice(0, split + 1));
        const second = maturityOfSeries(record.slice(split));
        const relative = (a: number, b: number): number =>
          Math.abs(a - b) / Math.max(1, Math.abs(b));
        expect(
          relative(
            first.arrheniusEquivalentAgeS + second.arrheniusEquivalentAgeS,
            whole.arrheniusEquivalentAgeS,
          ),
        ).toBeLessThan(1e-12);
        expect(
          relative(
            first.nurseSaulTemperatureTimeFactorKS + second.nurseSaulTemperatureTimeFactorKS,
            whole.nurseSaulTemperatureTimeFactorKS,
          ),
        ).toBeLessThan(1e-12);
        expect(first.realAgeS + second.realAgeS).toBe(whole.realAgeS);
      }),
    );
  });
});

describe('trapezoidAgeIncrement()', () => {
  it('averages the end factors over the interval', () => {
    expect(trapezoidAgeIncrement(600, 1, 2)).toBe(900);
    expect(trapezoidAgeIncrement(600, arrheniusAgeFactor(20), arrheniusAgeFactor(20))).toBeCloseTo(
      600,
      10,
    );
  });
});
