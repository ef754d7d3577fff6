/**
 * `npm run demo` end to end, accelerated: the real server (embedded broker, archive in a temp
 * folder, HTTP on a free port) started from MENISCUS_* variables, the scenario's run created
 * over the HTTP API, three hours of the scenario played with the engine as hidden truth on a
 * virtual clock, readings checked over the API.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import {
  noticeSummary,
  scenarioLocalTime,
  startDemo,
  warningSummary,
} from '../../simulators/src/demo.ts';
import type { DemoRun } from '../../simulators/src/demo.ts';
import { virtualClock } from '../../simulators/src/playClock.ts';
import type { PlayResult } from '../../simulators/src/playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const { runConfig } = loadScenarioFolder(DEMO_SCENARIO);

describe('the demo (server, run over HTTP, scenario on the engine truth)', () => {
  let dataDir: string;
  let demo: DemoRun;
  let result: PlayResult;
  const printed: string[] = [];
  beforeAll(async () => {
    dataDir = mkdtempSync(join(tmpdir(), 'meniscus-demo-'));
    demo = await startDemo({
      config: serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
        MENISCUS_LOG_LEVEL: 'silent',
      }),
      speed: 60,
      durationH: 3,
      clock: virtualClock(),
      print: (line) => printed.push(line),
    });
    result = await demo.played;
  }, 90_000);
  afterAll(async () => {
    await demo.server.close();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('prints the dashboard address of the run and its API', () => {
    expect(printed).toContain(`  dashboard   ${demo.baseUrl}/runs/${demo.runId}`);
    expect(printed.some((line) => line.includes(`/api/runs/${demo.runId}`))).toBe(true);
  });

  it('created the run over the API from run.json', async () => {
    const response = await fetch(`${demo.baseUrl}/api/runs/${demo.runId}`);
    expect(response.status).toBe(200);
    const run = (await response.json()) as { site: string; name: string; placedAt: string };
    expect(run).toMatchObject({
      site: runConfig.site,
      name: runConfig.name,
      placedAt: runConfig.placedAt,
    });
  });

  it('played on the engine truth and every pack reached the archive', async () => {
    expect(result.truthKind).toBe('engine');
    const response = await fetch(`${demo.baseUrl}/api/runs/${demo.runId}/readings`);
    const body = (await response.json()) as {
      count: number;
      readings: { device: string; sensor: string; value: number }[];
    };
    // 3 h at one pack a minute: 181 station packs of 5 readings, about 165 packs per probe string
    expect(body.count).toBeGreaterThan(181 * 5 + 2 * 150 * 3);
    expect(demo.server.ingestor.counters.messages).toBe(result.packsSent);
    const quarantine = (await (
      await fetch(`${demo.baseUrl}/api/runs/${demo.runId}/quarantine`)
    ).json()) as { counts: Record<string, number> };
    expect(quarantine.counts).toEqual({});
    const devices = new Set(body.readings.map((reading) => reading.device));
    expect(devices).toEqual(new Set(['mast-l3', 'probe-c5', 'probe-c7']));
  });

  it("notes when the hidden truth's margin closes without measures (after the dry wind rises at 12:45)", () => {
    const closedAt = demo.truthMarginClosedAtMs();
    expect(closedAt).not.toBeNull();
    expect(closedAt as number).toBeGreaterThan(Date.parse('2026-07-16T12:45:00+02:00'));
    expect(printed.some((line) => line.includes('hidden truth: the margin has closed'))).toBe(true);
  });

  it('the server has a state with numbers for the run', async () => {
    const response = await fetch(`${demo.baseUrl}/api/runs/${demo.runId}/state`);
    expect(response.status).toBe(200);
    const state = (await response.json()) as {
      eventTimeMs: number | null;
      phase: string;
      utilization: number | null;
    };
    expect(state.eventTimeMs).toBeGreaterThan(Date.parse(runConfig.placedAt));
    expect(['plastic', 'hardening']).toContain(state.phase);
    expect(Number.isFinite(state.utilization)).toBe(true);
  });

  it("the server's outlook foresaw the margin closing at least the lead time before the truth's closed", () => {
    const closedAt = demo.truthMarginClosedAtMs() as number;
    const leadMs = runConfig.leadTimeMin * 60_000;
    const warned = demo
      .serverStates()
      .find(
        (sample) =>
          sample.expectedClosingMs !== null &&
          sample.eventTimeMs !== null &&
          sample.eventTimeMs <= closedAt - leadMs,
      );
    expect(warned, JSON.stringify(demo.serverStates())).toBeDefined();
  });

  it("GET /api/runs/:id/notices holds an ACT NOW or CRACKING LIKELY raised (event time) before the truth's margin closed, and the demo printed it", async () => {
    const closedAt = demo.truthMarginClosedAtMs() as number;
    const response = await fetch(`${demo.baseUrl}/api/runs/${demo.runId}/notices`);
    expect(response.status).toBe(200);
    const body = (await response.json()) as {
      runId: string;
      notices: {
        level: string;
        raisedAtMs: number;
        title: string;
        text: string;
        deliveries: { channel: string; recipient: string; status: string }[];
      }[];
    };
    expect(body.runId).toBe(demo.runId);
    const warnings = body.notices.filter(
      (notice) =>
        (notice.level === 'ACT NOW' || notice.level === 'CRACKING LIKELY') &&
        notice.raisedAtMs < closedAt,
    );
    expect(warnings, JSON.stringify(body.notices.map((n) => n.title))).not.toEqual([]);
    const first = warnings.at(-1); // newest first: the last is the earliest
    expect(printed).toContain(
      `  ${scenarioLocalTime(first?.raisedAtMs ?? 0, demo.utcOffsetMin)}  notice  ${first?.title}`,
    );
    expect(first?.text).toContain('Estimates only');
    // sent on the log and through the server's embedded broker to meniscus/<site>/notices
    expect(first?.deliveries).toEqual([
      expect.objectContaining({ channel: 'log', status: 'sent' }),
      expect.objectContaining({
        channel: 'mqtt',
        recipient: `meniscus/${runConfig.site}/notices`,
        status: 'sent',
      }),
    ]);
  });
});

describe('the demo with the measure log "fogging"', () => {
  it("logs the crew's measures as they start and the truth's margin stays open", async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'meniscus-demo-'));
    const printed: string[] = [];
    const demo = await startDemo({
      config: serverConfigFromEnv({
        MENISCUS_DATA_DIR: dataDir,
        MENISCUS_HTTP_PORT: '0',
        MENISCUS_MQTT_PORT: '0',
        MENISCUS_LOG_LEVEL: 'silent',
      }),
      measureLog: 'fogging',
      durationH: 3,
      clock: virtualClock(),
      print: (line) => printed.push(line),
    });
    try {
      await demo.played;
      expect(printed.filter((line) => line.startsWith('  measure '))).toEqual([
        '  measure     fogging from 2026-07-16T12:50:00+02:00 to 2026-07-16T18:00:00+02:00',
        '  measure     windbreak from 2026-07-16T13:00:00+02:00',
      ]);
      expect(demo.truthMarginClosedAtMs()).toBeNull();
      const logged = (await (
        await fetch(`${demo.baseUrl}/api/runs/${demo.runId}/measures`)
      ).json()) as {
        measures: { kind: string; relativeHumidity?: number; windFactor?: number }[];
      };
      expect(logged.measures).toMatchObject([
        { kind: 'fogging', relativeHumidity: 0.95 },
        { kind: 'windbreak', windFactor: 0.4 },
      ]);
      expect(printed.filter((line) => line.includes('did not log the measure'))).toEqual([]);
      // The crew acted on time. Once the measures are logged and the outlook has had a cycle to
      // count them (15 min after the windbreak, our assumption), every warning says they are
      // logged and counted, and none asks again for fogging or a windbreak.
      // Known gap, not asserted away (test/live/foggingOutlook.test.ts holds the figures, as an
      // it.fails): the members' bleed film comes from the prior (median 0.2 kg/m2, against the
      // truth's 0.7) and the probes cannot see a film, so under the fog's remaining evaporation
      // the members' surface suction reaches air entry before set. The margin's ACT NOW is
      // then repeated after the measures (13:40 to 14:10 in each of 8 run ids replayed on the
      // engine alone, test/live/foggingNotices.ts 1-8), and in some run ids (the ensemble's
      // seed follows the random run id; 1 of 4 demo runs on 2 Dec) a CRACKING LIKELY raised
      // before the fogging is repeated within this test's 3 h. Whether no warning follows the
      // measures therefore depends on the run id, and is not asserted here.
      const settledMs = Date.parse('2026-07-16T13:15:00+02:00');
      const summary = demo
        .notices()
        .map((n) => `${new Date(n.raisedAtMs).toISOString()} ${n.title}`)
        .join('\n');
      const warningsAfter = demo
        .notices()
        .filter(
          (n) =>
            n.raisedAtMs >= settledMs &&
            (n.level === 'ACT NOW' || n.level === 'CRACKING LIKELY') &&
            n.conditionKey === 'margin',
        );
      for (const notice of warningsAfter) {
        expect(notice.text, summary).toMatch(/Fogging \(since 12:50.*windbreak \(since 13:00\)/);
        expect(notice.text, summary).toContain('are logged and counted in this forecast');
        expect(notice.text, summary).not.toContain('fog the air just above the surface');
        expect(notice.text, summary).not.toMatch(/put up windbreaks/);
      }
    } finally {
      await demo.server.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  }, 90_000);
});

describe('scripts/demo.js', () => {
  it('exits 2 with a one-line message for a speed out of range, before starting anything', async () => {
    const child = spawn(
      process.execPath,
      [fileURLToPath(new URL('../../scripts/demo.js', import.meta.url)), '--speed', '500'],
      {
        stdio: ['ignore', 'pipe', 'pipe'],
      },
    );
    let stderr = '';
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
    expect(code).toBe(2);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).toContain('must be between 1 and 120 (times real time): got 500');
  });
});

describe('warningSummary()', () => {
  const at = (time: string) => Date.parse(`2026-07-16T${time}:00+02:00`);
  it.each([
    {
      truth: at('13:17'),
      states: [
        {
          polledAtMs: at('11:20'),
          eventTimeMs: at('11:10'),
          phase: 'plastic',
          utilization: 0,
          expectedClosingMs: null,
        },
        {
          polledAtMs: at('11:30'),
          eventTimeMs: at('11:25'),
          phase: 'plastic',
          utilization: 0,
          expectedClosingMs: at('13:31'),
        },
      ],
      expected:
        "Warning check: the hidden truth's margin closed at 13:17; the server first expected closing at 13:31, saying so at 11:25.",
    },
    {
      truth: null,
      states: [],
      expected:
        'Warning check: the hidden truth kept its margin; the server never expected it to close.',
    },
  ])('$expected', ({ truth, states, expected }) => {
    expect(warningSummary(truth, states, 120)).toBe(expected);
  });
});

describe('noticeSummary()', () => {
  const at = (time: string) => Date.parse(`2026-07-16T${time}:00+02:00`);
  it.each([
    {
      truth: at('13:17'),
      notices: [
        { level: 'PREPARE' as const, raisedAtMs: at('11:20') },
        { level: 'ACT NOW' as const, raisedAtMs: at('12:20') },
        { level: 'CRACKING LIKELY' as const, raisedAtMs: at('12:55') },
      ],
      expected:
        "Crew notices: 1 PREPARE, 1 ACT NOW, 1 CRACKING LIKELY; the first ACT NOW at 12:20, 57 min before the hidden truth's margin closed.",
    },
    {
      truth: null,
      notices: [{ level: 'NOTE' as const, raisedAtMs: at('16:30') }],
      expected: 'Crew notices: 1 NOTE; no ACT NOW or CRACKING LIKELY.',
    },
    { truth: null, notices: [], expected: 'Crew notices: none; no ACT NOW or CRACKING LIKELY.' },
  ])('$expected', ({ truth, notices, expected }) => {
    expect(noticeSummary(truth, notices, 120)).toBe(expected);
  });
});
