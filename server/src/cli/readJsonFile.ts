/**
 * Reading a JSON file named by a flag and checking its shape with a zod schema. Missing files,
 * text that is not JSON and content that breaks the schema become one-line `UsageError`s naming
 * the flag and the path.
 */
import type { z } from 'zod';
import { readFileArgument } from './readFileArgument.ts';
import { oneLine, UsageError } from './usageError.ts';

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

/**
 * Checks parsed JSON against a zod schema and returns the typed value.
 * @throws UsageError naming the first offending field:
 *   `--psd psd.json field lognormal[0].geometricSd: <the schema's message>`
 */
export function checkJsonShape<Schema extends z.ZodType>(
  flag: string,
  path: string,
  value: unknown,
  schema: Schema,
): z.output<Schema> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const field = (issue?.path ?? [])
    .map((key, index) =>
      typeof key === 'number' ? `[${key}]` : `${index === 0 ? '' : '.'}${String(key)}`,
    )
    .join('');
  const where = field === '' ? `${flag} ${path}` : `${flag} ${path} field ${field}`;
  throw new UsageError(where, `is invalid (${oneLine(issue?.message ?? 'wrong shape')})`);
}
