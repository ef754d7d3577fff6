/**
 * Plays a scenario: advances the hidden truth in event time under the scripted weather and the
 * chosen measure log, and has each device publish its packs at its interval over its own MQTT
 * connection, paced so event time runs `speed` times faster than the wall clock.
 */
import { curingMeasuresActiveAt, type CuringMeasure } from '../../server/src/physics/index.ts';
import { createEngineTruth } from './engineTruth.ts';
import type { HiddenTruth, TruthWeather } from './hiddenTruth.ts';
import { connectDevice } from './mqttDevice.ts';
import type { DeviceConnection } from './mqttDevice.ts';

/** A device's login on a broker with authentication. */
export interface DeviceCredentials {
  username?: string;
  password?: string;
}
import { checkSpeed, realClock } from './playClock.ts';
import type { PlayClock } from './playClock.ts';
import { ProbeStringSimulator } from './probeString.ts';
import { utcOffsetMin } from './scenarioSchema.ts';
import type { Scenario, ScenarioMeasure, ScenarioWeather } from './scenarioSchema.ts';
import type { SenmlRecord } from './senmlPack.ts';
import { WeatherStationSimulator } from './weatherStation.ts';
import { scriptedWeatherAt } from './weatherScript.ts';

export interface PlayOptions {
  scenario: Scenario;
  /** Site id of the run (run.json `site`): the topics' second level. */
  site: string;
  /** Broker URL. */
  url: string;
  /** Event time per wall time, 1 to 120. */
  speed: number;
  /** Name of the measure log to play: the scenario's default. */
  measureLog?: string;
  /** The hidden truth: the engine truth by default. */
  truth?: HiddenTruth;
  /** Wall clock: the real one by default (tests pass a virtual clock). */
  clock?: PlayClock;
  /** Stops the play early (devices disconnect cleanly). */
  signal?: AbortSignal;
  /** Play only this many hours of event time (the scenario's durationH by default). */
  durationH?: number;
  /** Credentials of a device on a broker with authentication (username, password); none by default. */
  credentialsFor?: (device: string) => DeviceCredentials;
  /** Called once when a measure of the log starts, in event time (e.g. to log it on the server). */
  onMeasureStart?: (measure: ScenarioMeasure) => void | Promise<void>;
  /** Called after each round of packs with the event time reached. */
  onProgress?: (eventTimeMs: number, truth: HiddenTruth) => void | Promise<void>;
}

export interface PlayResult {
  packsSent: number;
  packsDropped: number;
  packsSilenced: number;
  /** Event time reached, ms. */
  endedAtMs: number;
  truthKind: HiddenTruth['kind'];
}

/** A scenario measure as the physics library's measure type. */
export function toCuringMeasure(measure: ScenarioMeasure): CuringMeasure {
  return {
    kind: measure.kind,
    startMs: Date.parse(measure.startAt),
    ...(measure.endAt === undefined ? {} : { endMs: Date.parse(measure.endAt) }),
    ...(measure.efficiency === undefined ? {} : { efficiency: measure.efficiency }),
    ...(measure.relativeHumidity === undefined
      ? {}
      : { relativeHumidity: measure.relativeHumidity }),
    ...(measure.windFactor === undefined ? {} : { windFactor: measure.windFactor }),
  };
}

/**
 * The weather the hidden truth is exposed to at `timeMs`: the scripted mean weather
 * ({@link scriptedWeatherAt}, no sensor noise or gusts) with the wind given at the mast's height.
 *
 * @param weather - the scenario's weather block
 * @param timeMs - event time, ms since the Unix epoch
 * @param utcOffsetMin - local offset from UTC of the scenario, min
 */
export function truthWeatherAt(
  weather: ScenarioWeather,
  timeMs: number,
  utcOffsetMin: number,
): TruthWeather {
  const scripted = scriptedWeatherAt(weather, timeMs, utcOffsetMin);
  return {
    airTemperatureC: scripted.airTemperatureC,
    relativeHumidityPercent: scripted.relativeHumidityPercent,
    windAtMastMS: scripted.windMS,
    mastHeightM: weather.mastHeightM,
    solarWm2: scripted.solarWm2,
    rainMmH: scripted.rainMmH,
  };
}

/** Every probe depth of a scenario, mm, ascending and unique. */
export function probeDepthsMm(scenario: Scenario): number[] {
  const depths = scenario.probeStrings.flatMap((probe) => probe.sensors.map((s) => s.depthMm));
  return [...new Set(depths)].sort((a, b) => a - b);
}

/** Plays the scenario to its end (or the signal); resolves when every device has disconnected. */
export async function playScenario(options: PlayOptions): Promise<PlayResult> {
  const speed = checkSpeed(options.speed);
  const { scenario } = options;
  const clock = options.clock ?? realClock;
  const logName = options.measureLog ?? scenario.defaultMeasureLog;
  const log = scenario.measureLogs[logName];
  if (log === undefined) {
    throw new RangeError(
      `measure log must be one of ${Object.keys(scenario.measureLogs).join(', ')}: got ${JSON.stringify(logName)}`,
    );
  }
  const measures = log.map(toCuringMeasure);
  const truth = options.truth ?? createEngineTruth(scenario.truth, probeDepthsMm(scenario));
  const offsetMin = utcOffsetMin(scenario.startAt);
  const startMs = Date.parse(scenario.startAt);
  const placedMs = Date.parse(scenario.truth.placedAt);
  const endMs = startMs + (options.durationH ?? scenario.durationH) * 3_600_000;
  const station = new WeatherStationSimulator(scenario.weather, scenario.seed);
  const probes = scenario.probeStrings.map(
    (spec) => new ProbeStringSimulator(spec, scenario.seed, startMs, scenario.faults),
  );
  const connections = new Map<string, DeviceConnection>();
  for (const device of [station.device, ...probes.map((probe) => probe.device)]) {
    connections.set(
      device,
      await connectDevice({
        url: options.url,
        site: options.site,
        device,
        ...(options.credentialsFor?.(device) ?? {}),
      }),
    );
  }
  // Probes report from placement (they are cast in); the station from the start.
  const firstProbeMs = Math.max(startMs, placedMs);
  const due = new Map<string, number>([[station.device, startMs]]);
  for (const probe of probes) due.set(probe.device, firstProbeMs);
  const started = new Set<ScenarioMeasure>();
  const result: PlayResult = {
    packsSent: 0,
    packsDropped: 0,
    packsSilenced: 0,
    endedAtMs: startMs,
    truthKind: truth.kind,
  };
  const aborted = (): boolean => options.signal?.aborted === true;
  const wallStart = clock.now();
  try {
    for (;;) {
      const nextMs = Math.min(...due.values());
      if (nextMs > endMs || aborted()) break;
      await clock.sleep(wallStart + (nextMs - startMs) / speed - clock.now());
      if (aborted()) break;
      while (truth.timeMs < nextMs && nextMs > placedMs) {
        const stepEndMs = Math.min(nextMs, truth.timeMs + scenario.truth.stepS * 1000);
        truth.advanceTo(
          stepEndMs,
          truthWeatherAt(scenario.weather, truth.timeMs, offsetMin),
          curingMeasuresActiveAt(measures, truth.timeMs),
        );
      }
      for (const measure of log) {
        if (!started.has(measure) && Date.parse(measure.startAt) <= nextMs) {
          started.add(measure);
          await options.onMeasureStart?.(measure);
        }
      }
      const sends: Promise<void>[] = [];
      const send = (device: string, pack: SenmlRecord[]) => {
        const connection = connections.get(device);
        if (connection !== undefined) sends.push(connection.publish(pack));
        result.packsSent += 1;
      };
      if (due.get(station.device) === nextMs) {
        send(
          station.device,
          station.sample(nextMs, scriptedWeatherAt(scenario.weather, nextMs, offsetMin)),
        );
        due.set(station.device, nextMs + station.intervalS * 1000);
      }
      for (const probe of probes) {
        if (due.get(probe.device) !== nextMs) continue;
        const sample = probe.sample(nextMs, truth);
        if ('pack' in sample) send(probe.device, sample.pack);
        else if (sample.skipped === 'dropout') result.packsDropped += 1;
        else result.packsSilenced += 1;
        due.set(probe.device, nextMs + probe.intervalS * 1000);
      }
      await Promise.all(sends);
      result.endedAtMs = nextMs;
      await options.onProgress?.(nextMs, truth);
    }
  } finally {
    await Promise.allSettled([...connections.values()].map((connection) => connection.close()));
  }
  return result;
}
