/**
 * The MQTT forecast topic on the composed server: a retained series on
 * `meniscus/<site>/forecast` replaces the forecast of every open run on that site (recorded once
 * even when delivered again), an invalid one is counted and never recorded.
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

const dirs: string[] = [];
afterAll(() => dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

async function until<T>(probe: () => Promise<T>, done: (value: T) => boolean): Promise<T> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const value = await probe();
    if (done(value) || Date.now() > deadline) return value;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

it(
  'a retained forecast on meniscus/<site>/forecast reaches every open run of the site',
  { timeout: 30_000 },
  async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-forecast-'));
    dirs.push(dataDir);
    const server = await startServer(
      serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
      }),
      pino({ level: 'silent' }),
    );
    const api = `http://127.0.0.1:${server.httpPort}/api`;
    const client = await mqtt.connectAsync(`mqtt://127.0.0.1:${server.mqttPort}`, {
      clientId: 'forecast-provider',
    });
    try {
      const ids: string[] = [];
      for (const name of ['bay 1', 'bay 2']) {
        const created = await fetch(`${api}/runs`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify(exampleRunInput({ name })),
        });
        ids.push(((await created.json()) as { id: string }).id);
      }
      const other = await fetch(`${api}/runs`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(exampleRunInput({ site: 'other-site' })),
      });
      const otherId = ((await other.json()) as { id: string }).id;
      const series = {
        points: [
          { time: '2026-06-14T15:00:00+02:00', windSpeedMs: 6.5, relativeHumidityPercent: 35 },
          { time: '2026-06-14T16:00:00+02:00', windSpeedMs: 7.5, relativeHumidityPercent: 30 },
        ],
      };
      await client.publishAsync('meniscus/harbour-deck/forecast', JSON.stringify(series), {
        qos: 1,
        retain: true,
      });
      await client.publishAsync(
        'meniscus/harbour-deck/forecast',
        '{"points": [{"time": "noon"}]}',
        {
          qos: 1,
        },
      );
      const forecastOf = async (id: string) =>
        (await (await fetch(`${api}/runs/${id}/forecast`)).json()) as {
          source: string;
          points: unknown[];
        };
      for (const id of ids) {
        const forecast = await until(
          () => forecastOf(id),
          (f) => f.source === 'supplied',
        );
        expect(forecast).toEqual({
          runId: id,
          source: 'supplied',
          points: [
            { time: '2026-06-14T13:00:00.000Z', windSpeedMs: 6.5, relativeHumidityPercent: 35 },
            { time: '2026-06-14T14:00:00.000Z', windSpeedMs: 7.5, relativeHumidityPercent: 30 },
          ],
        });
      }
      expect((await forecastOf(otherId)).source).toBe('persistence');
      const health = await until(
        async () =>
          (await (await fetch(`${api}/health`)).json()) as {
            forecasts: { accepted: number; rejected: number; lastError: string };
          },
        (h) => h.forecasts.rejected === 1,
      );
      expect(health.forecasts).toMatchObject({ accepted: 1, rejected: 1 });
      expect(health.forecasts.lastError).toContain('points[0].time must be an ISO 8601');
      // Recorded once per run, as an event of its record order.
      expect(server.archive.events(ids[0] ?? '', ['forecast'])).toHaveLength(1);
    } finally {
      await client.endAsync();
      await server.close();
    }
  },
);
