/**
 * RunStates for the alert tests: a plausible state of the invented example run (test/helpers
 * exampleRun.ts) with the figures a test sets, and an outlook with one crossing per threshold.
 */
import type { RunConfig } from '../../server/src/config/runConfig.ts';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { CAUTION_TEXT } from '../../server/src/live/caution.ts';
import type { RunOutlook, RunState } from '../../server/src/live/types.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

export const MIN = 60_000;
/** The example run with a lead time of 90 min and the default thresholds. */
export const CONFIG: RunConfig = parseRunConfig({
  ...exampleRunInput(),
  name: 'Harbour deck, bay 2 topping',
  leadTimeMin: 90,
  mix: { bleedRateKgM2h: 0.3 },
  recipients: [{ name: 'Crew lead', email: 'lead@harbour.example' }],
});
/** An hour after placement (placed 11:20 at +02:00, so 12:20 on site). */
export const T0 = EXAMPLE_PLACED_AT_MS + 60 * MIN;

export interface OutlookFigures {
  /** Probability that utilization reaches 1 within the horizon. */
  probability?: number;
  /** Median crossing time of U = 1, min after the state's time; null: fewer than half cross. */
  closingInMin?: number | null;
}

/** An outlook of 6 h whose U = 1 crossing has the given probability and median time. */
export function outlookAt(timeMs: number, figures: OutlookFigures): RunOutlook {
  const probability = figures.probability ?? 0;
  const closingMs =
    figures.closingInMin === undefined || figures.closingInMin === null
      ? null
      : timeMs + figures.closingInMin * MIN;
  return {
    horizonH: 6,
    timesMs: [timeMs],
    utilizationBand: { p05: [0], p50: [0], p95: [0] },
    marginBandMPa: { p05: [0], p50: [0], p95: [0] },
    crossings: [0.57, 0.69, 1].map((threshold) => ({
      threshold,
      probability: threshold === 1 ? probability : Math.min(1, probability + 0.1),
      expectedTimeMs: closingMs,
      medianTimeMs: threshold === 1 ? closingMs : null,
    })),
    probabilityCrackingWithinHorizon: probability,
    forecastSource: 'persistence',
  };
}

export interface StateFigures extends OutlookFigures {
  timeMs?: number;
  phase?: RunState['phase'];
  utilization?: number | null;
  evaporationKgM2h?: number | null;
  flags?: { code: string; message: string }[];
  timeToTargetStrengthH?: number | null;
  bleedFilmRemainingH?: number | null;
}

/** A state at `timeMs` (T0) with the figures given and quiet defaults for the rest. */
export function runState(figures: StateFigures = {}): RunState {
  const timeMs = figures.timeMs ?? T0;
  const utilization = figures.utilization ?? 0.2;
  const phase = figures.phase ?? 'hardening';
  return {
    runId: 'run-1',
    eventTimeMs: timeMs,
    phase,
    surfaceStressMPa: phase === 'hardening' ? (utilization ?? 0) * 0.5 : null,
    fctmMPa: phase === 'hardening' ? 0.5 : null,
    utilization,
    marginMPa: phase === 'hardening' ? 0.5 - (utilization ?? 0) * 0.5 : null,
    evaporationKgM2h: figures.evaporationKgM2h === undefined ? 0.2 : figures.evaporationKgM2h,
    inPlaceCompressiveStrengthMPa: 4,
    timeToTargetStrengthH:
      figures.timeToTargetStrengthH === undefined ? 30 : figures.timeToTargetStrengthH,
    nowBands: null,
    bleedFilmKgM2: 0,
    bleedFilmRemainingH: figures.bleedFilmRemainingH ?? null,
    analysisCount: 10,
    memberCount: 32,
    outlook: outlookAt(timeMs, figures),
    profiles: null,
    calibration: [],
    quality: {
      degraded: (figures.flags ?? []).length > 0,
      flags: (figures.flags ?? []).map((flag) => ({ ...flag, sinceMs: timeMs })),
    },
    caution: CAUTION_TEXT,
  };
}
