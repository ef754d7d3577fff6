/**
 * `npm run bench [-- --json] [-- --only NAME]`: runs every suite in bench/suites/ and prints
 * each figure with its baseline and ratio. With --json, one JSON object on stdout:
 * `{ figures: BenchFigure[] }`. Progress goes to stderr.
 */
import { readdir } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import type { BenchFigure, BenchSuite } from './figure.ts';

const { values } = parseArgs({
  options: { json: { type: 'boolean', default: false }, only: { type: 'string' } },
});

const suitesDir = new URL('./suites/', import.meta.url);
const files = (await readdir(suitesDir))
  .filter((file) => file.endsWith('.ts'))
  .filter((file) => values.only === undefined || file.includes(values.only))
  .sort();

const figures: BenchFigure[] = [];
for (const file of files) {
  process.stderr.write(`bench: ${file}\n`);
  const suite = (await import(new URL(file, suitesDir).href)) as { default: BenchSuite };
  figures.push(...(await suite.default()));
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
