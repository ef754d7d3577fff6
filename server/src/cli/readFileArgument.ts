/**
 * Reading the text of a file named by a flag, turning file-system failures into one-line
 * `UsageError`s that name the flag and the path.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { UsageError } from './usageError.ts';

/**
 * Reads a UTF-8 text file named by a flag.
 *
 * @param flag the flag that named the file, e.g. `--csv`
 * @param path the path as typed; relative paths are resolved against `cwd`
 * @param cwd directory for relative paths
 * @throws UsageError `--csv must name an existing file: got missing.csv` (also for a directory
 *   or an unreadable file)
 */
export function readFileArgument(flag: string, path: string, cwd: string): string {
  try {
    return readFileSync(resolve(cwd, path), 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const rule =
      code === 'ENOENT'
        ? 'must name an existing file'
        : code === 'EISDIR'
          ? 'must name a file, not a directory'
          : `must name a readable file (${code ?? 'read failed'})`;
    throw new UsageError(flag, rule, path, { cause: error });
  }
}
