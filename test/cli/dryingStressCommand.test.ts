/**
 * `meniscus drying-stress`: the JSON against the physics pipeline called in-process, the stress
 * modes against their definitions (physics.md section 5) applied to the reported equivalent pore
 * pressures, the temperature scaling of surface tension, the rule of thumb of physics.md section 5
 * (common practice), and exit code 2 for each kind of bad file or flag.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dryingStressOnSaturationProfile } from '../../server/src/physics/dryingStress.ts';
import { equivalentPorePressureCurve } from '../../server/src/physics/equivalentPorePressure.ts';
import { parsePoreSizeDistribution } from '../../server/src/physics/poreSizeDistributionInput.ts';
import { retentionFromPoreSizes } from '../../server/src/physics/retention.ts';
import { waterSurfaceTensionNPerM } from '../../server/src/physics/waterSurfaceTension.ts';
import {
  callCli,
  fixtureFolder,
  isOneLine,
  runCli,
  runCliJson,
  type FixtureFolder,
} from './_runCli.ts';

/** Fine-pored cementitious mortar: most pore volume below 0.1 um (physics.md section 5). */
const MORTAR_PSD = { lognormal: [{ medianDiameterUm: 0.03, geometricSd: 2.5, volumeFraction: 1 }] };
/** Coarse-pored stone: half the pore volume wider than 1 um, nothing below about 0.05 um. */
const STONE_PSD = { lognormal: [{ medianDiameterUm: 1, geometricSd: 2, volumeFraction: 1 }] };
/** A two-mode mortar given as a table, to exercise the table form of the PSD file. */
const TABLE_PSD = {
  table: [
    { diameterUm: 0.005, cumulativeFraction: 0 },
    { diameterUm: 0.02, cumulativeFraction: 0.35 },
    { diameterUm: 0.1, cumulativeFraction: 0.8 },
    { diameterUm: 1, cumulativeFraction: 0.95 },
    { diameterUm: 10, cumulativeFraction: 1 },
  ],
};

/** A steep drying front: dry skin, wet below a few millimetres; 50 mm to the symmetry plane. */
const STEEP: readonly (readonly [number, number])[] = [
  [0, 0.3],
  [0.5, 0.6],
  [1, 0.85],
  [2, 0.97],
  [5, 1],
  [20, 1],
  [50, 1],
];

const csv = (rows: readonly (readonly [number, number])[]) =>
  ['depthMm,saturation', ...rows.map(([depth, saturation]) => `${depth},${saturation}`)].join('\n');

let folder: FixtureFolder;
beforeAll(() => {
  folder = fixtureFolder();
  folder.write('mortar.json', JSON.stringify(MORTAR_PSD));
  folder.write('stone.json', JSON.stringify(STONE_PSD));
  folder.write('table.json', JSON.stringify(TABLE_PSD));
  folder.write('steep.csv', csv(STEEP));
  folder.write(
    'uniform.csv',
    csv([
      [0, 0.7],
      [10, 0.7],
      [40, 0.7],
      [100, 0.7],
    ]),
  );
  folder.write('not-json.json', '{"lognormal": [');
  folder.write(
    'bad-sd.json',
    JSON.stringify({
      lognormal: [{ medianDiameterUm: 0.03, geometricSd: 0.8, volumeFraction: 1 }],
    }),
  );
  folder.write('two-forms.json', JSON.stringify({ ...MORTAR_PSD, ...TABLE_PSD }));
  folder.write('wrong-columns.csv', 'depth,S\n0,0.5\n10,1\n');
  folder.write(
    'backwards.csv',
    csv([
      [0, 0.5],
      [2, 0.8],
      [1, 0.9],
    ]),
  );
  folder.write(
    'repeated.csv',
    csv([
      [0, 0.5],
      [2, 0.8],
      [2, 0.9],
    ]),
  );
  folder.write(
    'no-surface.csv',
    csv([
      [1, 0.5],
      [2, 0.8],
    ]),
  );
  folder.write(
    'oversaturated.csv',
    csv([
      [0, 0.5],
      [2, 1.2],
    ]),
  );
  folder.write('one-row.csv', csv([[0, 0.5]]));
  folder.write('ragged.csv', 'depthMm,saturation\n0,0.5\n2,0.8,3\n');
});
afterAll(() => folder.remove());

interface ProfileRow {
  depthMm: number;
  saturation: number;
  liquidPressureMPa: number;
  equivalentPorePressureMPa: number;
  stressMPa: number;
}

/** In-process by default (see _runCli.ts); `spawned` runs the real bin. */
const dryingStress = async (...args: string[]) => runDryingStress(args, callCli);
const spawned = async (...args: string[]) => runDryingStress(args, runCli);

const runDryingStress = async (args: readonly string[], runner: typeof runCli) => {
  const run = await runCliJson(['drying-stress', ...args], folder.path, runner);
  return { json: run.json, profile: run.json['profile'] as ProfileRow[] };
};

/** Trapezoid mean over depth, the weighting physics.md section 5 asks for node profiles. */
function trapezoidMean(depths: readonly number[], values: readonly number[]): number {
  const at = (list: readonly number[], i: number) => list[i] ?? Number.NaN;
  let area = 0;
  for (let i = 1; i < depths.length; i++) {
    area += ((at(depths, i) - at(depths, i - 1)) * (at(values, i) + at(values, i - 1))) / 2;
  }
  return area / (at(depths, depths.length - 1) - at(depths, 0));
}

describe.concurrent('meniscus drying-stress --json', () => {
  it.each([
    ['mortar.json', 'flat', []],
    ['mortar.json', 'curl', []],
    ['table.json', 'restrained', ['--restraint', '0.6', '--biot', '0.8', '--poisson', '0.25']],
  ] as const)(
    '%s, mode %s agrees with the physics library in-process',
    async (psdFile, mode, extra) => {
      const { json, profile } = await dryingStress(
        '--psd',
        psdFile,
        '--saturation',
        'steep.csv',
        '--mode',
        mode,
        ...extra,
      );
      const psd = parsePoreSizeDistribution(psdFile === 'mortar.json' ? MORTAR_PSD : TABLE_PSD);
      const retention = retentionFromPoreSizes(psd, waterSurfaceTensionNPerM(293.15));
      const pi = equivalentPorePressureCurve(retention);
      const expected = dryingStressOnSaturationProfile(
        { depthsM: STEEP.map(([depthMm]) => depthMm / 1000) },
        STEEP.map(([, saturation]) => saturation),
        (saturation) => pi.fromSaturation(saturation),
        mode === 'restrained'
          ? { mode, restraintDegree: 0.6, biotCoefficient: 0.8, poissonRatio: 0.25 }
          : { mode },
      );
      expect(json['surfaceStressMPa']).toBeCloseTo(expected.surfaceStressPa / 1e6, 9);
      expect(profile).toHaveLength(STEEP.length);
      profile.forEach((row, i) => {
        expect(row.depthMm).toBe(STEEP[i]?.[0]);
        expect(row.saturation).toBe(STEEP[i]?.[1]);
        expect(row.stressMPa).toBeCloseTo((expected.stressesPa[i] ?? Number.NaN) / 1e6, 9);
        expect(row.equivalentPorePressureMPa).toBeCloseTo(
          (expected.equivalentPressuresPa[i] ?? Number.NaN) / 1e6,
          9,
        );
        expect(row.liquidPressureMPa).toBeCloseTo(
          retention.liquidPressure(row.saturation) / 1e6,
          9,
        );
      });
      expect(json['caution']).toContain('Estimates only');
    },
  );

  it('flat mode is C (<pi> - pi) with C = b (1 - 2 nu) / (1 - nu) psi, applied to the reported pi', async () => {
    const { json, profile } = await spawned(
      ...['--psd', 'mortar.json', '--saturation', 'steep.csv', '--mode', 'flat'],
      ...['--biot', '0.8', '--poisson', '0.25', '--relaxation', '0.5'],
    );
    const factor = (0.8 * (1 - 2 * 0.25) * 0.5) / (1 - 0.25); // physics.md section 5
    expect(json['stressFactor']).toBeCloseTo(factor, 12);
    const depths = profile.map((row) => row.depthMm);
    const mean = trapezoidMean(
      depths,
      profile.map((row) => row.equivalentPorePressureMPa),
    );
    for (const row of profile) {
      expect(row.stressMPa).toBeCloseTo(factor * (mean - row.equivalentPorePressureMPa), 9);
      // Coussy (2004): pi(S) = S p(S) + integral_S^1 p ds lies between p(S) and 0.
      expect(row.equivalentPorePressureMPa).toBeGreaterThanOrEqual(row.liquidPressureMPa - 1e-9);
      expect(row.equivalentPorePressureMPa).toBeLessThan(0);
    }
    expect(json['surfaceStressMPa']).toBe(profile[0]?.stressMPa);
    expect(json['surfaceStressMPa']).toBeGreaterThan(0); // the dry skin is in tension
  });

  it('a uniform profile gives zero stress when flat or curling, and -C pi when fully restrained', async () => {
    const [flat, curl, restrained] = await Promise.all([
      dryingStress('--psd', 'mortar.json', '--saturation', 'uniform.csv', '--mode', 'flat'),
      dryingStress('--psd', 'mortar.json', '--saturation', 'uniform.csv', '--mode', 'curl'),
      dryingStress(
        '--psd',
        'mortar.json',
        '--saturation',
        'uniform.csv',
        '--mode',
        'restrained',
        '--restraint',
        '1',
      ),
    ]);
    for (const row of [...flat.profile, ...curl.profile])
      expect(Math.abs(row.stressMPa)).toBeLessThan(1e-9);
    for (const row of restrained.profile) {
      expect(row.stressMPa).toBeCloseTo(-0.75 * row.equivalentPorePressureMPa, 9); // C = 0.75 at b = 1, nu = 0.2
    }
  });

  it('warmer pore water lowers the stress in proportion to its surface tension (IAPWS R1-76)', async () => {
    const [at20, at40] = await Promise.all([
      dryingStress('--psd', 'mortar.json', '--saturation', 'steep.csv', '--mode', 'flat'),
      dryingStress(
        '--psd',
        'mortar.json',
        '--saturation',
        'steep.csv',
        '--mode',
        'flat',
        '--temp',
        '40',
      ),
    ]);
    // IAPWS R1-76(2014) table: 72.74 mN/m at 20 degC, 69.60 mN/m at 40 degC (from memory).
    expect(at20.json['surfaceTensionNPerM']).toBeCloseTo(0.07274, 5);
    expect(at40.json['surfaceTensionNPerM']).toBeCloseTo(0.0696, 5);
    // Young-Laplace: at fixed pore geometry p, pi and so the stress scale with gamma.
    const ratio = Number(at40.json['surfaceStressMPa']) / Number(at20.json['surfaceStressMPa']);
    expect(ratio).toBeCloseTo(
      Number(at40.json['surfaceTensionNPerM']) / Number(at20.json['surfaceTensionNPerM']),
      6,
    );
  });

  it('coarse stone stays near 0.1 MPa where fine mortar passes its ~3 MPa tensile strength (common practice)', async () => {
    const [stone, mortar] = await Promise.all([
      dryingStress('--psd', 'stone.json', '--saturation', 'steep.csv', '--mode', 'flat'),
      dryingStress('--psd', 'mortar.json', '--saturation', 'steep.csv', '--mode', 'flat'),
    ]);
    // Rule of thumb of physics.md section 5, common practice (not a published source).
    expect(Number(stone.json['surfaceStressMPa'])).toBeLessThan(0.5);
    expect(Number(mortar.json['surfaceStressMPa'])).toBeGreaterThan(3);
  });
});

describe.concurrent('meniscus drying-stress (human output)', () => {
  it('prints the depth profile table, the parameters and the caution', async () => {
    const run = await runCli(
      ['drying-stress', '--psd', 'mortar.json', '--saturation', 'steep.csv', '--mode', 'curl'],
      folder.path,
    );
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('Drying stress, mode curl: surface stress');
    expect(run.stdout).toContain('equiv. pore pressure (MPa)');
    expect(run.stdout).toMatch(/│ 50\.00\s*│ 1\.000\s*│/);
    expect(run.stdout).toContain('stress factor C');
    expect(run.stdout).toContain('Caution: Estimates only');
  });
});

describe.concurrent('meniscus drying-stress with bad input', () => {
  const base = ['--psd', 'mortar.json', '--saturation', 'steep.csv'];
  it.each([
    [
      'a missing PSD file',
      ['--psd', 'nope.json', '--saturation', 'steep.csv', '--mode', 'flat'],
      '--psd must name an existing file: got nope.json',
    ],
    [
      'a PSD file that is not JSON',
      ['--psd', 'not-json.json', '--saturation', 'steep.csv', '--mode', 'flat'],
      '--psd not-json.json is not valid JSON',
    ],
    [
      'a PSD mode with a bad spread',
      ['--psd', 'bad-sd.json', '--saturation', 'steep.csv', '--mode', 'flat'],
      '--psd bad-sd.json lognormal[0].geometricSd must be greater than 1 (a geometric standard deviation): got 0.8',
    ],
    [
      'a PSD with two forms',
      ['--psd', 'two-forms.json', '--saturation', 'steep.csv', '--mode', 'flat'],
      '--psd two-forms.json must have exactly one of the keys lognormal, table, vanGenuchten',
    ],
    [
      'a missing saturation file',
      ['--psd', 'mortar.json', '--saturation', 'nope.csv', '--mode', 'flat'],
      '--saturation must name an existing file: got nope.csv',
    ],
    [
      'wrong columns',
      ['--psd', 'mortar.json', '--saturation', 'wrong-columns.csv', '--mode', 'flat'],
      'must have a header row with the columns depthMm,saturation (missing depthMm, saturation): got columns depth,S',
    ],
    [
      'a ragged row',
      ['--psd', 'mortar.json', '--saturation', 'ragged.csv', '--mode', 'flat'],
      '--saturation ragged.csv is not valid CSV',
    ],
    [
      'depths going backwards',
      ['--psd', 'mortar.json', '--saturation', 'backwards.csv', '--mode', 'flat'],
      '--saturation backwards.csv line 4, column depthMm must increase from row to row (previous row 2 mm): got 1',
    ],
    [
      'a repeated depth',
      ['--psd', 'mortar.json', '--saturation', 'repeated.csv', '--mode', 'flat'],
      'line 4, column depthMm must increase from row to row (previous row 2 mm): got 2',
    ],
    [
      'a profile that does not start at the surface',
      ['--psd', 'mortar.json', '--saturation', 'no-surface.csv', '--mode', 'flat'],
      'line 2, column depthMm must be 0 (the exposed surface) in the first row: got 1',
    ],
    [
      'a saturation above 1',
      ['--psd', 'mortar.json', '--saturation', 'oversaturated.csv', '--mode', 'flat'],
      'line 3, column saturation must be between 0 and 1 (fraction): got 1.2',
    ],
    [
      'a single depth',
      ['--psd', 'mortar.json', '--saturation', 'one-row.csv', '--mode', 'flat'],
      'must hold at least two depths',
    ],
    [
      'an unknown mode',
      [...base, '--mode', 'bent'],
      '--mode must be one of flat, curl, restrained: got "bent"',
    ],
    [
      'restrained without a degree',
      [...base, '--mode', 'restrained'],
      '--restraint is required with --mode restrained (0 to 1)',
    ],
    [
      'a restraint above 1',
      [...base, '--mode', 'restrained', '--restraint', '1.5'],
      '--restraint must be between 0 and 1 (fraction): got 1.5',
    ],
    [
      'a restraint with flat mode',
      [...base, '--mode', 'flat', '--restraint', '0.5'],
      '--restraint only applies with --mode restrained, not flat: got 0.5',
    ],
    [
      "Poisson's ratio of 0.5",
      [...base, '--mode', 'flat', '--poisson', '0.5'],
      '--poisson must be at least 0 and less than 0.5 (dimensionless): got 0.5',
    ],
    [
      'a Biot coefficient of 0',
      [...base, '--mode', 'flat', '--biot', '0'],
      '--biot must be greater than 0 and at most 1 (dimensionless): got 0',
    ],
    ['no mode', base, "required option '--mode <mode>' not specified"],
  ])('%s: exit 2 with a one-line message', async (_case, args, message) => {
    const run = await callCli(['drying-stress', ...args], folder.path);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(isOneLine(run.stderr)).toBe(true);
  });
});
