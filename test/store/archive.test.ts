import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Archive, QUARANTINE_BYTES_KEPT, sha256 } from '../../server/src/store/archive.ts';
import { openDatabase } from '../../server/src/store/openDatabase.ts';
import { MIGRATIONS } from '../../server/src/store/_migrations.ts';
import type { CommitItem } from '../../server/src/store/types.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

let dir: string;
let archive: Archive;

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'meniscus-archive-'));
  archive = Archive.open(join(dir, 'archive.sqlite'));
});
afterEach(() => {
  archive.close();
  rmSync(dir, { recursive: true, force: true });
});

function accepted(runId: string, sensorId: number, eventAtMs: number, value: number): CommitItem {
  return {
    kind: 'accepted',
    runId,
    topic: 'meniscus/harbour-deck/probe-a/data',
    receivedAtMs: eventAtMs + 50,
    bytes: Buffer.from(`[{"n":"rh-10","v":${value},"t":${eventAtMs / 1000}}]`),
    readings: [{ sensorId, eventAtMs, value, unit: '%RH', updateIntervalS: null }],
  };
}

describe('Archive', () => {
  it('opens in WAL mode with synchronous FULL and the latest schema version', () => {
    const db = openDatabase(join(dir, 'pragmas.sqlite'));
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.pragma('synchronous', { simple: true })).toBe(2); // 2 = FULL (SQLite docs)
    expect(db.pragma('user_version', { simple: true })).toBe(MIGRATIONS.length);
    db.close();
    const normal = openDatabase(join(dir, 'pragmas.sqlite'), { synchronous: 'NORMAL' });
    expect(normal.pragma('synchronous', { simple: true })).toBe(1);
    normal.close();
  });

  it("indexes readings by message, so feeding a message to the live engine does not search all of the run's readings", () => {
    const db = openDatabase(join(dir, 'indexes.sqlite'));
    const plan = db
      .prepare(
        'EXPLAIN QUERY PLAN SELECT id FROM readings WHERE message_id = ? AND run_id = ? ORDER BY id',
      )
      .all(1, 'run-1') as { detail: string }[];
    expect(plan.map((step) => step.detail).join('; ')).toMatch(
      /INDEX readings_message \(message_id=\?\)/,
    );
    db.close();
  });

  it('runs each migration once and refuses a file written by a newer schema', () => {
    const path = join(dir, 'versions.sqlite');
    openDatabase(path).close();
    const again = openDatabase(path); // no migration runs twice (CREATE TABLE would throw)
    again.pragma(`user_version = ${MIGRATIONS.length + 1}`);
    again.close();
    expect(() => openDatabase(path)).toThrow(/newer than this server knows/);
  });

  it('createRun() keeps the validated configuration, devices and sensors', () => {
    const config = parseRunConfig(exampleRunInput());
    const run = archive.createRun(config, 1000, 'run-1');
    expect(archive.getRun('run-1')).toEqual(run);
    expect(run.placedAtMs).toBe(EXAMPLE_PLACED_AT_MS);
    const probeA = archive.bindingsFor('harbour-deck', 'probe-a');
    expect(probeA).toHaveLength(1);
    expect([...(probeA[0]?.sensors.keys() ?? [])].sort()).toEqual(['rh-10', 'rh-40', 't-10']);
    expect(probeA[0]?.sensors.get('t-10')).toMatchObject({
      quantity: 'temperature',
      unit: 'Cel',
      depthMm: 10,
    });
    expect(archive.bindingsFor('harbour-deck', 'mast-1')[0]?.sensors.get('wind')).toMatchObject({
      quantity: 'windSpeed',
      unit: 'm/s',
      depthMm: null,
    });
    expect(archive.bindingsFor('other-site', 'probe-a')).toEqual([]);
    expect(archive.records('run-1')).toEqual([{ seq: 1, kind: 'config', rowId: 0 }]);
  });

  it('commit() stores a reading once: the same sensor and event time again is a duplicate', () => {
    archive.createRun(parseRunConfig(exampleRunInput()), 1000, 'run-1');
    const sensorId =
      archive.bindingsFor('harbour-deck', 'probe-a')[0]?.sensors.get('rh-10')?.sensorId ?? -1;
    const t = EXAMPLE_PLACED_AT_MS + 60_000;
    const first = archive.commit([
      accepted('run-1', sensorId, t, 97.5),
      accepted('run-1', sensorId, t + 1000, 97.4),
    ]);
    expect(first).toEqual([
      { stored: 1, duplicates: 0, quarantined: null },
      { stored: 1, duplicates: 0, quarantined: null },
    ]);
    const again = archive.commit([accepted('run-1', sensorId, t, 97.5)]);
    expect(again).toEqual([{ stored: 0, duplicates: 1, quarantined: 'duplicate' }]);
    expect(archive.readings('run-1').map((r) => r.value)).toEqual([97.5, 97.4]);
    expect(archive.quarantineCounts('run-1')).toEqual({ duplicate: 1 });
    const kinds = archive.records('run-1').map((r) => r.kind);
    expect(kinds).toEqual(['config', 'message', 'reading', 'message', 'reading', 'quarantine']);
    expect(archive.records('run-1').map((r) => r.seq)).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it('keeps the raw message with its SHA-256 and links each reading to it', () => {
    archive.createRun(parseRunConfig(exampleRunInput()), 1000, 'run-1');
    const sensorId =
      archive.bindingsFor('harbour-deck', 'probe-a')[0]?.sensors.get('rh-10')?.sensorId ?? -1;
    const item = accepted('run-1', sensorId, EXAMPLE_PLACED_AT_MS, 90);
    archive.commit([item]);
    const [reading] = archive.readings('run-1');
    const db = openDatabase(join(dir, 'archive.sqlite'));
    const message = db
      .prepare('SELECT bytes, sha256 FROM raw_messages WHERE id = ?')
      .get(reading?.messageId) as {
      bytes: Buffer;
      sha256: string;
    };
    db.close();
    expect(message.bytes.equals(Buffer.from(item.bytes))).toBe(true);
    // SHA-256 of the empty string, FIPS 180-4 test vector, checks sha256() itself.
    expect(sha256(new Uint8Array())).toBe(
      'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855',
    );
    expect(message.sha256).toBe(sha256(item.bytes));
  });

  it('quarantines with reason, topic, receive time and (at most 64 KiB of) the raw bytes', () => {
    const big = Buffer.alloc(QUARANTINE_BYTES_KEPT + 10, 0x61);
    archive.commit([
      {
        kind: 'quarantine',
        runId: null,
        reason: 'oversize',
        detail: 'too big',
        topic: 't/x',
        receivedAtMs: 5,
        bytes: big,
      },
    ]);
    const [row] = archive.quarantine(null);
    expect(row).toMatchObject({
      reason: 'oversize',
      topic: 't/x',
      receivedAtMs: 5,
      byteLength: big.length,
    });
    expect(row?.bytes.length).toBe(QUARANTINE_BYTES_KEPT);
    expect(row?.sha256).toBe(sha256(big));
  });

  it('refuses to update or delete readings and records (append-only)', () => {
    archive.createRun(parseRunConfig(exampleRunInput()), 1000, 'run-1');
    const sensorId =
      archive.bindingsFor('harbour-deck', 'probe-a')[0]?.sensors.get('rh-10')?.sensorId ?? -1;
    archive.commit([accepted('run-1', sensorId, EXAMPLE_PLACED_AT_MS, 90)]);
    const db = openDatabase(join(dir, 'archive.sqlite'));
    expect(() => db.prepare('UPDATE readings SET value = 1').run()).toThrow(/append-only/);
    expect(() => db.prepare('DELETE FROM records').run()).toThrow(/append-only/);
    db.close();
  });

  it('a failed batch stores nothing and the record order stays gap-free', () => {
    archive.createRun(parseRunConfig(exampleRunInput()), 1000, 'run-1');
    const sensorId =
      archive.bindingsFor('harbour-deck', 'probe-a')[0]?.sensors.get('rh-10')?.sensorId ?? -1;
    const broken = { ...accepted('run-1', 999_999, EXAMPLE_PLACED_AT_MS, 1) }; // no such sensor: FK fails
    expect(() =>
      archive.commit([accepted('run-1', sensorId, EXAMPLE_PLACED_AT_MS, 2), broken]),
    ).toThrow();
    expect(archive.counts('run-1').readings).toBe(0);
    archive.commit([accepted('run-1', sensorId, EXAMPLE_PLACED_AT_MS, 3)]);
    expect(archive.records('run-1').map((r) => r.seq)).toEqual([1, 2, 3]);
    expect(archive.integrityCheck()).toEqual(['ok']);
  });

  it('a closed run no longer binds its devices; a reopened file keeps everything', () => {
    archive.createRun(parseRunConfig(exampleRunInput()), 1000, 'run-1');
    archive.closeRun('run-1', 2000);
    expect(archive.bindingsFor('harbour-deck', 'probe-a')).toEqual([]);
    archive.close();
    archive = Archive.open(join(dir, 'archive.sqlite'));
    expect(archive.getRun('run-1')?.closedAtMs).toBe(2000);
    expect(archive.listRuns()).toHaveLength(1);
  });
});
