/**
 * `meniscus maturity`: equivalent ages and temperature-time factor of a CSV record, against
 * the ASTM C1074 definitions written out here for records whose integral is exact, and against
 * the physics library called in-process for an irregular record; exit code 2 for bad files,
 * rows and flags.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { maturityOfSeries } from '../../server/src/physics/maturity.ts';
import {
  callCli,
  fixtureFolder,
  isOneLine,
  runCli,
  runCliJson,
  type FixtureFolder,
} from './_runCli.ts';

const R = 8.314462618; // J/(mol K), CODATA 2018
const HOUR_MS = 3_600_000;
const START_MS = Date.parse('2026-06-14T05:00:00Z');

/** A CSV record with readings at the given hours after START_MS (written with a +02:00 offset). */
function csv(readings: readonly (readonly [hours: number, temperatureC: number])[]): string {
  const rows = readings.map(([hours, temperatureC]) => {
    const local = new Date(START_MS + hours * HOUR_MS + 2 * HOUR_MS).toISOString().slice(0, 19);
    return `${local}+02:00,${temperatureC}`;
  });
  return ['time,temperatureC', ...rows].join('\n') + '\n';
}

/** An irregular night-and-morning record with one 3 h logger outage (hours, degC). */
const IRREGULAR: readonly (readonly [number, number])[] = [
  [0, 24.5],
  [0.25, 25.1],
  [0.6, 26.0],
  [1, 27.2],
  [1.5, 28.9],
  [4.5, 33.4],
  [4.75, 33.0],
  [5.2, 31.8],
  [6, 29.5],
];

let folder: FixtureFolder;
beforeAll(() => {
  folder = fixtureFolder();
  folder.write(
    'steady20.csv',
    csv([
      [0, 20],
      [0.5, 20],
      [2, 20],
      [2.1, 20],
      [9, 20],
      [24, 20],
    ]),
  );
  folder.write(
    'steady30.csv',
    csv([
      [0, 30],
      [1, 30],
      [4, 30],
      [10, 30],
    ]),
  );
  folder.write(
    'ramp.csv',
    csv([
      [0, 10],
      [1, 15],
      [4, 30],
    ]),
  );
  folder.write('irregular.csv', csv(IRREGULAR));
  folder.write(
    'mixed-offsets.csv',
    'temperatureC,time,probe\n20,2026-06-14T07:00:00+02:00,A\n20,2026-06-14T05:30:00Z,A\n20,2026-06-14 06:00,A\n',
  );
  folder.write('not-iso.csv', 'time,temperatureC\n2026-06-14T07:00:00Z,20\n14/06/2026 08:00,21\n');
  folder.write(
    'bad-temp.csv',
    'time,temperatureC\n2026-06-14T07:00:00Z,20\n2026-06-14T08:00:00Z,warm\n',
  );
  folder.write('hot.csv', 'time,temperatureC\n2026-06-14T07:00:00Z,20\n2026-06-14T08:00:00Z,180\n');
  folder.write(
    'backwards.csv',
    csv([
      [0, 20],
      [2, 21],
      [1, 22],
    ]),
  );
  folder.write('wrong-columns.csv', 'timestamp,temp\n2026-06-14T07:00:00Z,20\n');
  folder.write(
    'ragged.csv',
    'time,temperatureC\n2026-06-14T07:00:00Z,20\n2026-06-14T08:00:00Z,21,3\n',
  );
  folder.write('header-only.csv', 'time,temperatureC\n');
  folder.write('one-row.csv', 'time,temperatureC\n2026-06-14T07:00:00Z,20\n');
});
afterAll(() => folder.remove());

/** In-process run (see _runCli.ts); the first case below spawns the real bin. */
const maturity = (...args: string[]) => runCliJson(['maturity', ...args], folder.path, callCli);

describe.concurrent('meniscus maturity --json', () => {
  it('equivalent age equals real age at the reference temperature (ASTM C1074), both methods', async () => {
    for (const method of ['arrhenius', 'nurse-saul']) {
      const { json } = await runCliJson(
        ['maturity', '--csv', 'steady20.csv', '--method', method],
        folder.path,
      );
      expect(json['method']).toBe(method);
      expect(json['equivalentAgeH']).toBeCloseTo(24, 10);
      expect(json['arrheniusEquivalentAgeH']).toBeCloseTo(24, 10);
      expect(json['nurseSaulEquivalentAgeH']).toBeCloseTo(24, 10);
      expect(json['temperatureTimeFactorCH']).toBeCloseTo(20 * 24, 8); // (20 - 0) degC x 24 h
      expect(json['durationH']).toBeCloseTo(24, 10);
      expect(json['samples']).toBe(6);
      expect(json['gaps']).toHaveLength(3); // 1.5 h, 6.9 h and 15 h intervals exceed 1 h
      expect(json['caution']).toContain('field-cured specimens');
    }
  });

  it('Arrhenius equivalent age at a steady 30 degC follows exp(-E/R (1/T - 1/Tr))', async () => {
    // ASTM C1074 eq. for equivalent age (Freiesleben Hansen and Pedersen), written out here.
    const factor = (energyJMol: number) =>
      Math.exp((-energyJMol / R) * (1 / (30 + 273.15) - 1 / (20 + 273.15)));
    const standard = await maturity('--csv', 'steady30.csv');
    expect(standard.json['equivalentAgeH']).toBeCloseTo(10 * factor(40_000), 9); // about 17.2 h
    const slag = await maturity('--csv', 'steady30.csv', '--activation-energy', '50000');
    expect(slag.json['equivalentAgeH']).toBeCloseTo(10 * factor(50_000), 9);
    expect(slag.json['activationEnergyJMol']).toBe(50_000);
  });

  it('Nurse-Saul over a linear ramp: M = mean excess x duration, exact for the trapezoid', async () => {
    // 10 -> 15 degC over 1 h then 15 -> 30 over 3 h: M = 12.5 + 67.5 = 80 degC h with datum 0.
    const zeroDatum = await maturity('--csv', 'ramp.csv', '--method', 'nurse-saul');
    expect(zeroDatum.json['temperatureTimeFactorCH']).toBeCloseTo(80, 9);
    expect(zeroDatum.json['equivalentAgeH']).toBeCloseTo(80 / 20, 9);
    // Datum -10 degC: M = 80 + 10 x 4 = 120 degC h; te = 120 / (20 - (-10)) = 4 h.
    const lowDatum = await maturity(
      '--csv',
      'ramp.csv',
      '--method',
      'nurse-saul',
      '--datum-temp',
      '-10',
    );
    expect(lowDatum.json['temperatureTimeFactorCH']).toBeCloseTo(120, 9);
    expect(lowDatum.json['equivalentAgeH']).toBeCloseTo(4, 9);
    // Reference 23 degC (ASTM C1074 allows it): te = 80 / 23.
    const warmReference = await maturity(
      '--csv',
      'ramp.csv',
      '--method',
      'nurse-saul',
      '--reference-temp',
      '23',
    );
    expect(warmReference.json['equivalentAgeH']).toBeCloseTo(80 / 23, 9);
  });

  it('an irregular record with an outage agrees with maturityOfSeries() and flags the gap', async () => {
    const { json } = await maturity('--csv', 'irregular.csv', '--max-gap', '2');
    const library = maturityOfSeries(
      IRREGULAR.map(([hours, temperatureC]) => ({
        time: START_MS + hours * HOUR_MS,
        temperatureC,
      })),
      { maxGapS: 2 * 3600 },
    );
    expect(json['arrheniusEquivalentAgeH']).toBeCloseTo(library.arrheniusEquivalentAgeS / 3600, 10);
    expect(json['nurseSaulEquivalentAgeH']).toBeCloseTo(library.nurseSaulEquivalentAgeS / 3600, 10);
    expect(json['temperatureTimeFactorCH']).toBeCloseTo(
      library.nurseSaulTemperatureTimeFactorKS / 3600,
      8,
    );
    expect(json['durationH']).toBeCloseTo(6, 10);
    expect(json['gaps']).toEqual([
      {
        from: '2026-06-14T06:30:00.000Z',
        to: '2026-06-14T09:30:00.000Z',
        fromLine: 6,
        toLine: 7,
        durationH: 3,
      },
    ]);
  });

  it('reads offsets, Z and offset-less times (as UTC) and extra columns', async () => {
    const { json } = await maturity('--csv', 'mixed-offsets.csv');
    expect(json['durationH']).toBeCloseTo(1, 10); // 05:00Z, 05:30Z, 06:00 (UTC)
    expect(json['firstTime']).toBe('2026-06-14T05:00:00.000Z');
  });
});

describe.concurrent('meniscus maturity (human output)', () => {
  it('prints the table, the gap and the caution', async () => {
    const run = await runCli(['maturity', '--csv', 'irregular.csv'], folder.path);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('Maturity of irregular.csv (ASTM C1074; primary: arrhenius)');
    expect(run.stdout).toMatch(/duration of the record\s*│\s*6\.00\s*│\s*h/);
    expect(run.stdout).toContain('gap of 3.00 h between lines 6 and 7');
    expect(run.stdout).toContain('Caution: Estimates only');
  });
});

describe.concurrent('meniscus maturity with bad input', () => {
  it.each([
    ['a missing file', ['--csv', 'nope.csv'], '--csv must name an existing file: got nope.csv'],
    [
      'a time that is not ISO 8601',
      ['--csv', 'not-iso.csv'],
      '--csv not-iso.csv line 3, column time must be an ISO 8601 date-time',
    ],
    [
      'a temperature that is not a number',
      ['--csv', 'bad-temp.csv'],
      '--csv bad-temp.csv line 3, column temperatureC must be a number (degC): got "warm"',
    ],
    [
      'a temperature out of range',
      ['--csv', 'hot.csv'],
      '--csv hot.csv line 3, column temperatureC must be between -50 and 100 (degC): got 180',
    ],
    [
      'times going backwards',
      ['--csv', 'backwards.csv'],
      '--csv backwards.csv line 4, column time must be later than',
    ],
    [
      'wrong columns',
      ['--csv', 'wrong-columns.csv'],
      'must have a header row with the columns time,temperatureC (missing time, temperatureC): got columns timestamp,temp',
    ],
    ['a ragged row', ['--csv', 'ragged.csv'], '--csv ragged.csv is not valid CSV'],
    ['a header without rows', ['--csv', 'header-only.csv'], 'must have at least one data row'],
    ['a single reading', ['--csv', 'one-row.csv'], 'must hold at least two readings: got 1'],
    [
      'an unknown method',
      ['--csv', 'ramp.csv', '--method', 'weighted'],
      '--method must be one of arrhenius, nurse-saul: got "weighted"',
    ],
    [
      'activation energy in kJ/mol',
      ['--csv', 'ramp.csv', '--activation-energy', '40'],
      '--activation-energy must be between 10000 and 100000 (J/mol): got 40',
    ],
    [
      'a datum above the reference',
      ['--csv', 'ramp.csv', '--datum-temp', '20'],
      '--datum-temp must be below the reference temperature (20 degC): got 20',
    ],
    ['no --csv', [], "required option '--csv <file>' not specified"],
  ])('%s: exit 2 with a one-line message', async (_case, args, message) => {
    const run = await callCli(['maturity', ...args], folder.path);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(isOneLine(run.stderr)).toBe(true);
  });
});
