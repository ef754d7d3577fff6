/**
 * Assembles the RunState of the contract from the ensemble: the figures now (medians over the
 * members, with their bands), the last outlook in epoch milliseconds, depth profiles with the
 * probes beside the model, the calibrated parameters with their spread, the data-quality flags
 * and the caution every output carries. NaN figures become null.
 */
import { summariseParameters } from '../calibration/index.ts';
import type { Ensemble, OutlookStatistics, ParameterSpec } from '../calibration/index.ts';
import type { RunConfig } from '../config/index.ts';
import type { ElementModel, ElementState } from '../engine/index.ts';
import { CAUTION_TEXT } from './caution.ts';
import {
  bandPoint,
  ensembleProfiles,
  evaluateMembers,
  meanAndSd,
  timeToTargetStrengthH,
} from './nowFigures.ts';
import { latestAtOrBefore } from './readingStreams.ts';
import type { StreamBuffer } from './readingStreams.ts';
import type { ProbeRole } from './streamRoles.ts';
import type { QualityFlag, RunOutlook, RunState } from './types.ts';

/** Flag codes that make a run degraded (its figures rest on held or missing data). */
export const DEGRADING_FLAGS: readonly string[] = [
  'weather-held',
  'weather-gap',
  'weather-missing',
  'probe-silent',
  'model-refused',
];

/** What the state is built from. */
export interface RunStateInput {
  runId: string;
  config: RunConfig;
  model: ElementModel;
  placedMs: number;
  engineTimeMs: number | null;
  ensemble: Ensemble<ElementState> | null;
  specs: readonly ParameterSpec[];
  rhProbes: readonly ProbeRole[];
  streams: ReadonlyMap<string, StreamBuffer>;
  intervalMs: number;
  flags: readonly QualityFlag[];
  outlook: {
    startMs: number;
    statistics: OutlookStatistics;
    source: 'persistence' | 'supplied';
  } | null;
  horizonH: number;
  /** Equivalent age gained per second over the last interval. */
  ageRate: number;
  targetStrengthMPa: number | null;
}

const finiteOrNull = (value: number): number | null => (Number.isFinite(value) ? value : null);

/** The outlook in the contract's shape (epoch ms, MPa). */
export function toRunOutlook(
  outlook: NonNullable<RunStateInput['outlook']>,
  horizonH: number,
): RunOutlook {
  const { statistics, startMs } = outlook;
  const band = (bands: OutlookStatistics['utilizationBand']) => ({
    p05: bands[0]?.values ?? [],
    p50: bands[1]?.values ?? [],
    p95: bands[2]?.values ?? [],
  });
  const atMs = (seconds: number | null) => (seconds === null ? null : startMs + seconds * 1000);
  return {
    horizonH,
    timesMs: statistics.timesS.map((seconds) => startMs + seconds * 1000),
    utilizationBand: band(statistics.utilizationBand),
    marginBandMPa: band(statistics.marginBandMPa),
    crossings: statistics.crossings.map((crossing) => ({
      threshold: crossing.threshold,
      probability: crossing.fractionCrossing,
      expectedTimeMs: atMs(crossing.meanCrossingTimeS),
      medianTimeMs: atMs(crossing.ensembleMedianCrossingTimeS),
    })),
    probabilityCrackingWithinHorizon: statistics.probabilityUtilizationReachesOne,
    forecastSource: outlook.source,
  };
}

/** Builds the state; before placement or before the first cycle the figures are null. */
export function buildRunState(input: RunStateInput): RunState {
  const flags = [...input.flags].sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
  const base: RunState = {
    runId: input.runId,
    eventTimeMs: input.engineTimeMs,
    phase: 'before-placement',
    surfaceStressMPa: null,
    fctmMPa: null,
    utilization: null,
    marginMPa: null,
    evaporationKgM2h: null,
    inPlaceCompressiveStrengthMPa: null,
    timeToTargetStrengthH: null,
    nowBands: null,
    bleedFilmKgM2: null,
    bleedFilmRemainingH: null,
    analysisCount: input.ensemble?.analysisCount ?? 0,
    memberCount: input.ensemble?.members.length ?? 0,
    outlook: input.outlook === null ? null : toRunOutlook(input.outlook, input.horizonH),
    profiles: null,
    calibration: [],
    quality: {
      degraded: flags.some((flag) => DEGRADING_FLAGS.includes(flag.code)),
      flags,
    },
    caution: CAUTION_TEXT,
  };
  const ensemble = input.ensemble;
  if (ensemble === null || input.engineTimeMs === null || input.engineTimeMs <= input.placedMs) {
    return base;
  }
  const members = ensemble.members.map((member) => member.carried);
  const figures = evaluateMembers(input.model, members);
  const median = (pick: (index: number) => number) =>
    finiteOrNull(bandPoint(figures.map((_, index) => pick(index))).p50);
  const utilization = bandPoint(figures.map((figure) => figure.utilization));
  const stress = bandPoint(figures.map((figure) => figure.surfaceStressPa / 1e6));
  const margin = bandPoint(figures.map((figure) => figure.marginPa / 1e6));
  const meanCompressive = (index: number) => {
    const values = figures[index]?.profiles.compressiveStrengthPa ?? [];
    return values.reduce((sum, value) => sum + value, 0) / values.length / 1e6;
  };
  const compressiveMPa = median(meanCompressive);
  const ages = members[0]?.equivalentAgeS ?? new Float64Array(0);
  const meanAgeS = ages.reduce((sum, age) => sum + age, 0) / Math.max(1, ages.length);
  const mix = input.model.material.mix;
  const targetMPa =
    input.targetStrengthMPa ?? (mix === undefined ? Number.NaN : 0.7 * (mix.strength.fcmMPa - 8));
  const summary = summariseParameters(ensemble.members, input.specs);
  const measuredAt = (role: ProbeRole): number | null => {
    const stream = input.streams.get(role.key);
    const latest =
      stream === undefined ? null : latestAtOrBefore(stream, input.engineTimeMs as number);
    return latest === null || latest.timeMs <= (input.engineTimeMs as number) - input.intervalMs
      ? null
      : latest.value;
  };
  return {
    ...base,
    // Majority of the members: a member whose surface dries early matures more slowly there.
    phase:
      figures.filter((figure) => figure.phase === 'hardening').length * 2 >= figures.length
        ? 'hardening'
        : 'plastic',
    surfaceStressMPa: finiteOrNull(stress.p50),
    fctmMPa: median((index) => (figures[index]?.surfaceTensileStrengthPa ?? Number.NaN) / 1e6),
    utilization: finiteOrNull(utilization.p50),
    marginMPa: finiteOrNull(margin.p50),
    evaporationKgM2h: median((index) => (figures[index]?.evaporationKgM2s ?? Number.NaN) * 3600),
    inPlaceCompressiveStrengthMPa: compressiveMPa,
    timeToTargetStrengthH: Number.isFinite(targetMPa)
      ? timeToTargetStrengthH(input.model, meanAgeS, input.ageRate, targetMPa)
      : null,
    nowBands: { utilization, surfaceStressMPa: stress, marginMPa: margin },
    bleedFilmKgM2: median((index) => figures[index]?.bleedFilmKgM2 ?? Number.NaN),
    bleedFilmRemainingH: median((index) => figures[index]?.bleedFilmRemainingH ?? Number.NaN),
    profiles: ensembleProfiles(
      input.model,
      members,
      figures,
      input.rhProbes.map((role) => ({ role, measuredPercent: measuredAt(role) })),
    ),
    calibration: summary.map((entry, j) => {
      const { sd } = meanAndSd(ensemble.members.map((member) => member.parameters[j] as number));
      return { name: entry.name, mean: entry.mean, sd, p05: entry.p05, p95: entry.p95 };
    }),
  };
}
