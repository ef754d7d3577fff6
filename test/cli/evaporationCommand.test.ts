/**
 * `meniscus evaporation`: the JSON against Uno's formula written out here independently and
 * against the physics library called in-process; the wind-height conversion; the ACI 305R
 * verdict; the human table; exit code 2 for each kind of bad flag.
 */
import { describe, expect, it } from 'vitest';
import { unoEvaporationRateKgM2h } from '../../server/src/physics/evaporation.ts';
import { windSpeedAtUnoHeight } from '../../server/src/physics/windProfile.ts';
import { callCli, isOneLine, runCli, runCliJson } from './_runCli.ts';

/** Uno (1998), ACI Materials Journal 95(4), metric form, written out independently. */
function unoFormula(airC: number, concreteC: number, rhFraction: number, windKmH: number): number {
  return 5 * ((concreteC + 18) ** 2.5 - rhFraction * (airC + 18) ** 2.5) * (windKmH + 4) * 1e-6;
}

const weather = (air: number, concrete: number, rh: number, wind: number) => [
  'evaporation',
  '--air-temp',
  String(air),
  '--concrete-temp',
  String(concrete),
  '--rh',
  String(rh),
  '--wind',
  String(wind),
];

describe.concurrent('meniscus evaporation --json', () => {
  it("gives Uno's rate for a hot, dry, windy afternoon (31/34 degC, 35 %, 18 km/h at 0.5 m)", async () => {
    const { json } = await runCliJson(weather(31, 34, 35, 18));
    // Worked by hand from Uno's metric formula: 5 (52^2.5 - 0.35 * 49^2.5) (18 + 4) 1e-6 = 1.4978.
    expect(json['evaporationKgM2h']).toBeCloseTo(1.4978, 4);
    expect(json['evaporationKgM2h']).toBeCloseTo(unoFormula(31, 34, 0.35, 18), 12);
    expect(json['windAt05mKmH']).toBe(18);
    expect(json['windHeightAssumed']).toBe(true);
    expect(json['precautionThresholdKgM2h']).toBe(1);
    expect(json['precautionsNeeded']).toBe(true);
    expect(json['verdict']).toBe('precautions-needed');
    // +-40 % band, Hover (2006), ACI Materials Journal 103(5).
    expect(json['uncertaintyPercent']).toBe(40);
    expect(json['evaporationLowKgM2h']).toBeCloseTo(0.6 * 1.4978, 4);
    expect(json['evaporationHighKgM2h']).toBeCloseTo(1.4 * 1.4978, 4);
    expect(typeof json['caution']).toBe('string');
    expect(json['caution']).toContain('licensed engineer');
  });

  it.each([
    // [air, concrete, rh %, wind km/h]: a mild morning, a cool windy day, a calm hot day.
    [18, 20, 70, 5],
    [8, 12, 55, 30],
    [35, 38, 20, 0],
  ])(
    'matches the physics library for %s/%s degC, rh %s percent, wind %s km/h',
    async (air, concrete, rh, wind) => {
      const { json } = await runCliJson(weather(air, concrete, rh, wind), undefined, callCli);
      const expected = unoEvaporationRateKgM2h({
        airTemperatureC: air,
        concreteTemperatureC: concrete,
        relativeHumidity: rh / 100,
        windKmH: wind,
      });
      expect(json['evaporationKgM2h']).toBeCloseTo(expected, 12);
      expect(json['evaporationKgM2h']).toBeCloseTo(unoFormula(air, concrete, rh / 100, wind), 12);
      expect(json['precautionsNeeded']).toBe(expected >= 1);
    },
  );

  it('brings a 10 m mast wind down to 0.5 m by the log profile (z0 = 0.03 m)', async () => {
    const { json } = await runCliJson(
      [...weather(31, 34, 35, 18), '--wind-height', '10'],
      undefined,
      callCli,
    );
    // u(0.5) = u(10) ln(0.5 / 0.03) / ln(10 / 0.03): the log law of the surface layer.
    const at05 = (18 * Math.log(0.5 / 0.03)) / Math.log(10 / 0.03);
    expect(json['windAt05mKmH']).toBeCloseTo(at05, 10);
    expect(json['windAt05mKmH']).toBeCloseTo(windSpeedAtUnoHeight(18, 10), 12);
    expect(json['windHeightM']).toBe(10);
    expect(json['windHeightAssumed']).toBe(false);
    expect(json['evaporationKgM2h']).toBeCloseTo(unoFormula(31, 34, 0.35, at05), 12);
    expect(json['precautionsNeeded']).toBe(false);
  });

  it('uses a rougher terrain when --roughness-length is given', async () => {
    const { json } = await runCliJson(
      [...weather(31, 34, 35, 18), '--wind-height', '10', '--roughness-length', '0.3'],
      undefined,
      callCli,
    );
    expect(json['windAt05mKmH']).toBeCloseTo((18 * Math.log(0.5 / 0.3)) / Math.log(10 / 0.3), 10);
  });

  it('halves the threshold for a sensitive mix (silica fume, low w/c)', async () => {
    const { json } = await runCliJson(
      [...weather(31, 34, 35, 8), '--sensitive-mix'],
      undefined,
      callCli,
    );
    expect(json['precautionThresholdKgM2h']).toBe(0.5);
    expect(json['evaporationKgM2h']).toBeCloseTo(unoFormula(31, 34, 0.35, 8), 12); // 0.82
    expect(json['precautionsNeeded']).toBe(true);
  });

  it('reports zero, not condensation, when the air is warmer and damper than the surface', async () => {
    const { json } = await runCliJson(weather(25, 15, 95, 10), undefined, callCli);
    expect(json['evaporationKgM2h']).toBe(0);
    expect(json['precautionsNeeded']).toBe(false);
  });
});

describe.concurrent('meniscus evaporation (human output)', () => {
  it('prints the table, the assumption on wind height and the caution', async () => {
    const run = await runCli(weather(31, 34, 35, 18));
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/evaporation rate\s*│\s*1\.50\s*│\s*kg\/m2\/h/);
    expect(run.stdout).toMatch(/band \(\+-40 %, Hover 2006\)\s*│\s*0\.90 to 2\.10/);
    expect(run.stdout).toContain('take precautions against plastic shrinkage cracking');
    expect(run.stdout).toContain('taken as measured about 0.5 m above the surface');
    expect(run.stdout).toContain('Caution: Estimates only');
  });
});

describe.concurrent('meniscus evaporation with bad flags', () => {
  it.each([
    [
      'air temperature too low for the formula',
      weather(-20, 10, 50, 10),
      '--air-temp must be between -15 and 60 (degC): got -20',
    ],
    [
      'concrete temperature not a number',
      weather(20, Number.NaN, 50, 10),
      '--concrete-temp must be a number (degC): got "NaN"',
    ],
    [
      'humidity as a fraction above 100',
      weather(20, 22, 250, 10),
      '--rh must be between 0 and 100 (percent): got 250',
    ],
    ['negative wind', weather(20, 22, 50, -3), '--wind must be between 0 and 150 (km/h): got -3'],
    [
      'wind height zero',
      [...weather(20, 22, 50, 10), '--wind-height', '0'],
      '--wind-height must be greater than 0 and at most 100 (m): got 0',
    ],
    [
      'wind height inside the roughness',
      [...weather(20, 22, 50, 10), '--wind-height', '0.02'],
      '--wind-height must be above the roughness length (0.03 m): got 0.02',
    ],
    [
      'missing air temperature',
      ['evaporation', ...weather(20, 22, 50, 10).slice(3)],
      "required option '--air-temp <C>' not specified",
    ],
  ])('%s: exit 2, one line', async (_case, args, message) => {
    const run = await callCli(args);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(isOneLine(run.stderr)).toBe(true);
  });
});
