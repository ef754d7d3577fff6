#!/usr/bin/env node
// Builds the dashboard (web/ -> web/dist) when the build is missing or older than any file of
// web/ (sources, index.html, vite config), so `npm start` and `npm run demo` always serve the
// current dashboard without rebuilding on every start. `--force` builds regardless.
// Runs before `npm start` and `npm run demo` (package.json prestart/predemo); the Dockerfile
// builds with `npm run build:web` instead.
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const webDir = fileURLToPath(new URL('../web/', import.meta.url));
const builtIndex = join(webDir, 'dist', 'index.html');

/** Newest modification time of the files under `dir`, skipping dist/. */
function newestSourceMs(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'dist' || entry.name === 'node_modules') continue;
    const path = join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestSourceMs(path) : statSync(path).mtimeMs);
  }
  return newest;
}

function builtMs() {
  try {
    return statSync(builtIndex).mtimeMs;
  } catch {
    return null;
  }
}

const built = builtMs();
const force = process.argv.includes('--force');
if (!force && built !== null && built >= newestSourceMs(webDir)) {
  process.exit(0);
}
console.log(
  built === null
    ? 'Building the dashboard (web/dist is missing)...'
    : 'Rebuilding the dashboard (web/ changed)...',
);
const { build } = await import('vite');
await build({ configFile: join(webDir, 'vite.config.ts'), logLevel: 'warn' });
console.log('Dashboard built into web/dist.');
