/**
 * One live engine per open run (issue 6): fed the run's committed readings after each commit,
 * told the measure log and supplied forecasts, snapshotted into the archive at a set event-time
 * cadence, and resumed after a restart from the last snapshot with the readings committed since.
 *
 * Feeding order is storage order (reading id), one message at a time with an advance after each
 * (feedByMessage), so an engine's state depends on the run's messages in storage order alone and
 * a replay of the archive reproduces it. An engine has been fed exactly the run's readings up to
 * `lastReadingId`, which is stored with each snapshot. A snapshot leaves out what the
 * engine had buffered past its event time (server/src/live/runEngine.ts), so a resumed engine is
 * fed the readings after `lastReadingId` and, before them in storage order, those past the
 * snapshot's event time; a reading at or before that time is late for both the resumed engine
 * and an uninterrupted one, and both count it the same way. Work is deferred with setImmediate so
 * a commit (and the broker's PUBACK) never waits for a model step; runs are processed one per
 * turn of the event loop.
 */
import type { CreateRunEngine, RunEngine, RunEngineOptions, RunState } from '../live/types.ts';
import type { RunLifecycle } from '../runs/runLifecycle.ts';
import type { Archive } from '../store/archive.ts';
import type { RunRecord } from '../store/types.ts';
import { feedByMessage } from './feedByMessage.ts';
import { liveReading } from './liveReading.ts';

export interface LiveHostOptions {
  /** Passed to every engine (defaults of RunEngineOptions). */
  engineOptions?: RunEngineOptions;
  /** Event time between snapshots, s: 1800 (our assumption: at most 30 min to replay). */
  snapshotEveryS?: number;
  /** Readings fed per query while catching up: 20,000 (our assumption; bounds memory). */
  feedBatch?: number;
  /** Server clock for snapshot times, ms: Date.now. */
  clock?: () => number;
  /** Called with each new state (socket.io pushes it). */
  onState?: (runId: string, state: RunState) => void;
  /** Called when an engine throws; the run keeps its last state. */
  onError?: (runId: string, error: unknown) => void;
}

interface Hosted {
  run: RunRecord;
  engine: RunEngine;
  lastReadingId: number;
  lastSnapshotEventMs: number | null;
  /** Set after a resume until the first catch-up: also feed readings past this event time. */
  resumeAfterEventMs: number | null;
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
      feedBatch: options.feedBatch ?? 20_000,
      clock: options.clock ?? Date.now,
      onState: options.onState ?? (() => {}),
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
      measuresChanged: (runId, measures) => {
        this.#hosted.get(runId)?.engine.setMeasures(measures);
        this.#mark(runId);
      },
      forecastChanged: (runId, points) => {
        this.#hosted.get(runId)?.engine.setForecast(points);
        this.#mark(runId);
      },
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
    this.#catchUp(replayed);
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

  /** A fresh or snapshot-resumed engine told the run's measures and forecast (not yet fed). */
  #restore(run: RunRecord): Hosted {
    const row = this.#archive.latestSnapshot(run.id);
    const snapshot = row === null ? undefined : JSON.parse(row.snapshotJson);
    const engine = this.#create(run.id, run.config, this.#options.engineOptions, snapshot);
    engine.setMeasures(this.#lifecycle.measures(run.id));
    engine.setForecast(this.#lifecycle.forecast(run.id));
    return {
      run,
      engine,
      lastReadingId: row?.lastReadingId ?? 0,
      lastSnapshotEventMs: row?.eventTimeMs ?? null,
      resumeAfterEventMs: row?.eventTimeMs ?? null,
    };
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
   * Feeds every reading stored after lastReadingId one message at a time (feedByMessage); after
   * a resume, first puts back at once, without advancing, the readings fed before the snapshot
   * that it left out. Returns the newest state or null when the engine did not move.
   */
  #catchUp(hosted: Hosted): RunState | null {
    const fedUpToId = hosted.lastReadingId;
    const eventAfterMs = hosted.resumeAfterEventMs;
    hosted.resumeAfterEventMs = null;
    const limit = this.#options.feedBatch;
    let cursor = eventAfterMs === null ? fedUpToId : 0;
    let latest: RunState | null = null;
    for (;;) {
      let batch =
        eventAfterMs === null
          ? this.#archive.runReadingsAfter(hosted.run.id, cursor, limit)
          : this.#archive.runReadingsToResume(
              hosted.run.id,
              cursor,
              fedUpToId,
              eventAfterMs,
              limit,
            );
      if (batch.length === 0) break;
      const full = batch.length === limit;
      if (full) {
        // Keep a message whole: its tail would be in the next page.
        const lastMessage = batch[batch.length - 1]?.messageId;
        const cut = batch.findIndex((r) => r.messageId === lastMessage);
        if (cut > 0) batch = batch.slice(0, cut);
      }
      let first = 0;
      while (first < batch.length && (batch[first]?.id ?? 0) <= fedUpToId) first += 1;
      if (first > 0) hosted.engine.addReadings(batch.slice(0, first).map(liveReading));
      const fed = feedByMessage(hosted.engine, batch.slice(first));
      if (fed.state !== null) latest = fed.state;
      this.counters.advances += fed.advances;
      this.counters.readingsFed += batch.length;
      cursor = batch[batch.length - 1]?.id ?? cursor;
      if (!full) break;
    }
    hosted.lastReadingId = Math.max(hosted.lastReadingId, cursor);
    return latest;
  }

  #snapshot(hosted: Hosted): void {
    const snapshot = hosted.engine.snapshot();
    this.#archive.saveSnapshot(
      hosted.run.id,
      snapshot.eventTimeMs,
      hosted.lastReadingId,
      JSON.stringify(snapshot),
      this.#options.clock(),
    );
    hosted.lastSnapshotEventMs = snapshot.eventTimeMs;
    this.counters.snapshots += 1;
  }
}
