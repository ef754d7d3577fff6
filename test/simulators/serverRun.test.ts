/**
 * The run on a server over its HTTP API, against the real server started in-process (embedded
 * broker, archive in a temp folder, HTTP on a free port) and against a port nobody listens on.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/freePort.ts';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import type { ScenarioMeasure } from '../../simulators/src/scenarioSchema.ts';
import {
  DEMO_CREW,
  closeRun,
  findOrCreateRun,
  measureBody,
  measureLogger,
} from '../../simulators/src/serverRun.ts';

const { scenario, runConfig, runConfigInput } = loadScenarioFolder('level3-topping');
const foggingLog = scenario.measureLogs.fogging as ScenarioMeasure[];

describe('findOrCreateRun() and measureLogger() on a real server', () => {
  let dataDir: string;
  let server: RunningServer;
  let baseUrl: string;
  beforeAll(async () => {
    dataDir = mkdtempSync(join(tmpdir(), 'meniscus-server-run-'));
    server = await startServer(
      serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_HOST: '127.0.0.1',
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
        MENISCUS_LOG_LEVEL: 'silent',
      }),
    );
    baseUrl = `http://127.0.0.1:${server.httpPort}`;
  });
  afterAll(async () => {
    await server.close();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('creates the run once, then finds it', async () => {
    const first = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    expect(first.existing).toBe(false);
    const second = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    expect(second).toEqual({ runId: first.runId, existing: true });
  });

  it('closeRun() closes the run with the crew and note, and the next findOrCreateRun() creates a new one', async () => {
    const first = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    await closeRun(baseUrl, first.runId, 'a new demo play of the scenario');
    const run = (await (await fetch(`${baseUrl}/api/runs/${first.runId}`)).json()) as {
      status: string;
    };
    expect(run.status).toBe('closed');
    const next = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    expect(next.existing).toBe(false);
    expect(next.runId).not.toBe(first.runId);
    await expect(closeRun(baseUrl, first.runId, 'again')).rejects.toThrow(
      new RegExp(`^closing run ${first.runId} failed: HTTP 409 `),
    );
  });

  it('names the HTTP status and body when the server refuses the run', async () => {
    const badRun = { ...runConfig, name: 'another run', site: 'no spaces allowed?' };
    await expect(findOrCreateRun(baseUrl, badRun, badRun)).rejects.toThrow(
      /^creating the run failed: HTTP 400 /,
    );
  });

  it('reports only the first measure the server does not log', async () => {
    const reported: string[] = [];
    const log = measureLogger(baseUrl, 'no-such-run', (line) => reported.push(line));
    for (const measure of foggingLog) await log(measure);
    expect(reported).toHaveLength(1);
    expect(reported[0]).toMatch(/^\(the server did not log the measure: HTTP 404 /);
  });

  it('logs measures with the crew and figures of the scenario', async () => {
    const { runId } = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    const reported: string[] = [];
    const log = measureLogger(baseUrl, runId, (line) => reported.push(line));
    for (const measure of foggingLog) await log(measure);
    expect(reported).toEqual([]);
    const logged = (await (await fetch(`${baseUrl}/api/runs/${runId}/measures`)).json()) as {
      measures: unknown[];
    };
    // the server keeps times in UTC; the scenario writes them at +02:00
    expect(logged.measures).toMatchObject([
      {
        kind: 'fogging',
        startAt: '2026-07-16T10:50:00.000Z',
        endAt: '2026-07-16T16:00:00.000Z',
        relativeHumidity: 0.95,
        loggedBy: DEMO_CREW,
      },
      {
        kind: 'windbreak',
        startAt: '2026-07-16T11:00:00.000Z',
        windFactor: 0.4,
        loggedBy: DEMO_CREW,
      },
    ]);
  });
});

describe('findOrCreateRun() without a server', () => {
  it('retries for waitMs, says once that it waits, then names the server', async () => {
    const baseUrl = `http://127.0.0.1:${await freePort()}`;
    const waiting: string[] = [];
    const started = performance.now();
    await expect(
      findOrCreateRun(baseUrl, runConfig, runConfigInput, {
        waitMs: 600,
        onWaiting: (why) => waiting.push(why),
      }),
    ).rejects.toThrow(`the server at ${baseUrl} cannot be reached: `);
    expect(performance.now() - started).toBeGreaterThanOrEqual(550);
    expect(waiting).toHaveLength(1);
  });

  it('makes one attempt by default', async () => {
    const baseUrl = `http://127.0.0.1:${await freePort()}`;
    const started = performance.now();
    await expect(findOrCreateRun(baseUrl, runConfig, runConfigInput)).rejects.toThrow(
      /cannot be reached/,
    );
    expect(performance.now() - started).toBeLessThan(500);
  });
});

describe('measureBody()', () => {
  it('keeps the kind-specific figure and names the crew', () => {
    expect(foggingLog.map((measure) => measureBody(measure))).toEqual([
      {
        kind: 'fogging',
        startAt: '2026-07-16T12:50:00+02:00',
        endAt: '2026-07-16T18:00:00+02:00',
        relativeHumidity: 0.95,
        loggedBy: DEMO_CREW,
        note: 'Crew fogs bays C4 to C7 from the upwind edge as soon as the wind rises.',
      },
      {
        kind: 'windbreak',
        startAt: '2026-07-16T13:00:00+02:00',
        windFactor: 0.4,
        loggedBy: DEMO_CREW,
        note: 'Mesh screens clipped to the edge barrier on the windward side.',
      },
    ]);
  });
});
