/** Runs `npm start`'s entry (server/bin/meniscus-server.js) as a child process for fault tests. */
import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { killOnExit } from './killOnExit.ts';

const ENTRY = fileURLToPath(new URL('../../server/bin/meniscus-server.js', import.meta.url));

export interface ServerProcess {
  readonly child: ChildProcess;
  /** Sends `signal` and waits for the exit (SIGKILL after 10 s if it does not exit). */
  kill(signal: NodeJS.Signals): Promise<void>;
}

/** Starts the server with `env` added to the environment; resolves when /api/health answers. */
export async function startServerProcess(
  env: Record<string, string>,
  httpPort: number,
): Promise<ServerProcess> {
  const child = spawn(process.execPath, [ENTRY], {
    env: {
      ...process.env,
      MENISCUS_LOG_LEVEL: 'warn',
      ...env,
      MENISCUS_HTTP_PORT: String(httpPort),
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  killOnExit(child);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const deadline = Date.now() + 20_000;
  for (;;) {
    if (child.exitCode !== null)
      throw new Error(`server exited with ${child.exitCode} while starting`);
    try {
      const response = await fetch(`http://127.0.0.1:${httpPort}/api/health`);
      if (response.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error('server did not answer /api/health within 20 s');
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  return {
    child,
    async kill(signal) {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      // A clean stop that hangs must not hang the test run: SIGKILL after 10 s.
      const fallback = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(fallback);
    },
  };
}
