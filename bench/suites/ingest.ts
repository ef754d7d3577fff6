/**
 * Ingest throughput, publish to committed, against two baselines in the same run:
 * - a raw MQTT.js subscriber that does nothing, on the same broker (aedes);
 * - a bare SQLite loop at the same durability (WAL, synchronous=FULL) and the same commit
 *   grouping as the pipeline achieved.
 * Target (issue 4): the pipeline reaches at least half of the slower baseline. Stretch: group
 * commit at least 4x the one-commit-per-message rate at the same durability.
 * Also memory and archive size per million readings, extrapolated from a smaller count.
 * Each message is a SenML pack with one reading, so messages/s = readings/s. Every rate is the
 * best of three runs.
 */
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { join } from 'node:path';
import { Aedes } from 'aedes';
import mqtt from 'mqtt';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { startEmbeddedBroker } from '../../server/src/mqtt/embeddedBroker.ts';
import { startMqttSubscriber } from '../../server/src/mqtt/mqttSubscriber.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { openDatabase } from '../../server/src/store/openDatabase.ts';
import { MOSQUITTO_BINARY, startMosquitto } from '../../test/helpers/mosquitto.ts';
import type { BenchFigure } from '../figure.ts';
import { ratioFigure } from '../figure.ts';

const MESSAGES = 20_000;
const MEMORY_READINGS = 100_000;
const TOPIC = 'meniscus/bench-site/probe-a/data';
const PLACED_MS = Date.now() - 86_400_000;

const runConfig = parseRunConfig({
  site: 'bench-site',
  element: { kind: 'slab', thicknessMm: 100, drying: 'one-face' },
  placedAt: new Date(PLACED_MS).toISOString(),
  probes: [{ device: 'probe-a', sensor: 'rh-10', quantity: 'rh', depthMm: 10 }],
  weather: {
    device: 'mast-1',
    mastHeightM: 2,
    sensors: { airTemperature: 'air-t', relativeHumidity: 'air-rh', windSpeed: 'wind' },
  },
});

const payload = (i: number) =>
  JSON.stringify([
    { n: 'rh-10', u: '%RH', v: 90 + (i % 100) / 10, t: (PLACED_MS + 1000 + i) / 1000 },
  ]);

function withDir<T>(run: (dir: string) => Promise<T>): Promise<T> {
  const dir = mkdtempSync(join(tmpdir(), 'meniscus-bench-'));
  return run(dir).finally(() => rmSync(dir, { recursive: true, force: true }));
}

/** Publishes `count` QoS 1 messages and resolves with the seconds until the last PUBACK. */
async function publishAll(url: string, count: number, offset = 0): Promise<number> {
  const client = await mqtt.connectAsync(url, { protocolVersion: 4 });
  const start = performance.now();
  await Promise.all(
    Array.from({ length: count }, (_, i) =>
      client.publishAsync(TOPIC, payload(offset + i), { qos: 1 }),
    ),
  );
  const seconds = (performance.now() - start) / 1000;
  await client.endAsync();
  return seconds;
}

/** The pipeline: embedded broker, commit before PUBACK. */
async function pipelineRate(maxBatch: number): Promise<{ perS: number; perCommit: number }> {
  return withDir(async (dir) => {
    const archive = Archive.open(join(dir, 'a.sqlite'));
    archive.createRun(runConfig, Date.now(), 'run-1');
    const ingestor = new Ingestor(archive, { maxBatch });
    const broker = await startEmbeddedBroker(ingestor, { port: 0 });
    const seconds = await publishAll(`mqtt://127.0.0.1:${broker.port}`, MESSAGES);
    await broker.close();
    const stored = archive.totals().readings;
    archive.close();
    if (stored !== MESSAGES) throw new Error(`bench stored ${stored} of ${MESSAGES}`);
    return { perS: MESSAGES / seconds, perCommit: MESSAGES / ingestor.counters.commits };
  });
}

/**
 * The external-broker path: Mosquitto, the MQTT.js subscriber acknowledging after commit, over
 * `connections` connections sharing the subscription. Publish to the last reading committed.
 */
async function mosquittoRate(connections: number): Promise<number> {
  return withDir(async (dir) => {
    const mosquitto = await startMosquitto();
    const archive = Archive.open(join(dir, 'm.sqlite'));
    archive.createRun(runConfig, Date.now(), 'run-1');
    const ingestor = new Ingestor(archive);
    const subscriber = startMqttSubscriber(ingestor, {
      url: mosquitto.url,
      clientId: `bench-${connections}`,
      connections,
    });
    await subscriber.ready;
    const count = MESSAGES / 2;
    const start = performance.now();
    await publishAll(mosquitto.url, count);
    while (archive.totals().readings < count)
      await new Promise((resolve) => setTimeout(resolve, 2));
    const seconds = (performance.now() - start) / 1000;
    await subscriber.close();
    archive.close();
    await mosquitto.dispose();
    return count / seconds;
  });
}

/** Baseline: a raw MQTT.js subscriber on a plain aedes broker, doing nothing with messages. */
async function rawSubscriberRate(): Promise<number> {
  const broker = await Aedes.createBroker();
  const server = createServer(broker.handle);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = `mqtt://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const subscriber = await mqtt.connectAsync(url, {
    protocolVersion: 4,
    clientId: 'bench-raw',
    clean: false,
  });
  await subscriber.subscribeAsync(TOPIC, { qos: 1 });
  let received = 0;
  const all = new Promise<void>((resolve) => {
    subscriber.on('message', () => {
      received += 1;
      if (received === MESSAGES) resolve();
    });
  });
  const start = performance.now();
  await publishAll(url, MESSAGES);
  await all;
  const seconds = (performance.now() - start) / 1000;
  await subscriber.endAsync();
  await new Promise<void>((resolve) => broker.close(() => resolve()));
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return MESSAGES / seconds;
}

/** Baseline: bare inserts, WAL + synchronous=FULL, `perCommit` rows per transaction. */
async function bareSqliteRate(perCommit: number): Promise<number> {
  return withDir(async (dir) => {
    const db = openDatabase(join(dir, 'bare.sqlite'));
    db.exec(
      'CREATE TABLE bare (id INTEGER PRIMARY KEY, sensor INTEGER, t INTEGER, v REAL, UNIQUE (sensor, t))',
    );
    const insert = db.prepare('INSERT INTO bare (sensor, t, v) VALUES (?, ?, ?)');
    const group = Math.max(1, Math.round(perCommit));
    const commit = db.transaction((from: number, to: number) => {
      for (let i = from; i < to; i += 1) insert.run(1, i, 90 + (i % 100) / 10);
    });
    const start = performance.now();
    for (let from = 0; from < MESSAGES; from += group)
      commit(from, Math.min(MESSAGES, from + group));
    const seconds = (performance.now() - start) / 1000;
    db.close();
    return MESSAGES / seconds;
  });
}

/** A full garbage collection (V8's gc exposed at run time), so RSS shows what stays. */
function collectGarbage(): void {
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}

/** Memory growth and archive size for MEMORY_READINGS readings through the ingestor. */
async function footprint(): Promise<{ rssBytes: number; heapBytes: number; fileBytes: number }> {
  return withDir(async (dir) => {
    const path = join(dir, 'size.sqlite');
    const archive = Archive.open(path);
    archive.createRun(runConfig, Date.now(), 'run-1');
    const ingestor = new Ingestor(archive);
    collectGarbage();
    const before = process.memoryUsage().rss;
    const heapBefore = process.memoryUsage().heapUsed;
    for (let from = 0; from < MEMORY_READINGS; from += 1000) {
      await Promise.all(
        Array.from({ length: 1000 }, (_, k) =>
          ingestor.data(TOPIC, Buffer.from(payload(from + k))),
        ),
      );
    }
    collectGarbage();
    const rssBytes = process.memoryUsage().rss - before;
    const heapBytes = process.memoryUsage().heapUsed - heapBefore;
    archive.close(); // checkpoints the WAL into the file
    return { rssBytes, heapBytes, fileBytes: statSync(path).size };
  });
}

/** Rates are taken as the best of REPEATS runs: the run least disturbed by other work. */
const REPEATS = 3;

async function bestOf<T>(run: () => Promise<T>, rate: (result: T) => number): Promise<T> {
  let best: T | null = null;
  for (let i = 0; i < REPEATS; i += 1) {
    const result = await run();
    if (best === null || rate(result) > rate(best)) best = result;
  }
  return best as T;
}

export default async function ingestSuite(): Promise<BenchFigure[]> {
  const { rssBytes, heapBytes, fileBytes } = await footprint(); // first, before other runs leave garbage
  const grouped = await bestOf(
    async () => pipelineRate(1000),
    (r) => r.perS,
  );
  const single = await bestOf(
    async () => pipelineRate(1),
    (r) => r.perS,
  );
  const raw = await bestOf(rawSubscriberRate, (r) => r);
  const bare = await bestOf(
    async () => bareSqliteRate(grouped.perCommit),
    (r) => r,
  );
  const slower = Math.min(raw, bare);
  const figures: BenchFigure[] = [];
  if (existsSync(MOSQUITTO_BINARY)) {
    const one = await bestOf(
      async () => mosquittoRate(1),
      (r) => r,
    );
    const shared = await bestOf(
      async () => mosquittoRate(16),
      (r) => r,
    );
    figures.push(
      ratioFigure({
        name: 'ingest.mosquittoSharedConnectionsVsOne',
        value: shared,
        unit: 'readings/s',
        baseline: one,
        target: 'ratio >= 4 (stretch)',
        met: shared / one >= 4,
        detail: `${MESSAGES / 2} messages via Mosquitto, MQTT.js subscriber acknowledging after commit (synchronous=FULL): 16 connections on a shared subscription (group commit across connections) vs 1 connection (one commit per message)`,
      }),
    );
  }
  const scale = 1_000_000 / MEMORY_READINGS;
  return [
    ...figures,
    ratioFigure({
      name: 'ingest.pipelineVsSlowerBaseline',
      value: grouped.perS,
      unit: 'readings/s',
      baseline: slower,
      target: 'ratio >= 0.5',
      met: grouped.perS / slower >= 0.5,
      detail: `${MESSAGES} QoS 1 messages of one reading, publish to committed and acknowledged (embedded broker, synchronous=FULL, ${grouped.perCommit.toFixed(1)} messages per commit); raw subscriber ${raw.toFixed(0)}/s, bare SQLite ${bare.toFixed(0)}/s at the same grouping`,
    }),
    ratioFigure({
      name: 'ingest.pipelineVsRawSubscriber',
      value: grouped.perS,
      unit: 'readings/s',
      baseline: raw,
      detail: 'raw MQTT.js subscriber doing nothing, QoS 1, on a plain aedes broker',
    }),
    ratioFigure({
      name: 'ingest.pipelineVsBareSqlite',
      value: grouped.perS,
      unit: 'readings/s',
      baseline: bare,
      detail: `bare INSERT loop, WAL + synchronous=FULL, ${Math.round(grouped.perCommit)} rows per commit`,
    }),
    ratioFigure({
      name: 'ingest.groupCommitVsOnePerMessage',
      value: grouped.perS,
      unit: 'readings/s',
      baseline: single.perS,
      target: 'ratio >= 4 (stretch)',
      met: grouped.perS / single.perS >= 4,
      detail: 'same pipeline and durability, commit grouping on vs one commit per message',
    }),
    {
      name: 'ingest.memoryPerMillionReadings',
      value: (rssBytes * scale) / 2 ** 20,
      unit: 'MiB',
      baseline: null,
      ratio: null,
      detail: `RSS growth after a full GC, ingesting ${MEMORY_READINGS} readings, times ${scale} (extrapolated, not measured at 1 million; the archive keeps readings on disk, so this is mostly SQLite's page cache and allocator slack and should not grow linearly)`,
    },
    {
      name: 'ingest.heapPerMillionReadings',
      value: (heapBytes * scale) / 2 ** 20,
      unit: 'MiB',
      baseline: null,
      ratio: null,
      detail: `V8 heap kept after a full GC, ingesting ${MEMORY_READINGS} readings, times ${scale} (extrapolated): JavaScript objects held per reading`,
    },
    {
      name: 'ingest.archiveSizePerMillionReadings',
      value: (fileBytes * scale) / 2 ** 20,
      unit: 'MiB',
      baseline: null,
      ratio: null,
      detail: `archive file after ${MEMORY_READINGS} one-reading messages (raw message, reading and record rows), times ${scale} (extrapolated)`,
    },
  ];
}
