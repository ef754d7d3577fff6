/**
 * Fault test: SIGKILL the server (the `npm start` entry, as a child process) again and again
 * while a device publishes numbered readings at QoS 1; after each kill the archive must pass
 * `PRAGMA integrity_check`, and at the end every reading the device saw acknowledged must be
 * stored exactly once. Run with the embedded broker (which dies with the server), with
 * Mosquitto (which keeps the server's persistent session while it is down), and with Mosquitto
 * and three connections on a shared subscription (group commit across connections).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { ARCHIVE_FILE } from '../../server/src/server.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { freePort } from '../helpers/freePort.ts';
import { startMosquitto } from '../helpers/mosquitto.ts';
import type { Mosquitto } from '../helpers/mosquitto.ts';
import { startNumberedPublisher } from '../helpers/numberedPublisher.ts';
import { startServerProcess } from '../helpers/serverProcess.ts';

const KILLS = 10;
const TOPIC = 'meniscus/harbour-deck/probe-a/data';
const dirs: string[] = [];
afterAll(() => dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

describe.each(['embedded', 'mosquitto', 'mosquitto-shared'] as const)(
  'server SIGKILL, %s broker',
  (brokerKind) => {
    it(
      `loses no acknowledged reading over ${KILLS} kills (${brokerKind} broker)`,
      { timeout: 180_000 },
      async () => {
        const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-kill-'));
        dirs.push(dataDir);
        const setup = Archive.open(join(dataDir, ARCHIVE_FILE));
        setup.createRun(
          parseRunConfig(
            exampleRunInput({ placedAt: new Date(Date.now() - 7_200_000).toISOString() }),
          ),
          Date.now(),
          'run-1',
        );
        setup.close();

        let mosquitto: Mosquitto | null = null;
        const httpPort = await freePort();
        const env: Record<string, string> = { MENISCUS_DATA_DIR: dataDir };
        let deviceUrl: string;
        if (brokerKind === 'embedded') {
          const mqttPort = await freePort();
          env.MENISCUS_MQTT_PORT = String(mqttPort);
          deviceUrl = `mqtt://127.0.0.1:${mqttPort}`;
        } else {
          mosquitto = await startMosquitto();
          env.MENISCUS_MQTT_URL = mosquitto.url;
          env.MENISCUS_MQTT_CLIENT_ID = 'meniscus-kill-test';
          if (brokerKind === 'mosquitto-shared') env.MENISCUS_MQTT_CONNECTIONS = '3';
          deviceUrl = mosquitto.url;
        }

        let server = await startServerProcess(env, httpPort);
        const device = startNumberedPublisher(deviceUrl, TOPIC, 'rh-10', {
          clientId: `probe-a-${brokerKind}`,
        });
        const integrity: string[] = [];
        try {
          for (let kill = 0; kill < KILLS; kill += 1) {
            await new Promise((resolve) => setTimeout(resolve, 250 + Math.random() * 400));
            await server.kill('SIGKILL');
            const db = new Database(join(dataDir, ARCHIVE_FILE));
            integrity.push(
              ...(db.pragma('integrity_check') as { integrity_check: string }[]).map(
                (r) => r.integrity_check,
              ),
            );
            db.close();
            server = await startServerProcess(env, httpPort);
          }
          await new Promise((resolve) => setTimeout(resolve, 300));
          await device.stop();
          // Let the server drain what the broker still holds for it, then stop it cleanly.
          const want = device.acknowledged.size;
          const deadline = Date.now() + 45_000;
          while (Date.now() < deadline) {
            const health = (await (
              await fetch(`http://127.0.0.1:${httpPort}/api/health`)
            ).json()) as {
              archive: { counts: { readings: number } };
            };
            if (health.archive.counts.readings >= want) break;
            await new Promise((resolve) => setTimeout(resolve, 200));
          }
        } finally {
          await server.kill('SIGTERM');
          await mosquitto?.dispose();
        }

        expect(integrity).toEqual(Array.from({ length: KILLS }, () => 'ok'));
        const archive = Archive.open(join(dataDir, ARCHIVE_FILE));
        const stored = archive
          .readings('run-1', { sensor: 'rh-10' })
          .map((r) => r.eventAtMs - device.startS * 1000);
        const counts = new Map<number, number>();
        for (const index of stored) counts.set(index, (counts.get(index) ?? 0) + 1);
        const missing = [...device.acknowledged].filter((index) => counts.get(index) !== 1);
        expect(device.acknowledged.size).toBeGreaterThan(KILLS * 10);
        expect(missing).toEqual([]);
        expect([...counts.values()].every((n) => n === 1)).toBe(true);
        expect(archive.integrityCheck()).toEqual(['ok']);
        archive.close();
      },
    );
  },
);
