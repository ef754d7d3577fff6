/**
 * Test helper: runs the real `meniscus` bin in a child process and collects its exit code and
 * output, and writes fixture files to a temporary folder.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

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

/** Runs the CLI with `--json` appended and parses stdout; fails loudly when it is not JSON. */
export async function runCliJson(
  args: readonly string[],
  cwd?: string,
): Promise<CliRun & { json: Record<string, unknown> }> {
  const run = await runCli([...args, '--json'], cwd);
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
