/**
 * RunEngineOptions with their defaults filled in; each default's origin is stated in types.ts
 * and, for the calibration choices, here.
 */
import { seedFromRunId } from './seedFromRunId.ts';
import type { RunEngineOptions } from './types.ts';

/** Options with their defaults filled in. */
export type ResolvedOptions = Required<
  Omit<
    RunEngineOptions,
    'targetStrengthMPa' | 'observationErrorSdPercent' | 'localisationHalfWidthM' | 'rtpsAlpha'
  >
> & {
  targetStrengthMPa: number | null;
  observationErrorSdPercent: number | null;
  localisationHalfWidthM: number | null;
  rtpsAlpha: number | null;
};

/**
 * Defaults of RunEngineOptions (origins in types.ts).
 *
 * @param runId - seeds the ensemble when `options.seed` is absent
 * @param options - any subset; explicit nulls keep their meaning (e.g. the class error model)
 */
export function resolveOptions(runId: string, options: RunEngineOptions): ResolvedOptions {
  return {
    seed: options.seed ?? seedFromRunId(runId),
    memberCount: options.memberCount ?? 32,
    horizonH: options.horizonH ?? 6,
    assimilationIntervalS: options.assimilationIntervalS ?? 300,
    cellCount: options.cellCount ?? 60,
    outlookEveryAnalyses: options.outlookEveryAnalyses ?? 1,
    outlookStepS: options.outlookStepS ?? 600,
    weatherHoldS: options.weatherHoldS ?? 900,
    probeSilentS: options.probeSilentS ?? 1800,
    persistenceWindowS: options.persistenceWindowS ?? 3600,
    lateToleranceS: options.lateToleranceS ?? 300,
    assimilation: options.assimilation ?? true,
    inflationFactor: options.inflationFactor ?? 1.02,
    targetStrengthMPa: options.targetStrengthMPa ?? null,
    // 1 %RH: the random part of a reading once the bias parameters take up the offset (sensor
    // noise, resolution, representativeness of one point); our assumption, chosen in the twin
    // experiment of test/live/twinExperiment.test.ts against the 2-4 %RH accuracy class.
    observationErrorSdPercent:
      options.observationErrorSdPercent === undefined ? 1 : options.observationErrorSdPercent,
    localisationHalfWidthM: options.localisationHalfWidthM ?? null,
    // RTPS 0.7 (Whitaker and Hamill 2012 give 0.5 to 0.9): multiplicative 1.02 let the
    // parameters' spread collapse in the twin experiment; our choice.
    rtpsAlpha: options.rtpsAlpha === undefined ? 0.7 : options.rtpsAlpha,
    analysisUpdates: options.analysisUpdates ?? 'state-and-parameters',
    plasticPhaseUpdates: options.plasticPhaseUpdates ?? 'state-and-biases',
  };
}
