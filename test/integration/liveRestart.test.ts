/**
 * Restart (issue 6): the `npm start` server (a child process, embedded broker, default engine
 * options) takes level3-topping from the simulators over MQTT; once its engine has saved
 * snapshots it is killed with SIGKILL in the middle of the play, restarted on the same data
 * folder on the same ports, while the simulators play on (their unacknowledged publishes go out
 * again to the restarted broker). The restarted server resumes from its last snapshot and
 * replays the records since; its state must equal that of an uninterrupted twin: an engine of
 * the same run (same id, so the same seed) given the archive's record order (each message's
 * readings, then an advance), as the host gives it (server/src/liveHost/runFeed.ts).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunState } from '../../server/src/live/index.ts';
import { replayRun } from '../../server/src/liveHost/runFeed.ts';
import { ARCHIVE_FILE } from '../../server/src/server.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { virtualClock } from '../../simulators/src/playClock.ts';
import { playScenario } from '../../simulators/src/playScenario.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { freePort } from '../helpers/freePort.ts';
import { playTwin } from '../live/twinReadings.ts';
import { startServerProcess } from '../helpers/serverProcess.ts';
import type { ServerProcess } from '../helpers/serverProcess.ts';

const RUN_ID = 'ferngate-l3-restart';
const folder = loadScenarioFolder('level3-topping');
const dirs: string[] = [];
const servers: ServerProcess[] = [];
afterAll(async () => {
  for (const server of servers) await server.kill('SIGKILL');
  dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true }));
});

interface LiveHealth {
  runs: number;
  pending: number;
  readingsFed: number;
  advances: number;
  snapshots: number;
  errors: number;
}

async function liveHealth(base: string): Promise<LiveHealth> {
  const health = (await (await fetch(`${base}/api/health`)).json()) as { live: LiveHealth };
  return health.live;
}

/** Polls /api/health until `done` holds (the host answers between runs' work). */
async function waitFor(
  base: string,
  done: (live: LiveHealth) => boolean,
  timeoutMs = 120_000,
): Promise<LiveHealth> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const live = await liveHealth(base);
    if (done(live)) return live;
    if (Date.now() > deadline)
      throw new Error(`live host never got there: ${JSON.stringify(live)}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

const play = (mqttPort: number, durationH: number) =>
  playScenario({
    scenario: folder.scenario,
    site: folder.runConfig.site,
    url: `mqtt://127.0.0.1:${mqttPort}`,
    speed: 120,
    clock: virtualClock(),
    measureLog: 'no-action',
    durationH,
  });

it(
  'killed mid-run and restarted, the server ends in the state of an uninterrupted twin',
  { timeout: 240_000 },
  async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-live-restart-'));
    dirs.push(dataDir);
    const setup = Archive.open(join(dataDir, ARCHIVE_FILE));
    setup.createRun(folder.runConfig, Date.now(), RUN_ID);
    setup.close();
    const httpPort = await freePort();
    const mqttPort = await freePort();
    const env = { MENISCUS_DATA_DIR: dataDir, MENISCUS_MQTT_PORT: String(mqttPort) };
    const base = `http://127.0.0.1:${httpPort}`;

    const first = await startServerProcess(env, httpPort);
    servers.push(first);
    // The devices keep publishing through the kill: their QoS 1 publishes wait for the
    // restarted server's broker on the same port and go out again after reconnecting.
    const playing = play(mqttPort, 6);
    const beforeKill = await waitFor(base, (live) => live.snapshots >= 3);
    await first.kill('SIGKILL');
    const second = await startServerProcess(env, httpPort);
    servers.push(second);
    const played = await playing;
    const settled = await waitFor(base, (live) => live.pending === 0 && live.advances > 0);
    const served = (await (await fetch(`${base}/api/runs/${RUN_ID}/state`)).json()) as RunState;
    await second.kill('SIGTERM');

    const archive = Archive.open(join(dataDir, ARCHIVE_FILE));
    const readings = archive.runReadingsAfter(RUN_ID, 0, 1_000_000);
    const twin = createRunEngine(RUN_ID, folder.runConfig);
    replayRun(archive, RUN_ID, twin);
    archive.close();
    const twinState = JSON.parse(JSON.stringify(twin.state())) as RunState;
    console.info(
      `live restart: killed at ${beforeKill.snapshots} snapshots (${beforeKill.readingsFed} readings fed) while the simulators played on; the restarted host fed ${settled.readingsFed} of ${readings.length} readings (${played.packsSent} packs sent); state at ${new Date(served.eventTimeMs ?? 0).toISOString()}`,
    );

    // Nothing the simulators sent was lost across the kill, nothing stored twice.
    expect(readings.length).toBe(
      playTwin(folder.scenario, { logName: 'no-action', durationH: 6 }).readings.length,
    );
    // It resumed from a snapshot: it did not replay the whole run.
    expect(settled.readingsFed).toBeLessThan(readings.length);
    expect(served.eventTimeMs).toBeGreaterThan(Date.parse('2026-07-16T16:30:00+02:00'));
    expect(served.surfaceStressMPa).not.toBeNull();
    expect(served.outlook?.horizonH).toBe(6);
    expect(served).toEqual(twinState);
  },
);
