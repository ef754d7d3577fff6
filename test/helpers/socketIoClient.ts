/**
 * A minimal socket.io v4 client over a raw WebSocket, for tests: socket.io-client is not a
 * dependency of the project, and `ws` is (through engine.io). It speaks Engine.IO 4 and
 * Socket.IO 5 packets on the default namespace: open, connect, ping/pong, events, acks.
 */
import WebSocket from 'ws';

export interface TestSocket {
  /** Sends an event; resolves with the ack's first argument. */
  emitWithAck(event: string, ...args: unknown[]): Promise<unknown>;
  emit(event: string, ...args: unknown[]): void;
  /** Resolves with the next `event`'s first argument not yet taken (within `timeoutMs`). */
  next(event: string, timeoutMs?: number): Promise<unknown>;
  /** Every `event` payload received so far. */
  received(event: string): unknown[];
  close(): void;
}

/** Connects to `http://host:port` at path /socket.io with `query`; resolves once connected. */
export async function connectSocketIo(
  baseUrl: string,
  query: Record<string, string> = {},
): Promise<TestSocket> {
  const url = new URL('/socket.io/', baseUrl.replace(/^http/, 'ws'));
  url.searchParams.set('EIO', '4');
  url.searchParams.set('transport', 'websocket');
  for (const [key, value] of Object.entries(query)) url.searchParams.set(key, value);
  const ws = new WebSocket(url);
  const events = new Map<string, unknown[]>();
  /** Payloads not yet taken by next(). */
  const unread = new Map<string, unknown[]>();
  const waiting = new Map<string, ((payload: unknown) => void)[]>();
  const acks = new Map<number, (payload: unknown) => void>();
  let nextAck = 1;
  const connected = new Promise<void>((resolve, reject) => {
    ws.on('error', reject);
    ws.on('message', (data) => {
      const text = String(data);
      if (text.startsWith('0')) ws.send('40');
      else if (text === '2') ws.send('3');
      else if (text.startsWith('40')) resolve();
      else if (text.startsWith('44')) reject(new Error(`socket.io connect refused: ${text}`));
      else if (text.startsWith('42')) {
        const [event, payload] = JSON.parse(text.slice(2).replace(/^\d+/, '')) as [string, unknown];
        const list = events.get(event) ?? [];
        list.push(payload);
        events.set(event, list);
        const waiter = waiting.get(event)?.shift();
        if (waiter !== undefined) waiter(payload);
        else unread.set(event, [...(unread.get(event) ?? []), payload]);
      } else if (text.startsWith('43')) {
        const match = /^43(\d+)(.*)$/s.exec(text);
        if (match !== null) {
          const [payload] = JSON.parse(match[2] ?? '[]') as unknown[];
          acks.get(Number(match[1]))?.(payload);
        }
      }
    });
  });
  await connected;
  return {
    emitWithAck(event, ...args) {
      const id = nextAck++;
      return new Promise((resolve) => {
        acks.set(id, resolve);
        ws.send(`42${id}${JSON.stringify([event, ...args])}`);
      });
    },
    emit(event, ...args) {
      ws.send(`42${JSON.stringify([event, ...args])}`);
    },
    next(event, timeoutMs = 5000) {
      const queued = unread.get(event);
      if (queued !== undefined && queued.length > 0) return Promise.resolve(queued.shift());
      return new Promise((resolve, reject) => {
        const timer = setTimeout(
          () => reject(new Error(`no ${event} within ${timeoutMs} ms`)),
          timeoutMs,
        );
        const list = waiting.get(event) ?? [];
        list.push((payload) => {
          clearTimeout(timer);
          resolve(payload);
        });
        waiting.set(event, list);
      });
    },
    received: (event) => events.get(event) ?? [],
    close: () => ws.close(),
  };
}
