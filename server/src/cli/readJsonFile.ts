/**
 * Reading a JSON file named by a flag. Missing files and text that is not JSON become one-line
 * `UsageError`s naming the flag and the path; the shape is checked by the caller's schema.
 */
import { readFileArgument } from './readFileArgument.ts';
import { UsageError } from './usageError.ts';

/**
 * Reads and parses a JSON file.
 * @throws UsageError `--psd must name an existing file: got psd.json`, or
 *   `--psd psd.json is not valid JSON (Unexpected token ...)`
 */
export function readJsonFile(flag: string, path: string, cwd: string): unknown {
  const text = readFileArgument(flag, path, cwd);
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new UsageError(
      `${flag} ${path}`,
      `is not valid JSON (${(error as Error).message})`,
      undefined,
      {
        cause: error,
      },
    );
  }
}
