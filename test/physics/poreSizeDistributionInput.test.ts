import { describe, expect, it } from 'vitest';
import {
  parsePoreSizeDistribution,
  parsePoreSizeDistributionJson,
  poreSizeDistributionFileSchema,
  PoreSizeDistributionInputError,
} from '../../server/src/physics/poreSizeDistributionInput.ts';

describe('parsePoreSizeDistribution() accepts the documented forms', () => {
  it('converts a log-normal mixture from um to m', () => {
    expect(
      parsePoreSizeDistribution({
        lognormal: [
          { medianDiameterUm: 0.03, geometricSd: 2.5, volumeFraction: 0.7 },
          { medianDiameterUm: 1, geometricSd: 1.8, volumeFraction: 0.3 },
        ],
      }),
    ).toEqual({
      kind: 'lognormal',
      modes: [
        { medianDiameterM: 0.03e-6, geometricSd: 2.5, volumeFraction: 0.7 },
        { medianDiameterM: 1e-6, geometricSd: 1.8, volumeFraction: 0.3 },
      ],
    });
  });

  it('converts a diameter table from um to m', () => {
    const psd = parsePoreSizeDistribution({
      table: [
        { diameterUm: 0.01, cumulativeFraction: 0.2 },
        { diameterUm: 1, cumulativeFraction: 1 },
      ],
    });
    expect(psd).toEqual({
      kind: 'table',
      points: [
        { diameterM: 1e-8, cumulativeFraction: 0.2 },
        { diameterM: 1e-6, cumulativeFraction: 1 },
      ],
    });
  });

  // Washburn (1921); ASTM D4404 / ISO 15901-1 defaults gamma_Hg = 0.485 N/m, theta = 130 deg:
  // D = 4 x 0.485 x cos(50 deg) / P = 1.24701 um at 1 MPa (cos 50 deg = 0.6427876, by hand).
  it.each([
    [{}, 1, (4 * 0.485 * 0.6427876097) / 1e6],
    [{}, 100, (4 * 0.485 * 0.6427876097) / 1e8],
    [
      { mercurySurfaceTensionNPerM: 0.48, mercuryContactAngleDeg: 140 },
      10,
      (4 * 0.48 * 0.7660444431) / 1e7,
    ],
  ])('converts intrusion pressure by Washburn (%o, %s MPa)', (mercury, pressureMPa, expectedM) => {
    const psd = parsePoreSizeDistribution({
      ...mercury,
      table: [
        { intrusionPressureMPa: pressureMPa, cumulativeFraction: 0.5 },
        { intrusionPressureMPa: pressureMPa / 10, cumulativeFraction: 0.9 },
      ],
    });
    if (psd.kind !== 'table') throw new Error('expected a table');
    const [first, second] = psd.points.map((point) => point.diameterM);
    expect(Math.abs((first ?? Number.NaN) / expectedM - 1)).toBeLessThan(1e-9);
    expect((second ?? Number.NaN) / (first ?? Number.NaN)).toBeCloseTo(10, 12);
  });

  it('converts van Genuchten alpha from 1/MPa to 1/Pa with the default fit surface tension', () => {
    expect(parsePoreSizeDistribution({ vanGenuchten: { alphaPerMPa: 0.5, n: 2.2 } })).toEqual({
      kind: 'van-genuchten',
      alphaPerPa: 5e-7,
      n: 2.2,
      surfaceTensionNPerM: 0.07274,
    });
  });

  it('exports the zod schema for the CLI', () => {
    expect(
      poreSizeDistributionFileSchema.safeParse({ vanGenuchten: { alphaPerMPa: 1, n: 2 } }).success,
    ).toBe(true);
  });
});

describe('parsePoreSizeDistribution() rejects bad input naming field, rule and value', () => {
  const mode = { medianDiameterUm: 0.03, geometricSd: 2.5, volumeFraction: 1 };
  it.each([
    [
      { lognormal: [{ ...mode, geometricSd: 0.8 }] },
      'psd lognormal[0].geometricSd must be greater than 1 (a geometric standard deviation): got 0.8',
    ],
    [
      { lognormal: [{ ...mode, medianDiameterUm: -1 }] },
      'psd lognormal[0].medianDiameterUm must be greater than 0 um: got -1',
    ],
    [
      { lognormal: [{ medianDiameterUm: 0.03, volumeFraction: 1 }] },
      'psd lognormal[0].geometricSd is required: got nothing',
    ],
    [
      { lognormal: [{ ...mode, medianDiameterUm: '0.03' }] },
      'psd lognormal[0].medianDiameterUm must be a finite number: got "0.03"',
    ],
    [
      { lognormal: [{ ...mode, volumeFraction: 0.5 }] },
      'psd lognormal volumeFraction of the modes must sum to 1 (within 0.001): got 0.5',
    ],
    [{ lognormal: [mode, mode, mode, mode] }, 'psd lognormal must hold at most 3 modes'],
    [
      { lognormal: [{ ...mode, colour: 'grey' }] },
      'psd lognormal[0] must have only known keys: got colour',
    ],
    [{}, 'psd must have exactly one of the keys lognormal, table, vanGenuchten: got none'],
    [
      { lognormal: [mode], vanGenuchten: { alphaPerMPa: 1, n: 2 } },
      'psd must have exactly one of the keys lognormal, table, vanGenuchten: got lognormal, vanGenuchten',
    ],
    [
      [1, 2],
      'psd must be a JSON object with one of the keys lognormal, table, vanGenuchten: got [1,2]',
    ],
    [
      { table: [{ diameterUm: 0.01, cumulativeFraction: 0.5 }] },
      'psd table must hold at least 2 points',
    ],
    [
      {
        table: [
          { diameterUm: 0.01, cumulativeFraction: 0.7 },
          { diameterUm: 0.1, cumulativeFraction: 0.6 },
        ],
      },
      'psd table cumulativeFraction must not decrease as the diameter grows: got 0.6 at 0.1 um after 0.7 at 0.01 um',
    ],
    [
      {
        table: [
          { intrusionPressureMPa: 10, cumulativeFraction: 0.9 },
          { intrusionPressureMPa: 1, cumulativeFraction: 0.5 },
        ],
      },
      'psd table cumulativeFraction must not decrease as the diameter grows: got 0.5 at 1.24701 um after 0.9 at 0.124701 um',
    ],
    [
      {
        table: [
          { diameterUm: 0.01, cumulativeFraction: 0.2 },
          { diameterUm: 0.01, cumulativeFraction: 0.3 },
        ],
      },
      'psd table diameters must be distinct: got 0.01 um twice',
    ],
    [
      { table: [{ cumulativeFraction: 0.2 }, { diameterUm: 0.1, cumulativeFraction: 0.3 }] },
      'psd table[0] must give exactly one of diameterUm or intrusionPressureMPa',
    ],
    [
      {
        table: [
          { diameterUm: 0.01, cumulativeFraction: 1.2 },
          { diameterUm: 0.1, cumulativeFraction: 1 },
        ],
      },
      'psd table[0].cumulativeFraction must be at most 1: got 1.2',
    ],
    [
      {
        table: [
          { diameterUm: 0.01, cumulativeFraction: 0 },
          { diameterUm: 0.1, cumulativeFraction: 1 },
        ],
        mercuryContactAngleDeg: 60,
      },
      'psd mercuryContactAngleDeg must be greater than 90 deg (mercury does not wet): got 60',
    ],
    [
      { vanGenuchten: { alphaPerMPa: -0.5, n: 2.2 } },
      'psd vanGenuchten.alphaPerMPa must be greater than 0 per MPa: got -0.5',
    ],
    [
      { vanGenuchten: { alphaPerMPa: 0.5, n: 1 } },
      'psd vanGenuchten.n must be greater than 1: got 1',
    ],
  ])('%j', (input, message) => {
    expect(() => parsePoreSizeDistribution(input)).toThrow(PoreSizeDistributionInputError);
    expect(() => parsePoreSizeDistribution(input)).toThrow(message);
  });

  it('names the source and reports invalid JSON', () => {
    expect(() => parsePoreSizeDistributionJson('{"lognormal":', 'mortar.json')).toThrow(
      /^mortar\.json must be valid JSON: got /,
    );
    expect(() =>
      parsePoreSizeDistributionJson('{"vanGenuchten":{"alphaPerMPa":0,"n":2}}', 'vg.json'),
    ).toThrow('vg.json vanGenuchten.alphaPerMPa must be greater than 0 per MPa: got 0');
  });
});
