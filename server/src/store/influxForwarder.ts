/**
 * Forwards stored readings to InfluxDB (v2 write API, `@influxdata/influxdb-client`) from the
 * archive's outbox: the readings table in storage order with a persisted cursor
 * (`outbox_cursor.name = 'influx'`). A batch is written, flushed, and only then the cursor moves;
 * an outage of any length loses nothing (the archive keeps the readings), and a batch written
 * again after a crash between write and cursor update lands on the same series and timestamp.
 *
 * Line protocol: measurement `meniscus_reading`; tags `site`, `run`, `device`, `sensor`,
 * `quantity`, `unit`, and `depth_mm` for probes; field `value` (float, canonical unit);
 * timestamp = the reading's event time in ms.
 */
import { InfluxDB, Point, setLogger } from '@influxdata/influxdb-client';
import type { WriteApi } from '@influxdata/influxdb-client';
import type { InfluxSettings } from '../config/serverConfig.ts';
import type { Archive } from './archive.ts';
import type { StoredReading } from './types.ts';

/** Measurement name of every reading written to InfluxDB. */
export const INFLUX_MEASUREMENT = 'meniscus_reading';
const CURSOR = 'influx';

export interface InfluxForwarderOptions {
  /** Readings per write: 5000 (the client's default batch size). */
  batchSize?: number;
  /** Wait between polls of the outbox when it is empty, ms: 1000 (our assumption). */
  pollIntervalMs?: number;
  /** Longest wait between attempts while the database is unreachable, ms: 30,000 (our assumption). */
  maxBackoffMs?: number;
  /** HTTP timeout of one write, ms: 10,000 (the client's default). */
  timeoutMs?: number;
  /** Where the client logs (it is process-wide in the library): the console by default. */
  logger?: {
    error(message: string, error?: unknown): void;
    warn(message: string, error?: unknown): void;
  };
}

export interface ForwarderState {
  ok: boolean;
  url: string;
  /** Readings stored but not yet written. */
  backlog: number;
  lastReadingId: number;
  written: number;
  failures: number;
  lastError: string | null;
}

/** The point written for a stored reading. */
export function readingPoint(reading: StoredReading): Point {
  const point = new Point(INFLUX_MEASUREMENT)
    .tag('site', reading.site)
    .tag('run', reading.runId)
    .tag('device', reading.device)
    .tag('sensor', reading.sensor)
    .tag('quantity', reading.quantity)
    .tag('unit', reading.unit)
    .floatField('value', reading.value)
    .timestamp(new Date(reading.eventAtMs));
  if (reading.depthMm !== null) point.tag('depth_mm', String(reading.depthMm));
  return point;
}

/** The outbox loop: polls the archive, writes batches, moves the cursor after each flush. */
export class InfluxForwarder {
  readonly #archive: Archive;
  readonly #settings: InfluxSettings;
  readonly #batchSize: number;
  readonly #pollIntervalMs: number;
  readonly #maxBackoffMs: number;
  readonly #writeApi: WriteApi;
  #timer: NodeJS.Timeout | null = null;
  #running: Promise<void> | null = null;
  #stopped = false;
  #backoffMs = 0;
  #written = 0;
  #failures = 0;
  #lastError: string | null = null;

  constructor(archive: Archive, settings: InfluxSettings, options: InfluxForwarderOptions = {}) {
    this.#archive = archive;
    this.#settings = settings;
    this.#batchSize = options.batchSize ?? 5000;
    this.#pollIntervalMs = options.pollIntervalMs ?? 1000;
    this.#maxBackoffMs = options.maxBackoffMs ?? 30_000;
    if (options.logger !== undefined) setLogger(options.logger);
    const influx = new InfluxDB({
      url: settings.url,
      token: settings.token,
      timeout: options.timeoutMs ?? 10_000,
    });
    // The outbox retries, so the client must not: no retries, no timer, no buffer of its own.
    this.#writeApi = influx.getWriteApi(settings.org, settings.bucket, 'ms', {
      batchSize: this.#batchSize + 1,
      flushInterval: 0,
      maxRetries: 0,
      maxBufferLines: this.#batchSize * 2,
    });
  }

  /** Starts the poll loop. */
  start(): void {
    this.#schedule(0);
  }

  /**
   * Writes one batch from the outbox.
   *
   * @returns readings written (0 when the outbox is empty)
   * @throws the write error; the cursor is then unchanged
   */
  async forwardOnce(): Promise<number> {
    const readings = this.#archive.readingsAfter(
      this.#archive.outboxCursor(CURSOR),
      this.#batchSize,
    );
    const last = readings.at(-1);
    if (last === undefined) return 0;
    this.#writeApi.writePoints(readings.map(readingPoint));
    await this.#writeApi.flush();
    this.#archive.setOutboxCursor(CURSOR, last.id);
    this.#written += readings.length;
    return readings.length;
  }

  /** Backlog, cursor and the last error, for GET /api/health. */
  state(): ForwarderState {
    const cursor = this.#archive.outboxCursor(CURSOR);
    return {
      ok: this.#lastError === null,
      url: this.#settings.url,
      backlog: this.#archive.countReadingsAfter(cursor),
      lastReadingId: cursor,
      written: this.#written,
      failures: this.#failures,
      lastError: this.#lastError,
    };
  }

  /** Stops the loop after the write in progress; flushes what the client holds, then closes it. */
  async close(): Promise<void> {
    this.#stopped = true;
    if (this.#timer !== null) clearTimeout(this.#timer);
    await this.#running;
    try {
      await this.#writeApi.flush(true);
    } catch {
      // what did not reach the database stays in the outbox
    }
    await this.#writeApi.close().catch(() => {});
  }

  #schedule(delayMs: number): void {
    if (this.#stopped) return;
    this.#timer = setTimeout(() => {
      this.#running = this.#tick();
    }, delayMs);
  }

  async #tick(): Promise<void> {
    let next = this.#pollIntervalMs;
    try {
      const written = await this.forwardOnce();
      this.#lastError = null;
      this.#backoffMs = 0;
      if (written === this.#batchSize) next = 0;
    } catch (error) {
      this.#failures += 1;
      this.#lastError = error instanceof Error ? error.message : String(error);
      this.#backoffMs = Math.min(
        this.#maxBackoffMs,
        Math.max(this.#pollIntervalMs, this.#backoffMs * 2),
      );
      next = this.#backoffMs;
    }
    this.#schedule(next);
  }
}
