#!/usr/bin/env node
// Makes sure the Debian packages the tests need are installed before the tests start.
// As root (or with passwordless sudo) it installs what is missing with apt-get; otherwise it
// stops at once and prints the single command that installs them.
// The list lives in scripts/system-packages.json: { packages: [{ name, proves }] }, where
// `proves` is a file the package installs (an executable), checked with fs.existsSync.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';

const listUrl = new URL('./system-packages.json', import.meta.url);
const { packages } = JSON.parse(readFileSync(listUrl, 'utf8'));
const missing = packages.filter((pkg) => !existsSync(pkg.proves)).map((pkg) => pkg.name);

if (missing.length === 0) process.exit(0);

const installCommand = `apt-get update && apt-get install -y --no-install-recommends ${missing.join(' ')}`;
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const canSudo = !isRoot && spawnSync('sudo', ['-n', 'true'], { stdio: 'ignore' }).status === 0;

if (!isRoot && !canSudo) {
  console.error(`The tests need these Debian packages: ${missing.join(', ')}. Install them with:`);
  console.error(`  sudo sh -c '${installCommand}'`);
  process.exit(1);
}

console.error(`Installing Debian packages the tests need: ${missing.join(', ')}`);
const [command, args] = isRoot
  ? ['sh', ['-c', installCommand]]
  : ['sudo', ['-n', 'sh', '-c', installCommand]];
const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
try {
  execFileSync(command, args, { stdio: ['ignore', 'inherit', 'inherit'], env });
} catch {
  console.error(
    `Installing failed. Run this yourself, then npm test again:\n  sudo sh -c '${installCommand}'`,
  );
  process.exit(1);
}
const stillMissing = packages.filter((pkg) => !existsSync(pkg.proves)).map((pkg) => pkg.name);
if (stillMissing.length > 0) {
  console.error(`Still missing after apt-get: ${stillMissing.join(', ')}`);
  process.exit(1);
}
