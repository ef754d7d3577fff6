/**
 * Twin experiment through the real ingest path (issue 6): the simulators play level3-topping
 * (hidden truth on a 120-cell grid with hidden parameters, sensor noise, bias, quantisation,
 * dropouts, drifting clocks, a stuck sensor, a silent probe) over MQTT into the composed server
 * (embedded broker, commit before PUBACK, live host, socket.io), as fast as the broker
 * acknowledges (virtual play clock). The states the server pushes over socket.io are compared
 * with the truth on the criteria of the engine's offline twin test
 * (test/live/twinExperiment.test.ts), with its engine options (16 members, 40 cells, no outlook,
 * its seed) so the two are comparable. The prior is the same engine without assimilation, fed the
 * readings the archive committed.
 *
 * Determinism: engines of the same run and options, given the run's record order from the
 * archive (as the host gives it), end in exactly the state the server reached live.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pino } from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunEngineOptions, RunState } from '../../server/src/live/index.ts';
import { seedFromRunId } from '../../server/src/live/seedFromRunId.ts';
import { replayRun } from '../../server/src/liveHost/runFeed.ts';
import { liveReading } from '../../server/src/liveHost/liveReading.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import { virtualClock } from '../../simulators/src/playClock.ts';
import { playScenario } from '../../simulators/src/playScenario.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { connectSocketIo } from '../helpers/socketIoClient.ts';
import type { TestSocket } from '../helpers/socketIoClient.ts';
import { playTwin } from '../live/twinReadings.ts';
import { twinFigures } from '../helpers/twinMetrics.ts';
import type { TwinFigures } from '../helpers/twinMetrics.ts';

const folder = loadScenarioFolder('level3-topping');
/**
 * As the offline twin test (test/live/twinExperiment.test.ts), with its seed (that of its run id)
 * rather than the one of this run's random id: the figures are then reproducible and comparable.
 */
const OPTIONS: RunEngineOptions = {
  memberCount: 16,
  cellCount: 40,
  outlookEveryAnalyses: 1000,
  seed: seedFromRunId('ferngate-l3-twin'),
};

let dataDir: string;
let server: RunningServer;
let socket: TestSocket;
let runId: string;
let figures: TwinFigures;
let finalState: RunState;
let playWallS: number;
let simulated: ReturnType<typeof playTwin>;

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'meniscus-twin-'));
  server = await startServer(
    serverConfigFromEnv({
      MENISCUS_DATA_DIR: dataDir,
      MENISCUS_HTTP_PORT: '0',
      MENISCUS_MQTT_PORT: '0',
    }),
    pino({ level: 'silent' }),
    { engineOptions: OPTIONS },
  );
  const base = `http://127.0.0.1:${server.httpPort}`;
  const created = await fetch(`${base}/api/runs`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(folder.runConfigInput),
  });
  runId = ((await created.json()) as { id: string }).id;
  socket = await connectSocketIo(base, { run: runId });

  const started = performance.now();
  await playScenario({
    scenario: folder.scenario,
    site: folder.runConfig.site,
    url: `mqtt://127.0.0.1:${server.mqttPort}`,
    speed: 120,
    clock: virtualClock(),
    measureLog: 'no-action',
  });
  await server.live.idle();
  playWallS = (performance.now() - started) / 1000;
  finalState = (await (await fetch(`${base}/api/runs/${runId}/state`)).json()) as RunState;

  const pushed = new Map<number, RunState>();
  for (const state of socket.received('state')) {
    if (state?.eventTimeMs != null) pushed.set(state.eventTimeMs, state);
  }
  // The prior: the same engine without assimilation and without the exposure multiplier's random
  // walk (as in the offline twin test), fed what the archive committed in 5 min batches.
  const prior = createRunEngine(runId, folder.runConfig, {
    ...OPTIONS,
    assimilation: false,
    exposureRandomWalkPerSqrtH: 0,
  });
  const priorStates = new Map<number, RunState>();
  const readings = server.archive.readings(runId, { limit: 1_000_000 });
  for (let i = 0; i < readings.length;) {
    const batchEnd = Math.floor((readings[i]?.eventAtMs ?? 0) / 300_000);
    const batch = [];
    while (i < readings.length && Math.floor((readings[i]?.eventAtMs ?? 0) / 300_000) === batchEnd)
      batch.push(liveReading(readings[i++] as (typeof readings)[number]));
    prior.addReadings(batch);
    const state = prior.advance();
    if (state?.eventTimeMs != null) priorStates.set(state.eventTimeMs, state);
  }
  simulated = playTwin(folder.scenario, { logName: 'no-action' });
  figures = twinFigures(simulated.truth, pushed, priorStates);
  console.info(
    `live twin over MQTT: ${readings.length} readings committed, ${pushed.size} states pushed, play + engine ${playWallS.toFixed(1)} s wall; ` +
      `${figures.count} hardening samples, stress RMSE calibrated ${figures.calibratedRmseMPa.toFixed(4)} MPa, prior ${figures.priorRmseMPa.toFixed(4)} MPa, ratio ${figures.rmseRatio.toFixed(3)}, 90 % band coverage ${figures.coverage.toFixed(2)}`,
  );
}, 240_000);

afterAll(async () => {
  socket?.close();
  await server?.close();
  rmSync(dataDir, { recursive: true, force: true });
});

const parameter = (name: string) => finalState.calibration.find((entry) => entry.name === name);

describe('live twin experiment through MQTT, ingest and the live host (level3-topping)', () => {
  it('the archive committed exactly the readings the simulators produced (none lost, none twice)', () => {
    const key = (r: { device: string; sensor: string; eventTimeMs: number; value: number }) =>
      `${r.device}/${r.sensor}@${r.eventTimeMs}=${r.value}`;
    const committed = server.archive
      .readings(runId, { limit: 1_000_000 })
      .map((r) => key(liveReading(r)))
      .sort();
    expect(committed).toEqual(simulated.readings.map(key).sort());
  });

  it('the server pushed states over the hardening phase for at least 40 truth samples', () => {
    expect(figures.count).toBeGreaterThan(40);
  });

  it('calibrated surface-stress RMSE is at most half that of the prior', () => {
    expect(figures.rmseRatio).toBeLessThanOrEqual(0.5);
  });

  it('the 90 % band covers the truth at least 80 % of the time', () => {
    expect(figures.coverage).toBeGreaterThanOrEqual(0.8);
  });

  it('recovers the probe biases within 0.5 %RH (stated tolerance of the offline test, our assumption)', () => {
    for (const probe of folder.scenario.probeStrings) {
      for (const sensor of probe.sensors.filter((s) => s.quantity === 'rh')) {
        const bias = parameter(`rhBias:${probe.device}/${sensor.sensor}`);
        expect(Math.abs((bias?.mean ?? Number.NaN) - sensor.bias / 100)).toBeLessThanOrEqual(0.005);
      }
    }
  });

  it('the exposure and permeability multipliers 90 % intervals hold the hidden 1.1 and 1.3', () => {
    const exposure = parameter('evaporationExposureMultiplier');
    const permeability = parameter('permeabilityMultiplier');
    expect(exposure?.p05).toBeLessThanOrEqual(1.1);
    expect(exposure?.p95).toBeGreaterThanOrEqual(1.1);
    expect(permeability?.p05).toBeLessThanOrEqual(1.3);
    expect(permeability?.p95).toBeGreaterThanOrEqual(1.3);
  });

  it('the last pushed state is the state GET /api/runs/:id/state serves', () => {
    expect(socket.received('state').at(-1)).toEqual(finalState);
  });

  it("determinism: the same run replayed twice from the archive's record order gives the live figures exactly", () => {
    const replays = [1, 2].map(() => {
      const replay = createRunEngine(runId, folder.runConfig, OPTIONS);
      replayRun(server.archive, runId, replay);
      return JSON.parse(JSON.stringify(replay.state())) as RunState;
    });
    expect(replays[0]).toEqual(finalState);
    expect(replays[1]).toEqual(finalState);
    // Two whole replays of the run: 64 s measured on the shared 2-core machine under a load of 6,
    // past the default 30 s; a bound on waiting, not a speed target (bench/ has those).
  }, 180_000);
});
