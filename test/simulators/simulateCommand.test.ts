/**
 * The simulators' own command against the real ingest (embedded broker, archive on disk), at
 * 120x on the real clock for three minutes of event time, with the hostile set sent first; and
 * with `--server` against the real server started in-process (embedded broker, archive in a temp
 * folder, HTTP on a free port) as the demo's tests start it.
 */
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import { hostilePayloads } from '../../simulators/src/hostilePayloads.ts';
import { loadScenarioFolder, SCENARIOS_DIR } from '../../simulators/src/scenarioFolder.ts';
import { DEMO_CREW } from '../../simulators/src/serverRun.ts';
import { parsePasswords, simulateMain } from '../../simulators/src/simulateCommand.ts';
import { startScenarioRig } from './_scenarioRig.ts';
import type { ScenarioRig } from './_scenarioRig.ts';

const { runConfig, runConfigInput } = loadScenarioFolder('level3-topping');

describe('simulateMain()', () => {
  let rig: ScenarioRig;
  beforeAll(async () => {
    rig = await startScenarioRig(runConfigInput);
  });
  afterAll(async () => {
    await rig.dispose();
  });

  it('plays at 120x on the real clock and the hostile set lands in quarantine by reason', async () => {
    const wallStart = performance.now();
    const code = await simulateMain([
      '--url',
      rig.url,
      '--speed',
      '120',
      '--duration-h',
      '0.05',
      '--hostile',
      '--stand-in-truth',
    ]);
    const wallS = (performance.now() - wallStart) / 1000;
    expect(code).toBe(0);
    // 3 min of event time at 120x is 1.5 s of wall time (plus connecting)
    expect(wallS).toBeGreaterThan(1.4);
    expect(wallS).toBeLessThan(10);
    expect(rig.archive.readings(rig.runId).length).toBeGreaterThan(0);
    const expected: Record<string, number> = {};
    for (const hostile of hostilePayloads('t-05'))
      expected[hostile.reason] = (expected[hostile.reason] ?? 0) + 1;
    // hostile payloads are stamped at the scenario's start; `time-in-future` is stamped a day ahead
    expect(rig.archive.quarantineCounts(rig.runId)).toEqual(expected);
  });

  it.each([
    [['--speed', '121'], 2],
    [['--duration-h', '0'], 2],
    [['--scenario', 'no-such-scenario'], 2],
    [['--server', 'ftp://site-box:8080'], 2],
    [['--server', 'site-box:8080'], 2],
    [['--server', 'not a url'], 2],
  ])('%j exits %d', async (argv, code) => {
    expect(await simulateMain(argv)).toBe(code);
  });
});

describe('simulateMain() --server', () => {
  let dataDir: string;
  let scenarioDir: string;
  let server: RunningServer;
  let baseUrl: string;
  let mqttUrl: string;
  beforeAll(async () => {
    dataDir = mkdtempSync(join(tmpdir(), 'meniscus-sim-server-'));
    // the shipped scenario with its "fogging" log moved into the first three minutes of event time
    scenarioDir = join(dataDir, 'level3-early-measures');
    cpSync(join(SCENARIOS_DIR, 'level3-topping'), scenarioDir, { recursive: true });
    const file = join(scenarioDir, 'scenario.json');
    const scenario = JSON.parse(readFileSync(file, 'utf8')) as {
      measureLogs: Record<string, { startAt: string; endAt?: string }[]>;
    };
    const [fogging, windbreak] = scenario.measureLogs.fogging ?? [];
    if (fogging === undefined || windbreak === undefined) throw new Error('fogging log changed');
    fogging.startAt = '2026-07-16T11:01:00+02:00';
    fogging.endAt = '2026-07-16T11:30:00+02:00';
    windbreak.startAt = '2026-07-16T11:02:00+02:00';
    writeFileSync(file, JSON.stringify(scenario));
    server = await startServer(
      serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_HOST: '127.0.0.1',
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
        MENISCUS_LOG_LEVEL: 'silent',
      }),
    );
    baseUrl = `http://127.0.0.1:${server.httpPort}`;
    mqttUrl = `mqtt://127.0.0.1:${server.mqttPort}`;
  });
  afterAll(async () => {
    await server.close();
    rmSync(dataDir, { recursive: true, force: true });
  });

  const play = () =>
    simulateMain([
      '--url',
      mqttUrl,
      '--server',
      `${baseUrl}/`,
      '--scenario',
      scenarioDir,
      '--measures',
      'fogging',
      '--speed',
      '120',
      '--duration-h',
      '0.05',
      '--stand-in-truth',
    ]);
  const scenarioRuns = async () => {
    const { runs } = (await (await fetch(`${baseUrl}/api/runs`)).json()) as {
      runs: { id: string; site: string; name: string }[];
    };
    return runs.filter((run) => run.site === runConfig.site && run.name === runConfig.name);
  };

  it("creates the scenario's run, plays into it and logs the crew's measures as they start", async () => {
    expect(await scenarioRuns()).toEqual([]);
    expect(await play()).toBe(0);
    const runs = await scenarioRuns();
    expect(runs).toHaveLength(1);
    const runId = runs[0]?.id ?? '';
    const readings = (await (await fetch(`${baseUrl}/api/runs/${runId}/readings`)).json()) as {
      count: number;
      readings: { device: string }[];
    };
    expect(readings.count).toBeGreaterThan(0);
    // three minutes of event time: the station's packs, one a minute (the probes send less often)
    expect(readings.readings.map((reading) => reading.device)).toContain('mast-l3');
    const logged = (await (await fetch(`${baseUrl}/api/runs/${runId}/measures`)).json()) as {
      measures: { kind: string; loggedBy: string }[];
    };
    expect(logged.measures).toMatchObject([
      { kind: 'fogging', relativeHumidity: 0.95, loggedBy: DEMO_CREW },
      { kind: 'windbreak', windFactor: 0.4, loggedBy: DEMO_CREW },
    ]);
  });

  it('a second play finds the open run instead of creating another', async () => {
    const before = await scenarioRuns();
    expect(await play()).toBe(0);
    expect(await scenarioRuns()).toEqual(before);
  });
});

describe('parsePasswords()', () => {
  it('reads device:password lines, skipping blanks and comments', () => {
    expect(parsePasswords('# site box\nprobe-c5:s3cret:with:colons\n\nmast-l3:pw\n')).toEqual(
      new Map([
        ['probe-c5', 's3cret:with:colons'],
        ['mast-l3', 'pw'],
      ]),
    );
  });
  it('names a line that is not device:password', () => {
    expect(() => parsePasswords('probe-c5\n')).toThrow(
      'passwords line 1 must be device:password: got "probe-c5"',
    );
  });
});
