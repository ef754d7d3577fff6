/**
 * `npm run demo`: starts the server (embedded broker and archive, or whatever the MENISCUS_*
 * variables configure, exactly as `npm start`), creates the demo scenario's run over the HTTP
 * API, plays the scenario with the engine as hidden truth, logs the crew's measures over the
 * API as they start, prints each crew notice as the server raises it, and prints the server's
 * addresses. The server keeps serving after the play
 * until Ctrl-C.
 */
import type { Notice } from '../../server/src/alerts/types.ts';
import type { ServerConfig } from '../../server/src/config/index.ts';
import { startServer } from '../../server/src/server.ts';
import type { RunningServer } from '../../server/src/server.ts';
import type { PlayClock } from './playClock.ts';
import { checkSpeed } from './playClock.ts';
import { playScenario } from './playScenario.ts';
import type { PlayResult } from './playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from './scenarioFolder.ts';
import { api, closeRun, findOrCreateRun, measureLogger } from './serverRun.ts';
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
  /** The scenario's offset from UTC, min (for showing event times as on site). */
  utcOffsetMin: number;
  /** The server's state as polled during the play, every 10 min of event time. */
  serverStates(): readonly ServerStateSample[];
  /** The crew notices the server raised for the run so far, in order. */
  notices(): readonly Notice[];
}

/** What the demo keeps of GET /api/runs/:id/state. */
export interface ServerStateSample {
  /** Event time of the play when polled, ms. */
  polledAtMs: number;
  /** The engine's own event time, ms (null before its first reading). */
  eventTimeMs: number | null;
  phase: string;
  utilization: number | null;
  /** Expected time of the U = 1 crossing in the outlook, ms; null when none is expected. */
  expectedClosingMs: number | null;
}

/** Event time between polls of the server's state, and between progress lines. */
const STATE_POLL_MS = 10 * 60_000;
const PRINT_EVERY_MS = 30 * 60_000;

/**
 * One line comparing the server's warning with the hidden truth: when the truth's margin closed
 * and when the server's outlook first expected it to close (and at what event time it said so).
 */
export function warningSummary(
  truthClosedAtMs: number | null,
  states: readonly ServerStateSample[],
  utcOffsetMinutes: number,
): string {
  const time = (ms: number) => scenarioLocalTime(ms, utcOffsetMinutes).slice(11);
  const first = states.find(
    (sample) => sample.expectedClosingMs !== null && sample.eventTimeMs !== null,
  );
  const truthText =
    truthClosedAtMs === null
      ? 'the hidden truth kept its margin'
      : `the hidden truth's margin closed at ${time(truthClosedAtMs)}`;
  const serverText =
    first === undefined
      ? 'the server never expected it to close'
      : `the server first expected closing at ${time(first.expectedClosingMs as number)}, saying so at ${time(first.eventTimeMs as number)}`;
  return `Warning check: ${truthText}; ${serverText}.`;
}

/**
 * One line on the crew notices against the hidden truth: how many of each level, and when the
 * first ACT NOW or CRACKING LIKELY went out compared with the truth's margin closing.
 */
export function noticeSummary(
  truthClosedAtMs: number | null,
  notices: readonly Pick<Notice, 'level' | 'raisedAtMs'>[],
  utcOffsetMinutes: number,
): string {
  const levels = ['NOTE', 'PREPARE', 'ACT NOW', 'CRACKING LIKELY'] as const;
  const counts = levels
    .map((level) => [level, notices.filter((notice) => notice.level === level).length] as const)
    .filter(([, count]) => count > 0)
    .map(([level, count]) => `${count} ${level}`);
  const first = notices.find((n) => n.level === 'ACT NOW' || n.level === 'CRACKING LIKELY');
  const time = (ms: number) => scenarioLocalTime(ms, utcOffsetMinutes).slice(11);
  const firstText =
    first === undefined
      ? 'no ACT NOW or CRACKING LIKELY'
      : `the first ${first.level} at ${time(first.raisedAtMs)}` +
        (truthClosedAtMs === null
          ? ''
          : first.raisedAtMs < truthClosedAtMs
            ? `, ${Math.round((truthClosedAtMs - first.raisedAtMs) / 60_000)} min before the hidden truth's margin closed`
            : `, ${Math.round((first.raisedAtMs - truthClosedAtMs) / 60_000)} min after the hidden truth's margin closed`);
  return `Crew notices: ${notices.length === 0 ? 'none' : counts.join(', ')}; ${firstText}.`;
}

/** A figure with two decimals, without a minus sign on a rounded zero. */
function shownFigure(value: number): string {
  const text = value.toFixed(2);
  return text === '-0.00' ? '0.00' : text;
}

/** Polls the run's state; null when the server has none (yet) or cannot answer. */
async function fetchServerState(
  baseUrl: string,
  runId: string,
  polledAtMs: number,
): Promise<ServerStateSample | null> {
  try {
    const response = await api(baseUrl, `/runs/${runId}/state`);
    if (response.status !== 200) return null;
    const state = (await response.json()) as {
      eventTimeMs: number | null;
      phase: string;
      utilization: number | null;
      outlook: { crossings: { threshold: number; expectedTimeMs: number | null }[] } | null;
    };
    const crossing = state.outlook?.crossings.find((entry) => entry.threshold === 1);
    return {
      polledAtMs,
      eventTimeMs: state.eventTimeMs,
      phase: state.phase,
      utilization: state.utilization,
      expectedClosingMs: crossing?.expectedTimeMs ?? null,
    };
  } catch {
    return null;
  }
}

/** `2026-07-16 13:30` in the scenario's local time (its UTC offset). */
export function scenarioLocalTime(timeMs: number, offsetMin: number): string {
  return new Date(timeMs + offsetMin * 60_000).toISOString().slice(0, 16).replace('T', ' ');
}

/** The host a browser on this machine uses for a bind address. */
function reachableHost(bindHost: string): string {
  return bindHost === '0.0.0.0' || bindHost === '::' ? '127.0.0.1' : bindHost;
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
    let { runId, existing } = await findOrCreateRun(baseUrl, runConfig, runConfigInput);
    if (existing) {
      // A demo plays its scenario from the start. Played into a run that an earlier play took
      // past that start, its readings arrive after the engine processed their time and are
      // quarantined, unless they are the very readings stored (another measure log or another
      // seed of the truth are not): the earlier run is closed and the play gets a run of its own.
      const earlierRunId = runId;
      await closeRun(baseUrl, earlierRunId, 'a new demo play of the scenario');
      ({ runId, existing } = await findOrCreateRun(baseUrl, runConfig, runConfigInput));
      print(
        `An earlier demo run of this scenario (${earlierRunId}) is closed; it stays in the archive. This play starts run ${runId}.`,
      );
    }
    const mqttUrl =
      options.config.mqtt.mode === 'embedded'
        ? `mqtt://${reachableHost(options.config.mqtt.host)}:${server.mqttPort}`
        : options.config.mqtt.url;
    const durationH = options.durationH ?? scenario.durationH;
    print(`Meniscus demo: ${runConfig.name ?? scenario.name}`);
    print(`  dashboard   ${baseUrl}/runs/${runId}`);
    print(
      `  run         ${baseUrl}/api/runs/${runId}   (state: ${baseUrl}/api/runs/${runId}/state)`,
    );
    print(`  devices     ${mqttUrl}, site ${runConfig.site}`);
    print(
      `  playing     ${durationH} h of event time at ${speed}x (${Math.round((durationH * 60) / speed)} min), measure log "${measureLog}"`,
    );
    const postMeasure = measureLogger(baseUrl, runId, (line) => print(`  ${line}`));
    const logMeasure = async (measure: ScenarioMeasure) => {
      print(
        `  measure     ${measure.kind} from ${measure.startAt}${measure.endAt === undefined ? '' : ` to ${measure.endAt}`}`,
      );
      await postMeasure(measure);
    };
    const offsetMin = utcOffsetMin(scenario.startAt);
    const raised: Notice[] = [];
    server.notices.listen((notice) => {
      if (notice.runId !== runId || raised.some((known) => known.id === notice.id)) return;
      raised.push(notice);
      print(`  ${scenarioLocalTime(notice.raisedAtMs, offsetMin)}  notice  ${notice.title}`);
    });
    let lastPrintMs = 0;
    let lastStateMs = 0;
    let truthClosedAtMs: number | null = null;
    const states: ServerStateSample[] = [];
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
      onProgress: async (eventTimeMs, truth) => {
        const figures = truth.riskFigures();
        const local = scenarioLocalTime(eventTimeMs, offsetMin);
        if (truthClosedAtMs === null && figures !== null && figures.utilization >= 1) {
          truthClosedAtMs = eventTimeMs;
          print(
            `  ${local}  (hidden truth: the margin has closed, U ${figures.utilization.toFixed(2)}, ${figures.phase} phase)`,
          );
        }
        if (eventTimeMs - lastStateMs >= STATE_POLL_MS) {
          lastStateMs = eventTimeMs;
          const sample = await fetchServerState(baseUrl, runId, eventTimeMs);
          if (sample !== null) states.push(sample);
        }
        if (eventTimeMs - lastPrintMs < PRINT_EVERY_MS) return;
        lastPrintMs = eventTimeMs;
        const counters = server.ingestor.counters;
        const quarantined = Object.values(counters.quarantined).reduce((a, b) => a + b, 0);
        const latest = states[states.length - 1];
        const serverText =
          latest === undefined || latest.utilization === null
            ? ''
            : `; server U ${shownFigure(latest.utilization)} (${latest.phase})${
                latest.expectedClosingMs === null
                  ? ''
                  : `, margin expected to close ${scenarioLocalTime(latest.expectedClosingMs, offsetMin).slice(11)}`
              }`;
        const truthText =
          figures === null
            ? ''
            : `; hidden truth U ${shownFigure(figures.utilization)} (${figures.phase})`;
        print(
          `  ${local}  readings ${counters.readingsStored}, quarantined ${quarantined}${serverText}${truthText}`,
        );
      },
    });
    return {
      server,
      baseUrl,
      runId,
      played,
      truthMarginClosedAtMs: () => truthClosedAtMs,
      utcOffsetMin: offsetMin,
      serverStates: () => states,
      notices: () => raised,
    };
  } catch (error) {
    await server.close();
    throw error;
  }
}
