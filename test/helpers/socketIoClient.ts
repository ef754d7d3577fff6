/**
 * A typed socket.io-client for the live-push tests: the real client (websocket transport, no
 * reconnection) with the events of server/src/api/liveSocket.ts, and a recorder of every event
 * the server sent, so a test can await the next `state` or check that none arrived.
 */
import { io } from 'socket.io-client';
import type { Socket } from 'socket.io-client';
import type { JoinAck } from '../../server/src/api/liveSocket.ts';
import type { RunState } from '../../server/src/live/types.ts';

/** Server -> client events (server/src/api/README.md). */
export interface LiveServerEvents {
  /** The run's state on every update of its engine (null before its first analysis). */
  state: (state: RunState | null) => void;
  /** Message for a `join` without ack or a `?run=` naming an unknown run. */
  'join-error': (message: string) => void;
}

/** Client -> server events (server/src/api/README.md). */
export interface LiveClientEvents {
  /** Joins the run's room; the ack answers with the state now or an error. */
  join: (runId: string, ack: (answer: JoinAck) => void) => void;
  leave: (runId: string) => void;
}

export type LiveSocket = Socket<LiveServerEvents, LiveClientEvents>;

type Payload<E extends keyof LiveServerEvents> = Parameters<LiveServerEvents[E]>[0];

export interface TestSocket {
  /** The socket.io-client socket (emit, emitWithAck, on). */
  readonly socket: LiveSocket;
  /** Resolves with the next `event`'s payload not yet taken; rejects after `timeoutMs`. */
  next<E extends keyof LiveServerEvents>(event: E, timeoutMs?: number): Promise<Payload<E>>;
  /** Every `event` payload received so far, in order. */
  received<E extends keyof LiveServerEvents>(event: E): Payload<E>[];
  close(): void;
}

/**
 * Connects socket.io-client to `baseUrl` (path /socket.io, default namespace) with `query`
 * (e.g. `{ run: id }` joins at the handshake); resolves once connected, rejects on a connect
 * error. Events are recorded from before the handshake, so a `state` sent at once is kept.
 *
 * @param baseUrl - `http://host:port` of the server
 * @param query - handshake query, default none
 */
export async function connectSocketIo(
  baseUrl: string,
  query: Record<string, string> = {},
): Promise<TestSocket> {
  const socket: LiveSocket = io(baseUrl, {
    transports: ['websocket'],
    reconnection: false,
    // Each test client is its own connection (no multiplexing over a cached Manager).
    forceNew: true,
    query,
  });
  const events = new Map<string, unknown[]>();
  /** Payloads not yet taken by next(). */
  const unread = new Map<string, unknown[]>();
  const waiting = new Map<string, ((payload: unknown) => void)[]>();
  socket.onAny((event: string, payload: unknown) => {
    events.set(event, [...(events.get(event) ?? []), payload]);
    const waiter = waiting.get(event)?.shift();
    if (waiter !== undefined) waiter(payload);
    else unread.set(event, [...(unread.get(event) ?? []), payload]);
  });
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', (error) => {
      socket.disconnect();
      reject(error);
    });
  });
  return {
    socket,
    next(event, timeoutMs = 5000) {
      const queued = unread.get(event);
      if (queued !== undefined && queued.length > 0)
        return Promise.resolve(queued.shift() as Payload<typeof event>);
      return new Promise((resolve, reject) => {
        const timer = setTimeout(
          () => reject(new Error(`no ${event} within ${timeoutMs} ms`)),
          timeoutMs,
        );
        waiting.set(event, [
          ...(waiting.get(event) ?? []),
          (payload) => {
            clearTimeout(timer);
            resolve(payload as Payload<typeof event>);
          },
        ]);
      });
    },
    received: (event) => (events.get(event) ?? []) as Payload<typeof event>[],
    close: () => void socket.disconnect(),
  };
}
