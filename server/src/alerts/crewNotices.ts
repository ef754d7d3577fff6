/**
 * Crew notices of every run, end to end: each state a run's engine reaches (in event-time
 * order, from the live host's onAdvance) goes through the rules and the run's alert state; each
 * notice decided is written with its text (a warning's names the measures of the log the engine
 * had for that state) and one pending delivery per channel and recipient, together with the
 * alert state after it, in one transaction; then it is announced (socket.io, the demo's
 * terminal) and the outbox sends it. Acknowledgements come from the API.
 *
 * A replay after a restart feeds states the alert state has already taken (the engine resumes
 * from its last snapshot): they are recognised by their event time and raise nothing.
 */
import type { RunRecord } from '../store/types.ts';
import type { Archive } from '../store/archive.ts';
import type { MeasureEntry, RunState } from '../live/types.ts';
import type { RunLifecycle } from '../runs/runLifecycle.ts';
import { parseAlertOptions } from './alertOptions.ts';
import type { AlertOptions, AlertOptionsInput } from './alertOptions.ts';
import { AlertState } from './alertState.ts';
import type { NoticeChannel } from './channels/noticeChannel.ts';
import { NoticeOutbox } from './noticeOutbox.ts';
import type { NoticeOutboxOptions } from './noticeOutbox.ts';
import { noticeRules } from './noticeRules.ts';
import { noticeText } from './noticeText.ts';
import type { Notice, NoticeDraft, NoticeFigures } from './types.ts';
import { localClock, offsetMinOf } from './_localTime.ts';
import { noticeFigures } from './noticeRules.ts';

export interface CrewNoticesOptions {
  /** Rules, hysteresis and repeat options (defaults of alertOptions.ts); validated here. */
  alertOptions?: AlertOptionsInput;
  /** The channels notices go out on [none: notices are only stored and announced]. */
  channels?: readonly NoticeChannel[];
  /** Wall clock for deliveries and acknowledgements, ms [Date.now]. */
  clock?: () => number;
  /** Told of each new or acknowledged notice (socket.io pushes it). */
  onNotice?: (notice: Notice) => void;
  /** Told when a state could not be turned into notices (the engine carries on). */
  onError?: (runId: string, error: unknown) => void;
  /** Options of the outbox (attempts, backoff, polling). */
  outbox?: Omit<NoticeOutboxOptions, 'clock'>;
}

/** See the file comment. */
export class CrewNotices {
  readonly #archive: Archive;
  readonly #options: AlertOptions;
  readonly #clock: () => number;
  readonly #listeners: ((notice: Notice) => void)[] = [];
  readonly #onError: (runId: string, error: unknown) => void;
  readonly #states = new Map<string, { run: RunRecord; alert: AlertState }>();
  /** The last state taken per run (for the figures and phase of a measure's NOTE). */
  readonly #lastStates = new Map<string, RunState>();
  readonly outbox: NoticeOutbox;

  constructor(archive: Archive, options: CrewNoticesOptions = {}) {
    this.#archive = archive;
    this.#options = parseAlertOptions(options.alertOptions ?? {});
    this.#clock = options.clock ?? Date.now;
    if (options.onNotice !== undefined) this.#listeners.push(options.onNotice);
    this.#onError = options.onError ?? (() => {});
    this.outbox = new NoticeOutbox(archive.notices, options.channels ?? [], {
      ...options.outbox,
      clock: this.#clock,
    });
  }

  /** Adds a listener told of each new or acknowledged notice (the demo prints them). */
  listen(listener: (notice: Notice) => void): void {
    this.#listeners.push(listener);
  }

  /** Starts the outbox's polling (retries and deliveries left pending by a restart). */
  start(): void {
    this.outbox.start();
    void this.outbox.flush().catch(() => undefined);
  }

  /**
   * Takes a state of a run's engine; returns the notices it raised (already stored). Never
   * throws: a failure is reported to onError and the run's alert state reloaded from the archive.
   *
   * @param measures - the measure log as the engine had it for the state (the live host's
   *   onAdvance gives it) [none]; a warning's text names the measures in place at its time
   */
  onState(runId: string, state: RunState, measures: readonly MeasureEntry[] = []): Notice[] {
    if (state.eventTimeMs === null) return [];
    const eventTimeMs = state.eventTimeMs;
    try {
      const hosted = this.#hosted(runId);
      if (hosted === null) return [];
      const { run, alert } = hosted;
      const store = this.#archive.notices;
      const lastTaken = alert.lastEventTimeMs;
      if (lastTaken !== null && eventTimeMs <= lastTaken) return [];
      this.#lastStates.set(runId, state);
      const findings = noticeRules(state, run.config, this.#options);
      const notices = store.transaction(() => {
        const drafts = alert.update(findings, eventTimeMs, (id) => store.isAcknowledged(id));
        const stored = drafts.map((draft) => {
          const notice = this.#store(run, draft, state.phase, measures);
          alert.noticeSent(draft.conditionKey, notice.id, draft.kind);
          return notice;
        });
        store.saveAlertState(runId, alert.snapshot());
        return stored;
      });
      this.#sent(notices);
      return notices;
    } catch (error) {
      this.#states.delete(runId);
      this.#onError(runId, error);
      return [];
    }
  }

  /**
   * Raises a NOTE for each measure of the log that has none yet (condition key
   * `measure:<id>`, so a measure is noted once, also across restarts), at the measure's start.
   * Called with the whole log after each change (RunLifecycle's measuresChanged).
   */
  measuresChanged(runId: string, measures: readonly MeasureEntry[]): Notice[] {
    try {
      const hosted = this.#hosted(runId);
      if (hosted === null) return [];
      const { run } = hosted;
      const store = this.#archive.notices;
      const offset = offsetMinOf(run.config.placedAt);
      const last = this.#lastStates.get(runId);
      const notices = store.transaction(() =>
        measures
          .filter((measure) => !store.hasNoticeFor(runId, `measure:${measure.id}`))
          .map((measure) =>
            this.#store(
              run,
              {
                level: 'NOTE',
                kind: 'measure-logged',
                conditionKey: `measure:${measure.id}`,
                raisedAtMs: measure.startMs,
                reasons: [
                  `${measure.kind} from ${localClock(measure.startMs, offset)}` +
                    (measure.endMs === null ? '' : ` to ${localClock(measure.endMs, offset)}`) +
                    `, logged by ${measure.loggedBy}`,
                ],
                eased: null,
                repeat: false,
                figures: last === undefined ? NO_FIGURES : noticeFigures(last, run.config),
              },
              last?.phase ?? 'plastic',
            ),
          ),
      );
      this.#sent(notices);
      return notices;
    } catch (error) {
      this.#onError(runId, error);
      return [];
    }
  }

  /** Listens to a run lifecycle's measure-log changes (measuresChanged()). */
  watchMeasures(lifecycle: Pick<RunLifecycle, 'listen'>): void {
    lifecycle.listen({
      measuresChanged: (runId, measures) => void this.measuresChanged(runId, measures),
    });
  }

  /** The run's notices, newest first. */
  list(runId: string): Notice[] {
    return this.#archive.notices.list(runId);
  }

  /** One notice of a run, or null. */
  get(runId: string, noticeId: string): Notice | null {
    return this.#archive.notices.get(runId, noticeId);
  }

  /**
   * Acknowledges a notice (the first acknowledgement stands) and announces it; null when the
   * run has no such notice.
   */
  acknowledge(runId: string, noticeId: string, by: string): Notice | null {
    const notice = this.#archive.notices.acknowledge(runId, noticeId, by, this.#clock());
    if (notice !== null) this.#announce(notice);
    return notice;
  }

  /** Outbox counters, for /api/health. */
  health(): { ok: boolean; channels: string[] } & NoticeOutbox['counters'] {
    return {
      ok: true,
      channels: this.outbox.channels.map((channel) => channel.name),
      ...this.outbox.counters,
    };
  }

  /** Stops the outbox and closes the channels. */
  close(): Promise<void> {
    return this.outbox.close();
  }

  #store(
    run: RunRecord,
    draft: NoticeDraft,
    phase: RunState['phase'],
    measures: readonly MeasureEntry[] = [],
  ): Notice {
    const { title, text } = noticeText(draft, {
      config: run.config,
      phase,
      dwellMin: this.#options.dwellMin,
      measures,
    });
    return this.#archive.notices.add(
      {
        runId: run.id,
        level: draft.level,
        kind: draft.kind,
        conditionKey: draft.conditionKey,
        raisedAtMs: draft.raisedAtMs,
        title,
        text,
        figures: draft.figures,
        repeat: draft.repeat,
      },
      this.#deliveriesFor(run),
      this.#clock(),
    );
  }

  #sent(notices: readonly Notice[]): void {
    for (const notice of notices) this.#announce(notice);
    if (notices.length > 0) void this.outbox.flush().catch(() => undefined);
  }

  #announce(notice: Notice): void {
    for (const listener of this.#listeners) {
      try {
        listener(notice);
      } catch (error) {
        this.#onError(notice.runId, error);
      }
    }
  }

  #hosted(runId: string): { run: RunRecord; alert: AlertState } | null {
    const known = this.#states.get(runId);
    if (known !== undefined) return known;
    const run = this.#archive.getRun(runId);
    if (run === null) return null;
    const hosted = {
      run,
      alert: new AlertState(this.#options, this.#archive.notices.alertState(runId)),
    };
    this.#states.set(runId, hosted);
    return hosted;
  }

  #deliveriesFor(run: RunRecord): { channel: string; recipient: string }[] {
    return this.outbox.channels.flatMap((channel) =>
      channel.recipients(run).map((recipient) => ({ channel: channel.name, recipient })),
    );
  }
}

/** The figures of a notice raised before the engine's first state: none yet. */
const NO_FIGURES: NoticeFigures = {
  utilization: null,
  marginMPa: null,
  evaporationKgM2h: null,
  expectedClosingMs: null,
  probabilityCracking: null,
};
