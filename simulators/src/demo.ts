/**
 * `npm run demo`: starts the server (embedded broker and archive, or whatever the MENISCUS_*
 * variables configure, exactly as `npm start`), creates the demo scenario's run over the HTTP
 * API, plays the scenario with the engine as hidden truth, logs the crew's measures over the
 * API as they start, and prints the dashboard URL. The server keeps serving after the play
 * until Ctrl-C.
 */
import type { ServerConfig } from '../../server/src/config/index.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import type { PlayClock } from './playClock.ts';
import { checkSpeed } from './playClock.ts';
import { playScenario } from './playScenario.ts';
import type { PlayResult } from './playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from './scenarioFolder.ts';
import { utcOffsetMin } from './scenarioSchema.ts';
import type { ScenarioMeasure } from './scenarioSchema.ts';

export interface DemoOptions {
  /** Server configuration (serverConfigFromEnv(process.env) for `npm run demo`). */
  config: ServerConfig;
  /** Scenario name or folder: level3-topping. */
  scenario?: string;
  /** Event time per wall time: 60. */
  speed?: number;
  /** Measure log to play: the scenario's default (`no-action`). */
  measureLog?: string;
  /** Hours of event time to play: the whole scenario. */
  durationH?: number;
  /** Wall clock (tests pass a virtual one). */
  clock?: PlayClock;
  /** Where progress lines go: console.log. */
  print?: (line: string) => void;
  signal?: AbortSignal;
}

export interface DemoRun {
  server: RunningServer;
  /** Base URL of the HTTP server, e.g. http://127.0.0.1:8080. */
  baseUrl: string;
  runId: string;
  /** Resolves when the scenario has played (or was stopped). */
  played: Promise<PlayResult>;
  /**
   * Event time the hidden truth's margin first closed (its utilization reached 1), ms; null so
   * far. For judging the server's warning against what really happened.
   */
  truthMarginClosedAtMs(): number | null;
}

/** `2026-07-16 13:30` in the scenario's local time (its UTC offset). */
export function scenarioLocalTime(timeMs: number, offsetMin: number): string {
  return new Date(timeMs + offsetMin * 60_000).toISOString().slice(0, 16).replace('T', ' ');
}

/** The host a browser on this machine uses for a bind address. */
function reachableHost(bindHost: string): string {
  return bindHost === '0.0.0.0' || bindHost === '::' ? '127.0.0.1' : bindHost;
}

async function api(baseUrl: string, path: string, init: RequestInit = {}): Promise<Response> {
  return fetch(`${baseUrl}/api${path}`, {
    ...init,
    headers: { 'content-type': 'application/json', accept: 'application/json' },
  });
}

/** Starts the server, creates (or finds) the run and starts the play; see the file comment. */
export async function startDemo(options: DemoOptions): Promise<DemoRun> {
  const print = options.print ?? ((line: string) => console.log(line));
  const speed = checkSpeed(options.speed ?? 60);
  const { scenario, runConfig, runConfigInput } = loadScenarioFolder(
    options.scenario ?? DEMO_SCENARIO,
  );
  const measureLog = options.measureLog ?? scenario.defaultMeasureLog;
  if (!Object.hasOwn(scenario.measureLogs, measureLog)) {
    throw new RangeError(
      `measure log must be one of ${Object.keys(scenario.measureLogs).join(', ')}: got ${JSON.stringify(measureLog)}`,
    );
  }
  const server = await startServer(options.config);
  const baseUrl = `http://${reachableHost(options.config.httpHost)}:${server.httpPort}`;
  try {
    const listed = (await (await api(baseUrl, '/runs')).json()) as {
      runs: { id: string; site: string; name: string; placedAt: string; closedAt: string | null }[];
    };
    const existing = listed.runs.find(
      (run) =>
        run.site === runConfig.site &&
        run.name === runConfig.name &&
        Date.parse(run.placedAt) === Date.parse(runConfig.placedAt) &&
        run.closedAt === null,
    );
    let runId: string;
    if (existing !== undefined) {
      runId = existing.id;
      print(
        `Run ${runId} of this scenario is already in the archive: playing into it (readings already stored are kept once).`,
      );
    } else {
      const created = await api(baseUrl, '/runs', {
        method: 'POST',
        body: JSON.stringify(runConfigInput),
      });
      const body = (await created.json()) as { id?: string; error?: unknown };
      if (created.status !== 201 || body.id === undefined) {
        throw new Error(`creating the run failed: HTTP ${created.status} ${JSON.stringify(body)}`);
      }
      runId = body.id;
    }
    const mqttUrl =
      options.config.mqtt.mode === 'embedded'
        ? `mqtt://${reachableHost(options.config.mqtt.host)}:${server.mqttPort}`
        : options.config.mqtt.url;
    const durationH = options.durationH ?? scenario.durationH;
    print(`Meniscus demo: ${runConfig.name ?? scenario.name}`);
    print(`  dashboard   ${baseUrl}/`);
    print(
      `  run         ${baseUrl}/api/runs/${runId}   (state: ${baseUrl}/api/runs/${runId}/state)`,
    );
    print(`  devices     ${mqttUrl}, site ${runConfig.site}`);
    print(
      `  playing     ${durationH} h of event time at ${speed}x (${Math.round((durationH * 60) / speed)} min), measure log "${measureLog}"`,
    );
    let measuresApiMissing = false;
    const logMeasure = async (measure: ScenarioMeasure) => {
      print(
        `  measure     ${measure.kind} from ${measure.startAt}${measure.endAt === undefined ? '' : ` to ${measure.endAt}`}`,
      );
      const response = await api(baseUrl, `/runs/${runId}/measures`, {
        method: 'POST',
        body: JSON.stringify(measure),
      }).catch(() => null);
      if ((response === null || response.status === 404) && !measuresApiMissing) {
        measuresApiMissing = true;
        print(
          '  (the server has no measure log API yet: the measure acts on the hidden truth only)',
        );
      }
    };
    const offsetMin = utcOffsetMin(scenario.startAt);
    let lastPrintMs = 0;
    let truthClosedAtMs: number | null = null;
    const played = playScenario({
      scenario,
      site: runConfig.site,
      url: mqttUrl,
      speed,
      measureLog,
      durationH,
      ...(options.clock === undefined ? {} : { clock: options.clock }),
      ...(options.signal === undefined ? {} : { signal: options.signal }),
      onMeasureStart: logMeasure,
      onProgress: (eventTimeMs, truth) => {
        const figures = truth.riskFigures();
        if (truthClosedAtMs === null && figures !== null && figures.utilization >= 1) {
          truthClosedAtMs = eventTimeMs;
          print(
            `  ${scenarioLocalTime(eventTimeMs, offsetMin)}  (hidden truth: the margin has closed, U ${figures.utilization.toFixed(2)}, ${figures.phase} phase)`,
          );
        }
        if (eventTimeMs - lastPrintMs < 30 * 60_000) return;
        lastPrintMs = eventTimeMs;
        const counters = server.ingestor.counters;
        const quarantined = Object.values(counters.quarantined).reduce((a, b) => a + b, 0);
        const truthText =
          figures === null
            ? ''
            : `; hidden truth U ${figures.utilization.toFixed(2)} (${figures.phase})`;
        print(
          `  ${scenarioLocalTime(eventTimeMs, offsetMin)}  readings stored ${counters.readingsStored}, quarantined ${quarantined}${truthText}`,
        );
      },
    });
    return { server, baseUrl, runId, played, truthMarginClosedAtMs: () => truthClosedAtMs };
  } catch (error) {
    await server.close();
    throw error;
  }
}
