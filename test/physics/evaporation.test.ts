import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY,
  evaporationEstimateBand,
  evaporationFluxKgM2s,
  unoEvaporationRateKgM2h,
} from '../../server/src/physics/evaporation.ts';

interface UnoRow {
  airTemperatureC: number;
  concreteTemperatureC: number;
  relativeHumidity: number;
  windKmH: number;
  surfacePoreHumidity: number;
  evaporationKgM2h: number;
}

// Uno (1998), ACI Materials Journal 95(4), metric form, evaluated independently by
// test/physics/fixtures/uno.py (Python decimal arithmetic, no clamping).
const unoFixture = JSON.parse(
  readFileSync(new URL('./fixtures/uno.json', import.meta.url), 'utf8'),
) as { rows: UnoRow[] };

// Tolerance for the whole fixture range (Ta 0..40 degC, Tc 5..35 degC, r 0.1..0.9,
// V 0..45 km/h, h_s 0.5..1): 0.5 % relative, with a 1e-9 kg/(m2 h) floor for rows near zero.
const RELATIVE_TOLERANCE = 0.005;
const ABSOLUTE_FLOOR_KGM2H = 1e-9;

const expectClose = (actual: number, expected: number): void => {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(
    Math.max(RELATIVE_TOLERANCE * Math.abs(expected), ABSOLUTE_FLOOR_KGM2H),
  );
};

describe('unoEvaporationRateKgM2h()', () => {
  it('matches the published formula over the fixture grid (Uno 1998, uno.py), condensation allowed', () => {
    expect(unoFixture.rows.length).toBeGreaterThan(500);
    for (const row of unoFixture.rows) {
      const actual = unoEvaporationRateKgM2h(row, {
        surfacePoreHumidity: row.surfacePoreHumidity,
        allowCondensation: true,
      });
      expectClose(actual, row.evaporationKgM2h);
    }
  });

  it('clamps condensation to zero by default and passes evaporation unchanged (Uno 1998, uno.py)', () => {
    const negativeRows = unoFixture.rows.filter((row) => row.evaporationKgM2h < 0);
    expect(negativeRows.length).toBeGreaterThan(0);
    for (const row of unoFixture.rows) {
      const actual = unoEvaporationRateKgM2h(row, { surfacePoreHumidity: row.surfacePoreHumidity });
      expectClose(actual, Math.max(0, row.evaporationKgM2h));
    }
  });

  it('gives about 1 kg/m2/h at Ta = Tc = 30 degC, RH 50 %, wind 25 km/h (ACI 305R chart, reading from memory)', () => {
    // Hand evaluation of Uno (1998): 5 * 0.5 * 48^2.5 * 29 * 1e-6 = 1.157 kg/(m2 h).
    const rate = unoEvaporationRateKgM2h({
      airTemperatureC: 30,
      concreteTemperatureC: 30,
      relativeHumidity: 0.5,
      windKmH: 25,
    });
    expect(rate).toBeCloseTo(5 * 0.5 * 48 ** 2.5 * 29 * 1e-6, 10);
    // The ACI 305R chart read at these conditions gives roughly 1 kg/(m2 h) (from memory);
    // the chart is read to about +-20 %.
    expect(rate).toBeGreaterThan(0.8);
    expect(rate).toBeLessThan(1.4);
  });

  it('is zero when the air is saturated at the surface temperature, whatever the wind (Uno 1998 closed form)', () => {
    // r = 1 and Tc = Ta: the bracket is exactly zero, whatever the wind.
    expect(
      unoEvaporationRateKgM2h({
        airTemperatureC: 20,
        concreteTemperatureC: 20,
        relativeHumidity: 1,
        windKmH: 30,
      }),
    ).toBe(0);
  });

  it('returns NaN for NaN input and below -18 degC (documented edge cases)', () => {
    const base = {
      airTemperatureC: 20,
      concreteTemperatureC: 20,
      relativeHumidity: 0.5,
      windKmH: 10,
    };
    expect(unoEvaporationRateKgM2h({ ...base, windKmH: Number.NaN })).toBeNaN();
    expect(unoEvaporationRateKgM2h({ ...base, concreteTemperatureC: -20 })).toBeNaN();
  });

  it('rises with wind speed (property; Uno 1998: factor V + 4)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 0.95, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0.1, max: 20, noNaN: true }),
        (airTemperatureC, concreteTemperatureC, relativeHumidity, windKmH, extraKmH) => {
          const input = { airTemperatureC, concreteTemperatureC, relativeHumidity, windKmH };
          const slow = unoEvaporationRateKgM2h(input);
          const fast = unoEvaporationRateKgM2h({ ...input, windKmH: windKmH + extraKmH });
          if (slow > 0) expect(fast).toBeGreaterThan(slow);
          else expect(fast).toBeGreaterThanOrEqual(slow);
        },
      ),
    );
  });

  it('falls with air humidity (property; Uno 1998: term -r (Ta + 18)^2.5)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 0.9, noNaN: true }),
        fc.double({ min: 0.01, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        (airTemperatureC, concreteTemperatureC, relativeHumidity, extra, windKmH) => {
          const input = { airTemperatureC, concreteTemperatureC, relativeHumidity, windKmH };
          const dry = unoEvaporationRateKgM2h(input, { allowCondensation: true });
          const humid = unoEvaporationRateKgM2h(
            { ...input, relativeHumidity: relativeHumidity + extra },
            { allowCondensation: true },
          );
          expect(humid).toBeLessThan(dry);
        },
      ),
    );
  });

  it('falls as the surface pores drain (falling-rate extension, physics.md section 4)', () => {
    const input = {
      airTemperatureC: 25,
      concreteTemperatureC: 25,
      relativeHumidity: 0.4,
      windKmH: 15,
    };
    const wet = unoEvaporationRateKgM2h(input);
    const draining = unoEvaporationRateKgM2h(input, { surfacePoreHumidity: 0.8 });
    const dry = unoEvaporationRateKgM2h(input, { surfacePoreHumidity: 0.3 });
    expect(draining).toBeLessThan(wet);
    // h_s below r at equal temperatures: the vapour gradient reverses, clamped to zero.
    expect(dry).toBe(0);
  });
});

describe('evaporationFluxKgM2s()', () => {
  it('equals the native formula converted to SI (K, m/s in; kg/(m2 s) out)', () => {
    for (const row of unoFixture.rows.filter((candidate) => candidate.evaporationKgM2h > 0)) {
      const flux = evaporationFluxKgM2s(
        {
          airTemperatureK: row.airTemperatureC + 273.15,
          concreteTemperatureK: row.concreteTemperatureC + 273.15,
          relativeHumidity: row.relativeHumidity,
          windMS: row.windKmH / 3.6,
        },
        { surfacePoreHumidity: row.surfacePoreHumidity },
      );
      expectClose(flux * 3600, row.evaporationKgM2h);
    }
  });
});

describe('evaporationEstimateBand()', () => {
  it('spans +-40 % (Hover 2006, ACI Materials Journal 103(5))', () => {
    expect(EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY).toBe(0.4);
    const band = evaporationEstimateBand(1);
    expect(band.low).toBeCloseTo(0.6, 12);
    expect(band.high).toBeCloseTo(1.4, 12);
  });
});
