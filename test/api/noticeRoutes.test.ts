/**
 * The notice routes and the `notice` push on a real HTTP server with socket.io, a real archive
 * and the server's CrewNotices (log channel), states given as the live host would.
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { pino } from 'pino';
import { Server as SocketServer } from 'socket.io';
import { io as connect } from 'socket.io-client';
import type { Socket } from 'socket.io-client';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { logChannel } from '../../server/src/alerts/channels/logChannel.ts';
import { CrewNotices } from '../../server/src/alerts/crewNotices.ts';
import type { Notice } from '../../server/src/alerts/types.ts';
import { apiRouter } from '../../server/src/api/apiRouter.ts';
import { errorToHttp } from '../../server/src/api/httpError.ts';
import { attachLiveSocket, pushNotice } from '../../server/src/api/liveSocket.ts';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { CONFIG, MIN, T0, runState } from '../alerts/_runStates.ts';

let archive: Archive;
let notices: CrewNotices;
let http: Server;
let io: SocketServer;
let base: string;
let client: Socket | null = null;

beforeEach(async () => {
  archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(CONFIG), T0, 'run-1');
  let push: (notice: Notice) => void = () => {};
  notices = new CrewNotices(archive, {
    channels: [logChannel(pino({ level: 'silent' }))],
    onNotice: (notice) => push(notice),
  });
  const app = express();
  app.use('/api', apiRouter({ archive, notices, health: () => ({}), live: { state: () => null } }));
  app.use(errorToHttp({ error: () => {} }));
  http = await new Promise((resolve) => {
    const server = app.listen(0, '127.0.0.1', () => resolve(server));
  });
  io = new SocketServer(http, { serveClient: false });
  attachLiveSocket(io, archive, { state: () => null });
  push = (notice) => pushNotice(io, notice);
  base = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
});
afterEach(async () => {
  client?.close();
  client = null;
  await notices.close();
  await new Promise<void>((resolve) => {
    void io.close(() => resolve());
    http.closeAllConnections();
  });
  archive.close();
});

const get = async (path: string) => {
  const response = await fetch(`${base}/api${path}`);
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
};
const post = async (path: string, body: unknown) => {
  const response = await fetch(`${base}/api${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
};

/** Joins run-1's room; resolves with the list the `notice` events go into. */
async function joinRoom(): Promise<Notice[]> {
  const received: Notice[] = [];
  client = connect(base, {
    transports: ['websocket'],
    reconnection: false,
    query: { run: 'run-1' },
  });
  client.on('notice', (notice: Notice) => received.push(notice));
  await new Promise((resolve) => client?.once('state', resolve));
  return received;
}

describe('GET /api/runs/:id/notices', () => {
  it("answers the run's notices newest first, each with its deliveries", async () => {
    expect((await get('/runs/run-1/notices')).body).toEqual({ runId: 'run-1', notices: [] });
    notices.onState('run-1', runState({ probability: 0.5 }));
    notices.onState('run-1', runState({ timeMs: T0 + 5 * MIN, utilization: 0.6 }));
    await notices.outbox.flush();
    const { status, body } = await get('/runs/run-1/notices');
    expect(status).toBe(200);
    const list = body.notices as Notice[];
    expect(list.map((n) => `${n.id} ${n.level}`)).toEqual([
      'n-run-1-2 ACT NOW',
      'n-run-1-1 PREPARE',
    ]);
    expect(list[0]).toMatchObject({
      runId: 'run-1',
      seq: 2,
      kind: 'utilization',
      raisedAtMs: T0 + 5 * MIN,
      title: expect.stringMatching(/^ACT NOW: /),
      figures: {
        utilization: 0.6,
        marginMPa: expect.any(Number),
        evaporationKgM2h: 0.2,
        expectedClosingMs: null,
        probabilityCracking: 0,
      },
      deliveries: [
        {
          channel: 'log',
          recipient: 'log',
          status: 'sent',
          attempts: 1,
          lastAttemptMs: expect.any(Number),
          error: null,
        },
      ],
      acknowledgedAtMs: null,
      acknowledgedBy: null,
    });
  });

  it('answers 404 for an unknown run', async () => {
    const { status, body } = await get('/runs/nope/notices');
    expect(status).toBe(404);
    expect(body.error).toBe('run "nope" does not exist');
  });

  it("pushes each new notice to the run's room as `notice`", async () => {
    const received = await joinRoom();
    notices.onState('run-1', runState({ utilization: 1.1 }));
    await expect.poll(() => received.map((n) => n.level)).toEqual(['CRACKING LIKELY']);
  });
});

describe('POST /api/runs/:id/notices/:noticeId/ack', () => {
  it('records who acknowledged and when, answers the notice and pushes it again', async () => {
    notices.onState('run-1', runState({ utilization: 0.6 }));
    const received = await joinRoom();
    const { status, body } = await post('/runs/run-1/notices/n-run-1-1/ack', { by: 'J. Okafor' });
    expect(status).toBe(200);
    expect(body).toMatchObject({
      id: 'n-run-1-1',
      acknowledgedBy: 'J. Okafor',
      acknowledgedAtMs: expect.any(Number),
    });
    await expect.poll(() => received.map((n) => n.acknowledgedBy)).toEqual(['J. Okafor']);
  });

  it.each([
    {
      path: '/runs/nope/notices/n-run-1-1/ack',
      body: { by: 'x' },
      status: 404,
      error: 'run "nope" does not exist',
    },
    {
      path: '/runs/run-1/notices/n-run-1-9/ack',
      body: { by: 'x' },
      status: 404,
      error: 'notice "n-run-1-9" does not exist in run run-1',
    },
    {
      path: '/runs/run-1/notices/n-run-1-1/ack',
      body: {},
      status: 400,
      issue: 'by is required: got nothing',
    },
    {
      path: '/runs/run-1/notices/n-run-1-1/ack',
      body: { by: '  ' },
      status: 400,
      issue: 'by must be 1 to 100 characters: got "  "',
    },
    {
      path: '/runs/run-1/notices/n-run-1-1/ack',
      body: { by: 'x', note: 'y' },
      status: 400,
      issue: 'configuration has unknown field(s) note',
    },
  ])('answers $status for $path with $body', async ({ path, body, status, error, issue }) => {
    notices.onState('run-1', runState({ utilization: 0.6 }));
    const answer = await post(path, body);
    expect(answer.status).toBe(status);
    if (error !== undefined) expect(answer.body.error).toBe(error);
    if (issue !== undefined) expect(answer.body.issues).toContain(issue);
  });
});
