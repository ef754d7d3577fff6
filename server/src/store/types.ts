import type { RunConfig } from '../config/runConfig.ts';
import type { Quantity } from '../ingest/quantities.ts';

/** A run as the archive holds it. */
export interface RunRecord {
  id: string;
  site: string;
  config: RunConfig;
  placedAtMs: number;
  createdAtMs: number;
  closedAtMs: number | null;
}

/** A sensor of an open run, as ingest needs it to validate and store a reading. */
export interface SensorBinding {
  runId: string;
  sensorId: number;
  quantity: Quantity;
  unit: string;
  depthMm: number | null;
}

/** What ingest knows about one device in one open run. */
export interface DeviceBinding {
  runId: string;
  placedAtMs: number;
  sensors: ReadonlyMap<string, SensorBinding>;
}

/** A validated reading ready to be stored, in its sensor's canonical unit. */
export interface ReadingToStore {
  sensorId: number;
  eventAtMs: number;
  value: number;
  unit: string;
  /** SenML `ut`: the longest time, s, before the sensor reports again; null when not sent. */
  updateIntervalS: number | null;
}

/** One item of a batched commit. */
export type CommitItem =
  | {
      kind: 'accepted';
      runId: string;
      topic: string;
      receivedAtMs: number;
      bytes: Uint8Array;
      readings: readonly ReadingToStore[];
    }
  | {
      kind: 'quarantine';
      runId: string | null;
      reason: string;
      detail: string;
      topic: string;
      receivedAtMs: number;
      bytes: Uint8Array;
    };

/** What happened to one commit item. */
export interface CommitOutcome {
  /** Readings newly stored. */
  stored: number;
  /** Readings already in the archive (same sensor and event time), not stored again. */
  duplicates: number;
  /** Set when the item went to quarantine: its reason (an accepted item whose readings were all duplicates becomes `duplicate`). */
  quarantined: string | null;
}

/** A stored reading, as the API and the outbox read it. */
export interface StoredReading {
  id: number;
  runId: string;
  site: string;
  device: string;
  sensor: string;
  quantity: Quantity;
  depthMm: number | null;
  eventAtMs: number;
  receivedAtMs: number;
  value: number;
  unit: string;
  updateIntervalS: number | null;
  messageId: number;
}

export interface QuarantinedMessage {
  id: number;
  runId: string | null;
  reason: string;
  detail: string;
  topic: string;
  receivedAtMs: number;
  byteLength: number;
  bytes: Buffer;
  sha256: string;
}

/** One row of a run's `events` table, its detail parsed from JSON. */
export interface RunEventRow {
  id: number;
  atMs: number;
  kind: string;
  detail: unknown;
}

/** A stored engine snapshot: the engine's JSON and the last reading id it had been fed. */
export interface SnapshotRow {
  id: number;
  runId: string;
  /** The engine's event time when taken, ms (null before its first reading). */
  eventTimeMs: number | null;
  /** Id of the last of the run's readings fed to the engine before the snapshot. */
  lastReadingId: number;
  /** Seq of the last record of the run's order the engine had been given (null: older snapshot). */
  lastSeq: number | null;
  takenAtMs: number;
  snapshotJson: string;
}

/** One record of a run's order as an engine takes it: a message with its readings, or an event. */
export type RunFeedItem =
  | { seq: number; kind: 'message'; readings: StoredReading[] }
  | { seq: number; kind: 'event'; event: RunEventRow };
