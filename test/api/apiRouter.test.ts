import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { parse } from 'csv-parse/sync';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiRouter } from '../../server/src/api/apiRouter.ts';
import { errorToHttp } from '../../server/src/api/httpError.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

let archive: Archive;
let server: Server;
let base: string;
const logged: unknown[] = [];
let healthThrows = false;

beforeEach(async () => {
  archive = Archive.open(':memory:');
  const app = express();
  app.use(
    '/api',
    apiRouter({
      archive,
      clock: () => EXAMPLE_PLACED_AT_MS,
      health: () => {
        if (healthThrows) throw new Error('secret internal detail');
        return { broker: { ok: true } };
      },
    }),
  );
  app.use(errorToHttp({ error: (details) => logged.push(details) }));
  server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
});
afterEach(async () => {
  healthThrows = false;
  await new Promise((resolve) => server.close(resolve));
  archive.close();
});

const postRun = (body: unknown) =>
  fetch(`${base}/runs`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });

async function runWithReadings(): Promise<string> {
  const response = await postRun(exampleRunInput());
  const { id } = (await response.json()) as { id: string };
  const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 3_600_000 });
  const t0 = EXAMPLE_PLACED_AT_MS / 1000;
  await ingestor.data(
    'meniscus/harbour-deck/probe-a/data',
    Buffer.from(
      JSON.stringify([
        { bn: 'probe-a/', bt: t0 + 60, n: 'rh-10', v: 99 },
        { n: 't-10', u: 'Cel', v: 24.5 },
        { n: 'rh-10', v: 98, t: 60 },
        { n: 'rh-10', v: 97, t: 120 },
      ]),
    ),
  );
  await ingestor.data(
    'meniscus/harbour-deck/probe-a/data',
    Buffer.from('[{"n":"rh-10","v":140,"t":-1}]'),
  );
  return id;
}

describe('/api', () => {
  it('POST /runs creates a run from a valid configuration (201) and GET reads it back', async () => {
    const response = await postRun(exampleRunInput());
    expect(response.status).toBe(201);
    const run = (await response.json()) as {
      id: string;
      site: string;
      config: { leadTimeMin: number };
    };
    expect(response.headers.get('location')).toBe(`/api/runs/${run.id}`);
    expect(run.config.leadTimeMin).toBe(90);
    const again = (await (await fetch(`${base}/runs/${run.id}`)).json()) as { site: string };
    expect(again.site).toBe('harbour-deck');
    const list = (await (await fetch(`${base}/runs`)).json()) as { runs: { id: string }[] };
    expect(list.runs.map((r) => r.id)).toEqual([run.id]);
  });

  it('POST /runs answers 400 with issues that name field, rule and value', async () => {
    const input = exampleRunInput({
      element: { kind: 'slab', thicknessMm: 100, drying: 'one-face' },
      probes: [{ device: 'p', sensor: 'rh', quantity: 'rh', depthMm: 140 }],
    });
    const response = await postRun(input);
    expect(response.status).toBe(400);
    const body = (await response.json()) as { issues: string[] };
    expect(body.issues).toEqual([
      'probes[0].depthMm must be between 0 and the element thickness (100 mm): got 140',
    ]);
    const malformed = await fetch(`${base}/runs`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: '{"site":',
    });
    expect(malformed.status).toBe(400);
  });

  it('GET /runs/:id/readings filters by sensor and time and answers CSV on Accept: text/csv', async () => {
    const id = await runWithReadings();
    const all = (await (await fetch(`${base}/runs/${id}/readings`)).json()) as { count: number };
    expect(all.count).toBe(4);
    const from = new Date(EXAMPLE_PLACED_AT_MS + 120_000).toISOString();
    const filtered = (await (
      await fetch(`${base}/runs/${id}/readings?sensor=rh-10&from=${from}`)
    ).json()) as {
      readings: { value: number; unit: string; depthMm: number }[];
    };
    expect(filtered.readings.map((r) => r.value)).toEqual([98, 97]);
    const csvResponse = await fetch(`${base}/runs/${id}/readings?sensor=probe-a/t-10`, {
      headers: { accept: 'text/csv' },
    });
    expect(csvResponse.headers.get('content-type')).toMatch(/^text\/csv/);
    const rows = parse(await csvResponse.text(), { columns: true }) as Record<string, string>[];
    expect(rows).toEqual([
      expect.objectContaining({
        device: 'probe-a',
        sensor: 't-10',
        quantity: 'temperature',
        depth_mm: '10',
        value: '24.5',
        unit: 'Cel',
      }),
    ]);
    const to = new Date(EXAMPLE_PLACED_AT_MS + 120_000).toISOString();
    const early = (await (
      await fetch(`${base}/runs/${id}/readings?sensor=rh-10&to=${to}&limit=5`)
    ).json()) as {
      readings: { value: number }[];
    };
    expect(early.readings.map((r) => r.value)).toEqual([99]); // `to` is exclusive
    const tooMany = await fetch(`${base}/runs/${id}/readings?limit=0`);
    expect(((await tooMany.json()) as { issues: string[] }).issues).toEqual([
      'limit must be between 1 and 1000000: got "0"',
    ]);
    const bad = await fetch(`${base}/runs/${id}/readings?from=yesterday`);
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { issues: string[] }).issues[0]).toMatch(
      /^from must be an ISO 8601 .*: got "yesterday"$/,
    );
  });

  it('GET /runs/:id lists each sensor with its latest reading and update interval', async () => {
    const id = await runWithReadings();
    const run = (await (await fetch(`${base}/runs/${id}`)).json()) as {
      sensors: Record<string, unknown>[];
    };
    expect(run.sensors.find((s) => s.device === 'probe-a' && s.sensor === 'rh-10')).toMatchObject({
      role: 'probe',
      quantity: 'rh',
      unit: '%RH',
      depthMm: 10,
      readings: 3,
      lastEventAt: new Date(EXAMPLE_PLACED_AT_MS + 180_000).toISOString(),
    });
    expect(run.sensors.find((s) => s.sensor === 'wind')).toMatchObject({
      role: 'weather',
      readings: 0,
      lastEventAt: null,
    });
    expect(run.sensors).toHaveLength(8);
  });

  it('GET /runs/:id/quarantine lists rejected messages with reason and raw bytes', async () => {
    const id = await runWithReadings();
    const body = (await (await fetch(`${base}/runs/${id}/quarantine`)).json()) as {
      counts: Record<string, number>;
      messages: { reason: string; bytesBase64: string }[];
    };
    expect(body.counts).toEqual({ 'impossible-value': 1 });
    expect(Buffer.from(body.messages[0]?.bytesBase64 ?? '', 'base64').toString()).toBe(
      '[{"n":"rh-10","v":140,"t":-1}]',
    );
  });

  it('answers 404 for an unknown run and a plain 500 without internals for an unknown error', async () => {
    expect((await fetch(`${base}/runs/nope`)).status).toBe(404);
    expect((await fetch(`${base}/runs/nope/readings`)).status).toBe(404);
    healthThrows = true;
    const response = await fetch(`${base}/health`);
    expect(response.status).toBe(500);
    const text = await response.text();
    expect(text).toBe('Internal Server Error');
    expect(logged.length).toBeGreaterThan(0);
  });

  it('GET /health reports the archive, quarantine counts and the parts passed in', async () => {
    const body = (await (await fetch(`${base}/health`)).json()) as Record<string, unknown>;
    expect(body).toMatchObject({
      status: 'ok',
      archive: { ok: true },
      broker: { ok: true },
      quarantine: {},
    });
  });
});
