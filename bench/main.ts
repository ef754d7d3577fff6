/**
 * `npm run bench [-- --json] [-- --only NAME]`: runs every suite in bench/suites/ and prints
 * each figure with its baseline and ratio. With --json, one JSON object on stdout:
 * `{ figures: BenchFigure[] }`. Progress goes to stderr.
 *
 * Each suite runs in a process of its own (this script with `--suite FILE`), its figures and
 * their baselines measured in that same process: a suite that ran before in the same process
 * left the engine's shared call sites trained on other inputs (other hydraulics, other
 * surfaces), and the engine's whole-model figure read 29 times the bare solve after the
 * calibration suite against about 20 alone.
 */
import { spawnSync } from 'node:child_process';
import { readdir } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import type { BenchFigure, BenchSuite } from './figure.ts';

const { values } = parseArgs({
  options: {
    json: { type: 'boolean', default: false },
    only: { type: 'string' },
    suite: { type: 'string' },
  },
});

const suitesDir = new URL('./suites/', import.meta.url);

if (values.suite !== undefined) {
  // Child: one suite, its figures as JSON on stdout.
  const suite = (await import(new URL(values.suite, suitesDir).href)) as { default: BenchSuite };
  process.stdout.write(JSON.stringify(await suite.default()));
  process.exit(0);
}

const files = (await readdir(suitesDir))
  .filter((file) => file.endsWith('.ts'))
  .filter((file) => values.only === undefined || file.includes(values.only))
  .sort();

const figures: BenchFigure[] = [];
for (const file of files) {
  process.stderr.write(`bench: ${file}\n`);
  const child = spawnSync(
    process.execPath,
    [...process.execArgv, fileURLToPath(import.meta.url), '--suite', file],
    { stdio: ['ignore', 'pipe', 'inherit'], encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 },
  );
  if (child.status !== 0) {
    process.stderr.write(`bench: ${file} failed (exit ${child.status ?? child.signal})\n`);
    process.exit(1);
  }
  figures.push(...(JSON.parse(child.stdout) as BenchFigure[]));
}

if (values.json) {
  process.stdout.write(`${JSON.stringify({ figures }, null, 2)}\n`);
} else {
  for (const figure of figures) {
    const ratio = figure.ratio === null ? '' : ` ratio ${figure.ratio.toPrecision(3)}`;
    const baseline =
      figure.baseline === null ? '' : ` (baseline ${figure.baseline.toPrecision(4)})`;
    const target =
      figure.target === undefined
        ? ''
        : ` target ${figure.target}: ${figure.met ? 'met' : 'NOT met'}`;
    process.stdout.write(
      `${figure.name}: ${figure.value.toPrecision(4)} ${figure.unit}${baseline}${ratio}${target}\n`,
    );
  }
}
