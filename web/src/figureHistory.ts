/**
 * The figure history a run page plots: points from GET /api/runs/:id/figures, extended by each
 * `state` push. Kept sorted by event time with one point per time, as uPlot needs (sorted unique
 * x, dependencies.md). Pure functions.
 */
import type { FigurePoint, RunState } from './contract.ts';

/** The history point of a pushed state; null before the engine's first reading. */
export function figurePointOf(state: RunState): FigurePoint | null {
  if (state.eventTimeMs === null) return null;
  return {
    eventTimeMs: state.eventTimeMs,
    phase: state.phase,
    surfaceStressMPa: state.surfaceStressMPa,
    fctmMPa: state.fctmMPa,
    utilization: state.utilization,
    marginMPa: state.marginMPa,
    evaporationKgM2h: state.evaporationKgM2h,
    bleedFilmKgM2: state.bleedFilmKgM2,
    utilizationP05: state.nowBands?.utilization.p05 ?? null,
    utilizationP95: state.nowBands?.utilization.p95 ?? null,
  };
}

/**
 * Merges points into a history: sorted by event time, one point per time (an incoming point
 * replaces an existing one at the same time). Returns a new array; inputs are not changed.
 */
export function mergeFigurePoints(
  history: readonly FigurePoint[],
  incoming: readonly FigurePoint[],
): FigurePoint[] {
  const byTime = new Map<number, FigurePoint>();
  for (const point of history) byTime.set(point.eventTimeMs, point);
  for (const point of incoming) byTime.set(point.eventTimeMs, point);
  return [...byTime.values()].sort((a, b) => a.eventTimeMs - b.eventTimeMs);
}
