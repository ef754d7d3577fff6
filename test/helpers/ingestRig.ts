/**
 * Starts ingest with a real archive on disk and one of the broker connections, for the shared
 * ingest suite and the fault tests.
 */
import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Aedes } from 'aedes';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import type { MessageSink, BrokerConnection } from '../../server/src/mqtt/brokerConnection.ts';
import { startEmbeddedBroker } from '../../server/src/mqtt/embeddedBroker.ts';
import { startMqttSubscriber } from '../../server/src/mqtt/mqttSubscriber.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { exampleRunInput } from './exampleRun.ts';
import { startMosquitto } from './mosquitto.ts';

export type BrokerKind =
  | 'embedded aedes (commit in authorizePublish)'
  | 'Mosquitto + MQTT.js v5'
  | 'Mosquitto + MQTT.js v5, 3 shared connections'
  | 'aedes + MQTT.js v3.1.1';
export const BROKER_KINDS: BrokerKind[] = [
  'embedded aedes (commit in authorizePublish)',
  'Mosquitto + MQTT.js v5',
  'Mosquitto + MQTT.js v5, 3 shared connections',
  'aedes + MQTT.js v3.1.1',
];

export interface IngestRig {
  archive: Archive;
  ingestor: Ingestor;
  /** URL devices publish to. */
  url: string;
  connection: BrokerConnection;
  /** Makes the next `n` commits fail as if the disk were full. */
  failNextCommits(n: number): void;
  dispose(): Promise<void>;
}

/** Starts the rig; the archive holds the example run with id `run-1`. */
export async function startIngestRig(kind: BrokerKind): Promise<IngestRig> {
  const dir = mkdtempSync(join(tmpdir(), 'meniscus-ingest-'));
  const archive = Archive.open(join(dir, 'archive.sqlite'));
  archive.createRun(
    parseRunConfig(exampleRunInput({ placedAt: new Date(Date.now() - 3_600_000).toISOString() })),
    Date.now(),
    'run-1',
  );
  const ingestor = new Ingestor(archive);
  let failures = 0;
  const sink: MessageSink = {
    data: (topic, payload) => {
      if (failures > 0) {
        failures -= 1;
        return Promise.reject(new Error('disk full (injected by the test)'));
      }
      return ingestor.data(topic, payload);
    },
    status: (topic, payload) => ingestor.status(topic, payload),
  };
  const cleanups: (() => Promise<void>)[] = [];
  let url: string;
  let connection: BrokerConnection;
  if (kind === 'embedded aedes (commit in authorizePublish)') {
    const broker = await startEmbeddedBroker(sink, { port: 0 });
    url = `mqtt://127.0.0.1:${broker.port}`;
    connection = broker;
  } else {
    let brokerUrl: string;
    const viaMosquitto = kind !== 'aedes + MQTT.js v3.1.1';
    if (viaMosquitto) {
      const mosquitto = await startMosquitto();
      cleanups.push(() => mosquitto.dispose());
      brokerUrl = mosquitto.url;
    } else {
      const aedes = await Aedes.createBroker();
      const server = createServer(aedes.handle);
      await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
      cleanups.push(async () => {
        await new Promise<void>((resolve) => aedes.close(() => resolve()));
        await new Promise<void>((resolve) => server.close(() => resolve()));
      });
      brokerUrl = `mqtt://127.0.0.1:${(server.address() as AddressInfo).port}`;
    }
    const subscriber = startMqttSubscriber(sink, {
      url: brokerUrl,
      clientId: `meniscus-test-${process.pid}`,
      protocolVersion: viaMosquitto ? 5 : 4,
      reconnectPeriodMs: 100,
      connections: kind === 'Mosquitto + MQTT.js v5, 3 shared connections' ? 3 : 1,
    });
    await subscriber.ready;
    url = brokerUrl;
    connection = subscriber;
  }
  return {
    archive,
    ingestor,
    url,
    connection,
    failNextCommits(n) {
      failures = n;
    },
    async dispose() {
      await connection.close();
      for (const cleanup of cleanups.reverse()) await cleanup();
      archive.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Polls `condition` every 20 ms until it holds, or throws after `timeoutMs`. */
export async function waitUntil(
  condition: () => boolean,
  timeoutMs = 10_000,
  what = 'condition',
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline)
      throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}
