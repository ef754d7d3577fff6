/**
 * Material presets: data files (server/src/engine/presets/*.json) describing a material's pore
 * structure, mechanics and (for cementitious mixes) hydration, strength and bleeding. Every
 * number carries its origin: a published source, "common practice", or "our assumption".
 * Presets are validated with zod when loaded, with messages naming field, rule and value.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { formatIssues } from '../config/formatIssues.ts';

/** A number with the origin of its value. */
const sourced = (rule: z.ZodNumber) => z.object({ value: rule, origin: z.string().min(3) });

const logNormalMode = z.object({
  medianDiameterUm: z.number().positive(),
  geometricSd: z.number().gt(1),
  volumeFraction: z.number().gt(0).max(1),
});

const poreSizes = z.object({
  lognormal: z.array(logNormalMode).min(1).max(3),
  origin: z.string().min(3),
});

const mix = z.object({
  waterCementRatio: sourced(z.number().gt(0.2).lt(1)),
  concreteClass: z.object({ value: z.string().regex(/^C\d+\/\d+$/), origin: z.string().min(3) }),
  cementClass: z.object({ value: z.enum(['R', 'N', 'S']), origin: z.string().min(3) }),
  hydrationTimeH: sourced(z.number().positive()),
  hydrationShape: sourced(z.number().positive()),
  finalSetH: sourced(z.number().positive()),
  bleedRateKgM2h: sourced(z.number().min(0)),
  bleedingDurationH: sourced(z.number().min(0)),
  drainedBulkModulusFloorMPa: sourced(z.number().positive()),
  criticalSuctionKPa: sourced(z.number().positive()).optional(),
});

const fixedStrength = z.object({
  tensileStrengthMPa: sourced(z.number().positive()),
  youngsModulusGPa: sourced(z.number().positive()),
});

/** Schema of a preset file. */
export const materialPresetSchema = z.object({
  id: z.string().regex(/^[a-z0-9-]+$/),
  name: z.string().min(3),
  description: z.string(),
  porosity: sourced(z.number().gt(0).lt(1)),
  tortuosity: sourced(z.number().min(1)),
  biotCoefficient: sourced(z.number().gt(0).max(1)),
  poissonRatio: sourced(z.number().min(0).lt(0.5)),
  relaxationFactor: sourced(z.number().gt(0).max(1)),
  freshPores: poreSizes,
  /** Pores at the degree of hydration reached at 28 days; absent: no refinement. */
  hardenedPores: poreSizes.optional(),
  mix: mix.optional(),
  fixedStrength: fixedStrength.optional(),
  /** Known limits of the model with this preset, said with every run that uses it. */
  limitations: z.array(z.string().min(10)).optional(),
});

/** A validated preset. */
export type MaterialPreset = z.infer<typeof materialPresetSchema>;

/** Raised for a preset that does not validate; the message lists every broken rule. */
export class MaterialPresetError extends Error {
  constructor(source: string, messages: readonly string[]) {
    super(`material preset ${source} is not valid: ${messages.join('; ')}`);
    this.name = 'MaterialPresetError';
  }
}

/**
 * Validates a parsed preset. A preset needs `mix` (cementitious) or `fixedStrength`
 * (non-hydrating), and the volume fractions of each distribution must sum to 1 (to 1e-6).
 * Throws {@link MaterialPresetError} naming field, rule and value.
 */
export function parseMaterialPreset(input: unknown, source = 'input'): MaterialPreset {
  const result = materialPresetSchema.safeParse(input);
  if (!result.success)
    throw new MaterialPresetError(source, formatIssues(result.error.issues, input));
  const preset = result.data;
  const messages: string[] = [];
  if (preset.mix === undefined && preset.fixedStrength === undefined) {
    messages.push(
      'a preset needs "mix" (cementitious) or "fixedStrength" (non-hydrating): got neither',
    );
  }
  for (const field of ['freshPores', 'hardenedPores'] as const) {
    const modes = preset[field]?.lognormal;
    if (modes === undefined) continue;
    const total = modes.reduce((sum, mode) => sum + mode.volumeFraction, 0);
    if (Math.abs(total - 1) > 1e-6) {
      messages.push(`${field}.lognormal volumeFraction must sum to 1: got ${total}`);
    }
  }
  if (messages.length > 0) throw new MaterialPresetError(source, messages);
  return preset;
}

const presetDirectory = join(dirname(fileURLToPath(import.meta.url)), 'presets');

/** Identifiers of the presets shipped in server/src/engine/presets, sorted. */
export function listMaterialPresets(): string[] {
  return readdirSync(presetDirectory)
    .filter((file) => file.endsWith('.json'))
    .map((file) => file.slice(0, -'.json'.length))
    .sort();
}

/**
 * Loads and validates a shipped preset by id. Throws {@link MaterialPresetError} for an unknown
 * id (listing the known ones) or an invalid file.
 */
export function loadMaterialPreset(id: string): MaterialPreset {
  const known = listMaterialPresets();
  if (!known.includes(id)) {
    throw new MaterialPresetError(id, [
      `material must be one of ${known.join(', ')}: got ${JSON.stringify(id)}`,
    ]);
  }
  const text = readFileSync(join(presetDirectory, `${id}.json`), 'utf8');
  return parseMaterialPreset(JSON.parse(text) as unknown, `${id}.json`);
}
