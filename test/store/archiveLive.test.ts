import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { Archive, SNAPSHOTS_KEPT } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

let archive: Archive;
let ingestor: Ingestor;
beforeEach(() => {
  archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(exampleRunInput()), EXAMPLE_PLACED_AT_MS, 'run-1');
  ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 86_400_000 });
});
afterEach(() => archive.close());

const publish = (minute: number, sensor = 'rh-10') =>
  ingestor.data(
    'meniscus/harbour-deck/probe-a/data',
    Buffer.from(
      JSON.stringify([
        { bn: 'probe-a/', bt: EXAMPLE_PLACED_AT_MS / 1000 + minute * 60, n: sensor, v: 95 },
      ]),
    ),
  );

describe('Archive for the live host', () => {
  it('onCommit() reports the runs whose readings a commit stored, and not duplicates or quarantine', async () => {
    const told: string[][] = [];
    archive.onCommit((runIds) => told.push([...runIds]));
    await publish(1);
    await publish(1); // duplicate
    await publish(2, 'no-such-sensor'); // quarantined
    expect(told).toEqual([['run-1']]);
  });

  it(`saveSnapshot() keeps the newest ${SNAPSHOTS_KEPT} snapshots of a run`, () => {
    for (let i = 1; i <= 5; i += 1) archive.saveSnapshot('run-1', i * 1000, i, `{"n":${i}}`, i);
    expect(archive.latestSnapshot('run-1')).toMatchObject({
      eventTimeMs: 5000,
      lastReadingId: 5,
      snapshotJson: '{"n":5}',
    });
    const kept = (archive as unknown as { db: { prepare(sql: string): { all(): unknown[] } } }).db
      .prepare('SELECT last_reading_id AS id FROM snapshots ORDER BY id')
      .all();
    expect(kept).toEqual([{ id: 3 }, { id: 4 }, { id: 5 }]);
    expect(archive.latestSnapshot('nope')).toBeNull();
  });

  it('runFeedAfter() gives messages with their readings and events in record order; runReadingsBufferedAt() what a snapshot left out', async () => {
    for (const minute of [1, 5]) await publish(minute);
    archive.appendEvent('run-1', EXAMPLE_PLACED_AT_MS, 'measure-started', { id: 'm1' });
    for (const minute of [2, 6]) await publish(minute);
    const minuteOf = (ms: number) => (ms - EXAMPLE_PLACED_AT_MS) / 60_000;
    const feed = archive.runFeedAfter('run-1', 1);
    expect(
      feed.map((item) =>
        item.kind === 'message' ? item.readings.map((r) => minuteOf(r.eventAtMs)) : item.event.kind,
      ),
    ).toEqual([[1], [5], 'measure-started', [2], [6]]);
    expect(archive.runFeedAfter('run-1', feed[2]?.seq ?? 0)).toHaveLength(2);
    // A snapshot at the event record, engine time minute 2: minute 5 was buffered past it.
    const buffered = archive.runReadingsBufferedAt(
      'run-1',
      feed[2]?.seq ?? 0,
      EXAMPLE_PLACED_AT_MS + 2 * 60_000,
    );
    expect(buffered.map((r) => minuteOf(r.eventAtMs))).toEqual([5]);
    expect(archive.eventsUpTo('run-1', feed[2]?.seq ?? 0, ['measure-started'])).toHaveLength(1);
    expect(archive.eventsUpTo('run-1', feed[1]?.seq ?? 0, ['measure-started'])).toHaveLength(0);
  });
});
