import type { ChildProcess } from 'node:child_process';

/**
 * Kills `child` when this process exits, so a test run that ends early (a timeout, a failed
 * hook, Ctrl-C) leaves no broker or database behind. Returns the function that unregisters it.
 */
export function killOnExit(child: ChildProcess): () => void {
  const kill = () => {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  };
  process.once('exit', kill);
  child.once('exit', () => process.off('exit', kill));
  return () => process.off('exit', kill);
}

/**
 * Stops `child` with SIGTERM (brokers and databases save their state on it) and resolves when it
 * has exited; resolves at once for null or a child that has already exited.
 */
export async function terminate(child: ChildProcess | null): Promise<void> {
  if (child === null || child.exitCode !== null) return;
  const exited = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  await exited;
}
