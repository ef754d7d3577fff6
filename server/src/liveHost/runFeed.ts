/**
 * Feeds a run's record order to its engine: each message's readings followed by an advance, and
 * each measure-log or forecast event at its place between them. The engine drops a reading whose
 * time it has already processed and applies a measure from when it is told, so what it computes
 * depends on the order in which it learns things; fed this way its state is a function of the
 * run's record order alone, whatever the grouping of commits or the timing of the host, and a
 * replay of the archive gives the live figures exactly.
 */
import type { MeasureEntry, RunEngine, RunState } from '../live/types.ts';
import type { ForecastPoint } from '../live/types.ts';
import { foldMeasureLog, MEASURE_EVENT_KINDS, measureEntry } from '../runs/measureLog.ts';
import type { ArchiveQueries } from '../store/archiveQueries.ts';
import type { RunEventRow } from '../store/types.ts';
import { liveReading } from './liveReading.ts';

/** Where a resumed engine's snapshot was taken. */
export interface FeedPosition {
  /** Seq of the last record the engine had been given. */
  lastSeq: number;
  /** The engine's event time in the snapshot, ms (null before its first analysis). */
  eventTimeMs: number | null;
}

/** What one catch-up did. */
export interface FeedResult {
  /** The newest state an advance returned, or null when the engine did not move. */
  state: RunState | null;
  advances: number;
  readings: number;
}

/** A run's feed; see the file comment. */
export class RunFeed {
  readonly #archive: ArchiveQueries;
  readonly #runId: string;
  readonly #engine: RunEngine;
  #measureEvents: RunEventRow[];
  #measures: readonly MeasureEntry[] = [];
  /** Seq of the last record given to the engine. */
  lastSeq: number;
  /** Id of the last reading given to the engine (for reports). */
  lastReadingId = 0;

  /**
   * Tells the engine the measure log and forecast as of the position, and (after a resume) puts
   * back at once, without an advance, the readings it had buffered past its snapshot's event
   * time, which a snapshot leaves out.
   *
   * @param from - the snapshot's position; null for an engine that has been given nothing
   */
  constructor(
    archive: ArchiveQueries,
    runId: string,
    engine: RunEngine,
    from: FeedPosition | null,
  ) {
    this.#archive = archive;
    this.#runId = runId;
    this.#engine = engine;
    this.lastSeq = from?.lastSeq ?? 0;
    const kinds = [...MEASURE_EVENT_KINDS, 'forecast'];
    const events = from === null ? [] : archive.eventsUpTo(runId, from.lastSeq, kinds);
    this.#measureEvents = events.filter((e) => e.kind !== 'forecast');
    this.#giveMeasures();
    const forecast = events.filter((e) => e.kind === 'forecast').at(-1);
    engine.setForecast(forecast === undefined ? [] : forecastPoints(forecast));
    if (from !== null && from.eventTimeMs !== null) {
      const buffered = archive.runReadingsBufferedAt(runId, from.lastSeq, from.eventTimeMs);
      engine.addReadings(buffered.map(liveReading));
    }
  }

  /** The measure log as last given to the engine: what its states count (crew notices name it). */
  get measures(): readonly MeasureEntry[] {
    return this.#measures;
  }

  /**
   * Gives the engine every record after lastSeq, `pageSize` records per query.
   *
   * @param onAdvance - called with every state an advance returns, in order (the history of
   *   figures and the notices need each one, not only the newest of a batch)
   */
  catchUp(pageSize = 10_000, onAdvance?: (state: RunState) => void): FeedResult {
    const result: FeedResult = { state: null, advances: 0, readings: 0 };
    for (;;) {
      const items = this.#archive.runFeedAfter(this.#runId, this.lastSeq, pageSize);
      for (const item of items) {
        if (item.kind === 'message') {
          this.#engine.addReadings(item.readings.map(liveReading));
          result.readings += item.readings.length;
          const last = item.readings.at(-1);
          if (last !== undefined) this.lastReadingId = Math.max(this.lastReadingId, last.id);
          const moved = this.#engine.advance();
          if (moved !== null) {
            result.state = moved;
            result.advances += 1;
            onAdvance?.(moved);
          }
        } else if ((MEASURE_EVENT_KINDS as readonly string[]).includes(item.event.kind)) {
          this.#measureEvents.push(item.event);
          this.#giveMeasures();
        } else if (item.event.kind === 'forecast') {
          this.#engine.setForecast(forecastPoints(item.event));
        }
        this.lastSeq = item.seq;
      }
      if (items.length < pageSize) return result;
    }
  }

  #giveMeasures(): void {
    this.#measures = foldMeasureLog(this.#measureEvents).map(measureEntry);
    this.#engine.setMeasures(this.#measures);
  }
}

/**
 * Replays a run's whole record order into a fresh engine (as the live host fed it).
 *
 * @returns what the catch-up did; the engine holds the final state
 */
export function replayRun(archive: ArchiveQueries, runId: string, engine: RunEngine): FeedResult {
  return new RunFeed(archive, runId, engine, null).catchUp();
}

function forecastPoints(event: RunEventRow): ForecastPoint[] {
  return (event.detail as { points: ForecastPoint[] }).points;
}
