/**
 * createRunEngine: the per-run live engine (issue 6). Readings are buffered per stream and
 * consumed in event time, on a grid of cycles aligned to placement (every
 * `assimilationIntervalS`); a cycle runs only when every stream it needs has reached its end or
 * has fallen silent (watermark). Each cycle: the weather of the window drives the surface flux
 * (held when silent, flagged), probe temperatures give the temperature field, the ensemble is
 * advanced (each member's exposure multiplier taking one step of its random walk, the model error
 * of the surface flux) and the probe humidities are assimilated (ETKF of server/src/calibration).
 * Outlooks follow at their own cadence. Seeded from the run id: a replay is identical, and a snapshot
 * resumed with the readings after it ends in the same state.
 */
import {
  createEnsemble,
  defaultParameterSpecs,
  forecastEnsemble,
  relativeHumidityErrorSd,
  restoreEnsemble,
  snapshotEnsemble,
} from '../calibration/index.ts';
import type { Ensemble, Observation } from '../calibration/index.ts';
import type { RunConfig } from '../config/index.ts';
import { placedAtMs } from '../config/index.ts';
import { deserialiseElementState, serialiseElementState } from '../engine/index.ts';
import type { ElementState, ElementStateSnapshot } from '../engine/index.ts';
import { createRunModel } from './runModel.ts';
import {
  forecastModel,
  initialMemberFactory,
  observationOperator,
  stateLayout,
} from './memberModel.ts';
import { analysisStep } from './analysisStep.ts';
import { resolveOptions } from './engineOptions.ts';
import { toCuringMeasures } from './measureLog.ts';
import { runOutlook } from './outlook.ts';
import { emptyStream, insertReading, latestAtOrBefore, pruneStream } from './readingStreams.ts';
import type { StreamBuffer } from './readingStreams.ts';
import { buildRunState } from './runStateBuilder.ts';
import { streamKey, streamRoles } from './streamRoles.ts';
import type { ProbeRole, WeatherQuantity } from './streamRoles.ts';
import type {
  ForecastPoint,
  LiveReading,
  MeasureEntry,
  QualityFlag,
  RunEngine,
  RunEngineOptions,
  RunEngineSnapshot,
  RunState,
} from './types.ts';
import { streamsFromJson, streamsToJson } from './engineBody.ts';
import type { EngineBody } from './engineBody.ts';
import { windowInputs } from './windowInputs.ts';
import type { InputSources } from './windowInputs.ts';

/**
 * Creates the live engine of one run, or resumes it from a snapshot of the same run.
 * Determinism: with the same seed and readings, figures are bit-identical whatever the order and
 * batching of `addReadings` calls for readings that arrive in event-time order per stream; after
 * `snapshot()`, feed the resumed engine every reading with `eventTimeMs` > the snapshot's
 * `eventTimeMs` (readings at or before the engine's time are late and dropped).
 *
 * @param runId - the run's id (seeds the ensemble unless `options.seed` is given)
 * @param config - the validated run configuration (parseRunConfig)
 * @param options - see RunEngineOptions; every field optional
 * @param snapshot - a snapshot from `RunEngine.snapshot()` of the same run and options
 * @throws Error when the snapshot belongs to another run or has another version
 */
export function createRunEngine(
  runId: string,
  config: RunConfig,
  options: RunEngineOptions = {},
  snapshot?: RunEngineSnapshot,
): RunEngine {
  const opts = resolveOptions(runId, options);
  const placedMs = placedAtMs(config);
  const intervalMs = opts.assimilationIntervalS * 1000;
  const run = createRunModel(config, opts.cellCount);
  const model = run.model;
  const roles = streamRoles(config);
  const rhProbes = [...roles.values()].filter(
    (role): role is ProbeRole => role.kind === 'probe' && role.quantity === 'rh',
  );
  const temperatureProbes = [...roles.values()]
    .filter((role): role is ProbeRole => role.kind === 'probe' && role.quantity === 'temperature')
    .sort((a, b) => a.domainDepthM - b.domainDepthM);
  const specs = defaultParameterSpecs(rhProbes.map((role) => role.key));
  const biasIndex = new Map(rhProbes.map((role, index) => [role.key, 4 + index]));
  const layout = stateLayout(model);
  const operator = observationOperator(model, biasIndex);

  let body: EngineBody = {
    engineTimeMs: null,
    cycle: 0,
    streams: {},
    ensemble: null,
    flags: {},
    lateReadings: 0,
    previousAge: null,
    ageRate: 0,
    outlook: null,
    measures: [],
    forecast: [],
    state: null,
  };
  const streams = new Map<string, StreamBuffer>();
  let ensemble: Ensemble<ElementState> | null = null;
  if (snapshot !== undefined) {
    if (snapshot.version !== 1 || snapshot.runId !== runId) {
      throw new Error(
        `snapshot must be version 1 of run ${runId}: got version ${String(snapshot.version)} of run ${snapshot.runId}`,
      );
    }
    body = structuredClone(snapshot.body as EngineBody);
    for (const [key, stream] of streamsFromJson(body.streams)) streams.set(key, stream);
    if (body.ensemble !== null) {
      ensemble = restoreEnsemble(body.ensemble, (json) =>
        deserialiseElementState(json as ElementStateSnapshot, model.grid.cellCount),
      );
    }
  }
  for (const key of roles.keys()) if (!streams.has(key)) streams.set(key, emptyStream());
  let measures = toCuringMeasures(body.measures);

  const weatherStreams = new Map<WeatherQuantity, StreamBuffer>();
  for (const role of roles.values()) {
    if (role.kind === 'weather')
      weatherStreams.set(role.quantity, streams.get(role.key) as StreamBuffer);
  }
  const sources = (): InputSources => ({
    weather: weatherStreams,
    probeTemperatures: temperatureProbes.map((role) => ({
      role,
      stream: streams.get(role.key) as StreamBuffer,
    })),
    mastHeightM: config.weather.mastHeightM,
    measures,
    holdMs: opts.weatherHoldS * 1000,
  });

  /** Whether every stream a cycle ending at `toMs` needs has reached it or fallen silent. */
  const canAdvanceTo = (toMs: number): boolean => {
    let newestMs = Number.NEGATIVE_INFINITY;
    for (const stream of streams.values()) newestMs = Math.max(newestMs, stream.lastSeenMs);
    if (!(newestMs >= toMs)) return false;
    const toleranceMs = opts.lateToleranceS * 1000;
    for (const stream of streams.values()) {
      if (stream.lastSeenMs >= toMs) continue;
      if (newestMs - stream.lastSeenMs > toleranceMs) continue; // silent: does not hold back
      return false;
    }
    return true;
  };

  let raised: Record<string, QualityFlag> = {};
  const raise = (code: string, subject: string, message: string, atMs: number) => {
    const id = `${code}:${subject}`;
    raised[id] = { code, message, sinceMs: body.flags[id]?.sinceMs ?? atMs };
  };

  /** One cycle over (fromMs, toMs]; false when it cannot run (weather never read). */
  const runCycle = (fromMs: number, toMs: number, outlookDue: boolean): boolean => {
    raised = {};
    const ran = cycleBody(fromMs, toMs, outlookDue);
    body.flags = raised;
    return ran;
  };

  const cycleBody = (fromMs: number, toMs: number, outlookDue: boolean): boolean => {
    if (toMs > placedMs) {
      const window = windowInputs(sources(), fromMs, toMs);
      if (window.inputs === null) {
        for (const quantity of window.missing) {
          raise('weather-missing', quantity, `no ${quantity} reading yet: the model waits`, toMs);
        }
        return false;
      }
      const inputs = window.inputs;
      for (const held of window.held) {
        raise(
          held.beyondHold ? 'weather-gap' : 'weather-held',
          held.quantity,
          `${held.quantity} held from a reading ${Math.round(held.ageMs / 60000)} min old` +
            (held.beyondHold ? ` (beyond the ${opts.weatherHoldS / 60} min hold)` : ''),
          toMs,
        );
      }
      if (ensemble === null) {
        const temperatures = inputs.probeTemperatures ?? [];
        const startK =
          temperatures.length > 0
            ? temperatures.reduce((sum, p) => sum + p.temperatureK, 0) / temperatures.length
            : inputs.surfaceTemperatureK;
        ensemble = createEnsemble({
          seed: opts.seed,
          specs,
          memberCount: opts.memberCount,
          timeS: 0,
          initialMember: initialMemberFactory(model, startK),
        });
      }
      try {
        ensemble = forecastEnsemble(
          ensemble,
          forecastModel(model, () => inputs, opts.exposureRandomWalkPerSqrtH),
          (toMs - placedMs) / 1000,
        );
      } catch (error) {
        raise(
          'model-refused',
          'model',
          error instanceof Error ? error.message : String(error),
          toMs,
        );
      }
      const observations: Observation[] = [];
      for (const role of rhProbes) {
        const latest = latestAtOrBefore(streams.get(role.key) as StreamBuffer, toMs);
        if (latest === null || latest.timeMs <= fromMs) continue;
        const value = latest.value / 100;
        observations.push({
          id: role.key,
          value,
          errorSd:
            opts.observationErrorSdPercent === null
              ? relativeHumidityErrorSd(value)
              : opts.observationErrorSdPercent / 100,
          depthM: role.domainDepthM,
        });
      }
      if (opts.assimilation && observations.length > 0) {
        const member0 = ensemble.members[0];
        ensemble = analysisStep(ensemble, observations, {
          operator,
          specs,
          layout,
          options: opts,
          plastic: member0 !== undefined && !model.hasSet(member0.carried),
        });
      }
      const member0 = ensemble.members[0];
      if (member0 !== undefined) {
        const ages = member0.carried.equivalentAgeS;
        const ageS = ages.reduce((sum, age) => sum + age, 0) / ages.length;
        if (body.previousAge !== null && toMs > body.previousAge.timeMs) {
          body.ageRate = (ageS - body.previousAge.ageS) / ((toMs - body.previousAge.timeMs) / 1000);
        }
        body.previousAge = { timeMs: toMs, ageS };
      }
      if (outlookDue) {
        const persistence =
          windowInputs(sources(), toMs - opts.persistenceWindowS * 1000, toMs).inputs ?? inputs;
        // Points within the horizon, and those before its start up to 3 h old (forecast series
        // come hourly to three-hourly, our assumption); a stale forecast falls back to
        // persistence.
        const forecast = body.forecast.filter(
          (point) =>
            point.timeMs < toMs + opts.horizonH * 3_600_000 && point.timeMs >= toMs - 3 * 3_600_000,
        );
        const { activeMeasures: _ignored, ...persistenceWithoutMeasures } = persistence;
        void _ignored;
        body.outlook = {
          startMs: toMs,
          source: forecast.length > 0 ? 'supplied' : 'persistence',
          statistics: runOutlook({
            model,
            members: ensemble.members.map((member) => member.carried),
            placedMs,
            startMs: toMs,
            horizonS: opts.horizonH * 3600,
            stepS: opts.outlookStepS,
            persistence: persistenceWithoutMeasures,
            forecast,
            mastHeightM: config.weather.mastHeightM,
            measures,
            thresholds: config.thresholds.utilization,
          }),
        };
      }
    }
    for (const role of roles.values()) {
      if (role.kind !== 'probe') continue;
      const lastSeen = (streams.get(role.key) as StreamBuffer).lastSeenMs;
      const silentSince = Math.max(lastSeen, placedMs);
      if (toMs - silentSince > opts.probeSilentS * 1000) {
        raise(
          'probe-silent',
          role.key,
          `probe ${role.key} silent`,
          Math.max(silentSince, placedMs),
        );
      }
    }
    if (body.lateReadings > 0) {
      raise(
        'late-readings',
        'all',
        `${body.lateReadings} readings arrived after their time was processed and were dropped`,
        toMs,
      );
    }
    return true;
  };

  const currentState = (): RunState =>
    buildRunState({
      runId,
      config,
      model,
      placedMs,
      engineTimeMs: body.engineTimeMs,
      ensemble,
      specs,
      rhProbes,
      streams,
      intervalMs,
      flags: Object.values(body.flags),
      outlook: body.outlook,
      horizonH: opts.horizonH,
      ageRate: body.ageRate,
      targetStrengthMPa: opts.targetStrengthMPa,
    });

  const engine: RunEngine = {
    runId,
    addReadings(readings: readonly LiveReading[]) {
      for (const reading of readings) {
        const key = streamKey(reading.device, reading.sensor);
        const stream = streams.get(key);
        if (stream === undefined) continue;
        if (body.engineTimeMs !== null && reading.eventTimeMs <= body.engineTimeMs) {
          body.lateReadings += 1;
          continue;
        }
        const value = reading.unit === 'K' ? reading.value - 273.15 : reading.value;
        insertReading(stream, reading.eventTimeMs, value);
      }
    },
    setMeasures(entries: readonly MeasureEntry[]) {
      body.measures = entries.map((entry) => ({ ...entry }));
      measures = toCuringMeasures(body.measures);
    },
    setForecast(points: readonly ForecastPoint[]) {
      body.forecast = [...points].sort((a, b) => a.timeMs - b.timeMs);
    },
    advance() {
      if (body.engineTimeMs === null) {
        let firstMs = Number.POSITIVE_INFINITY;
        for (const stream of streams.values()) {
          if (stream.timesMs.length > 0) firstMs = Math.min(firstMs, stream.timesMs[0] as number);
        }
        if (!Number.isFinite(firstMs)) return null;
        body.engineTimeMs =
          placedMs + (Math.ceil((firstMs - placedMs) / intervalMs) - 1) * intervalMs;
      }
      const startMs: number = body.engineTimeMs;
      let lastMs = startMs;
      while (canAdvanceTo(lastMs + intervalMs)) lastMs += intervalMs;
      if (lastMs === startMs) return null;
      const every = Math.max(1, Math.round(opts.outlookEveryAnalyses));
      const lastDueCycle =
        Math.floor((body.cycle + Math.round((lastMs - startMs) / intervalMs)) / every) * every;
      let reachedMs = startMs;
      while (reachedMs < lastMs) {
        const toMs = reachedMs + intervalMs;
        const cycle = body.cycle + 1;
        if (!runCycle(reachedMs, toMs, cycle === lastDueCycle)) break;
        body.cycle = cycle;
        body.engineTimeMs = toMs;
        reachedMs = toMs;
      }
      if (reachedMs === startMs) {
        body.state = currentState();
        return null;
      }
      const keepFromMs =
        reachedMs - Math.max(opts.persistenceWindowS, opts.weatherHoldS) * 1000 - intervalMs;
      for (const stream of streams.values()) pruneStream(stream, keepFromMs);
      body.state = currentState();
      return body.state;
    },
    state() {
      return body.state ?? currentState();
    },
    snapshot(): RunEngineSnapshot {
      const snapshotBody: EngineBody = {
        ...body,
        streams: streamsToJson(streams, body.engineTimeMs),
        ensemble:
          ensemble === null
            ? null
            : snapshotEnsemble(ensemble, (carried) => serialiseElementState(carried)),
      };
      return {
        version: 1,
        runId,
        eventTimeMs: body.engineTimeMs,
        body: JSON.parse(JSON.stringify(snapshotBody)) as unknown,
      };
    },
  };
  return engine;
}
