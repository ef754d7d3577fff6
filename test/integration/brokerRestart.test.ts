/**
 * Fault test: restart Mosquitto (with persistence, as a site broker runs) twice while a device
 * publishes numbered readings at QoS 1 to the server's persistent session: every reading the
 * device saw acknowledged is stored exactly once, and the archive passes integrity_check.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pino } from 'pino';
import { afterAll, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { startServer } from '../../server/src/server.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { waitUntil } from '../helpers/ingestRig.ts';
import { startMosquitto } from '../helpers/mosquitto.ts';
import { startNumberedPublisher } from '../helpers/numberedPublisher.ts';

const dirs: string[] = [];
afterAll(() => dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

it('loses nothing when the broker restarts mid-stream (twice)', { timeout: 90_000 }, async () => {
  const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-broker-restart-'));
  dirs.push(dataDir);
  const mosquitto = await startMosquitto({ persistence: true });
  const config = serverConfigFromEnv({
    MENISCUS_DATA_DIR: dataDir,
    MENISCUS_HTTP_PORT: '0',
    MENISCUS_MQTT_URL: mosquitto.url,
    MENISCUS_MQTT_CLIENT_ID: 'meniscus-restart-test',
  });
  const server = await startServer(config, pino({ level: 'silent' }));
  server.archive.createRun(
    parseRunConfig(exampleRunInput({ placedAt: new Date(Date.now() - 7_200_000).toISOString() })),
    Date.now(),
    'run-1',
  );
  try {
    await waitUntil(() => server.broker.state().connected, 10_000, 'the server connected');
    await new Promise((resolve) => setTimeout(resolve, 200)); // its subscription acknowledged
    const device = startNumberedPublisher(
      mosquitto.url,
      'meniscus/harbour-deck/probe-b/data',
      'rh-10',
      {
        clientId: 'probe-b-restart',
        ratePerS: 200,
      },
    );
    for (let restart = 0; restart < 2; restart += 1) {
      await new Promise((resolve) => setTimeout(resolve, 1500));
      await mosquitto.stop();
      await new Promise((resolve) => setTimeout(resolve, 700));
      await mosquitto.start();
    }
    await new Promise((resolve) => setTimeout(resolve, 1500));
    await device.stop();
    const acknowledged = [...device.acknowledged];
    await waitUntil(
      () => server.archive.counts('run-1').readings >= acknowledged.length,
      45_000,
      'every acknowledged reading stored',
    );
    const counts = new Map<number, number>();
    for (const reading of server.archive.readings('run-1')) {
      const index = reading.eventAtMs - device.startS * 1000;
      counts.set(index, (counts.get(index) ?? 0) + 1);
    }
    expect(acknowledged.length).toBeGreaterThan(500);
    expect(acknowledged.filter((index) => counts.get(index) !== 1)).toEqual([]);
    expect([...counts.values()].every((n) => n === 1)).toBe(true);
    expect(server.archive.integrityCheck()).toEqual(['ok']);
  } finally {
    await server.close();
    await mosquitto.dispose();
  }
});
