/**
 * The live link to one run: socket.io (same origin, path /socket.io), joining the run's room on
 * every (re)connect. socket.io's connection state recovery replays only broadcasts, so after each
 * reconnect the page is told to fetch the state (and what else it shows) over REST again
 * (dependencies.md, server/src/api/liveSocket.ts).
 */
import { io } from 'socket.io-client';
import type { Notice, RunState } from './contract.ts';

/** What the page hears from the link. */
export interface LiveHandlers {
  /** A pushed state (and the state answered to each join). */
  onState(state: RunState): void;
  /** A new or updated crew notice. */
  onNotice(notice: Notice): void;
  /** Connected and joined after a (re)connect: refetch over REST. */
  onJoined(): void;
  /** Connection status in words, for the top bar. */
  onStatus(status: 'live' | 'connecting' | 'reconnecting' | 'offline', detail?: string): void;
}

/** Opens the link; returns a function that closes it. */
export function connectLive(runId: string, handlers: LiveHandlers): () => void {
  const socket = io({ path: '/socket.io', transports: ['websocket', 'polling'] });
  let everConnected = false;
  handlers.onStatus('connecting');
  socket.on('connect', () => {
    socket.emit(
      'join',
      runId,
      (answer: { ok: true; state: RunState | null } | { ok: false; error: string }) => {
        if (!answer.ok) {
          handlers.onStatus('offline', answer.error);
          return;
        }
        handlers.onStatus('live');
        if (answer.state !== null) handlers.onState(answer.state);
        if (everConnected) handlers.onJoined();
        everConnected = true;
      },
    );
  });
  socket.on('disconnect', (reason) => {
    handlers.onStatus('reconnecting');
    // socket.io retries by itself except after the server closed the socket on purpose.
    if (reason === 'io server disconnect') socket.connect();
  });
  socket.on('connect_error', () =>
    handlers.onStatus(everConnected ? 'reconnecting' : 'connecting'),
  );
  socket.on('state', (state: RunState | null) => {
    if (state !== null) handlers.onState(state);
  });
  socket.on('notice', (notice: Notice) => handlers.onNotice(notice));
  return () => {
    socket.close();
  };
}
