/**
 * The run archive: the system of record (architecture.md). One SQLite file holds runs with their
 * validated configuration, devices, sensors, raw messages, readings, quarantine and events, each
 * run's records in an append-only order (`records.seq`). All writes of a batch commit in one
 * transaction; a reading is acknowledged to the broker only after `commit()` has returned.
 */
import { createHash, randomUUID } from 'node:crypto';
import type Database from 'better-sqlite3';
import type { RunConfig } from '../config/runConfig.ts';
import { placedAtMs } from '../config/runConfig.ts';
import { QUANTITIES, sensorsOfRun } from '../ingest/quantities.ts';
import { parseDeviceTopic } from '../ingest/topics.ts';
import type { Quantity } from '../ingest/quantities.ts';
import { ArchiveQueries } from './archiveQueries.ts';
import { FigureHistory } from './figureHistory.ts';
import { NoticeStore } from './noticeStore.ts';
import { openDatabase } from './openDatabase.ts';
import type { OpenDatabaseOptions } from './openDatabase.ts';
import type {
  CommitItem,
  CommitOutcome,
  DeviceBinding,
  RunRecord,
  SensorBinding,
} from './types.ts';

/** Snapshots kept per run; older ones are deleted when a new one is saved (our assumption). */
export const SNAPSHOTS_KEPT = 3;

/** Raw bytes kept of a quarantined message at most (the oversize limit): 64 KiB (our assumption). */
export const QUARANTINE_BYTES_KEPT = 64 * 1024;

type RecordKind = 'config' | 'message' | 'reading' | 'quarantine' | 'event';

/** The archive of every run: writes here, reads inherited from ArchiveQueries. Single writer per file. */
export class Archive extends ArchiveQueries {
  readonly #nextSeq = new Map<string, number>();
  #bindings: Map<string, DeviceBinding[]> | null = null;
  readonly #statements;
  readonly #commitListeners: ((runIds: ReadonlySet<string>) => void)[] = [];
  /** The history of each run's engine figures (table `figures`). */
  readonly figures: FigureHistory;
  /** Crew notices, their deliveries and each run's alert state (server/src/alerts/). */
  readonly notices: NoticeStore;

  constructor(db: Database.Database) {
    super(db);
    this.figures = new FigureHistory(db);
    this.notices = new NoticeStore(db);
    this.#statements = {
      insertRecord: db.prepare(
        'INSERT INTO records (run_id, seq, kind, row_id) VALUES (?, ?, ?, ?)',
      ),
      maxSeq: db.prepare('SELECT MAX(seq) AS seq FROM records WHERE run_id = ?'),
      insertMessage: db.prepare(
        'INSERT INTO raw_messages (run_id, topic, received_at_ms, bytes, sha256) VALUES (?, ?, ?, ?, ?)',
      ),
      readingExists: db.prepare('SELECT 1 FROM readings WHERE sensor_id = ? AND event_at_ms = ?'),
      insertReading: db.prepare(
        `INSERT OR IGNORE INTO readings
           (run_id, sensor_id, event_at_ms, received_at_ms, value, unit, update_interval_s, message_id)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      insertQuarantine: db.prepare(
        `INSERT INTO quarantine
           (run_id, reason, detail, topic, received_at_ms, byte_length, bytes, sha256)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      insertEvent: db.prepare(
        'INSERT INTO events (run_id, at_ms, kind, detail_json) VALUES (?, ?, ?, ?)',
      ),
      closedRunOf: db.prepare(
        `SELECT r.id, r.closed_at_ms AS closedAtMs FROM runs r JOIN devices d ON d.run_id = r.id
          WHERE r.site = ? AND d.name = ? AND r.closed_at_ms IS NOT NULL
          ORDER BY r.closed_at_ms DESC, r.id LIMIT 1`,
      ),
    };
  }

  /** Opens or creates the archive file at `path` (see openDatabase for the pragmas). */
  static open(path: string, options: OpenDatabaseOptions = {}): Archive {
    return new Archive(openDatabase(path, options));
  }

  /**
   * Creates a run from a validated configuration: the run, its devices and sensors, and the
   * configuration as the run's first record.
   *
   * @param config - output of parseRunConfig
   * @param nowMs - creation time, ms since the epoch
   * @param id - run id; a random UUID by default
   */
  createRun(config: RunConfig, nowMs: number, id: string = randomUUID()): RunRecord {
    const db = this.db;
    const placed = placedAtMs(config);
    db.transaction(() => {
      db.prepare(
        'INSERT INTO runs (id, site, config_json, placed_at_ms, created_at_ms) VALUES (?, ?, ?, ?, ?)',
      ).run(id, config.site, JSON.stringify(config), placed, nowMs);
      const deviceIds = new Map<string, number>();
      for (const sensor of sensorsOfRun(config)) {
        let deviceId = deviceIds.get(sensor.device);
        if (deviceId === undefined) {
          deviceId = Number(
            db
              .prepare('INSERT INTO devices (run_id, name, role) VALUES (?, ?, ?)')
              .run(id, sensor.device, sensor.role).lastInsertRowid,
          );
          deviceIds.set(sensor.device, deviceId);
        }
        db.prepare(
          'INSERT INTO sensors (device_id, name, quantity, unit, depth_mm) VALUES (?, ?, ?, ?, ?)',
        ).run(
          deviceId,
          sensor.sensor,
          sensor.quantity,
          QUANTITIES[sensor.quantity].unit,
          sensor.depthMm,
        );
      }
      this.#append(id, 'config', 0);
    })();
    this.#bindings = null;
    return {
      id,
      site: config.site,
      config,
      placedAtMs: placed,
      createdAtMs: nowMs,
      closedAtMs: null,
    };
  }

  /** Closes a run: its devices' readings are no longer accepted. No-op on a closed run. */
  closeRun(id: string, nowMs: number): void {
    this.db
      .prepare('UPDATE runs SET closed_at_ms = ? WHERE id = ? AND closed_at_ms IS NULL')
      .run(nowMs, id);
    this.#bindings = null;
  }

  /** The open runs that listen to `device` on `site`, with that device's sensors. */
  bindingsFor(site: string, device: string): readonly DeviceBinding[] {
    this.#bindings ??= this.#loadBindings();
    return this.#bindings.get(`${site}/${device}`) ?? [];
  }

  /**
   * Commits a batch in one transaction. An accepted item stores its raw message (bytes and
   * SHA-256) and its readings not yet in the archive; when every reading is already there it
   * goes to quarantine as `duplicate` instead. A quarantine item stores the reason, topic,
   * receive time and the first QUARANTINE_BYTES_KEPT bytes.
   *
   * @returns one outcome per item, in order
   * @throws whatever SQLite throws; then nothing of the batch is stored
   */
  commit(items: readonly CommitItem[]): CommitOutcome[] {
    let outcomes: CommitOutcome[];
    try {
      outcomes = this.db.transaction(() => items.map((item) => this.#commitItem(item)))();
    } catch (error) {
      this.#nextSeq.clear();
      throw error;
    }
    const runIds = new Set<string>();
    items.forEach((item, index) => {
      if (item.kind === 'accepted' && (outcomes[index]?.stored ?? 0) > 0) runIds.add(item.runId);
    });
    if (runIds.size > 0) for (const listener of this.#commitListeners) listener(runIds);
    return outcomes;
  }

  /**
   * Calls `listener` after every commit that stored new readings, with the runs they belong to.
   * It runs synchronously before commit() returns (before the broker's PUBACK): keep it short
   * and defer real work (the live host schedules its engines with setImmediate).
   */
  onCommit(listener: (runIds: ReadonlySet<string>) => void): void {
    this.#commitListeners.push(listener);
  }

  /**
   * Saves an engine snapshot of a run and deletes all but the newest SNAPSHOTS_KEPT of that
   * run's snapshots, in one transaction. Snapshots are derived data, not part of the evidence.
   */
  saveSnapshot(
    runId: string,
    eventTimeMs: number | null,
    lastReadingId: number,
    snapshotJson: string,
    takenAtMs: number,
    lastSeq: number | null = null,
  ): void {
    this.db.transaction(() => {
      this.db
        .prepare(
          `INSERT INTO snapshots
             (run_id, event_time_ms, last_reading_id, last_seq, taken_at_ms, snapshot_json)
           VALUES (?, ?, ?, ?, ?, ?)`,
        )
        .run(runId, eventTimeMs, lastReadingId, lastSeq, takenAtMs, snapshotJson);
      this.db
        .prepare(
          `DELETE FROM snapshots WHERE run_id = ? AND id NOT IN
             (SELECT id FROM snapshots WHERE run_id = ? ORDER BY id DESC LIMIT ?)`,
        )
        .run(runId, runId, SNAPSHOTS_KEPT);
    })();
  }

  /**
   * Records a device status (retained status or last will) on every open run using it, with a
   * `device-status` event when it differs from the status already recorded.
   */
  recordDeviceStatus(site: string, device: string, status: string, atMs: number): void {
    const runs = this.bindingsFor(site, device);
    if (runs.length === 0) return;
    this.db.transaction(() => {
      for (const binding of runs) {
        // A retained status comes again at every reconnect: record changes only.
        const changed = this.db
          .prepare(
            'UPDATE devices SET status = ?, status_at_ms = ? WHERE run_id = ? AND name = ? AND status IS NOT ?',
          )
          .run(status, atMs, binding.runId, device, status);
        if (changed.changes > 0) {
          this.#appendEventRow(binding.runId, atMs, 'device-status', { device, status });
        }
      }
    })();
  }

  /** Appends an event (anything the run's evidence should show) to a run's record order. */
  appendEvent(runId: string, atMs: number, kind: string, detail: unknown): number {
    return this.db.transaction(() => this.#appendEventRow(runId, atMs, kind, detail))();
  }

  /** Closes the database (SQLite checkpoints the WAL into the file). */
  close(): void {
    this.db.close();
  }

  #appendEventRow(runId: string, atMs: number, kind: string, detail: unknown): number {
    const rowId = Number(
      this.#statements.insertEvent.run(runId, atMs, kind, JSON.stringify(detail)).lastInsertRowid,
    );
    this.#append(runId, 'event', rowId);
    return rowId;
  }

  #commitItem(item: CommitItem): CommitOutcome {
    const s = this.#statements;
    if (item.kind === 'quarantine') {
      const closed =
        item.reason === 'unknown-device' && item.runId === null
          ? this.#closedRunOf(item.topic)
          : null;
      if (closed !== null) {
        // Kept with the closed run for people to see, outside its record order: that order is
        // frozen when the run closes (a closed run is read-only).
        this.#quarantine(
          null,
          'run-closed',
          closed.detail,
          item.topic,
          item.receivedAtMs,
          item.bytes,
          closed.runId,
        );
        return { stored: 0, duplicates: 0, quarantined: 'run-closed' };
      }
      this.#quarantine(
        item.runId,
        item.reason,
        item.detail,
        item.topic,
        item.receivedAtMs,
        item.bytes,
      );
      return { stored: 0, duplicates: 0, quarantined: item.reason };
    }
    const fresh = item.readings.filter(
      (r) => s.readingExists.get(r.sensorId, r.eventAtMs) === undefined,
    );
    if (fresh.length === 0) {
      const detail = `all ${item.readings.length} reading(s) already stored (same sensor and event time)`;
      this.#quarantine(item.runId, 'duplicate', detail, item.topic, item.receivedAtMs, item.bytes);
      return { stored: 0, duplicates: item.readings.length, quarantined: 'duplicate' };
    }
    const messageId = Number(
      s.insertMessage.run(item.runId, item.topic, item.receivedAtMs, item.bytes, sha256(item.bytes))
        .lastInsertRowid,
    );
    this.#append(item.runId, 'message', messageId);
    let stored = 0;
    for (const r of fresh) {
      const result = s.insertReading.run(
        item.runId,
        r.sensorId,
        r.eventAtMs,
        item.receivedAtMs,
        r.value,
        r.unit,
        r.updateIntervalS,
        messageId,
      );
      if (result.changes === 1) {
        stored += 1;
        this.#append(item.runId, 'reading', Number(result.lastInsertRowid));
      }
    }
    return { stored, duplicates: item.readings.length - stored, quarantined: null };
  }

  #quarantine(
    runId: string | null,
    reason: string,
    detail: string,
    topic: string,
    receivedAtMs: number,
    bytes: Uint8Array,
    unrecordedRunId: string | null = null,
  ): void {
    const kept = bytes.subarray(0, QUARANTINE_BYTES_KEPT);
    const rowId = Number(
      this.#statements.insertQuarantine.run(
        runId ?? unrecordedRunId,
        reason,
        detail,
        topic,
        receivedAtMs,
        bytes.length,
        kept,
        sha256(bytes),
      ).lastInsertRowid,
    );
    if (runId !== null) this.#append(runId, 'quarantine', rowId);
  }

  /** The most recently closed run listing the topic's device, with a detail line; or null. */
  #closedRunOf(topic: string): { runId: string; detail: string } | null {
    const parts = parseDeviceTopic(topic);
    if (parts === null) return null;
    const row = this.#statements.closedRunOf.get(parts.site, parts.device) as
      { id: string; closedAtMs: number } | undefined;
    if (row === undefined) return null;
    return {
      runId: row.id,
      detail: `device ${parts.device} on site ${parts.site} is in no open run: its run ${row.id} was closed at ${new Date(row.closedAtMs).toISOString()} and a closed run takes no readings`,
    };
  }

  #append(runId: string, kind: RecordKind, rowId: number): void {
    let seq = this.#nextSeq.get(runId);
    if (seq === undefined) {
      const row = this.#statements.maxSeq.get(runId) as { seq: number | null };
      seq = (row.seq ?? 0) + 1;
    }
    this.#statements.insertRecord.run(runId, seq, kind, rowId);
    this.#nextSeq.set(runId, seq + 1);
  }

  #loadBindings(): Map<string, DeviceBinding[]> {
    const rows = this.db
      .prepare(
        `SELECT r.id AS runId, r.site, r.placed_at_ms AS placedAtMs, d.name AS device,
                s.id AS sensorId, s.name AS sensor, s.quantity, s.unit, s.depth_mm AS depthMm
           FROM runs r JOIN devices d ON d.run_id = r.id JOIN sensors s ON s.device_id = d.id
          WHERE r.closed_at_ms IS NULL`,
      )
      .all() as {
      runId: string;
      site: string;
      placedAtMs: number;
      device: string;
      sensorId: number;
      sensor: string;
      quantity: Quantity;
      unit: string;
      depthMm: number | null;
    }[];
    const byKey = new Map<
      string,
      Map<string, { placedAtMs: number; sensors: Map<string, SensorBinding> }>
    >();
    for (const row of rows) {
      const key = `${row.site}/${row.device}`;
      let runs = byKey.get(key);
      if (runs === undefined) byKey.set(key, (runs = new Map()));
      let run = runs.get(row.runId);
      if (run === undefined)
        runs.set(row.runId, (run = { placedAtMs: row.placedAtMs, sensors: new Map() }));
      run.sensors.set(row.sensor, {
        runId: row.runId,
        sensorId: row.sensorId,
        quantity: row.quantity,
        unit: row.unit,
        depthMm: row.depthMm,
      });
    }
    const bindings = new Map<string, DeviceBinding[]>();
    for (const [key, runs] of byKey) {
      bindings.set(
        key,
        [...runs].map(([runId, run]) => ({
          runId,
          placedAtMs: run.placedAtMs,
          sensors: run.sensors,
        })),
      );
    }
    return bindings;
  }
}

/** Lower-case hex SHA-256 of `bytes` (FIPS 180-4). */
export function sha256(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}
