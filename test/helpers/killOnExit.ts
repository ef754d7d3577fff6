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
