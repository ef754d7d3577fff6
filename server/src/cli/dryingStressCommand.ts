/**
 * `meniscus drying-stress`: in-plane drying stress through a plate on a given saturation
 * profile (physics.md section 5): retention curve from the pore-size distribution, Coussy's
 * equivalent pore pressure pi(S) at each depth, then the stress of the chosen mode.
 */
import type { DryingStressMode } from '../physics/dryingStress.ts';
import type { PoreSizeDistribution } from '../physics/retentionCurve.ts';
import { celsiusToKelvin, M_PER_MM, PA_PER_MPA } from '../physics/units.ts';
import type { CommandDefinition } from './commandDefinition.ts';
import { formatNumber } from './output.ts';
import { csvNumber, describeCell, readCsvFile, type CsvTable } from './readCsv.ts';
import { readJsonFile } from './readJsonFile.ts';
import { UsageError } from './usageError.ts';

const MODES: readonly DryingStressMode[] = ['flat', 'curl', 'restrained'];

/** Defaults, each with its origin (the same as the physics library's). */
const DEFAULT_BIOT = 1; // early-age skeleton, upper bound (our assumption)
const DEFAULT_POISSON = 0.2; // uncracked concrete, EN 1992-1-1 3.1.3(4)
const DEFAULT_RELAXATION = 1; // elastic upper bound (physics.md section 5)
const DEFAULT_TEMPERATURE_C = 20;

/**
 * The pore-structure physics, imported when the command runs: its zod schema and numerics add
 * about 0.25 s to the start-up of every other command if imported at the top.
 */
async function loadPhysics() {
  const [dryingStress, equivalentPorePressure, input, retention, surfaceTension] =
    await Promise.all([
      import('../physics/dryingStress.ts'),
      import('../physics/equivalentPorePressure.ts'),
      import('../physics/poreSizeDistributionInput.ts'),
      import('../physics/retention.ts'),
      import('../physics/waterSurfaceTension.ts'),
    ]);
  return { ...dryingStress, ...equivalentPorePressure, ...input, ...retention, ...surfaceTension };
}

type Physics = Awaited<ReturnType<typeof loadPhysics>>;

function readPoreSizes(physics: Physics, path: string, cwd: string): PoreSizeDistribution {
  const parsed = readJsonFile('--psd', path, cwd);
  try {
    return physics.parsePoreSizeDistribution(parsed, `--psd ${path}`);
  } catch (error) {
    if (!(error instanceof physics.PoreSizeDistributionInputError)) throw error;
    throw UsageError.fromMessage(`--psd ${path}`, error.message, error);
  }
}

/** Depths (m) and saturations of the profile file, checked row by row. */
function readSaturationProfile(table: CsvTable): { depthsM: number[]; saturations: number[] } {
  const depthsMm: number[] = [];
  const saturations: number[] = [];
  for (const [index, record] of table.records.entries()) {
    const depthMm = csvNumber(table, record, 'depthMm', { unit: 'mm', min: 0, max: 10_000 });
    const previousMm = depthsMm[index - 1];
    if (index === 0 && depthMm !== 0) {
      throw new UsageError(
        describeCell(table, record, 'depthMm'),
        'must be 0 (the exposed surface) in the first row',
        String(depthMm),
      );
    }
    if (previousMm !== undefined && depthMm <= previousMm) {
      throw new UsageError(
        describeCell(table, record, 'depthMm'),
        `must increase from row to row (previous row ${previousMm} mm)`,
        String(depthMm),
      );
    }
    depthsMm.push(depthMm);
    saturations.push(csvNumber(table, record, 'saturation', { unit: 'fraction', min: 0, max: 1 }));
  }
  if (depthsMm.length < 2) {
    throw new UsageError(
      `${table.flag} ${table.path}`,
      'must hold at least two depths (the surface and the far face or symmetry plane)',
      String(depthsMm.length),
    );
  }
  return { depthsM: depthsMm.map((depthMm) => depthMm * M_PER_MM), saturations };
}

export const dryingStressCommand: CommandDefinition = {
  name: 'drying-stress',
  summary:
    'drying stress through a plate on a saturation profile (Coussy equivalent pore pressure)',
  description:
    'Drying stress on a given saturation profile (physics.md section 5). The retention curve comes ' +
    'from the pore-size distribution by Young-Laplace (capillary bundle, contact angle 0); the ' +
    'equivalent pore pressure is pi(S) = S p(S) + integral_S^1 p ds (Coussy 2004); the stress is ' +
    'sigma = C (<pi> - pi) (flat), C (pi_fit - pi) with the least-squares line (curl) or ' +
    'C ((1 - R) <pi> - pi) (restrained), C = b (1 - 2 nu) / (1 - nu) psi, tension positive. ' +
    'PSD FILE: JSON {"lognormal":[{"medianDiameterUm":..,"geometricSd":..,"volumeFraction":..}]}, ' +
    '{"table":[{"diameterUm":..,"cumulativeFraction":..}]} (fraction of pore volume in pores ' +
    'narrower than the diameter) or {"vanGenuchten":{"alphaPerMPa":..,"n":..}}. Saturation FILE: ' +
    'CSV depthMm,saturation from 0 (the exposed surface) to the far face or the symmetry plane.',
  flags: [
    { flags: '--psd <file>', description: 'pore-size distribution, JSON', required: true },
    {
      flags: '--saturation <file>',
      description: 'CSV with columns depthMm,saturation',
      required: true,
    },
    { flags: '--mode <mode>', description: 'flat, curl or restrained', required: true },
    {
      flags: '--restraint <R>',
      description: 'external restraint degree, 0 to 1 (required with --mode restrained)',
    },
    {
      flags: '--biot <b>',
      description:
        'Biot coefficient, above 0 to 1 (default 1: early-age upper bound, our assumption)',
    },
    {
      flags: '--poisson <nu>',
      description: "Poisson's ratio, 0 to below 0.5 (default 0.2, EN 1992-1-1 3.1.3)",
    },
    {
      flags: '--relaxation <psi>',
      description: 'creep relaxation factor, above 0 to 1 (default 1: elastic upper bound)',
    },
    {
      flags: '--temp <C>',
      description: 'pore water temperature for its surface tension, degC (-10 to 80; default 20)',
    },
  ],
  example:
    'drying-stress --psd mortar-psd.json --saturation profile.csv --mode restrained --restraint 0.6',
  async run(flags, context) {
    const mode = flags.choice('--mode', MODES);
    const restraintDegree = flags.optionalNumber('--restraint', {
      unit: 'fraction',
      min: 0,
      max: 1,
    });
    if (mode === 'restrained' && restraintDegree === undefined) {
      throw new UsageError('--restraint', 'is required with --mode restrained (0 to 1)');
    }
    if (mode !== 'restrained' && restraintDegree !== undefined) {
      throw new UsageError(
        '--restraint',
        `only applies with --mode restrained, not ${mode}`,
        String(restraintDegree),
      );
    }
    const biotCoefficient =
      flags.optionalNumber('--biot', {
        unit: 'dimensionless',
        min: 0,
        max: 1,
        minExclusive: true,
      }) ?? DEFAULT_BIOT;
    const poissonRatio =
      flags.optionalNumber('--poisson', {
        unit: 'dimensionless',
        min: 0,
        max: 0.5,
        maxExclusive: true,
      }) ?? DEFAULT_POISSON;
    const relaxationFactor =
      flags.optionalNumber('--relaxation', {
        unit: 'dimensionless',
        min: 0,
        max: 1,
        minExclusive: true,
      }) ?? DEFAULT_RELAXATION;
    const temperatureC =
      flags.optionalNumber('--temp', { unit: 'degC', min: -10, max: 80 }) ?? DEFAULT_TEMPERATURE_C;

    const physics = await loadPhysics();
    const psdPath = flags.string('--psd');
    const poreSizes = readPoreSizes(physics, psdPath, context.cwd);
    const table = readCsvFile(
      '--saturation',
      flags.string('--saturation'),
      ['depthMm', 'saturation'],
      context.cwd,
    );
    const profile = readSaturationProfile(table);

    const surfaceTensionNPerM = physics.waterSurfaceTensionNPerM(celsiusToKelvin(temperatureC));
    const retention = physics.retentionFromPoreSizes(poreSizes, surfaceTensionNPerM);
    const equivalentPressure = physics.equivalentPorePressureCurve(retention);
    const result = physics.dryingStressOnSaturationProfile(
      { depthsM: profile.depthsM },
      profile.saturations,
      (saturation) => equivalentPressure.fromSaturation(saturation),
      {
        mode,
        ...(restraintDegree === undefined ? {} : { restraintDegree }),
        biotCoefficient,
        poissonRatio,
        relaxationFactor,
      },
    );

    const rows = profile.depthsM.map((depthM, i) => {
      const saturation = profile.saturations[i] as number;
      return {
        depthMm: depthM / M_PER_MM,
        saturation,
        liquidPressureMPa: retention.liquidPressure(saturation) / PA_PER_MPA,
        equivalentPorePressureMPa: (result.equivalentPressuresPa[i] as number) / PA_PER_MPA,
        stressMPa: (result.stressesPa[i] as number) / PA_PER_MPA,
      };
    });
    const surfaceStressMPa = result.surfaceStressPa / PA_PER_MPA;
    const maxStressMPa = Math.max(...rows.map((row) => row.stressMPa));
    const notes: string[] = [];
    if (rows.some((row) => !Number.isFinite(row.liquidPressureMPa))) {
      notes.push(
        'a saturation of 0 has no finite liquid pressure for this distribution (null in JSON).',
      );
    }

    return {
      json: {
        command: 'drying-stress',
        mode,
        ...(restraintDegree === undefined ? {} : { restraintDegree }),
        biotCoefficient,
        poissonRatio,
        relaxationFactor,
        temperatureC,
        surfaceTensionNPerM,
        stressFactor: result.stressFactor,
        airEntryPressureMPa: retention.airEntryPressurePa / PA_PER_MPA,
        maxPoreDiameterUm: retention.maxPoreDiameterM * 1e6,
        thicknessMm: rows[rows.length - 1]?.depthMm ?? Number.NaN,
        surfaceStressMPa,
        maxStressMPa,
        meanEquivalentPorePressureMPa: result.meanEquivalentPressurePa / PA_PER_MPA,
        profile: rows,
        method:
          'retention by Young-Laplace from the pore sizes; equivalent pore pressure after Coussy (2004); thin-plate poroelastic stress (physics.md 5)',
        notes,
      },
      tables: [
        {
          title: `Drying stress, mode ${mode}${restraintDegree === undefined ? '' : ` (restraint ${restraintDegree})`}: surface stress ${formatNumber(surfaceStressMPa, 3)} MPa (tension positive)`,
          head: [
            'depth (mm)',
            'saturation',
            'liquid pressure (MPa)',
            'equiv. pore pressure (MPa)',
            'stress (MPa)',
          ],
          rows: rows.map((row) => [
            formatNumber(row.depthMm, 2),
            formatNumber(row.saturation, 3),
            formatNumber(row.liquidPressureMPa, 3),
            formatNumber(row.equivalentPorePressureMPa, 3),
            formatNumber(row.stressMPa, 3),
          ]),
        },
        {
          title: 'Parameters',
          rows: [
            ['Biot coefficient b', formatNumber(biotCoefficient, 2), ''],
            ["Poisson's ratio nu", formatNumber(poissonRatio, 2), ''],
            ['relaxation factor psi', formatNumber(relaxationFactor, 2), ''],
            ['stress factor C', formatNumber(result.stressFactor, 3), ''],
            [
              `surface tension of water at ${temperatureC} degC`,
              formatNumber(surfaceTensionNPerM * 1000, 2),
              'mN/m',
            ],
            [
              'air-entry pressure',
              formatNumber(retention.airEntryPressurePa / PA_PER_MPA, 4),
              'MPa',
            ],
          ],
        },
      ],
      notes,
    };
  },
};
