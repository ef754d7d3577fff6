/**
 * What the browser tests of the dashboard run against, all real: the dashboard built by Vite
 * into a temp folder, the composed server (startServer: embedded broker, SQLite archive, live
 * engines, socket.io) serving it, the demo scenario's run created over the API and its devices
 * played over MQTT on a virtual clock that pauses where a test asks, and Debian's chromium
 * driven by playwright-core.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import type { BrowserContext } from 'playwright-core';
import { build } from 'vite';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import type { RunState } from '../../server/src/live/types.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import { virtualClock } from '../../simulators/src/playClock.ts';
import { playScenario } from '../../simulators/src/playScenario.ts';
import type { PlayResult } from '../../simulators/src/playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { findOrCreateRun } from '../../simulators/src/serverRun.ts';

const VITE_CONFIG = fileURLToPath(new URL('../../web/vite.config.ts', import.meta.url));

/** Chromium flags that work for a fresh headless profile here (dependencies.md). */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/**
 * Builds the dashboard into `outDir` with the project's own Vite config (the same build as
 * `npm run build:web`, only the output folder differs).
 */
export async function buildDashboard(outDir: string): Promise<void> {
  await build({
    configFile: VITE_CONFIG,
    logLevel: 'silent',
    build: { outDir, emptyOutDir: true },
  });
}

/** Launches Debian's chromium headless with a fresh profile in `profileDir`. */
export async function launchChromium(profileDir: string): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profileDir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1280, height: 900 },
  });
}

export interface DashboardRig {
  server: RunningServer;
  baseUrl: string;
  runId: string;
  /** The run page's address. */
  runUrl: string;
  /** Time `HH:MM` of the scenario's day at its own offset, as ms since the epoch. */
  siteTimeMs(hhmm: string): number;
  /**
   * Plays the scenario on until its event time reaches `eventTimeMs`, then holds the devices
   * there; resolves once the server's state has caught up (to within an analysis and a pack).
   */
  playUntil(eventTimeMs: number): Promise<RunState>;
  /** GET a JSON answer of the server's API. */
  apiJson<T>(path: string): Promise<T>;
  browser: BrowserContext;
  close(): Promise<void>;
}

/**
 * How far the state may trail the devices' time once they hold: one analysis interval (300 s,
 * RunEngineOptions default) plus the one-minute packs of the slowest stream.
 */
const STATE_LAG_MS = 2 * 300_000;

/** Starts everything; the play waits for the first playUntil(). */
export async function startDashboardRig(): Promise<DashboardRig> {
  const folder = mkdtempSync(join(tmpdir(), 'meniscus-dashboard-'));
  const webDir = join(folder, 'web');
  await buildDashboard(webDir);
  const server = await startServer(
    serverConfigFromEnv({
      MENISCUS_DATA_DIR: join(folder, 'data'),
      MENISCUS_HTTP_PORT: '0',
      MENISCUS_MQTT_PORT: '0',
      MENISCUS_LOG_LEVEL: 'silent',
    }),
    undefined,
    { webDir },
  );
  const baseUrl = `http://127.0.0.1:${server.httpPort}`;
  const { scenario, runConfig, runConfigInput } = loadScenarioFolder(DEMO_SCENARIO);
  const { runId } = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
  const day = scenario.startAt.slice(0, 10);
  const offset = scenario.startAt.slice(19);
  const siteTimeMs = (hhmm: string) => Date.parse(`${day}T${hhmm}:00${offset}`);

  const apiJson = async <T>(path: string): Promise<T> => {
    const response = await fetch(`${baseUrl}/api${path}`);
    if (!response.ok) throw new Error(`GET ${path}: ${response.status} ${await response.text()}`);
    return (await response.json()) as T;
  };

  // The play holds in onProgress while its event time is at or past the target.
  let targetMs = -Infinity;
  let release: (() => void) | null = null;
  let onReached: ((eventTimeMs: number) => void) | null = null;
  let played: Promise<PlayResult> | null = null;
  const controller = new AbortController();
  const startPlay = () =>
    playScenario({
      scenario,
      site: runConfig.site,
      url: `mqtt://127.0.0.1:${server.mqttPort}`,
      speed: 120,
      clock: virtualClock(),
      signal: controller.signal,
      onProgress: async (eventTimeMs) => {
        if (eventTimeMs < targetMs) return;
        onReached?.(eventTimeMs);
        await new Promise<void>((resolve) => (release = resolve));
      },
    });

  const stateCaughtUp = async (eventTimeMs: number): Promise<RunState> => {
    const deadline = Date.now() + 60_000;
    for (;;) {
      const state = await apiJson<RunState>(`/runs/${runId}/state`);
      if (state.eventTimeMs !== null && state.eventTimeMs >= eventTimeMs - STATE_LAG_MS)
        return state;
      if (Date.now() > deadline)
        throw new Error(
          `the server's state stayed at ${state.eventTimeMs} short of ${eventTimeMs}`,
        );
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  };

  const browser = await launchChromium(join(folder, 'profile'));
  return {
    server,
    baseUrl,
    runId,
    runUrl: `${baseUrl}/runs/${runId}`,
    siteTimeMs,
    async playUntil(eventTimeMs) {
      targetMs = eventTimeMs;
      const reached = new Promise<number>((resolve) => (onReached = resolve));
      if (played === null) played = startPlay();
      else release?.();
      const atMs = await Promise.race([reached, played.then((result) => result.endedAtMs)]);
      return stateCaughtUp(Math.min(atMs, eventTimeMs));
    },
    apiJson,
    browser,
    async close() {
      controller.abort();
      release?.();
      await played?.catch(() => undefined);
      await browser.close();
      await server.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}
