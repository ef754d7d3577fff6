/**
 * Readings of a simulated scenario without MQTT, for the live engine's twin experiments: the
 * simulators' own hidden truth (the engine on a finer grid with hidden parameters), weather
 * station and probe strings (noise, bias, quantisation, dropouts, drifting clocks, scripted
 * faults), stepped exactly as simulators/src/playScenario.ts steps them, with each SenML pack
 * turned into the readings ingest would commit. The integration tests repeat this through MQTT
 * and the real ingest path.
 */
import { curingMeasuresActiveAt } from '../../server/src/physics/index.ts';
import type { LiveReading, MeasureEntry } from '../../server/src/live/index.ts';
import { createEngineTruth } from '../../simulators/src/engineTruth.ts';
import {
  probeDepthsMm,
  toCuringMeasure,
  truthWeatherAt,
} from '../../simulators/src/playScenario.ts';
import { ProbeStringSimulator } from '../../simulators/src/probeString.ts';
import type { Scenario } from '../../simulators/src/scenarioSchema.ts';
import { utcOffsetMin } from '../../simulators/src/scenarioSchema.ts';
import type { SenmlRecord } from '../../simulators/src/senmlPack.ts';
import { WeatherStationSimulator } from '../../simulators/src/weatherStation.ts';
import { scriptedWeatherAt } from '../../simulators/src/weatherScript.ts';

/** The truth's risk figures at one event time. */
export interface TruthSample {
  timeMs: number;
  phase: string;
  utilization: number;
  marginPa: number;
}

/** What a played scenario produced. */
export interface TwinRun {
  readings: LiveReading[];
  measures: MeasureEntry[];
  /** Truth figures at every multiple of `sampleEveryS` after placement. */
  truth: TruthSample[];
}

/**
 * The twin's readings in batches of `batchS` of event time (aligned to the epoch), oldest
 * first: how the twin tests feed an engine (one batch, then an advance).
 */
export function readingBatches(readings: readonly LiveReading[], batchS: number): LiveReading[][] {
  const batches = new Map<number, LiveReading[]>();
  for (const reading of readings) {
    const key = Math.floor(reading.eventTimeMs / (batchS * 1000));
    const batch = batches.get(key);
    if (batch === undefined) batches.set(key, [reading]);
    else batch.push(reading);
  }
  return [...batches.keys()].sort((a, b) => a - b).map((key) => batches.get(key) ?? []);
}

/** SenML pack -> committed readings (base name `<device>/`, base time s, offsets s). */
export function packReadings(pack: readonly SenmlRecord[]): LiveReading[] {
  const first = pack[0];
  if (first === undefined) return [];
  const device = (first.bn ?? '').replace(/\/$/, '');
  const baseS = first.bt ?? 0;
  return pack.map((record) => ({
    device,
    sensor: record.n,
    eventTimeMs: Math.round((baseS + (record.t ?? 0)) * 1000),
    value: record.v,
    unit: record.u,
  }));
}

/**
 * Plays `scenario` with measure log `logName` for `durationH` hours of event time.
 *
 * @param truthOverrides - hidden parameters to use instead of the scenario's (other twins)
 */
export function playTwin(
  scenario: Scenario,
  options: {
    logName?: string;
    durationH?: number;
    sampleEveryS?: number;
    truthOverrides?: Partial<Scenario['truth']>;
  } = {},
): TwinRun {
  const logName = options.logName ?? scenario.defaultMeasureLog;
  const log = scenario.measureLogs[logName] ?? [];
  const measures = log.map(toCuringMeasure);
  const truthSpec = { ...scenario.truth, ...options.truthOverrides };
  const truth = createEngineTruth(truthSpec, probeDepthsMm(scenario));
  const offsetMin = utcOffsetMin(scenario.startAt);
  const startMs = Date.parse(scenario.startAt);
  const placedMs = Date.parse(truthSpec.placedAt);
  const endMs = startMs + (options.durationH ?? scenario.durationH) * 3_600_000;
  const sampleMs = (options.sampleEveryS ?? 300) * 1000;
  const station = new WeatherStationSimulator(scenario.weather, scenario.seed);
  const probes = scenario.probeStrings.map(
    (spec) => new ProbeStringSimulator(spec, scenario.seed, startMs, scenario.faults),
  );
  const firstProbeMs = Math.max(startMs, placedMs);
  const due = new Map<string, number>([[station.device, startMs]]);
  for (const probe of probes) due.set(probe.device, firstProbeMs);
  const readings: LiveReading[] = [];
  const samples: TruthSample[] = [];
  let nextSampleMs = placedMs + sampleMs;
  for (;;) {
    const nextMs = Math.min(...due.values());
    if (nextMs > endMs) break;
    while (truth.timeMs < nextMs && nextMs > placedMs) {
      const stepEndMs = Math.min(nextMs, truth.timeMs + truthSpec.stepS * 1000);
      truth.advanceTo(
        stepEndMs,
        truthWeatherAt(scenario.weather, truth.timeMs, offsetMin),
        curingMeasuresActiveAt(measures, truth.timeMs),
      );
      if (truth.timeMs === nextSampleMs) {
        const figures = truth.riskFigures();
        if (figures !== null) samples.push({ timeMs: truth.timeMs, ...figures });
        nextSampleMs += sampleMs;
      }
    }
    if (due.get(station.device) === nextMs) {
      readings.push(
        ...packReadings(
          station.sample(nextMs, scriptedWeatherAt(scenario.weather, nextMs, offsetMin)),
        ),
      );
      due.set(station.device, nextMs + station.intervalS * 1000);
    }
    for (const probe of probes) {
      if (due.get(probe.device) !== nextMs) continue;
      const sample = probe.sample(nextMs, truth);
      if ('pack' in sample) readings.push(...packReadings(sample.pack));
      due.set(probe.device, nextMs + probe.intervalS * 1000);
    }
  }
  return {
    readings,
    measures: log.map((measure, index) => ({
      id: `m${index + 1}`,
      kind: measure.kind,
      startMs: Date.parse(measure.startAt),
      endMs: measure.endAt === undefined ? null : Date.parse(measure.endAt),
      loggedBy: 'crew lead (scenario)',
      ...(measure.efficiency === undefined ? {} : { efficiency: measure.efficiency }),
      ...(measure.relativeHumidity === undefined
        ? {}
        : { relativeHumidity: measure.relativeHumidity }),
      ...(measure.windFactor === undefined ? {} : { windFactor: measure.windFactor }),
    })),
    truth: samples,
  };
}
