/**
 * Archive schema, one entry per version; `PRAGMA user_version` records how many have run.
 * Append new migrations; never edit one that has shipped.
 *
 * Times are integers in ms since the Unix epoch (UTC). `records` is the per-run append-only
 * order of everything the run's archive holds: a later hash chain covers it by `seq`. The measure
 * log, supplied forecasts and the close of a run are `events` (kinds `measure-started`,
 * `measure-ended`, `forecast`, `run-closed`; server/src/runs/runLifecycle.ts).
 */
export const MIGRATIONS: readonly string[] = [
  `
  CREATE TABLE runs (
    id TEXT PRIMARY KEY,
    site TEXT NOT NULL,
    config_json TEXT NOT NULL,
    placed_at_ms INTEGER NOT NULL,
    created_at_ms INTEGER NOT NULL,
    closed_at_ms INTEGER
  ) STRICT;
  CREATE INDEX runs_site ON runs(site);

  CREATE TABLE devices (
    id INTEGER PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    name TEXT NOT NULL,
    role TEXT NOT NULL CHECK (role IN ('probe', 'weather')),
    status TEXT,
    status_at_ms INTEGER,
    UNIQUE (run_id, name)
  ) STRICT;

  CREATE TABLE sensors (
    id INTEGER PRIMARY KEY,
    device_id INTEGER NOT NULL REFERENCES devices(id),
    name TEXT NOT NULL,
    quantity TEXT NOT NULL,
    unit TEXT NOT NULL,
    depth_mm REAL,
    UNIQUE (device_id, name)
  ) STRICT;

  CREATE TABLE records (
    run_id TEXT NOT NULL REFERENCES runs(id),
    seq INTEGER NOT NULL,
    kind TEXT NOT NULL CHECK (kind IN ('config', 'message', 'reading', 'quarantine', 'event')),
    row_id INTEGER NOT NULL,
    PRIMARY KEY (run_id, seq)
  ) STRICT, WITHOUT ROWID;

  CREATE TABLE raw_messages (
    id INTEGER PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    topic TEXT NOT NULL,
    received_at_ms INTEGER NOT NULL,
    bytes BLOB NOT NULL,
    sha256 TEXT NOT NULL
  ) STRICT;

  CREATE TABLE readings (
    id INTEGER PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    sensor_id INTEGER NOT NULL REFERENCES sensors(id),
    event_at_ms INTEGER NOT NULL,
    received_at_ms INTEGER NOT NULL,
    value REAL NOT NULL,
    unit TEXT NOT NULL,
    update_interval_s REAL,
    message_id INTEGER NOT NULL REFERENCES raw_messages(id),
    UNIQUE (sensor_id, event_at_ms)
  ) STRICT;
  CREATE INDEX readings_run_time ON readings(run_id, event_at_ms);

  CREATE TABLE quarantine (
    id INTEGER PRIMARY KEY,
    run_id TEXT REFERENCES runs(id),
    reason TEXT NOT NULL,
    detail TEXT NOT NULL,
    topic TEXT NOT NULL,
    received_at_ms INTEGER NOT NULL,
    byte_length INTEGER NOT NULL,
    bytes BLOB NOT NULL,
    sha256 TEXT NOT NULL
  ) STRICT;
  CREATE INDEX quarantine_run ON quarantine(run_id, id);
  CREATE INDEX quarantine_reason ON quarantine(reason);

  CREATE TABLE events (
    id INTEGER PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    at_ms INTEGER NOT NULL,
    kind TEXT NOT NULL,
    detail_json TEXT NOT NULL
  ) STRICT;

  CREATE TABLE outbox_cursor (
    name TEXT PRIMARY KEY,
    last_reading_id INTEGER NOT NULL
  ) STRICT;

  CREATE TRIGGER records_append_only_u BEFORE UPDATE ON records
    BEGIN SELECT RAISE(ABORT, 'records are append-only'); END;
  CREATE TRIGGER records_append_only_d BEFORE DELETE ON records
    BEGIN SELECT RAISE(ABORT, 'records are append-only'); END;
  CREATE TRIGGER readings_append_only_u BEFORE UPDATE ON readings
    BEGIN SELECT RAISE(ABORT, 'readings are append-only'); END;
  CREATE TRIGGER readings_append_only_d BEFORE DELETE ON readings
    BEGIN SELECT RAISE(ABORT, 'readings are append-only'); END;
  CREATE TRIGGER raw_messages_append_only_u BEFORE UPDATE ON raw_messages
    BEGIN SELECT RAISE(ABORT, 'raw messages are append-only'); END;
  CREATE TRIGGER raw_messages_append_only_d BEFORE DELETE ON raw_messages
    BEGIN SELECT RAISE(ABORT, 'raw messages are append-only'); END;
  `,
  // 2: snapshots of each run's live engine (not evidence: superseded ones may be deleted).
  `
  CREATE TABLE snapshots (
    id INTEGER PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    event_time_ms INTEGER,
    last_reading_id INTEGER NOT NULL,
    taken_at_ms INTEGER NOT NULL,
    snapshot_json TEXT NOT NULL
  ) STRICT;
  CREATE INDEX snapshots_run ON snapshots(run_id, id);
  `,
  // 3: a snapshot's position in the run's record order (the live host feeds records in order).
  `
  ALTER TABLE snapshots ADD COLUMN last_seq INTEGER;
  `,
  // 4: the figures the live engine reported, one row per state update (server/src/store/figureHistory.ts).
  // Derived, not evidence of readings: a replay of the archive rebuilds them identically.
  `
  CREATE TABLE figures (
    run_id TEXT NOT NULL REFERENCES runs(id),
    event_time_ms INTEGER NOT NULL,
    figures_json TEXT NOT NULL,
    PRIMARY KEY (run_id, event_time_ms)
  ) STRICT, WITHOUT ROWID;
  `,
  // 5: crew notices, their deliveries (the outbox of the notice channels) and each run's alert
  // state (server/src/store/noticeStore.ts, server/src/alerts/). Records of what was sent to whom:
  // acknowledgements and delivery attempts update them, so they are not append-only.
  `
  CREATE TABLE notices (
    id TEXT PRIMARY KEY,
    run_id TEXT NOT NULL REFERENCES runs(id),
    seq INTEGER NOT NULL,
    level TEXT NOT NULL CHECK (level IN ('NOTE', 'PREPARE', 'ACT NOW', 'CRACKING LIKELY')),
    kind TEXT NOT NULL,
    condition_key TEXT NOT NULL,
    raised_at_ms INTEGER NOT NULL,
    title TEXT NOT NULL,
    text TEXT NOT NULL,
    figures_json TEXT NOT NULL,
    repeat INTEGER NOT NULL DEFAULT 0,
    acknowledged_at_ms INTEGER,
    acknowledged_by TEXT,
    UNIQUE (run_id, seq)
  ) STRICT;

  CREATE TABLE notice_deliveries (
    id INTEGER PRIMARY KEY,
    notice_id TEXT NOT NULL REFERENCES notices(id),
    channel TEXT NOT NULL,
    recipient TEXT NOT NULL,
    status TEXT NOT NULL CHECK (status IN ('pending', 'sent', 'failed')),
    attempts INTEGER NOT NULL DEFAULT 0,
    last_attempt_ms INTEGER,
    next_attempt_ms INTEGER,
    error TEXT,
    UNIQUE (notice_id, channel, recipient)
  ) STRICT;
  CREATE INDEX notice_deliveries_due ON notice_deliveries(next_attempt_ms)
    WHERE next_attempt_ms IS NOT NULL;

  CREATE TABLE alert_states (
    run_id TEXT PRIMARY KEY REFERENCES runs(id),
    event_time_ms INTEGER,
    state_json TEXT NOT NULL
  ) STRICT;
  `,
  // 6: a message's readings by message id. The live host reads each message's readings as it feeds
  // the engine; without this index SQLite searched all of the run's readings (readings_run_time)
  // for every message, so catching up slowed as the run grew (quadratic over a long run).
  `
  CREATE INDEX readings_message ON readings(message_id);
  `,
];
