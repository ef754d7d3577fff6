/**
 * The demo's fogging case without the server: the live engine fed the level3-topping twin's
 * readings in 5-minute batches, each measure of the log handed to the engine when it starts (as
 * the demo logs it over the API), and every state put through the crew-notice rules and an alert
 * state as the server's CrewNotices does (no acknowledgements). Used by foggingOutlook.test.ts
 * and the scripts foggingNotices.ts and foggingMembers.ts.
 */
import { AlertState, DEFAULT_ALERT_OPTIONS, noticeRules } from '../../server/src/alerts/index.ts';
import type { NoticeLevel } from '../../server/src/alerts/index.ts';
import type { RunConfig } from '../../server/src/config/index.ts';
import { createRunEngine } from '../../server/src/live/index.ts';
import type {
  MeasureEntry,
  RunEngine,
  RunEngineOptions,
  RunState,
} from '../../server/src/live/index.ts';
import { PARAMETER_INDEX } from '../../server/src/live/memberModel.ts';
import { readingBatches } from './twinReadings.ts';
import type { TwinRun } from './twinReadings.ts';

/** A margin notice the alert state decided. */
export interface MarginNotice {
  level: NoticeLevel;
  kind: string;
  repeat: boolean;
  /** Event time of the state that raised it, ms. */
  raisedAtMs: number;
  /** The state's utilization now (median over the members). */
  utilization: number | null;
  phase: RunState['phase'];
  /** The outlook's median crossing of the highest threshold (U = 1), ms, or null. */
  expectedClosingMs: number | null;
  /** Fraction of the outlook's members that cross U = 1 within the horizon. */
  closingProbability: number | null;
}

/** What one replay gives. */
export interface FoggingReplay {
  engine: RunEngine;
  marginNotices: MarginNotice[];
}

/** Options of a replay. */
export interface FoggingReplayOptions {
  engineOptions?: RunEngineOptions;
  /**
   * Gives every member this initial bleed film, kg/m2, once the engine has made its ensemble
   * (its first 5 minutes after placement), by a restart from its own snapshot: how the twin
   * seeds script gives the members the truth's hidden parameters. Absent: the prior's draws.
   */
  memberInitialFilmKgM2?: number;
  /** Called after each advance that produced a state (e.g. to take a snapshot). */
  onState?: (engine: RunEngine, state: RunState) => void;
}

/** Member of a snapshot's ensemble, as the engine writes it (the fields changed here). */
interface SnapshotMember {
  state: (number | null)[];
  parameters: number[];
  carried: { bleedFilmKgM2: number };
}

/**
 * Replays `twin` for `runId`: see the file comment.
 *
 * @param config - the scenario's run configuration
 */
export function replayFogging(
  twin: TwinRun,
  config: RunConfig,
  runId: string,
  options: FoggingReplayOptions = {},
): FoggingReplay {
  const engineOptions = options.engineOptions ?? {};
  let engine = createRunEngine(runId, config, engineOptions);
  let patched = options.memberInitialFilmKgM2 === undefined;
  const alerts = new AlertState(DEFAULT_ALERT_OPTIONS);
  const marginNotices: MarginNotice[] = [];
  let logged: MeasureEntry[] = [];
  let noticeCount = 0;
  for (const batch of readingBatches(twin.readings, 300)) {
    const batchEndMs = Math.max(...batch.map((reading) => reading.eventTimeMs));
    const started = twin.measures.filter((measure) => measure.startMs <= batchEndMs);
    if (started.length !== logged.length) {
      logged = started;
      engine.setMeasures(logged);
    }
    engine.addReadings(batch);
    const state = engine.advance();
    if (!patched) {
      const snapshot = engine.snapshot();
      const body = snapshot.body as { ensemble: { members: SnapshotMember[] } | null };
      if (body.ensemble !== null) {
        const film = options.memberInitialFilmKgM2 as number;
        for (const member of body.ensemble.members) {
          member.parameters[PARAMETER_INDEX.initialBleedFilmKgM2] = film;
          member.carried.bleedFilmKgM2 = film;
          member.state[member.state.length - 1] = film; // the film's entry of the state vector
        }
        engine = createRunEngine(runId, config, engineOptions, snapshot);
        patched = true;
      }
    }
    if (state === null || state.eventTimeMs === null) continue;
    options.onState?.(engine, state);
    const drafts = alerts.update(
      noticeRules(state, config, DEFAULT_ALERT_OPTIONS),
      state.eventTimeMs,
    );
    for (const draft of drafts) {
      noticeCount += 1;
      alerts.noticeSent(draft.conditionKey, `n${noticeCount}`, draft.kind);
      if (draft.conditionKey !== 'margin') continue;
      const closing = state.outlook?.crossings.find((crossing) => crossing.threshold === 1);
      marginNotices.push({
        level: draft.level,
        kind: draft.kind,
        repeat: draft.repeat,
        raisedAtMs: state.eventTimeMs,
        utilization: state.utilization,
        phase: state.phase,
        expectedClosingMs: closing?.medianTimeMs ?? null,
        closingProbability: closing?.probability ?? null,
      });
    }
  }
  return { engine, marginNotices };
}

/** The margin's ACT NOW and CRACKING LIKELY notices raised at or after `fromMs`. */
export function warningsFrom(notices: readonly MarginNotice[], fromMs: number): MarginNotice[] {
  return notices.filter(
    (notice) =>
      notice.raisedAtMs >= fromMs &&
      (notice.level === 'ACT NOW' || notice.level === 'CRACKING LIKELY'),
  );
}
