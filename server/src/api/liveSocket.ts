/**
 * Live push over socket.io (v4, on the HTTP server, path `/socket.io`). A client joins a run's
 * room with the `join` event (`socket.emit('join', runId, ack)`) or the handshake query
 * `?run=<id>`; it then gets `state` (a RunState) on every update of that run's engine, and
 * `notice` (a crew notice) when one is raised or acknowledged. After a
 * reconnect the client joins again and fetches GET /api/runs/:id/state: connection state
 * recovery replays only broadcasts, not the state (dependencies.md). Documented in README.md.
 */
import type { Server as SocketServer, Socket } from 'socket.io';
import type { Notice } from '../alerts/types.ts';
import type { RunState } from '../live/types.ts';
import type { Archive } from '../store/archive.ts';
import type { LiveStates } from './runRoutes.ts';

/** Room name of a run. */
export function runRoom(runId: string): string {
  return `run:${runId}`;
}

/** Answer of `join`: the run's state now, or an error message. */
export type JoinAck =
  { ok: true; runId: string; state: RunState | null } | { ok: false; error: string };

/**
 * Handles `join` and `leave` on every connection (and `?run=` at the handshake).
 *
 * @param io - the socket.io server
 * @param archive - to check that a run exists
 * @param live - the states to answer a join with
 */
export function attachLiveSocket(io: SocketServer, archive: Archive, live: LiveStates): void {
  const join = (socket: Socket, runId: unknown): JoinAck => {
    if (typeof runId !== 'string' || runId.length === 0 || runId.length > 200)
      return { ok: false, error: 'join needs a run id (a string)' };
    if (archive.getRun(runId) === null)
      return { ok: false, error: `run ${JSON.stringify(runId.slice(0, 80))} does not exist` };
    void socket.join(runRoom(runId));
    return { ok: true, runId, state: live.state(runId) };
  };
  io.on('connection', (socket) => {
    const queried = socket.handshake.query.run;
    if (typeof queried === 'string') {
      const answer = join(socket, queried);
      if (answer.ok) socket.emit('state', answer.state);
      else socket.emit('join-error', answer.error);
    }
    socket.on('join', (runId: unknown, ack?: unknown) => {
      const answer = join(socket, runId);
      if (typeof ack === 'function') (ack as (answer: JoinAck) => void)(answer);
      else if (answer.ok) socket.emit('state', answer.state);
      else socket.emit('join-error', answer.error);
    });
    socket.on('leave', (runId: unknown) => {
      if (typeof runId === 'string') void socket.leave(runRoom(runId));
    });
  });
}

/** Pushes a run's new state to its room. */
export function pushState(io: SocketServer, runId: string, state: RunState): void {
  io.to(runRoom(runId)).emit('state', state);
}

/**
 * Pushes a crew notice (new, or updated by an acknowledgement: same id) to its run's room as
 * the `notice` event.
 */
export function pushNotice(io: SocketServer, notice: Notice): void {
  io.to(runRoom(notice.runId)).emit('notice', notice);
}
