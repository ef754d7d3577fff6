/**
 * A run's life: created from a validated configuration, open from creation (ingest takes its
 * readings from 1 h before placement; the engine reports `before-placement` until placedAt),
 * closed at the end of the watch. A closed run is read-only: ingest quarantines its devices'
 * readings as `run-closed`, and measure or forecast changes are refused (409).
 *
 * The measure log and supplied forecasts are events in the run's append-only record order
 * (`measure-started`, `measure-ended`, `forecast`), closing is a `run-closed` event: the evidence
 * holds what the model was told and when.
 */
import type { RunConfig } from '../config/runConfig.ts';
import type { ForecastPoint, MeasureEntry } from '../live/types.ts';
import type { Archive } from '../store/archive.ts';
import type { RunRecord } from '../store/types.ts';
import type { MeasureStart } from './measureInput.ts';
import { foldMeasureLog, MEASURE_EVENT_KINDS, measureEntry } from './measureLog.ts';
import type { MeasureRecord } from './measureLog.ts';
import { RunError, runClosed, runNotFound } from './runErrors.ts';

/** Told about every change, after it is committed (the live host). */
export interface RunListener {
  runCreated(run: RunRecord): void;
  runClosed(run: RunRecord): void;
  measuresChanged(runId: string, measures: readonly MeasureEntry[]): void;
  forecastChanged(runId: string, points: readonly ForecastPoint[]): void;
}

/** Where a supplied forecast came from. */
export type ForecastSource = 'api' | 'mqtt';

/** Lifecycle, measure log and forecasts of the archive's runs. */
export class RunLifecycle {
  readonly #archive: Archive;
  readonly #clock: () => number;
  readonly #listeners: Partial<RunListener>[] = [];

  /**
   * @param archive - the system of record
   * @param clock - server time for creation, closing and defaulted measure times, ms since the epoch
   */
  constructor(archive: Archive, clock: () => number = Date.now) {
    this.#archive = archive;
    this.#clock = clock;
  }

  /** Adds a listener (called synchronously after each committed change). */
  listen(listener: Partial<RunListener>): void {
    this.#listeners.push(listener);
  }

  /** Server time, ms since the epoch. */
  now(): number {
    return this.#clock();
  }

  /** The run, or a 404 RunError. */
  get(runId: string): RunRecord {
    const run = this.#archive.getRun(runId);
    if (run === null) throw runNotFound(runId);
    return run;
  }

  /** Creates and opens a run from a configuration validated by parseRunConfig. */
  create(config: RunConfig, id?: string): RunRecord {
    const run = this.#archive.createRun(config, this.#clock(), id);
    for (const listener of this.#listeners) listener.runCreated?.(run);
    return run;
  }

  /**
   * Closes a run with a `run-closed` event naming who closed it.
   *
   * @throws RunError 404 for an unknown run, 409 when already closed
   */
  close(runId: string, closedBy: string | null, note: string | null): RunRecord {
    const run = this.#open(runId, 'closing again');
    const nowMs = this.#clock();
    this.#archive.appendEvent(runId, nowMs, 'run-closed', { closedBy, note });
    this.#archive.closeRun(runId, nowMs);
    const closed = { ...run, closedAtMs: nowMs };
    for (const listener of this.#listeners) listener.runClosed?.(closed);
    return closed;
  }

  /** The run's measure log in the order logged, with who ended each (404 for an unknown run). */
  measureLog(runId: string): MeasureRecord[] {
    this.get(runId);
    return foldMeasureLog(this.#archive.events(runId, MEASURE_EVENT_KINDS));
  }

  /** The run's measure log as the engine takes it (404 for an unknown run). */
  measures(runId: string): MeasureEntry[] {
    return this.measureLog(runId).map(measureEntry);
  }

  /**
   * Logs a measure; its id is `m<n>`, n counting the run's measures from 1.
   *
   * @throws RunError 404 unknown run, 409 closed run
   */
  startMeasure(runId: string, start: MeasureStart): MeasureEntry {
    this.#open(runId, 'logging a measure');
    const id = `m${this.measures(runId).length + 1}`;
    const entry: MeasureEntry = { id, ...start };
    this.#archive.appendEvent(runId, this.#clock(), 'measure-started', entry);
    this.#measuresChanged(runId);
    return entry;
  }

  /**
   * Ends a measure still applied.
   *
   * @throws RunError 404 unknown run or measure; 409 closed run, measure already ended, or an
   *   end before the measure's start
   */
  endMeasure(runId: string, measureId: string, endMs: number, endedBy: string): MeasureRecord {
    this.#open(runId, 'ending a measure');
    const entry = this.measureLog(runId).find((m) => m.id === measureId);
    if (entry === undefined)
      throw new RunError(
        404,
        `run ${runId} has no measure ${JSON.stringify(measureId.slice(0, 40))}`,
      );
    if (entry.endMs !== null)
      throw new RunError(
        409,
        `measure ${measureId} already ended at ${new Date(entry.endMs).toISOString()}`,
      );
    if (endMs < entry.startMs)
      throw new RunError(
        409,
        `endAt must not be before the measure's start (${new Date(entry.startMs).toISOString()}): got ${new Date(endMs).toISOString()}`,
      );
    this.#archive.appendEvent(runId, this.#clock(), 'measure-ended', {
      id: measureId,
      endMs,
      endedBy,
    });
    this.#measuresChanged(runId);
    return { ...entry, endMs, endedBy };
  }

  /** The run's latest supplied forecast (empty: persistence). 404 for an unknown run. */
  forecast(runId: string): ForecastPoint[] {
    this.get(runId);
    const last = this.#archive.events(runId, ['forecast']).at(-1);
    return last === undefined ? [] : (last.detail as { points: ForecastPoint[] }).points;
  }

  /**
   * Replaces the run's supplied forecast series.
   *
   * @throws RunError 404 unknown run, 409 closed run
   */
  setForecast(runId: string, points: readonly ForecastPoint[], source: ForecastSource): void {
    this.#open(runId, 'a forecast');
    this.#archive.appendEvent(runId, this.#clock(), 'forecast', { source, points });
    for (const listener of this.#listeners) listener.forecastChanged?.(runId, points);
  }

  #open(runId: string, what: string): RunRecord {
    const run = this.get(runId);
    if (run.closedAtMs !== null) throw runClosed(runId, run.closedAtMs, what);
    return run;
  }

  #measuresChanged(runId: string): void {
    const measures = this.measures(runId);
    for (const listener of this.#listeners) listener.measuresChanged?.(runId, measures);
  }
}
