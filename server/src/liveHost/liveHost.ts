/**
 * One live engine per open run (issue 6): given the run's committed records after each commit,
 * snapshotted into the archive at a set event-time cadence, and resumed after a restart from the
 * last snapshot with the records committed since.
 *
 * Each engine is given its run's record order (RunFeed): every message's readings followed by an
 * advance, and the measure log and forecasts at their places between them, so its state is a
 * function of the archive and a replay reproduces it. A snapshot stores the seq of the last
 * record given; a resumed engine is told the measure log and forecast as of that seq, gets back
 * the readings it had buffered past its event time (a snapshot leaves them out), and then the
 * records after it, ending in the state of an uninterrupted run. Work is deferred with
 * setImmediate so a commit (and the broker's PUBACK) never waits for a model step; runs are
 * processed one per turn of the event loop.
 */
import type {
  CreateRunEngine,
  MeasureEntry,
  RunEngine,
  RunEngineOptions,
  RunEngineSnapshot,
  RunState,
} from '../live/types.ts';
import type { RunLifecycle } from '../runs/runLifecycle.ts';
import type { Archive } from '../store/archive.ts';
import type { RunRecord } from '../store/types.ts';
import { RunFeed } from './runFeed.ts';

export interface LiveHostOptions {
  /** Passed to every engine (defaults of RunEngineOptions). */
  engineOptions?: RunEngineOptions;
  /** Event time between snapshots, s: 1800 (our assumption: at most 30 min to replay). */
  snapshotEveryS?: number;
  /** Records given per query while catching up: 10,000 (our assumption; bounds memory). */
  feedBatch?: number;
  /** Server clock for snapshot times, ms: Date.now. */
  clock?: () => number;
  /** Called with the newest state after each catch-up (socket.io pushes it). */
  onState?: (runId: string, state: RunState) => void;
  /**
   * Called with every state the engine reaches, in event-time order, including those of a
   * catch-up after a restart (rules that follow event time need each one). The host itself
   * records each one in the archive's figure history before calling this. `measures` is the
   * measure log as the engine had it for the state (what its outlook counts).
   */
  onAdvance?: (runId: string, state: RunState, measures: readonly MeasureEntry[]) => void;
  /** Called when an engine throws; the run keeps its last state. */
  onError?: (runId: string, error: unknown) => void;
}

interface Hosted {
  run: RunRecord;
  engine: RunEngine;
  feed: RunFeed;
  lastSnapshotEventMs: number | null;
}

/** Hosts the engines of the archive's open runs; see the file comment. */
export class LiveHost {
  readonly #archive: Archive;
  readonly #lifecycle: RunLifecycle;
  readonly #create: CreateRunEngine;
  readonly #options: Required<Omit<LiveHostOptions, 'engineOptions'>> & {
    engineOptions: RunEngineOptions;
  };
  readonly #hosted = new Map<string, Hosted>();
  /** Last state of closed runs, computed on demand. */
  readonly #closedStates = new Map<string, RunState>();
  readonly #dirty = new Set<string>();
  #scheduled = false;
  #waiters: (() => void)[] = [];
  #stopped = false;
  /** Counters for /api/health. */
  readonly counters = { readingsFed: 0, advances: 0, snapshots: 0, errors: 0 };

  constructor(
    archive: Archive,
    lifecycle: RunLifecycle,
    createEngine: CreateRunEngine,
    options: LiveHostOptions = {},
  ) {
    this.#archive = archive;
    this.#lifecycle = lifecycle;
    this.#create = createEngine;
    this.#options = {
      engineOptions: options.engineOptions ?? {},
      snapshotEveryS: options.snapshotEveryS ?? 1800,
      feedBatch: options.feedBatch ?? 10_000,
      clock: options.clock ?? Date.now,
      onState: options.onState ?? (() => {}),
      onAdvance: options.onAdvance ?? (() => {}),
      onError: options.onError ?? (() => {}),
    };
  }

  /**
   * Resumes every open run (last snapshot, then the readings since) and listens to commits and
   * lifecycle changes. Catching up is scheduled, not awaited: use idle() to wait for it.
   */
  start(): void {
    for (const run of this.#archive.openRuns()) this.#host(run);
    this.#archive.onCommit((runIds) => {
      for (const runId of runIds) this.#mark(runId);
    });
    this.#lifecycle.listen({
      runCreated: (run) => this.#host(run),
      runClosed: (run) => this.#retire(run),
      // The change is a record of the run's order: the feed gives it to the engine in its place.
      measuresChanged: (runId) => this.#mark(runId),
      forecastChanged: (runId) => this.#mark(runId),
    });
  }

  /**
   * The run's latest state: from its engine when open; for a closed run, replayed once from its
   * last snapshot and kept. Null for an unknown run.
   */
  state(runId: string): RunState | null {
    const hosted = this.#hosted.get(runId);
    if (hosted !== undefined) {
      this.#process(runId);
      return hosted.engine.state();
    }
    const cached = this.#closedStates.get(runId);
    if (cached !== undefined) return cached;
    const run = this.#archive.getRun(runId);
    if (run === null) return null;
    const replayed = this.#restore(run);
    // A closed run's states were recorded and reported while it was open: replay silently.
    this.#catchUp(replayed, false);
    const state = replayed.engine.state();
    this.#closedStates.set(runId, state);
    return state;
  }

  /** Resolves when every pending reading has been fed and advanced. */
  idle(): Promise<void> {
    if (this.#dirty.size === 0 && !this.#scheduled) return Promise.resolve();
    return new Promise((resolve) => this.#waiters.push(resolve));
  }

  /** What the host is doing, for /api/health. */
  health(): { ok: boolean; runs: number; pending: number } & LiveHost['counters'] {
    return { ok: true, runs: this.#hosted.size, pending: this.#dirty.size, ...this.counters };
  }

  /** Processes what is pending, snapshots every engine, and stops taking work. */
  close(): void {
    for (const runId of [...this.#dirty]) this.#process(runId);
    for (const hosted of this.#hosted.values()) this.#snapshot(hosted);
    this.#stopped = true;
    this.#hosted.clear();
    this.#release();
  }

  #host(run: RunRecord): void {
    if (this.#stopped || this.#hosted.has(run.id)) return;
    try {
      this.#hosted.set(run.id, this.#restore(run));
      this.#mark(run.id);
    } catch (error) {
      this.counters.errors += 1;
      this.#options.onError(run.id, error);
    }
  }

  /** A fresh or snapshot-resumed engine with its feed (records after the snapshot not yet given). */
  #restore(run: RunRecord): Hosted {
    // Snapshots of before the record-order feed (no lastSeq) are not used: replay from the start.
    const row = this.#archive.latestSnapshot(run.id);
    const usable = row !== null && row.lastSeq !== null ? row : null;
    const snapshot =
      usable === null ? undefined : (JSON.parse(usable.snapshotJson) as RunEngineSnapshot);
    const engine = this.#create(run.id, run.config, this.#options.engineOptions, snapshot);
    const feed = new RunFeed(
      this.#archive,
      run.id,
      engine,
      usable === null ? null : { lastSeq: usable.lastSeq ?? 0, eventTimeMs: usable.eventTimeMs },
    );
    return { run, engine, feed, lastSnapshotEventMs: usable?.eventTimeMs ?? null };
  }

  #retire(run: RunRecord): void {
    const hosted = this.#hosted.get(run.id);
    if (hosted === undefined) return;
    this.#process(run.id);
    this.#snapshot(hosted);
    this.#closedStates.set(run.id, hosted.engine.state());
    this.#hosted.delete(run.id);
    this.#dirty.delete(run.id);
  }

  #mark(runId: string): void {
    if (this.#stopped || !this.#hosted.has(runId)) return;
    this.#dirty.add(runId);
    this.#schedule();
  }

  #schedule(): void {
    if (this.#scheduled) return;
    this.#scheduled = true;
    setImmediate(() => {
      this.#scheduled = false;
      const next = this.#dirty.values().next();
      if (!next.done) this.#process(next.value);
      if (this.#dirty.size > 0) this.#schedule();
      else this.#release();
    });
  }

  #release(): void {
    const waiters = this.#waiters;
    this.#waiters = [];
    for (const resolve of waiters) resolve();
  }

  /** Feeds the run's new readings, advances, snapshots when due, and pushes a new state. */
  #process(runId: string): void {
    this.#dirty.delete(runId);
    const hosted = this.#hosted.get(runId);
    if (hosted === undefined) return;
    try {
      const state = this.#catchUp(hosted);
      if (state === null) return;
      const due =
        state.eventTimeMs !== null &&
        (hosted.lastSnapshotEventMs === null ||
          state.eventTimeMs - hosted.lastSnapshotEventMs >= this.#options.snapshotEveryS * 1000);
      if (due) this.#snapshot(hosted);
      this.#options.onState(runId, state);
    } catch (error) {
      this.counters.errors += 1;
      this.#options.onError(runId, error);
    }
  }

  /**
   * Gives the engine the records after its feed's position; the newest state or null. With
   * `report`, every state reached is recorded in the figure history and passed to onAdvance.
   */
  #catchUp(hosted: Hosted, report = true): RunState | null {
    const runId = hosted.run.id;
    const onAdvance = report
      ? (state: RunState): void => {
          this.#archive.figures.record(runId, state);
          this.#options.onAdvance(runId, state, hosted.feed.measures);
        }
      : undefined;
    const fed = hosted.feed.catchUp(this.#options.feedBatch, onAdvance);
    this.counters.advances += fed.advances;
    this.counters.readingsFed += fed.readings;
    return fed.state;
  }

  #snapshot(hosted: Hosted): void {
    const snapshot = hosted.engine.snapshot();
    this.#archive.saveSnapshot(
      hosted.run.id,
      snapshot.eventTimeMs,
      hosted.feed.lastReadingId,
      JSON.stringify(snapshot),
      this.#options.clock(),
      hosted.feed.lastSeq,
    );
    hosted.lastSnapshotEventMs = snapshot.eventTimeMs;
    this.counters.snapshots += 1;
  }
}
