/** The API with the run routes, a live host on the fake engine, and socket.io, on a free port. */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { Server as SocketServer } from 'socket.io';
import { apiRouter } from '../../server/src/api/apiRouter.ts';
import { errorToHttp } from '../../server/src/api/httpError.ts';
import { attachLiveSocket, pushState } from '../../server/src/api/liveSocket.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import type { CreateRunEngine } from '../../server/src/live/types.ts';
import { LiveHost } from '../../server/src/liveHost/liveHost.ts';
import { RunLifecycle } from '../../server/src/runs/runLifecycle.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS } from '../helpers/exampleRun.ts';
import { createFakeRunEngine } from '../liveHost/_fakeRunEngine.ts';

export interface LiveApiRig {
  base: string;
  archive: Archive;
  host: LiveHost;
  ingestor: Ingestor;
  /** Server time the routes see, ms; tests may move it. */
  clock: { nowMs: number };
  close(): Promise<void>;
}

export async function startLiveApiRig(): Promise<LiveApiRig> {
  const archive = Archive.open(':memory:');
  const clock = { nowMs: EXAMPLE_PLACED_AT_MS };
  const lifecycle = new RunLifecycle(archive, () => clock.nowMs);
  let io: SocketServer | null = null;
  // A run named "broken" gets an engine that cannot start (the 503 path).
  const createEngine: CreateRunEngine = (runId, config, options, snapshot) => {
    if (config.name === 'broken') throw new Error('the model cannot start: no material data');
    return createFakeRunEngine(runId, config, options, snapshot);
  };
  const host = new LiveHost(archive, lifecycle, createEngine, {
    onState: (runId, state) => {
      if (io !== null) pushState(io, runId, state);
    },
  });
  host.start();
  const app = express();
  app.use('/api', apiRouter({ archive, lifecycle, live: host, health: () => ({}) }));
  app.use(errorToHttp({ error: () => {} }));
  const http: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  io = new SocketServer(http, { serveClient: false });
  attachLiveSocket(io, archive, host);
  const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 86_400_000 });
  return {
    base: `http://127.0.0.1:${(http.address() as AddressInfo).port}`,
    archive,
    host,
    ingestor,
    clock,
    async close() {
      await new Promise<void>((resolve) => {
        void io?.close(() => resolve());
        http.closeAllConnections();
      });
      host.close();
      archive.close();
    },
  };
}
