/**
 * The Dockerfile's build and start, exercised as plain shell steps (no Docker engine runs on this
 * machine kind): its COPY sources are copied into an empty folder, its `npm` RUN steps run there,
 * and its CMD starts the server with the Dockerfile's ENV (port and data folder moved to the
 * test's own). This proves the image's production-only install is enough to serve, and, as the
 * compose file's `demo` profile does, to run the simulators from the same image against it.
 * Skipped step: the apt-get RUN line (python3, make, g++ for the native addon), which this
 * machine already has for `npm ci`.
 */
import { execSync, spawn, type ChildProcess } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { freePort } from '../helpers/freePort.ts';

const repo = new URL('../../', import.meta.url);
const dockerfile = readFileSync(new URL('Dockerfile', repo), 'utf8').replace(/\\\n\s*/g, ' ');

let imageDir = '';
let server: ChildProcess | undefined;

afterAll(() => {
  server?.kill('SIGKILL');
  if (imageDir !== '') rmSync(imageDir, { recursive: true, force: true });
});

it(
  'Dockerfile steps install production dependencies and start a serving server',
  { timeout: 600_000 },
  async () => {
    imageDir = mkdtempSync(join(tmpdir(), 'meniscus-image-'));
    const steps = dockerfile.split('\n').filter((line) => /^(COPY|RUN npm|ENV|CMD) /.test(line));
    let environment: Record<string, string> = {};
    let command: string[] = [];
    for (const step of steps) {
      const [instruction = '', ...rest] = step.split(' ');
      if (instruction === 'COPY') {
        const sources = rest.slice(0, -1);
        for (const source of sources)
          cpSync(new URL(source, repo), join(imageDir, source), { recursive: true });
      } else if (instruction === 'RUN') {
        execSync(rest.join(' '), {
          cwd: imageDir,
          stdio: 'ignore',
          env: { ...process.env, CI: 'true' },
        });
      } else if (instruction === 'ENV') {
        for (const pair of rest.join(' ').match(/\w+=\S+/g) ?? []) {
          const [name = '', value = ''] = pair.split('=');
          environment[name] = value;
        }
      } else {
        command = JSON.parse(rest.join(' ')) as string[];
      }
    }
    expect(command[0]).toBe('node');
    const httpPort = await freePort();
    const mqttPort = await freePort();
    environment = {
      ...environment,
      MENISCUS_HTTP_HOST: '127.0.0.1',
      MENISCUS_HTTP_PORT: String(httpPort),
      MENISCUS_MQTT_PORT: String(mqttPort),
      MENISCUS_DATA_DIR: join(imageDir, 'data'),
    };
    server = spawn(process.execPath, command.slice(1), {
      cwd: imageDir,
      env: { PATH: process.env.PATH ?? '', ...environment },
      stdio: 'ignore',
    });
    const health = await (async () => {
      const deadline = Date.now() + 30_000;
      for (;;) {
        try {
          return await fetch(`http://127.0.0.1:${httpPort}/api/health`);
        } catch (error) {
          if (Date.now() > deadline) throw error;
          await new Promise((resolve) => setTimeout(resolve, 200));
        }
      }
    })();
    expect(health.status).toBe(200);
    const body = (await health.json()) as { archive: { ok: boolean } };
    expect(body.archive.ok).toBe(true);
    // the dashboard built by the image's own step, served at /
    const page = await fetch(`http://127.0.0.1:${httpPort}/`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<main id="app"');

    // the demo profile's command, three minutes of event time at 120x
    const simulators = spawn(
      process.execPath,
      [
        'simulators/bin/simulate.js',
        '--url',
        `mqtt://127.0.0.1:${mqttPort}`,
        '--server',
        `http://127.0.0.1:${httpPort}`,
        '--speed',
        '120',
        '--duration-h',
        '0.05',
      ],
      { cwd: imageDir, env: { PATH: process.env.PATH ?? '' }, stdio: ['ignore', 'ignore', 'pipe'] },
    );
    let stderr = '';
    simulators.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    const code = await new Promise<number | null>((resolve) => simulators.on('exit', resolve));
    expect(code, stderr).toBe(0);
    const { runs } = (await (await fetch(`http://127.0.0.1:${httpPort}/api/runs`)).json()) as {
      runs: { id: string; site: string }[];
    };
    const run = runs.find((entry) => entry.site === 'ferngate-deck');
    expect(run).toBeDefined();
    const readings = (await (
      await fetch(`http://127.0.0.1:${httpPort}/api/runs/${run?.id ?? ''}/readings`)
    ).json()) as { count: number };
    expect(readings.count).toBeGreaterThan(0);
  },
);
