/**
 * RunEngineOptions with their defaults filled in; each default's origin is stated in types.ts
 * and, for the calibration choices, here.
 */
import { seedFromRunId } from './seedFromRunId.ts';
import type { RunEngineOptions } from './types.ts';

/**
 * Default of `exposureRandomWalkPerSqrtH`: 0.1 per square-root hour, model error of the surface
 * flux (our assumption). The exposure multiplier lumps what the evaporation estimate gets wrong:
 * Uno's closed form scatters by about +-40 % against measured evaporation (Hover 2006, as
 * physics.md 4 cites it), the surface temperature is read at the shallowest probe rather than at
 * the surface (the estimate changes by about 7 % per K of surface temperature at 34 degC and
 * 30 %RH, from Uno's formula), and the wind at 0.5 m is inferred from the mast. Part of that
 * error changes over hours with sun, shade and wind, so the multiplier drifts instead of being
 * a constant: one sigma of about 10 % in an hour and 25 % over six hours, inside the +-40 % of
 * the estimate. Measured in the twin experiment (test/live/twinExperiment.test.ts, 22 seeds)
 * while the simulators' 5 mm temperature trailed their surface by some 35 min: both targets met
 * in 17 runs against 16 with a constant multiplier, ratio <= 0.5 in 18 against 16, coverage of
 * the 90 % band >= 0.8 in 19 against 20; 0.15 and 0.2 did no better, 0.3 loosened the
 * calibration (worst ratio 0.73). Since that lag was fixed (b890b20): 17 runs with the walk
 * against 18 without (ratio in 17 against 18, coverage in 21 both), a difference within the
 * ensemble's draw; kept for the reason above, not for a gain the twin shows.
 */
export const EXPOSURE_RANDOM_WALK_PER_SQRT_H = 0.1;

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
    // Biases out of RTPS: a bias is a constant of the sensor, nothing makes it drift, and
    // relaxing its spread at every analysis kept it 0.2-0.3 %RH wide at set against a drying
    // signal of about 1.5 %RH at the probes, so the filter traded biases against the drying
    // (exposure multiplier drifting high). Twin experiment over 22 seeds after the simulators'
    // thermal fix: both targets met in 20 runs against 17 with the biases relaxed, ratio <= 0.5
    // in 20 against 17, coverage >= 0.8 in 21 both; 17 ratios lower, one the same, four higher
    // (runs 5, 8, 14 slightly; run 13 from 0.80 to 1.08). Our choice.
    rtpsOnBiases: options.rtpsOnBiases ?? false,
    analysisUpdates: options.analysisUpdates ?? 'state-and-parameters',
    plasticPhaseUpdates: options.plasticPhaseUpdates ?? 'state-and-biases',
    exposureRandomWalkPerSqrtH:
      options.exposureRandomWalkPerSqrtH ?? EXPOSURE_RANDOM_WALK_PER_SQRT_H,
  };
}
