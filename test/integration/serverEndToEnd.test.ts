/**
 * The composed server end to end, as `npm start` builds it from MENISCUS_* variables: a run
 * created over HTTP, readings published to the embedded broker, read back over HTTP, forwarded
 * to a real InfluxDB v2 write endpoint (victoria-metrics), and reported by /api/health.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import mqtt from 'mqtt';
import { pino } from 'pino';
import { afterAll, expect, it } from 'vitest';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { startServer } from '../../server/src/server.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { startVictoriaMetrics } from '../helpers/victoriaMetrics.ts';

const dirs: string[] = [];
afterAll(() => dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

it(
  'creates a run over HTTP, ingests over MQTT, serves readings and forwards them to InfluxDB',
  { timeout: 60_000 },
  async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-e2e-'));
    dirs.push(dataDir);
    const vm = await startVictoriaMetrics();
    const server = await startServer(
      serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
        MENISCUS_INFLUX_URL: vm.url,
        MENISCUS_INFLUX_TOKEN: 'site-token',
        MENISCUS_INFLUX_ORG: 'meniscus',
        MENISCUS_INFLUX_BUCKET: 'readings',
      }),
      pino({ level: 'silent' }),
    );
    const api = `http://127.0.0.1:${server.httpPort}/api`;
    try {
      const placedAt = new Date(Date.now() - 3_600_000).toISOString();
      const created = await fetch(`${api}/runs`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(exampleRunInput({ placedAt })),
      });
      expect(created.status).toBe(201);
      const { id } = (await created.json()) as { id: string };

      const device = await mqtt.connectAsync(`mqtt://127.0.0.1:${server.mqttPort}`, {
        protocolVersion: 4,
      });
      for (let i = 0; i < 10; i += 1) {
        await device.publishAsync(
          'meniscus/harbour-deck/probe-a/data',
          JSON.stringify([
            { bn: 'probe-a/', n: 'rh-10', u: '%RH', v: 99 - i / 10, t: -600 + i * 60 },
            { n: 't-10', u: 'degF', v: 77, t: -600 + i * 60 },
          ]),
          { qos: 1 },
        );
      }
      await device.publishAsync('meniscus/harbour-deck/probe-a/data', '[{"n":"rh-10","v":250}]', {
        qos: 1,
      });
      await device.endAsync();

      const readings = (await (await fetch(`${api}/runs/${id}/readings?sensor=t-10`)).json()) as {
        count: number;
        readings: { value: number }[];
      };
      expect(readings.count).toBe(10);
      expect(readings.readings[0]?.value).toBeCloseTo(25, 12); // 77 degF
      const quarantine = (await (await fetch(`${api}/runs/${id}/quarantine`)).json()) as {
        counts: Record<string, number>;
      };
      expect(quarantine.counts).toEqual({ 'impossible-value': 1 });

      type Health = {
        status: string;
        forwarder: { enabled: boolean; backlog: number; written: number };
        broker: { kind: string };
      };
      let health: Health | null = null;
      const deadline = Date.now() + 15_000;
      while (Date.now() < deadline) {
        health = (await (await fetch(`${api}/health`)).json()) as Health;
        if (health.forwarder.backlog === 0 && health.forwarder.written === 20) break;
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
      expect(health).toMatchObject({
        status: 'ok',
        broker: { kind: 'embedded' },
        forwarder: { enabled: true, backlog: 0, written: 20 },
      });
      const exported = await vm.exportSeries();
      expect(exported.reduce((sum, series) => sum + series.values.length, 0)).toBe(20);
    } finally {
      await server.close();
      await vm.dispose();
    }
  },
);
