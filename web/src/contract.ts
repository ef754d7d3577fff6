/**
 * The shapes the dashboard reads from the server. RunState and its parts come from the live
 * engine's own types (type-only imports, erased from the bundle); the crew notices and the
 * figure history follow the contract agreed between the parts (notices: alerts; figures: live
 * host), and the run and measure answers server/src/api/README.md.
 */
import type { RunState } from '../../server/src/live/types.ts';
import type { RunConfig } from '../../server/src/config/runConfig.ts';

export type { RunState };

/** Levels of a crew notice (vocabulary.md), always shown in words. */
export type NoticeLevel = 'NOTE' | 'PREPARE' | 'ACT NOW' | 'CRACKING LIKELY';

/** One delivery of a notice to one recipient. */
export interface NoticeDelivery {
  channel: string;
  recipient: string;
  status: 'pending' | 'sent' | 'failed';
  attempts: number;
  lastAttemptMs: number | null;
  error: string | null;
  /** Wall-clock time of the next attempt, ms; null when none is due (a field the server adds). */
  nextAttemptMs?: number | null;
}

/** A crew notice (GET /api/runs/:id/notices, socket.io `notice`). */
export interface Notice {
  id: string;
  runId: string;
  seq: number;
  level: NoticeLevel;
  kind: string;
  /**
   * The concern it is about (`margin`, `evaporation`, `sensor:<device>/<sensor>`...): the level
   * is kept per concern (a field the server adds; absent, the kind stands in for it).
   */
  conditionKey?: string;
  /** True for a repeat of an unacknowledged notice (a field the server adds). */
  repeat?: boolean;
  /** Engine event time it was raised at, ms. */
  raisedAtMs: number;
  title: string;
  text: string;
  figures: {
    utilization: number | null;
    marginMPa: number | null;
    evaporationKgM2h: number | null;
    expectedClosingMs: number | null;
    probabilityCracking: number | null;
  };
  deliveries: NoticeDelivery[];
  acknowledgedAtMs: number | null;
  acknowledgedBy: string | null;
}

/** One point of the figure history (GET /api/runs/:id/figures), one per engine update. */
export interface FigurePoint {
  eventTimeMs: number;
  phase: RunState['phase'];
  surfaceStressMPa: number | null;
  fctmMPa: number | null;
  utilization: number | null;
  marginMPa: number | null;
  evaporationKgM2h: number | null;
  bleedFilmKgM2: number | null;
  utilizationP05: number | null;
  utilizationP95: number | null;
}

/** A run in GET /api/runs. */
export interface RunSummary {
  id: string;
  site: string;
  name: string;
  /** ISO 8601 with the offset it was configured with. */
  placedAt: string;
  status: 'open' | 'closed';
  createdAt: string;
  closedAt: string | null;
}

/** GET /api/runs/:id: the summary with the run's configuration. */
export interface RunDetail extends RunSummary {
  config: RunConfig;
}

/** An entry of the measure log (GET /api/runs/:id/measures). */
export interface Measure {
  id: string;
  kind: string;
  loggedBy: string;
  endedBy: string | null;
  startAt: string;
  endAt: string | null;
  applied: boolean;
  note?: string;
}
