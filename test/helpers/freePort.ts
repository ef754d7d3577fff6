import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';

/**
 * A TCP port on 127.0.0.1 that was free a moment ago (the OS picks it): for a server to listen
 * on, or, where nothing is started on it, an address that refuses connections.
 */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', resolve);
  });
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/** Resolves when something accepts TCP connections on `port`, or rejects after `timeoutMs`. */
export async function waitForPort(port: number, timeoutMs = 10_000): Promise<void> {
  const { connect } = await import('node:net');
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const ok = await new Promise<boolean>((resolve) => {
      const socket = connect(port, '127.0.0.1');
      socket.once('connect', () => {
        socket.destroy();
        resolve(true);
      });
      socket.once('error', () => resolve(false));
    });
    if (ok) return;
    if (Date.now() > deadline)
      throw new Error(`nothing listens on port ${port} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
}
