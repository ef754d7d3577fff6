import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';
import { startLiveApiRig } from './_liveApiRig.ts';
import type { LiveApiRig } from './_liveApiRig.ts';

let rig: LiveApiRig;
let runId: string;

const call = async (method: string, path: string, body?: unknown) => {
  const response = await fetch(`${rig.base}/api${path}`, {
    method,
    ...(body === undefined
      ? {}
      : { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }),
  });
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
};

beforeEach(async () => {
  rig = await startLiveApiRig();
  const created = await call('POST', '/runs', exampleRunInput());
  runId = String(created.body.id);
});
afterEach(() => rig.close());

describe('run routes', () => {
  it('POST /api/runs opens the run at once (status open)', async () => {
    const run = await call('GET', `/runs/${runId}`);
    expect(run.body.status).toBe('open');
  });

  it('POST /api/runs/:id/measures logs a measure (201) and GET lists it', async () => {
    const posted = await call('POST', `/runs/${runId}/measures`, {
      kind: 'wet-covering',
      startAt: '2026-06-14T12:00:00+02:00',
      loggedBy: 'crew lead',
    });
    expect(posted).toEqual({
      status: 201,
      body: {
        id: 'm1',
        kind: 'wet-covering',
        loggedBy: 'crew lead',
        endedBy: null,
        startAt: '2026-06-14T10:00:00.000Z',
        endAt: null,
        applied: true,
      },
    });
    const ended = await call('POST', `/runs/${runId}/measures/m1/end`, {
      endAt: '2026-06-14T15:00:00+02:00',
      endedBy: 'foreman',
    });
    expect(ended.status).toBe(200);
    expect(ended.body).toMatchObject({
      endAt: '2026-06-14T13:00:00.000Z',
      endedBy: 'foreman',
      applied: false,
    });
    const listed = await call('GET', `/runs/${runId}/measures`);
    expect(listed.body.measures).toEqual([ended.body]);
  });

  it.each([
    ['POST', '/measures', { kind: 'ponding' }, 400, 'loggedBy is required: got nothing'],
    ['POST', '/measures', { kind: 'hose', loggedBy: 'x' }, 400, 'kind must be one of'],
    ['POST', '/measures/m7/end', { endedBy: 'x' }, 404, 'has no measure "m7"'],
    [
      'POST',
      '/forecast',
      { points: [{ time: 'noon', windSpeedMs: 3 }] },
      400,
      'points[0].time must be an ISO 8601',
    ],
    ['POST', '/close', { note: 5 }, 400, 'note'],
  ])(
    '%s %s with a bad body answers %i naming the field',
    async (method, path, body, status, text) => {
      const answer = await call(method, `/runs/${runId}${path}`, body);
      expect(answer.status).toBe(status);
      expect(JSON.stringify(answer.body)).toContain(text.replaceAll('"', '\\"'));
    },
  );

  it.each([
    ['GET', '/state'],
    ['GET', '/measures'],
    ['POST', '/measures'],
    ['GET', '/forecast'],
    ['POST', '/close'],
  ])('%s /api/runs/<unknown>%s is 404', async (method, path) => {
    const answer = await call(method, `/runs/nope${path}`, method === 'POST' ? {} : undefined);
    expect(answer).toEqual({ status: 404, body: { error: 'run "nope" does not exist' } });
  });

  it('POST /api/runs/:id/close closes; then measures, forecasts and a second close get 409', async () => {
    rig.clock.nowMs = EXAMPLE_PLACED_AT_MS + 86_400_000;
    const closed = await call('POST', `/runs/${runId}/close`, { closedBy: 'site engineer' });
    expect(closed).toEqual({
      status: 200,
      body: { id: runId, status: 'closed', closedAt: '2026-06-15T09:20:00.000Z' },
    });
    for (const [path, body] of [
      ['/measures', { kind: 'ponding', loggedBy: 'x' }],
      ['/forecast', { points: [] }],
      ['/close', {}],
    ] as const) {
      const refused = await call('POST', `/runs/${runId}${path}`, body);
      expect(refused.status).toBe(409);
      expect(String(refused.body.error)).toMatch(
        /was closed at 2026-06-15T09:20:00.000Z: a closed run is read-only/,
      );
    }
    expect((await call('GET', `/runs/${runId}`)).body.status).toBe('closed');
  });

  it('POST /api/runs/:id/forecast replaces the series; GET shows it; an empty one returns to persistence', async () => {
    const posted = await call('POST', `/runs/${runId}/forecast`, {
      points: [{ time: '2026-06-14T14:00:00+02:00', windSpeedMs: 6, airTemperatureC: 31 }],
    });
    expect(posted.body).toEqual({ runId, source: 'supplied', points: 1 });
    expect((await call('GET', `/runs/${runId}/forecast`)).body).toEqual({
      runId,
      source: 'supplied',
      points: [{ time: '2026-06-14T12:00:00.000Z', windSpeedMs: 6, airTemperatureC: 31 }],
    });
    await call('POST', `/runs/${runId}/forecast`, { points: [] });
    expect((await call('GET', `/runs/${runId}/forecast`)).body.source).toBe('persistence');
  });

  it('GET /api/runs/:id/state answers 503 with the message when the run engine failed', async () => {
    const broken = await call('POST', '/runs', exampleRunInput({ name: 'broken' }));
    const state = await call('GET', `/runs/${String(broken.body.id)}/state`);
    expect(state).toEqual({
      status: 503,
      body: {
        error: `the live engine of run ${String(broken.body.id)} failed: the model cannot start: no material data`,
      },
    });
  });

  it('GET /api/runs/:id/state answers before the first reading, then follows the readings', async () => {
    const before = await call('GET', `/runs/${runId}/state`);
    expect(before.status).toBe(200);
    expect(before.body).toMatchObject({ runId, eventTimeMs: null, caution: 'fake engine' });
    const t = EXAMPLE_PLACED_AT_MS / 1000 + 600;
    await rig.ingestor.data(
      'meniscus/harbour-deck/probe-a/data',
      // The fake engine consumes readings 10 min behind the newest one.
      Buffer.from(
        JSON.stringify([
          { bn: 'probe-a/', bt: t, n: 'rh-10', v: 98 },
          { t: 600, n: 'rh-10', v: 97 },
        ]),
      ),
    );
    const after = await call('GET', `/runs/${runId}/state`);
    expect(after.body.eventTimeMs).toBe(t * 1000);
  });
});
