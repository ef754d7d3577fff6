/**
 * Test helper: runs the `meniscus` CLI and collects its exit code and output, and writes fixture
 * files to a temporary folder.
 *
 * Two ways to run it: `runCli` spawns the real bin (node + tsx, about 0.4 s of CPU each), for what
 * only a real process shows: the exit code, stdout/stderr separation, the shebang entry point.
 * `callCli` calls the same `main()` the bin calls, in-process with captured output (milliseconds),
 * for the long tables of cases; main.test.ts checks that both give the same answers.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { main } from '../../server/src/cli/main.ts';

const BIN = resolve(import.meta.dirname, '../../server/bin/meniscus.js');

/** What one run of the CLI produced. */
export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/**
 * Runs `node server/bin/meniscus.js ...args` with `cwd` as working directory.
 * Resolves (never rejects) with the exit code and both streams.
 */
export function runCli(args: readonly string[], cwd: string = process.cwd()): Promise<CliRun> {
  return new Promise((done) => {
    execFile(
      process.execPath,
      [BIN, ...args],
      { cwd, encoding: 'utf8', timeout: 20_000, env: { ...process.env, NO_COLOR: '1' } },
      (error, stdout, stderr) => {
        const code = error === null ? 0 : typeof error.code === 'number' ? error.code : Number.NaN;
        done({ code, stdout, stderr });
      },
    );
  });
}

/**
 * Runs the CLI's `main()` in-process with `cwd` as the directory for relative paths, capturing
 * what it writes. Same result shape as {@link runCli}.
 */
export async function callCli(
  args: readonly string[],
  cwd: string = process.cwd(),
): Promise<CliRun> {
  const run: CliRun = { code: Number.NaN, stdout: '', stderr: '' };
  run.code = await main(
    args,
    {
      stdout: (text) => void (run.stdout += text),
      stderr: (text) => void (run.stderr += text),
    },
    { cwd },
  );
  return run;
}

/**
 * Runs the CLI with `--json` appended (by default spawning the bin) and parses stdout; fails
 * loudly when the exit code is not 0 or stdout is not one JSON object.
 */
export async function runCliJson(
  args: readonly string[],
  cwd?: string,
  runner: typeof runCli = runCli,
): Promise<CliRun & { json: Record<string, unknown> }> {
  const run = await runner([...args, '--json'], cwd);
  if (run.code !== 0) throw new Error(`exit ${run.code}: ${run.stderr}`);
  return { ...run, json: JSON.parse(run.stdout) as Record<string, unknown> };
}

/** A temporary folder of fixture files, removed by `remove()`. */
export interface FixtureFolder {
  path: string;
  /** Writes `text` to `name` inside the folder and returns the name. */
  write(name: string, text: string): string;
  remove(): void;
}

/** Creates an empty temporary folder for fixture files. */
export function fixtureFolder(): FixtureFolder {
  const path = mkdtempSync(join(tmpdir(), 'meniscus-cli-'));
  return {
    path,
    write(name, text) {
      writeFileSync(join(path, name), text);
      return name;
    },
    remove() {
      rmSync(path, { recursive: true, force: true });
    },
  };
}

/** Whether `text` is exactly one non-empty line (the one-line error rule). */
export function isOneLine(text: string): boolean {
  return text.trimEnd().length > 0 && !text.trimEnd().includes('\n');
}
