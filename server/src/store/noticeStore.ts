/**
 * Crew notices in the archive (tables `notices`, `notice_deliveries`, `alert_states`; schema 5):
 * each notice with its text and figures, one delivery row per channel and recipient (the outbox
 * the notice channels work through, with status, attempts and the last error), and each run's
 * alert-state snapshot. A notice, its deliveries and the alert state after it are written in one
 * transaction (transaction()), so a crash never leaves a notice without its state or the reverse,
 * and a restart resumes without raising a notice twice.
 */
import type Database from 'better-sqlite3';
import type { AlertStateSnapshot } from '../alerts/alertState.ts';
import type {
  DeliveryStatus,
  Notice,
  NoticeDelivery,
  NoticeFigures,
  NoticeKind,
  NoticeLevel,
} from '../alerts/types.ts';

/** A notice to store: everything but the id, seq, deliveries and acknowledgement. */
export type NewNotice = Omit<
  Notice,
  'id' | 'seq' | 'deliveries' | 'acknowledgedAtMs' | 'acknowledgedBy'
>;

/** A delivery that is due, with its notice. */
export interface DueDelivery {
  deliveryId: number;
  channel: string;
  recipient: string;
  attempts: number;
  notice: Notice;
}

/** The outcome of one delivery attempt. */
export interface DeliveryAttempt {
  /** Wall-clock time of the attempt, ms. */
  atMs: number;
  /** null: sent. */
  error: string | null;
  /** When to try again, ms; null: no further attempt (sent, or given up). */
  nextAttemptMs: number | null;
}

interface NoticeRow {
  id: string;
  run_id: string;
  seq: number;
  level: string;
  kind: string;
  condition_key: string;
  raised_at_ms: number;
  title: string;
  text: string;
  figures_json: string;
  repeat: number;
  acknowledged_at_ms: number | null;
  acknowledged_by: string | null;
}

interface DeliveryRow {
  id: number;
  notice_id: string;
  channel: string;
  recipient: string;
  status: string;
  attempts: number;
  last_attempt_ms: number | null;
  next_attempt_ms: number | null;
  error: string | null;
}

/** Reads and writes the crew notices of an archive's database. */
export class NoticeStore {
  readonly #db: Database.Database;
  readonly #s;

  constructor(db: Database.Database) {
    this.#db = db;
    this.#s = {
      nextSeq: db.prepare('SELECT COALESCE(MAX(seq), 0) + 1 AS seq FROM notices WHERE run_id = ?'),
      insert: db.prepare(
        `INSERT INTO notices (id, run_id, seq, level, kind, condition_key, raised_at_ms, title,
           text, figures_json, repeat) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      insertDelivery: db.prepare(
        `INSERT INTO notice_deliveries (notice_id, channel, recipient, status, next_attempt_ms)
         VALUES (?, ?, ?, 'pending', ?)`,
      ),
      byRun: db.prepare('SELECT * FROM notices WHERE run_id = ? ORDER BY seq DESC LIMIT ?'),
      byId: db.prepare('SELECT * FROM notices WHERE run_id = ? AND id = ?'),
      byKey: db.prepare('SELECT 1 FROM notices WHERE run_id = ? AND condition_key = ? LIMIT 1'),
      deliveriesOf: db.prepare('SELECT * FROM notice_deliveries WHERE notice_id = ? ORDER BY id'),
      acknowledge: db.prepare(
        `UPDATE notices SET acknowledged_at_ms = ?, acknowledged_by = ?
          WHERE run_id = ? AND id = ? AND acknowledged_at_ms IS NULL`,
      ),
      acknowledged: db.prepare('SELECT acknowledged_at_ms AS at FROM notices WHERE id = ?'),
      due: db.prepare(
        `SELECT d.*, n.run_id FROM notice_deliveries d JOIN notices n ON n.id = d.notice_id
          WHERE d.next_attempt_ms IS NOT NULL AND d.next_attempt_ms <= ?
          ORDER BY d.next_attempt_ms, d.id LIMIT ?`,
      ),
      nextDue: db.prepare(
        'SELECT MIN(next_attempt_ms) AS at FROM notice_deliveries WHERE next_attempt_ms IS NOT NULL',
      ),
      attempt: db.prepare(
        `UPDATE notice_deliveries SET status = ?, attempts = attempts + 1, last_attempt_ms = ?,
           next_attempt_ms = ?, error = ? WHERE id = ?`,
      ),
      saveState: db.prepare(
        `INSERT INTO alert_states (run_id, event_time_ms, state_json) VALUES (?, ?, ?)
         ON CONFLICT (run_id) DO UPDATE SET event_time_ms = excluded.event_time_ms,
           state_json = excluded.state_json`,
      ),
      loadState: db.prepare('SELECT state_json AS json FROM alert_states WHERE run_id = ?'),
    };
  }

  /** Runs `work` in one transaction (nested calls join the outer one). */
  transaction<T>(work: () => T): T {
    return this.#db.transaction(work)();
  }

  /**
   * Stores a new notice with a pending delivery per channel and recipient, due at `nowMs`.
   *
   * @returns the notice with its id `n-<runId>-<seq>` (seq counts the run's notices from 1)
   */
  add(
    notice: NewNotice,
    deliveries: readonly { channel: string; recipient: string }[],
    nowMs: number,
  ): Notice {
    return this.transaction(() => {
      const { seq } = this.#s.nextSeq.get(notice.runId) as { seq: number };
      const id = `n-${notice.runId}-${seq}`;
      this.#s.insert.run(
        id,
        notice.runId,
        seq,
        notice.level,
        notice.kind,
        notice.conditionKey,
        notice.raisedAtMs,
        notice.title,
        notice.text,
        JSON.stringify(notice.figures),
        notice.repeat ? 1 : 0,
      );
      for (const delivery of deliveries)
        this.#s.insertDelivery.run(id, delivery.channel, delivery.recipient, nowMs);
      return this.get(notice.runId, id) as Notice;
    });
  }

  /** The run's notices, newest first (at most `limit`, default 1000: our assumption). */
  list(runId: string, limit = 1000): Notice[] {
    return (this.#s.byRun.all(runId, limit) as NoticeRow[]).map((row) => this.#notice(row));
  }

  /** One notice of a run, or null. */
  get(runId: string, noticeId: string): Notice | null {
    const row = this.#s.byId.get(runId, noticeId) as NoticeRow | undefined;
    return row === undefined ? null : this.#notice(row);
  }

  /**
   * Acknowledges a notice (the first acknowledgement stands; later ones change nothing).
   *
   * @returns the notice, or null when the run has no such notice
   */
  acknowledge(runId: string, noticeId: string, by: string, atMs: number): Notice | null {
    this.#s.acknowledge.run(atMs, by, runId, noticeId);
    return this.get(runId, noticeId);
  }

  /** Whether the run has any notice of a condition key (e.g. `measure:m1`). */
  hasNoticeFor(runId: string, conditionKey: string): boolean {
    return this.#s.byKey.get(runId, conditionKey) !== undefined;
  }

  /** Whether a notice has been acknowledged. */
  isAcknowledged(noticeId: string): boolean {
    const row = this.#s.acknowledged.get(noticeId) as { at: number | null } | undefined;
    return row !== undefined && row.at !== null;
  }

  /** Deliveries due at `nowMs` (next attempt at or before it), the oldest first. */
  due(nowMs: number, limit = 100): DueDelivery[] {
    const rows = this.#s.due.all(nowMs, limit) as (DeliveryRow & { run_id: string })[];
    return rows.map((row) => ({
      deliveryId: row.id,
      channel: row.channel,
      recipient: row.recipient,
      attempts: row.attempts,
      notice: this.get(row.run_id, row.notice_id) as Notice,
    }));
  }

  /** Earliest next attempt of any delivery, ms; null when none is pending. */
  nextDueMs(): number | null {
    return (this.#s.nextDue.get() as { at: number | null }).at;
  }

  /** Records an attempt: `sent` without error, else `failed` (retried while nextAttemptMs is set). */
  recordAttempt(deliveryId: number, attempt: DeliveryAttempt): void {
    const status: DeliveryStatus = attempt.error === null ? 'sent' : 'failed';
    this.#s.attempt.run(
      status,
      attempt.atMs,
      attempt.error === null ? null : attempt.nextAttemptMs,
      attempt.error,
      deliveryId,
    );
  }

  /** Saves a run's alert state. */
  saveAlertState(runId: string, snapshot: AlertStateSnapshot): void {
    this.#s.saveState.run(runId, snapshot.lastEventTimeMs, JSON.stringify(snapshot));
  }

  /** A run's saved alert state, or null. */
  alertState(runId: string): AlertStateSnapshot | null {
    const row = this.#s.loadState.get(runId) as { json: string } | undefined;
    return row === undefined ? null : (JSON.parse(row.json) as AlertStateSnapshot);
  }

  #notice(row: NoticeRow): Notice {
    const deliveries = (this.#s.deliveriesOf.all(row.id) as DeliveryRow[]).map(
      (d): NoticeDelivery => ({
        channel: d.channel,
        recipient: d.recipient,
        status: d.status as DeliveryStatus,
        attempts: d.attempts,
        lastAttemptMs: d.last_attempt_ms,
        error: d.error,
        nextAttemptMs: d.next_attempt_ms,
      }),
    );
    return {
      id: row.id,
      runId: row.run_id,
      seq: row.seq,
      level: row.level as NoticeLevel,
      kind: row.kind as NoticeKind,
      conditionKey: row.condition_key,
      raisedAtMs: row.raised_at_ms,
      title: row.title,
      text: row.text,
      figures: JSON.parse(row.figures_json) as NoticeFigures,
      deliveries,
      acknowledgedAtMs: row.acknowledged_at_ms,
      acknowledgedBy: row.acknowledged_by,
      repeat: row.repeat === 1,
    };
  }
}
