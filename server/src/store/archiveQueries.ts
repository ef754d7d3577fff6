/** The read side of the archive: runs, readings, quarantine, counts, the outbox cursor. */
import type Database from 'better-sqlite3';
import type { RunConfig } from '../config/runConfig.ts';
import type {
  QuarantinedMessage,
  RunEventRow,
  RunFeedItem,
  RunRecord,
  SnapshotRow,
  StoredReading,
} from './types.ts';

export interface ReadingFilter {
  /** Only this sensor name (any device), or `device/sensor`. */
  sensor?: string;
  /** Event time from, ms since the epoch, inclusive. */
  fromMs?: number;
  /** Event time to, ms since the epoch, exclusive. */
  toMs?: number;
  /** At most this many readings (default 100,000, our assumption), in event-time order. */
  limit?: number;
}

export interface SensorSummary {
  device: string;
  role: 'probe' | 'weather';
  deviceStatus: string | null;
  deviceStatusAtMs: number | null;
  sensor: string;
  quantity: string;
  unit: string;
  depthMm: number | null;
  readings: number;
  lastEventAtMs: number | null;
  updateIntervalS: number | null;
}

interface RunRow {
  id: string;
  site: string;
  config_json: string;
  placed_at_ms: number;
  created_at_ms: number;
  closed_at_ms: number | null;
}

const READING_COLUMNS = `
  rd.id, rd.run_id AS runId, r.site, d.name AS device, s.name AS sensor, s.quantity,
  s.depth_mm AS depthMm, rd.event_at_ms AS eventAtMs, rd.received_at_ms AS receivedAtMs,
  rd.value, rd.unit, rd.update_interval_s AS updateIntervalS, rd.message_id AS messageId
  FROM readings rd JOIN sensors s ON s.id = rd.sensor_id JOIN devices d ON d.id = s.device_id
  JOIN runs r ON r.id = rd.run_id`;

/** Read-only queries over an open archive database. */
export class ArchiveQueries {
  protected readonly db: Database.Database;

  constructor(db: Database.Database) {
    this.db = db;
  }

  /** The run with this id, or null. */
  getRun(id: string): RunRecord | null {
    const row = this.db.prepare('SELECT * FROM runs WHERE id = ?').get(id) as RunRow | undefined;
    return row === undefined ? null : toRun(row);
  }

  /** Every run, newest first. */
  listRuns(): RunRecord[] {
    const rows = this.db
      .prepare('SELECT * FROM runs ORDER BY created_at_ms DESC, id')
      .all() as RunRow[];
    return rows.map(toRun);
  }

  /** A run's readings in event-time order, filtered by sensor and event time. */
  readings(runId: string, filter: ReadingFilter = {}): StoredReading[] {
    const where = ['rd.run_id = ?'];
    const params: (string | number)[] = [runId];
    if (filter.sensor !== undefined) {
      const slash = filter.sensor.indexOf('/');
      if (slash > 0) {
        where.push('d.name = ? AND s.name = ?');
        params.push(filter.sensor.slice(0, slash), filter.sensor.slice(slash + 1));
      } else {
        where.push('s.name = ?');
        params.push(filter.sensor);
      }
    }
    if (filter.fromMs !== undefined) {
      where.push('rd.event_at_ms >= ?');
      params.push(filter.fromMs);
    }
    if (filter.toMs !== undefined) {
      where.push('rd.event_at_ms < ?');
      params.push(filter.toMs);
    }
    params.push(filter.limit ?? 100_000);
    return this.db
      .prepare(
        `SELECT ${READING_COLUMNS} WHERE ${where.join(' AND ')} ORDER BY rd.event_at_ms, rd.id LIMIT ?`,
      )
      .all(...params) as StoredReading[];
  }

  /** Readings stored after `afterId` in storage order: the outbox's next batch. */
  readingsAfter(afterId: number, limit: number): StoredReading[] {
    return this.db
      .prepare(`SELECT ${READING_COLUMNS} WHERE rd.id > ? ORDER BY rd.id LIMIT ?`)
      .all(afterId, limit) as StoredReading[];
  }

  /** Number of readings stored after `afterId` (an outbox's backlog). */
  countReadingsAfter(afterId: number): number {
    return (
      this.db.prepare('SELECT COUNT(*) AS n FROM readings WHERE id > ?').get(afterId) as {
        n: number;
      }
    ).n;
  }

  /** The outbox cursor `name`: id of the last reading delivered, 0 when none. */
  outboxCursor(name: string): number {
    const row = this.db
      .prepare('SELECT last_reading_id AS id FROM outbox_cursor WHERE name = ?')
      .get(name) as { id: number } | undefined;
    return row?.id ?? 0;
  }

  /** Moves the outbox cursor `name` to `lastReadingId` (the last reading delivered). */
  setOutboxCursor(name: string, lastReadingId: number): void {
    this.db
      .prepare(
        `INSERT INTO outbox_cursor (name, last_reading_id) VALUES (?, ?)
         ON CONFLICT (name) DO UPDATE SET last_reading_id = excluded.last_reading_id`,
      )
      .run(name, lastReadingId);
  }

  /** Quarantined messages of a run (or those that matched no run, with `null`), oldest first. */
  quarantine(runId: string | null, limit = 1000): QuarantinedMessage[] {
    const sql = `SELECT id, run_id AS runId, reason, detail, topic, received_at_ms AS receivedAtMs,
                 byte_length AS byteLength, bytes, sha256 FROM quarantine
                 WHERE run_id ${runId === null ? 'IS NULL' : '= ?'} ORDER BY id LIMIT ?`;
    const params = runId === null ? [limit] : [runId, limit];
    return this.db.prepare(sql).all(...params) as QuarantinedMessage[];
  }

  /** Quarantined messages per reason, for one run or (no argument) the whole archive. */
  quarantineCounts(runId?: string): Record<string, number> {
    const rows = (
      runId === undefined
        ? this.db.prepare('SELECT reason, COUNT(*) AS n FROM quarantine GROUP BY reason').all()
        : this.db
            .prepare(
              'SELECT reason, COUNT(*) AS n FROM quarantine WHERE run_id = ? GROUP BY reason',
            )
            .all(runId)
    ) as { reason: string; n: number }[];
    return Object.fromEntries(rows.map((row) => [row.reason, row.n]));
  }

  /**
   * Rows per table in the whole archive. They read the largest row id, which equals the row
   * count because these tables are append-only (no deletes, ids never reused): cheap enough for
   * every GET /api/health on a big archive.
   */
  totals(): { readings: number; messages: number; quarantine: number } {
    const max = (table: string) =>
      (this.db.prepare(`SELECT COALESCE(MAX(id), 0) AS n FROM ${table}`).get() as { n: number }).n;
    return {
      readings: max('readings'),
      messages: max('raw_messages'),
      quarantine: max('quarantine'),
    };
  }

  /** Rows per table for one run (exact counts over the run's index). */
  counts(runId: string): {
    readings: number;
    messages: number;
    quarantine: number;
    records: number;
  } {
    const count = (table: string) =>
      (
        this.db.prepare(`SELECT COUNT(*) AS n FROM ${table} WHERE run_id = ?`).get(runId) as {
          n: number;
        }
      ).n;
    return {
      readings: count('readings'),
      messages: count('raw_messages'),
      quarantine: count('quarantine'),
      records: count('records'),
    };
  }

  /**
   * Every sensor of a run with its device's status and its latest reading: what a dashboard
   * needs to show a silent sensor (no reading for longer than its `ut`).
   */
  sensorSummaries(runId: string): SensorSummary[] {
    return this.db
      .prepare(
        `SELECT d.name AS device, d.role, d.status AS deviceStatus, d.status_at_ms AS deviceStatusAtMs,
                s.name AS sensor, s.quantity, s.unit, s.depth_mm AS depthMm,
                (SELECT COUNT(*) FROM readings r WHERE r.sensor_id = s.id) AS readings,
                (SELECT MAX(event_at_ms) FROM readings r WHERE r.sensor_id = s.id) AS lastEventAtMs,
                (SELECT update_interval_s FROM readings r WHERE r.sensor_id = s.id
                  ORDER BY event_at_ms DESC LIMIT 1) AS updateIntervalS
           FROM devices d JOIN sensors s ON s.device_id = d.id
          WHERE d.run_id = ? ORDER BY d.name, s.name`,
      )
      .all(runId) as SensorSummary[];
  }

  /** A run's record order: `[seq, kind, rowId]` rows from `fromSeq` on. */
  records(runId: string, fromSeq = 1): { seq: number; kind: string; rowId: number }[] {
    return this.db
      .prepare(
        'SELECT seq, kind, row_id AS rowId FROM records WHERE run_id = ? AND seq >= ? ORDER BY seq',
      )
      .all(runId, fromSeq) as { seq: number; kind: string; rowId: number }[];
  }

  /** Runs not closed, oldest first (what the live host resumes at start). */
  openRuns(): RunRecord[] {
    const rows = this.db
      .prepare('SELECT * FROM runs WHERE closed_at_ms IS NULL ORDER BY created_at_ms, id')
      .all() as RunRow[];
    return rows.map(toRun);
  }

  /** A run's readings stored after reading id `afterId`, in storage order (what an engine has not seen). */
  runReadingsAfter(runId: string, afterId: number, limit = 100_000): StoredReading[] {
    return this.db
      .prepare(`SELECT ${READING_COLUMNS} WHERE rd.run_id = ? AND rd.id > ? ORDER BY rd.id LIMIT ?`)
      .all(runId, afterId, limit) as StoredReading[];
  }

  /** A run's events of the given kinds (all kinds when empty), in record order. */
  events(runId: string, kinds: readonly string[] = []): RunEventRow[] {
    const filter = kinds.length === 0 ? '' : `AND kind IN (${kinds.map(() => '?').join(', ')})`;
    const rows = this.db
      .prepare(
        `SELECT id, at_ms AS atMs, kind, detail_json AS detailJson FROM events
          WHERE run_id = ? ${filter} ORDER BY id`,
      )
      .all(runId, ...kinds) as { id: number; atMs: number; kind: string; detailJson: string }[];
    return rows.map(({ detailJson, ...row }) => ({
      ...row,
      detail: JSON.parse(detailJson) as unknown,
    }));
  }

  /**
   * A run's records after `afterSeq` that an engine takes, in record order: each message with its
   * readings (storage order) and each event with its kind and detail. Readings of the same
   * message come together; at most `limit` records.
   */
  runFeedAfter(runId: string, afterSeq: number, limit = 10_000): RunFeedItem[] {
    const records = this.db
      .prepare(
        `SELECT seq, kind, row_id AS rowId FROM records
          WHERE run_id = ? AND seq > ? AND kind IN ('message', 'event') ORDER BY seq LIMIT ?`,
      )
      .all(runId, afterSeq, limit) as { seq: number; kind: string; rowId: number }[];
    const messageReadings = this.db.prepare(
      `SELECT ${READING_COLUMNS} WHERE rd.message_id = ? AND rd.run_id = ? ORDER BY rd.id`,
    );
    const event = this.db.prepare(
      'SELECT id, at_ms AS atMs, kind, detail_json AS detailJson FROM events WHERE id = ?',
    );
    return records.map((record): RunFeedItem => {
      if (record.kind === 'message') {
        return {
          seq: record.seq,
          kind: 'message',
          readings: messageReadings.all(record.rowId, runId) as StoredReading[],
        };
      }
      const row = event.get(record.rowId) as {
        id: number;
        atMs: number;
        kind: string;
        detailJson: string;
      };
      return {
        seq: record.seq,
        kind: 'event',
        event: { id: row.id, atMs: row.atMs, kind: row.kind, detail: JSON.parse(row.detailJson) },
      };
    });
  }

  /** A run's events of the given kinds recorded at or before record `seq`, in record order. */
  eventsUpTo(runId: string, seq: number, kinds: readonly string[]): RunEventRow[] {
    const rows = this.db
      .prepare(
        `SELECT e.id, e.at_ms AS atMs, e.kind, e.detail_json AS detailJson
           FROM records r JOIN events e ON e.id = r.row_id
          WHERE r.run_id = ? AND r.kind = 'event' AND r.seq <= ?
            AND e.kind IN (${kinds.map(() => '?').join(', ')})
          ORDER BY r.seq`,
      )
      .all(runId, seq, ...kinds) as {
      id: number;
      atMs: number;
      kind: string;
      detailJson: string;
    }[];
    return rows.map(({ detailJson, ...row }) => ({
      ...row,
      detail: JSON.parse(detailJson) as unknown,
    }));
  }

  /**
   * Readings of messages recorded at or before record `seq` whose event time is after
   * `eventAfterMs`, in storage order: what an engine had buffered past its event time when a
   * snapshot was taken at `seq` (a snapshot leaves them out).
   */
  runReadingsBufferedAt(runId: string, seq: number, eventAfterMs: number): StoredReading[] {
    return this.db
      .prepare(
        `SELECT ${READING_COLUMNS}
           JOIN records rec ON rec.run_id = rd.run_id AND rec.kind = 'message' AND rec.row_id = rd.message_id
          WHERE rd.run_id = ? AND rec.seq <= ? AND rd.event_at_ms > ? ORDER BY rd.id`,
      )
      .all(runId, seq, eventAfterMs) as StoredReading[];
  }

  /** The run's latest engine snapshot, or null. */
  latestSnapshot(runId: string): SnapshotRow | null {
    const row = this.db
      .prepare(
        `SELECT id, run_id AS runId, event_time_ms AS eventTimeMs, last_reading_id AS lastReadingId,
                last_seq AS lastSeq, taken_at_ms AS takenAtMs, snapshot_json AS snapshotJson
           FROM snapshots WHERE run_id = ? ORDER BY id DESC LIMIT 1`,
      )
      .get(runId) as SnapshotRow | undefined;
    return row ?? null;
  }

  /** `PRAGMA integrity_check`: `['ok']` when the file is sound. */
  integrityCheck(): string[] {
    return (this.db.pragma('integrity_check') as { integrity_check: string }[]).map(
      (row) => row.integrity_check,
    );
  }
}

function toRun(row: RunRow): RunRecord {
  return {
    id: row.id,
    site: row.site,
    config: JSON.parse(row.config_json) as RunConfig,
    placedAtMs: row.placed_at_ms,
    createdAtMs: row.created_at_ms,
    closedAtMs: row.closed_at_ms,
  };
}
