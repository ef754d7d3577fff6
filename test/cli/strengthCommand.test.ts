/**
 * `meniscus strength`: 28-day values against EN 1992-1-1 Table 3.1, development against
 * EN 1992-1-1 3.1.2 written out here, agreement with the physics library in-process, and exit
 * code 2 for an unknown class, cement class or age.
 */
import { describe, expect, it } from 'vitest';
import { parseConcreteClass } from '../../server/src/physics/concreteClass.ts';
import {
  compressiveStrengthAtAgeMPa,
  modulusAtAgeGPa,
  tensileStrengthAtAgeMPa,
} from '../../server/src/physics/strengthDevelopment.ts';
import { callCli, isOneLine, runCli, runCliJson } from './_runCli.ts';

const strengthArgs = (
  concreteClass: string,
  cement: string,
  ageDays: number,
  ...more: string[]
) => [
  'strength',
  '--class',
  concreteClass,
  '--cement',
  cement,
  '--age-days',
  String(ageDays),
  ...more,
];

/** In-process run (see _runCli.ts); the 7-day case below spawns the real bin. */
const strength = (concreteClass: string, cement: string, ageDays: number, ...more: string[]) =>
  runCliJson(strengthArgs(concreteClass, cement, ageDays, ...more), undefined, callCli);

/** beta_cc(t) = exp{s [1 - (28/t)^0.5]}, EN 1992-1-1:2004 eq. (3.2), written out. */
const betaCc = (ageDays: number, s: number) => Math.exp(s * (1 - Math.sqrt(28 / ageDays)));

describe.concurrent('meniscus strength --json', () => {
  // EN 1992-1-1:2004 Table 3.1 (fcm, fctm, Ecm), values from memory; the table rounds fctm to
  // 0.1 MPa and Ecm to 1 GPa, so the tolerance is half a unit of the last digit.
  it.each([
    ['C20/25', 28, 2.2, 30],
    ['C25/30', 33, 2.6, 31],
    ['C30/37', 38, 2.9, 33],
    ['C35/45', 43, 3.2, 34],
    ['C40/50', 48, 3.5, 35],
    ['C45/55', 53, 3.8, 36],
    ['C50/60', 58, 4.1, 37],
    ['C60/75', 68, 4.4, 39],
    ['C90/105', 98, 5.0, 44],
  ])('%s at 28 days matches EN 1992-1-1 Table 3.1', async (name, fcm, fctm, ecm) => {
    const { json } = await strength(name, 'N', 28);
    expect(json['class']).toBe(name);
    expect(json['fcmMPa']).toBeCloseTo(fcm, 9);
    expect(json['fcm28MPa']).toBe(fcm);
    expect(Math.abs(Number(json['fctmMPa']) - fctm)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(Number(json['ecmGPa']) - ecm)).toBeLessThanOrEqual(0.5);
    expect(json['betaCc']).toBeCloseTo(1, 12);
  });

  it('C30/37 with class N cement at 7 days follows EN 1992-1-1 3.1.2', async () => {
    const { json } = await runCliJson(strengthArgs('C30/37', 'N', 7));
    const beta = betaCc(7, 0.25); // = exp(-0.25), s = 0.25 for class N, EN 1992-1-1 3.1.2(6)
    const fctm28 = 0.3 * 30 ** (2 / 3); // Table 3.1 formula
    const ecm28 = 22 * (38 / 10) ** 0.3; // Table 3.1 formula
    expect(json['cementCoefficientS']).toBe(0.25);
    expect(json['betaCc']).toBeCloseTo(Math.exp(-0.25), 12);
    expect(json['fcmMPa']).toBeCloseTo(beta * 38, 10); // eq. (3.1): 29.59 MPa
    expect(json['fctmMPa']).toBeCloseTo(beta * fctm28, 10); // eq. (3.4), alpha = 1 before 28 d
    expect(json['ecmGPa']).toBeCloseTo(beta ** 0.3 * ecm28, 10); // eq. (3.5)
    expect(json['fctm28MPa']).toBeCloseTo(fctm28, 12);
    expect(json['ecm28GPa']).toBeCloseTo(ecm28, 12);
  });

  it.each([
    ['C25/30', 'R', 2],
    ['C40/50', 'S', 90],
    ['C70/85', 'N', 0.8],
  ])('%s with cement %s at %s days agrees with the physics library', async (name, cement, age) => {
    const { json } = await strength(name, cement, age);
    const concrete = parseConcreteClass(name);
    const s = Number(json['cementCoefficientS']);
    expect(s).toBe({ R: 0.2, N: 0.25, S: 0.38 }[cement]);
    expect(json['fcmMPa']).toBeCloseTo(compressiveStrengthAtAgeMPa(age, concrete.fcmMPa, s), 12);
    expect(json['fctmMPa']).toBeCloseTo(tensileStrengthAtAgeMPa(age, concrete.fctmMPa, s), 12);
    expect(json['ecmGPa']).toBeCloseTo(modulusAtAgeGPa(age, concrete.ecmGPa, s), 12);
  });

  it('rapid cement is stronger than slow cement at 3 days, and the class name is case-blind', async () => {
    const [rapid, slow] = await Promise.all([
      strength('c30/37', 'r', 3),
      strength('C30/37', 'S', 3),
    ]);
    expect(rapid.json['class']).toBe('C30/37');
    expect(rapid.json['cementClass']).toBe('R');
    expect(Number(rapid.json['fcmMPa'])).toBeGreaterThan(Number(slow.json['fcmMPa']));
  });

  it('gives the equivalent age at which fcm reaches a target (stripping)', async () => {
    const { json } = await strength('C30/37', 'N', 3, '--target-fcm', '15');
    const ageDays = Number(json['ageForTargetDays']);
    expect(betaCc(ageDays, 0.25) * 38).toBeCloseTo(15, 9);
    expect(json['targetFcmMPa']).toBe(15);
  });

  it('below one day warns that the code curve overstates strength; in place it starts at set', async () => {
    const young = await strength('C30/37', 'N', 0.2);
    const inPlace = young.json['inPlace'] as Record<string, unknown>;
    expect(inPlace['hasSet']).toBe(false); // final set at 0.25 d equivalent age by default
    expect(inPlace['fcmMPa']).toBe(0);
    expect(Number(young.json['fcmMPa'])).toBeGreaterThan(0);
    expect(String(young.json['notes'])).toContain('not calibrated');
  });
});

describe.concurrent('meniscus strength (human output)', () => {
  it('prints the table with the 28-day column and the caution', async () => {
    const run = await runCli(['strength', '--class', 'C30/37', '--cement', 'N', '--age-days', '7']);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('C30/37, cement class N (s = 0.25) at 7 days equivalent age');
    expect(run.stdout).toMatch(/mean compressive strength fcm\s*│\s*29\.6\s*│\s*38\.0/);
    expect(run.stdout).toMatch(/mean tensile strength fctm\s*│\s*2\.26\s*│\s*2\.90/);
    expect(run.stdout).toContain('Caution: Estimates only');
  });
});

describe.concurrent('meniscus strength with bad flags', () => {
  it.each([
    [
      'an unknown class',
      ['--class', 'C33/40', '--cement', 'N', '--age-days', '7'],
      '--class must be one of C12/15 C16/20',
    ],
    [
      'a cube-only class name',
      ['--class', 'C37', '--cement', 'N', '--age-days', '7'],
      'C90/105 (EN 1992-1-1 Table 3.1): got "C37"',
    ],
    [
      'an unknown cement class',
      ['--class', 'C30/37', '--cement', 'CEM I', '--age-days', '7'],
      '--cement must be one of R, N, S: got "CEM I"',
    ],
    [
      'age zero',
      ['--class', 'C30/37', '--cement', 'N', '--age-days', '0'],
      '--age-days must be greater than 0 and at most 3650 (days): got 0',
    ],
    [
      'age in words',
      ['--class', 'C30/37', '--cement', 'N', '--age-days', 'seven'],
      '--age-days must be a number (days): got "seven"',
    ],
    [
      'a negative target',
      ['--class', 'C30/37', '--cement', 'N', '--age-days', '7', '--target-fcm', '-5'],
      '--target-fcm must be greater than 0 and at most 200 (MPa): got -5',
    ],
    [
      'no class',
      ['--cement', 'N', '--age-days', '7'],
      "required option '--class <class>' not specified",
    ],
  ])('%s: exit 2 with a one-line message', async (_case, args, message) => {
    const run = await callCli(['strength', ...args]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(isOneLine(run.stderr)).toBe(true);
  });
});
