/**
 * The pore-size distribution file of the CLI (and of material presets): validation at the edge
 * with zod, then conversion to SI `PoreSizeDistribution`. Accepted forms (exactly one key):
 *
 *   {"lognormal":[{"medianDiameterUm":0.03,"geometricSd":2.5,"volumeFraction":1}]}   (1..3 modes,
 *     shares summing to 1 within 0.001)
 *   {"table":[{"diameterUm":0.01,"cumulativeFraction":0.2}, ...]}
 *   {"table":[{"intrusionPressureMPa":120,"cumulativeFraction":0.2}, ...],
 *    "mercurySurfaceTensionNPerM":0.485, "mercuryContactAngleDeg":130}   (optional, ASTM D4404
 *     / ISO 15901-1 defaults; converted by the Washburn equation)
 *   {"vanGenuchten":{"alphaPerMPa":0.5,"n":2.2,"surfaceTensionNPerM":0.07274}}  (surface tension
 *     of the fit optional: water at 20 degC, IAPWS R1-76(2014), by default)
 *
 * Tables: cumulativeFraction is the fraction of the pore volume in pores narrower than the
 * diameter; in any order, but the fraction must not decrease as the diameter grows.
 * Messages name the field, the rule and the value: "psd lognormal[0].geometricSd must be greater
 * than 1: got 0.8".
 */
import { z } from 'zod';
import type { PoreSizeDistribution } from './retentionCurve.ts';
import {
  MERCURY_CONTACT_ANGLE_RAD,
  MERCURY_SURFACE_TENSION_N_PER_M,
  washburnDiameterM,
} from './washburn.ts';
import { M_PER_UM, PA_PER_MPA } from './units.ts';

/** Surface tension of water at 20 degC, N/m (IAPWS R1-76(2014): 72.74 mN/m), assumed for a fit. */
export const VAN_GENUCHTEN_FIT_SURFACE_TENSION_N_PER_M = 0.07274;

const numberField = () =>
  z.number({
    error: (issue) => (issue.input === undefined ? 'is required' : 'must be a finite number'),
  });

const logNormalModeSchema = z.strictObject({
  medianDiameterUm: numberField().gt(0, 'must be greater than 0 um'),
  geometricSd: numberField().gt(1, 'must be greater than 1 (a geometric standard deviation)'),
  volumeFraction: numberField().gt(0, 'must be greater than 0').lte(1, 'must be at most 1'),
});

const tablePointSchema = z
  .strictObject({
    diameterUm: numberField().gt(0, 'must be greater than 0 um').optional(),
    intrusionPressureMPa: numberField().gt(0, 'must be greater than 0 MPa').optional(),
    cumulativeFraction: numberField().gte(0, 'must be at least 0').lte(1, 'must be at most 1'),
  })
  .superRefine((point, context) => {
    const given =
      Number(point.diameterUm !== undefined) + Number(point.intrusionPressureMPa !== undefined);
    if (given !== 1) {
      context.addIssue({
        code: 'custom',
        message: 'must give exactly one of diameterUm or intrusionPressureMPa',
        input: point,
      });
    }
  });

const vanGenuchtenSchema = z.strictObject({
  alphaPerMPa: numberField().gt(0, 'must be greater than 0 per MPa'),
  n: numberField().gt(1, 'must be greater than 1'),
  surfaceTensionNPerM: numberField().gt(0, 'must be greater than 0 N/m').optional(),
});

/** The zod schema of the pore-size distribution file (before conversion to SI). */
export const poreSizeDistributionFileSchema = z
  .strictObject(
    {
      lognormal: z
        .array(logNormalModeSchema, { error: 'must be a list of modes' })
        .min(1, 'must hold at least 1 mode')
        .max(3, 'must hold at most 3 modes')
        .optional(),
      table: z
        .array(tablePointSchema, { error: 'must be a list of points' })
        .min(2, 'must hold at least 2 points')
        .optional(),
      mercurySurfaceTensionNPerM: numberField().gt(0, 'must be greater than 0 N/m').optional(),
      mercuryContactAngleDeg: numberField()
        .gt(90, 'must be greater than 90 deg (mercury does not wet)')
        .lt(180, 'must be less than 180 deg')
        .optional(),
      vanGenuchten: vanGenuchtenSchema.optional(),
    },
    { error: 'must be a JSON object with one of the keys lognormal, table, vanGenuchten' },
  )
  .superRefine((file, context) => {
    const forms = (['lognormal', 'table', 'vanGenuchten'] as const).filter(
      (key) => file[key] !== undefined,
    );
    if (forms.length !== 1) {
      context.addIssue({
        code: 'custom',
        message: 'must have exactly one of the keys lognormal, table, vanGenuchten',
        input: forms.length === 0 ? 'none' : forms.join(', '),
      });
      return;
    }
    if (file.lognormal !== undefined) {
      const sum = file.lognormal.reduce((total, mode) => total + mode.volumeFraction, 0);
      if (Math.abs(sum - 1) > 1e-3) {
        context.addIssue({
          code: 'custom',
          path: ['lognormal'],
          message: 'volumeFraction of the modes must sum to 1 (within 0.001)',
          input: Number(sum.toPrecision(6)),
        });
      }
    }
    if (file.table !== undefined) checkTable(tableToSi(file), context);
  });

/** The validated file, before conversion to SI. */
export type PoreSizeDistributionFile = z.infer<typeof poreSizeDistributionFileSchema>;

function tableToSi(
  file: PoreSizeDistributionFile,
): { diameterM: number; cumulativeFraction: number }[] {
  const surfaceTension = file.mercurySurfaceTensionNPerM ?? MERCURY_SURFACE_TENSION_N_PER_M;
  const contactAngle =
    file.mercuryContactAngleDeg === undefined
      ? MERCURY_CONTACT_ANGLE_RAD
      : (file.mercuryContactAngleDeg * Math.PI) / 180;
  return (file.table ?? []).map((point) => ({
    diameterM:
      point.diameterUm !== undefined
        ? point.diameterUm * M_PER_UM
        : washburnDiameterM(
            (point.intrusionPressureMPa ?? Number.NaN) * PA_PER_MPA,
            surfaceTension,
            contactAngle,
          ),
    cumulativeFraction: point.cumulativeFraction,
  }));
}

function checkTable(
  points: { diameterM: number; cumulativeFraction: number }[],
  context: z.RefinementCtx,
): void {
  const sorted = [...points].sort((first, second) => first.diameterM - second.diameterM);
  for (let k = 1; k < sorted.length; k++) {
    const previous = sorted[k - 1] as (typeof sorted)[number];
    const current = sorted[k] as (typeof sorted)[number];
    const describe = (point: typeof current) =>
      `${Number((point.diameterM / M_PER_UM).toPrecision(6))} um`;
    if (current.diameterM === previous.diameterM) {
      context.addIssue({
        code: 'custom',
        path: ['table'],
        message: 'diameters must be distinct',
        input: `${describe(current)} twice`,
      });
      return;
    }
    if (current.cumulativeFraction < previous.cumulativeFraction) {
      context.addIssue({
        code: 'custom',
        path: ['table'],
        message: 'cumulativeFraction must not decrease as the diameter grows',
        input: `${current.cumulativeFraction} at ${describe(current)} after ${previous.cumulativeFraction} at ${describe(previous)}`,
      });
      return;
    }
  }
}

/** Converts a validated file to the SI `PoreSizeDistribution`. */
export function poreSizeDistributionFromFile(file: PoreSizeDistributionFile): PoreSizeDistribution {
  if (file.lognormal !== undefined) {
    return {
      kind: 'lognormal',
      modes: file.lognormal.map((mode) => ({
        medianDiameterM: mode.medianDiameterUm * M_PER_UM,
        geometricSd: mode.geometricSd,
        volumeFraction: mode.volumeFraction,
      })),
    };
  }
  if (file.vanGenuchten !== undefined) {
    return {
      kind: 'van-genuchten',
      alphaPerPa: file.vanGenuchten.alphaPerMPa / PA_PER_MPA,
      n: file.vanGenuchten.n,
      surfaceTensionNPerM:
        file.vanGenuchten.surfaceTensionNPerM ?? VAN_GENUCHTEN_FIT_SURFACE_TENSION_N_PER_M,
    };
  }
  return { kind: 'table', points: tableToSi(file) };
}

/** Bad pore-size distribution input; the message names the field, the rule and the value. */
export class PoreSizeDistributionInputError extends Error {
  override readonly name = 'PoreSizeDistributionInputError';
}

function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  const text = JSON.stringify(value);
  return text.length > 80 ? `${text.slice(0, 77)}...` : text;
}

function describePath(path: readonly PropertyKey[]): string {
  return path
    .map((key, i) => (typeof key === 'number' ? `[${key}]` : `${i > 0 ? '.' : ''}${String(key)}`))
    .join('');
}

/**
 * Validates a parsed JSON value as a pore-size distribution file and converts it to SI.
 *
 * @param input the parsed JSON. @param source name used in messages (default 'psd', e.g. a file name).
 * @throws PoreSizeDistributionInputError with a one-line message naming field, rule and value,
 *   e.g. "psd table must not ... : got 0.6 at 0.1 um after 0.7 at 0.05 um".
 */
export function parsePoreSizeDistribution(input: unknown, source = 'psd'): PoreSizeDistribution {
  const result = poreSizeDistributionFileSchema.safeParse(input, { reportInput: true });
  if (result.success) return poreSizeDistributionFromFile(result.data);
  const issue = result.error.issues[0];
  if (issue === undefined)
    throw new PoreSizeDistributionInputError(`${source} is not a valid pore-size distribution`);
  const field = describePath(issue.path);
  const unknownKeys = issue.code === 'unrecognized_keys';
  const message = unknownKeys ? 'must have only known keys' : issue.message;
  const got = unknownKeys
    ? issue.keys.join(', ')
    : issue.code === 'custom' && typeof issue.input === 'string'
      ? issue.input
      : describeValue(issue.input);
  throw new PoreSizeDistributionInputError(
    `${source}${field === '' ? '' : ` ${field}`} ${message}: got ${got}`,
  );
}

/** As `parsePoreSizeDistribution`, from JSON text; invalid JSON gives a message with the parser's reason. */
export function parsePoreSizeDistributionJson(text: string, source = 'psd'): PoreSizeDistribution {
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw new PoreSizeDistributionInputError(
      `${source} must be valid JSON: got ${(error as Error).message}`,
      {
        cause: error,
      },
    );
  }
  return parsePoreSizeDistribution(parsed, source);
}
