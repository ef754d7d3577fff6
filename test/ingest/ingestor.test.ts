import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

const NOW_MS = EXAMPLE_PLACED_AT_MS + 3_600_000;
const DATA = 'meniscus/harbour-deck/probe-a/data';
let archive: Archive;

beforeEach(() => {
  archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(exampleRunInput()), 0, 'run-1');
});
afterEach(() => archive.close());

const pack = (i: number) =>
  Buffer.from(JSON.stringify([{ n: 'rh-10', v: 95, t: EXAMPLE_PLACED_AT_MS / 1000 + i }]));

describe('Ingestor', () => {
  it('data() groups messages that arrive together into one commit (group commit)', async () => {
    const ingestor = new Ingestor(archive, { clock: () => NOW_MS });
    await Promise.all(Array.from({ length: 50 }, (_, i) => ingestor.data(DATA, pack(i))));
    expect(ingestor.counters).toMatchObject({ messages: 50, readingsStored: 50, commits: 1 });
  });

  it('data() commits at most maxBatch messages per transaction', async () => {
    const ingestor = new Ingestor(archive, { clock: () => NOW_MS, maxBatch: 10 });
    await Promise.all(Array.from({ length: 50 }, (_, i) => ingestor.data(DATA, pack(i))));
    expect(ingestor.counters.commits).toBe(5);
  });

  it('data() resolves for bad input (it is quarantined) and counts it by reason', async () => {
    const ingestor = new Ingestor(archive, { clock: () => NOW_MS });
    await ingestor.data(DATA, Buffer.from('not json'));
    await ingestor.data(DATA, pack(1));
    await ingestor.data(DATA, pack(1));
    expect(ingestor.counters.quarantined).toEqual({ 'malformed-json': 1, duplicate: 1 });
    expect(ingestor.counters.readingsDuplicate).toBe(1);
  });

  it('data() rejects when the archive cannot commit, and nothing is stored', async () => {
    const errors: unknown[] = [];
    const ingestor = new Ingestor(archive, {
      clock: () => NOW_MS,
      onCommitError: (e) => errors.push(e),
    });
    const closing = Archive.open(':memory:');
    const broken = new Ingestor(closing, {
      clock: () => NOW_MS,
      onCommitError: (e) => errors.push(e),
    });
    closing.close();
    await expect(broken.data(DATA, pack(1))).rejects.toThrow(/not open/);
    expect(broken.counters.commitFailures).toBe(1);
    expect(errors).toHaveLength(1);
    await ingestor.data(DATA, pack(2));
    expect(archive.totals().readings).toBe(1);
  });

  it('status() records a repeated status (a retained message after a reconnect) once', () => {
    const ingestor = new Ingestor(archive, { clock: () => NOW_MS });
    for (const status of ['online', 'online', 'offline', 'offline', 'online']) {
      ingestor.status('meniscus/harbour-deck/probe-a/status', Buffer.from(status));
    }
    expect(archive.records('run-1').filter((r) => r.kind === 'event')).toHaveLength(3);
  });

  const statuses = [
    { payload: 'online', expected: 'online' },
    { payload: '  offline\n', expected: 'offline' },
    { payload: '{"status":"battery-low","mV":3100}', expected: 'battery-low' },
    { payload: '', expected: '(empty)' },
    { payload: 'x'.repeat(200), expected: 'x'.repeat(64) },
  ];
  it.each(statuses)('status() records $payload as $expected', ({ payload, expected }) => {
    const ingestor = new Ingestor(archive, { clock: () => NOW_MS });
    ingestor.status('meniscus/harbour-deck/probe-a/status', Buffer.from(payload));
    const db = (archive as unknown as { db: import('better-sqlite3').Database }).db;
    const row = db
      .prepare("SELECT status, status_at_ms AS at FROM devices WHERE name = 'probe-a'")
      .get() as { status: string; at: number };
    expect(row).toEqual({ status: expected, at: NOW_MS });
    expect(archive.records('run-1').at(-1)?.kind).toBe('event');
  });
});
