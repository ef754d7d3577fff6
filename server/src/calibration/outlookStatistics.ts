/**
 * Ensemble statistics of the outlook (physics.md section 9): from every member's trajectory of
 * utilization and margin over the horizon, when each threshold is expected to be crossed, how
 * likely utilization reaches 1, and the band of the margin. Members are equally weighted.
 */
import { firstCrossingTimeS } from './firstCrossingTime.ts';
import { quantileOfSorted, sortedFinite } from './quantile.ts';

/** Crossing statistics of one threshold. */
export interface ThresholdCrossing {
  threshold: number;
  /** Fraction of members whose utilization reaches the threshold within the horizon, 0..1. */
  fractionCrossing: number;
  /** Mean crossing time over the members that cross, s; null when none does. */
  meanCrossingTimeS: number | null;
  /** Median crossing time over the members that cross, s; null when none does. */
  medianCrossingTimeS: number | null;
  /**
   * Median over all members, counting those that do not cross as crossing after the horizon, s:
   * null when fewer than half cross (the ensemble median lies beyond the horizon). When exactly
   * half cross, the latest crossing of that half (the lower median).
   */
  ensembleMedianCrossingTimeS: number | null;
  /** Each member's crossing time, s, or null (same order as the members). */
  memberCrossingTimesS: (number | null)[];
}

/** A quantile band over time. */
export interface QuantileBand {
  probability: number;
  /** One value per output time; NaN where no member has a finite value. */
  values: number[];
}

/** The statistics the outlook reports. */
export interface OutlookStatistics {
  timesS: number[];
  crossings: ThresholdCrossing[];
  /** Fraction of members with utilization >= 1 at some time within the horizon, 0..1. */
  probabilityUtilizationReachesOne: number;
  /** Quantiles of the margin (strength - stress, MPa) at each time. */
  marginBandMPa: QuantileBand[];
  /** Quantiles of utilization at each time. */
  utilizationBand: QuantileBand[];
}

/**
 * Crossing statistics of one threshold over the members' utilization trajectories.
 * Definitions in {@link ThresholdCrossing}; each member's time by {@link firstCrossingTimeS}.
 *
 * @param timesS - output times of the outlook, s, ascending.
 * @param trajectories - one utilization trajectory per member, aligned with `timesS`.
 * @param threshold - utilization level (dimensionless), e.g. 0.57, 0.69, 1.
 */
export function thresholdCrossing(
  timesS: readonly number[],
  trajectories: readonly (readonly number[])[],
  threshold: number,
): ThresholdCrossing {
  const memberCrossingTimesS = trajectories.map((values) =>
    firstCrossingTimeS(timesS, values, threshold),
  );
  const crossing = sortedFinite(
    memberCrossingTimesS.filter((time): time is number => time !== null),
  );
  const memberCount = trajectories.length;
  const mean =
    crossing.length === 0 ? null : crossing.reduce((sum, time) => sum + time, 0) / crossing.length;
  // Ensemble median with non-crossers at +Infinity: the lower median (order statistic
  // ceil(N/2)) when N is even, so that exactly half crossing still gives a time.
  const medianRank = Math.ceil(memberCount / 2);
  const ensembleMedian =
    memberCount > 0 && crossing.length >= medianRank ? (crossing[medianRank - 1] ?? null) : null;
  return {
    threshold,
    fractionCrossing: memberCount === 0 ? 0 : crossing.length / memberCount,
    meanCrossingTimeS: mean,
    medianCrossingTimeS: crossing.length === 0 ? null : quantileOfSorted(crossing, 0.5),
    ensembleMedianCrossingTimeS: ensembleMedian,
    memberCrossingTimesS,
  };
}

/**
 * Per-time quantiles of member trajectories (Hyndman and Fan 1996, definition 7), over the
 * members with a finite value at that time.
 *
 * @param trajectories - one trajectory per member, each as long as the output times.
 * @param probabilities - e.g. [0.05, 0.5, 0.95].
 */
export function quantileBands(
  trajectories: readonly (readonly number[])[],
  probabilities: readonly number[],
): QuantileBand[] {
  const timeCount = Math.max(0, ...trajectories.map((values) => values.length));
  const sortedByTime: number[][] = [];
  for (let t = 0; t < timeCount; t++) {
    sortedByTime.push(sortedFinite(trajectories.map((values) => values[t] ?? Number.NaN)));
  }
  return probabilities.map((probability) => ({
    probability,
    values: sortedByTime.map((sorted) => quantileOfSorted(sorted, probability)),
  }));
}

/** Default thresholds of utilization (physics.md section 7: 1/1.75, 1/1.45, 1; from memory). */
export const DEFAULT_UTILIZATION_THRESHOLDS: readonly number[] = [0.57, 0.69, 1];

/** Default band: 5 %, 50 % and 95 % (a 90 % band and the median; our choice). */
export const DEFAULT_BAND_PROBABILITIES: readonly number[] = [0.05, 0.5, 0.95];

/**
 * All outlook statistics at once.
 *
 * @param input.timesS - output times, s, ascending.
 * @param input.utilization - per member, utilization at each time (dimensionless).
 * @param input.marginMPa - per member, margin at each time, MPa.
 * @param input.thresholds - default {@link DEFAULT_UTILIZATION_THRESHOLDS}.
 * @param input.bandProbabilities - default {@link DEFAULT_BAND_PROBABILITIES}.
 * @returns statistics; with no members, fractions are 0, times null and bands NaN.
 */
export function outlookStatistics(input: {
  timesS: readonly number[];
  utilization: readonly (readonly number[])[];
  marginMPa: readonly (readonly number[])[];
  thresholds?: readonly number[];
  bandProbabilities?: readonly number[];
}): OutlookStatistics {
  const thresholds = input.thresholds ?? DEFAULT_UTILIZATION_THRESHOLDS;
  const probabilities = input.bandProbabilities ?? DEFAULT_BAND_PROBABILITIES;
  return {
    timesS: [...input.timesS],
    crossings: thresholds.map((threshold) =>
      thresholdCrossing(input.timesS, input.utilization, threshold),
    ),
    probabilityUtilizationReachesOne: thresholdCrossing(input.timesS, input.utilization, 1)
      .fractionCrossing,
    marginBandMPa: quantileBands(input.marginMPa, probabilities),
    utilizationBand: quantileBands(input.utilization, probabilities),
  };
}
