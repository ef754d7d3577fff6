/**
 * The twin experiment's figures (physics.md 8), shared by the live engine's offline twin test
 * (test/live/twinExperiment.test.ts) and the one through MQTT (test/integration/liveTwin.test.ts):
 * the truth's surface stress recovered from its
 * utilization and margin (fct = margin / (1 - U), stress = fct - margin, see truthStressMPa),
 * compared with the calibrated and the prior engine over the hardening phase at the truth's
 * sample times.
 */
import type { RunState } from '../../server/src/live/index.ts';
import type { TruthSample } from '../live/twinReadings.ts';

export interface TwinFigures {
  /** Hardening samples compared. */
  count: number;
  calibratedRmseMPa: number;
  priorRmseMPa: number;
  /** Calibrated over prior RMSE. */
  rmseRatio: number;
  /** Share of samples where the truth lies in the calibrated 5..95 % band. */
  coverage: number;
}

/**
 * Largest |1 - U| for which the truth's stress is not taken from its own figures: U and the
 * margin are exact doubles of the truth's model, and fct = margin / (1 - U) loses about
 * 1e-16 / |1 - U| of relative accuracy, so below 1e-6 (a loss of 1e-10) fct is interpolated.
 */
const ILL_CONDITIONED = 1e-6;

/**
 * Truth surface stress (MPa) at each hardening sample: stress = U fct with fct = margin / (1 - U),
 * i.e. U margin / (1 - U), exact to rounding wherever |1 - U| > 1e-6; at the few samples where U
 * is within 1e-6 of 1, fct is interpolated linearly in time between its neighbours.
 */
export function truthStressMPa(truth: readonly TruthSample[]): Map<number, number> {
  const anchors = truth
    .filter((s) => Number.isFinite(s.marginPa) && Math.abs(1 - s.utilization) > ILL_CONDITIONED)
    .map((s) => ({ timeMs: s.timeMs, fctMPa: s.marginPa / 1e6 / (1 - s.utilization) }));
  const stress = new Map<number, number>();
  for (const sample of truth) {
    if (!Number.isFinite(sample.marginPa)) continue;
    const next = anchors.findIndex((a) => a.timeMs >= sample.timeMs);
    const b = anchors[next];
    const a = anchors[next - 1] ?? b;
    if (a === undefined || b === undefined) continue;
    const fct =
      b.timeMs === a.timeMs || b.timeMs === sample.timeMs
        ? b.fctMPa
        : a.fctMPa + ((b.fctMPa - a.fctMPa) * (sample.timeMs - a.timeMs)) / (b.timeMs - a.timeMs);
    stress.set(sample.timeMs, fct - sample.marginPa / 1e6);
  }
  return stress;
}

/** Compares calibrated and prior states (by event time) with the truth. */
export function twinFigures(
  truth: readonly TruthSample[],
  calibrated: ReadonlyMap<number, RunState>,
  prior: ReadonlyMap<number, RunState>,
): TwinFigures {
  let posteriorSum = 0;
  let priorSum = 0;
  let covered = 0;
  let count = 0;
  for (const [timeMs, stress] of truthStressMPa(truth)) {
    const post = calibrated.get(timeMs);
    const before = prior.get(timeMs);
    if (post?.phase !== 'hardening' || post.surfaceStressMPa === null) continue;
    if (before?.surfaceStressMPa == null || post.nowBands === null) continue;
    posteriorSum += (post.surfaceStressMPa - stress) ** 2;
    priorSum += (before.surfaceStressMPa - stress) ** 2;
    const band = post.nowBands.surfaceStressMPa;
    if (stress >= band.p05 && stress <= band.p95) covered += 1;
    count += 1;
  }
  return {
    count,
    calibratedRmseMPa: Math.sqrt(posteriorSum / count),
    priorRmseMPa: Math.sqrt(priorSum / count),
    rmseRatio: Math.sqrt(posteriorSum / priorSum),
    coverage: covered / count,
  };
}
