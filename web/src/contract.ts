/**
 * The shapes the dashboard reads from the server. RunState, the crew notices and the figure
 * history are the server's own types (type-only imports, erased from the bundle), so a change
 * on either side fails the type check; the run and measure answers follow
 * server/src/api/README.md.
 */
import type { RunState } from '../../server/src/live/types.ts';
import type { RunConfig } from '../../server/src/config/runConfig.ts';

export type { RunState };
/** Crew notices (GET /api/runs/:id/notices, socket.io `notice`): the alerts' own types. */
export type { Notice, NoticeDelivery, NoticeLevel } from '../../server/src/alerts/types.ts';
/** One point of the figure history (GET /api/runs/:id/figures): the store's own type. */
export type { FigurePoint } from '../../server/src/store/figureHistory.ts';

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
