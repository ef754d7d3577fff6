/**
 * The history of a run's figures: one point per update of its live engine, kept in the archive
 * (table `figures`) so the dashboard can draw surface stress against strength since placement
 * after a reload, and a reviewer can see what the tool reported at any time. Derived data: the
 * engine is deterministic, so a replay after a restart rewrites the same points (keyed by event
 * time, the later write wins).
 */
import type Database from 'better-sqlite3';
import type { RunState } from '../live/types.ts';

/** One point of the history (JSON; keys with unit suffixes; null where a figure is undefined). */
export interface FigurePoint {
  /** Engine event time of the update, ms since the Unix epoch. */
  eventTimeMs: number;
  phase: RunState['phase'];
  surfaceStressMPa: number | null;
  fctmMPa: number | null;
  utilization: number | null;
  marginMPa: number | null;
  evaporationKgM2h: number | null;
  bleedFilmKgM2: number | null;
  /** 5 % and 95 % quantiles of utilization over the members now. */
  utilizationP05: number | null;
  utilizationP95: number | null;
}

/** Turns a non-finite number (NaN, Infinity) or undefined into null, as JSON would. */
function finiteOrNull(value: number | null | undefined): number | null {
  return value === null || value === undefined || !Number.isFinite(value) ? null : value;
}

/**
 * The point a state contributes to the history, or null for a state before the first reading
 * (no event time).
 */
export function figurePointOf(state: RunState): FigurePoint | null {
  if (state.eventTimeMs === null) return null;
  return {
    eventTimeMs: state.eventTimeMs,
    phase: state.phase,
    surfaceStressMPa: finiteOrNull(state.surfaceStressMPa),
    fctmMPa: finiteOrNull(state.fctmMPa),
    utilization: finiteOrNull(state.utilization),
    marginMPa: finiteOrNull(state.marginMPa),
    evaporationKgM2h: finiteOrNull(state.evaporationKgM2h),
    bleedFilmKgM2: finiteOrNull(state.bleedFilmKgM2),
    utilizationP05: finiteOrNull(state.nowBands?.utilization.p05),
    utilizationP95: finiteOrNull(state.nowBands?.utilization.p95),
  };
}

/** Options of FigureHistory.list. */
export interface FigureListOptions {
  /** Only points with an event time at or after this, ms since the epoch [all]. */
  sinceMs?: number;
  /** At most this many points, the oldest first [20,000: 69 days at the 5-min cadence, our assumption]. */
  limit?: number;
}

/** Reads and writes the `figures` table of an archive's database. */
export class FigureHistory {
  readonly #upsert;
  readonly #select;

  constructor(db: Database.Database) {
    this.#upsert = db.prepare(
      `INSERT INTO figures (run_id, event_time_ms, figures_json) VALUES (?, ?, ?)
       ON CONFLICT (run_id, event_time_ms) DO UPDATE SET figures_json = excluded.figures_json`,
    );
    this.#select = db.prepare(
      `SELECT figures_json AS json FROM figures
        WHERE run_id = ? AND event_time_ms >= ? ORDER BY event_time_ms LIMIT ?`,
    );
  }

  /** Records the point of `state` for `runId`; a state without event time is skipped. */
  record(runId: string, state: RunState): void {
    const point = figurePointOf(state);
    if (point === null) return;
    this.#upsert.run(runId, point.eventTimeMs, JSON.stringify(point));
  }

  /** The run's points, oldest first. */
  list(runId: string, options: FigureListOptions = {}): FigurePoint[] {
    const rows = this.#select.all(
      runId,
      options.sinceMs ?? Number.MIN_SAFE_INTEGER,
      options.limit ?? 20_000,
    ) as { json: string }[];
    return rows.map((row) => JSON.parse(row.json) as FigurePoint);
  }
}
