/**
 * Runs an element model through a weather record and a measure log (planning a pour, the CLI,
 * the benchmarks): advances in event time, lands exactly on measure changes and output times,
 * and collects the figures over time and depth profiles at requested times.
 */
import { curingMeasuresActiveAt, type CuringMeasure } from '../physics/curingMeasures.ts';
import { DEFAULT_UTILIZATION_THRESHOLDS } from '../physics/utilization.ts';
import type { BoundaryInputs, ProbeTemperature } from './boundaryInputs.ts';
import { evaluateElement, type ElementFigures, type ElementProfiles } from './elementFigures.ts';
import type { ElementModel } from './elementModel.ts';
import type { ElementState } from './elementState.ts';

/** One weather record at a time since placement. SI units (wind at about 0.5 m). */
export interface WeatherSample {
  timeS: number;
  airTemperatureK: number;
  relativeHumidity: number;
  windMS: number;
  surfaceTemperatureK: number;
  probeTemperatures?: readonly ProbeTemperature[];
  measuredEvaporationKgM2s?: number;
}

/** What to simulate. */
export interface SimulationRequest {
  model: ElementModel;
  /** Weather records sorted by time; linear in time between records, constant beyond the ends. */
  weather: readonly WeatherSample[];
  /** Curing measures; their times are ms since placement (placement = 0 ms). */
  measures?: readonly CuringMeasure[];
  durationS: number;
  /** Spacing of the output series, s; default 900 (our choice). */
  outputIntervalS?: number;
  /** Times at which to keep depth profiles, s. */
  profileTimesS?: readonly number[];
  /** Longest interval over which inputs are held constant, s; default 900 (our choice). */
  maxInputIntervalS?: number;
  /** Start from this state instead of a fresh one (it is advanced in place). */
  initialState?: ElementState;
  /**
   * Target in-place compressive strength of the figures' strength forecast, MPa; default
   * DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA (strengthForecast.ts).
   */
  targetCompressiveStrengthMPa?: number;
  /** Called after each output time with the fraction done (0..1). */
  onProgress?: (fraction: number) => void;
}

/** The result of a simulation. */
export interface SimulationResult {
  series: ElementFigures[];
  profiles: { timeS: number; profiles: ElementProfiles }[];
  state: ElementState;
  maxSurfaceStressPa: number;
  /** Smallest hardening-phase margin, Pa (NaN if the run never left the plastic phase). */
  minMarginPa: number;
  maxUtilization: number;
  waterLossKgM2: number;
}

/** a + w (b - a). */
function between(w: number, a: number, b: number): number {
  return a + w * (b - a);
}

/** Weather at time t: linear interpolation between records, constant beyond the ends. */
export function weatherAt(weather: readonly WeatherSample[], timeS: number): WeatherSample {
  const first = weather[0];
  const last = weather[weather.length - 1];
  if (first === undefined || last === undefined)
    throw new Error('weather must hold at least one record');
  if (timeS <= first.timeS) return first;
  if (timeS >= last.timeS) return last;
  let j = 1;
  while ((weather[j] as WeatherSample).timeS < timeS) j += 1;
  const upper = weather[j] as WeatherSample;
  const lower = weather[j - 1] as WeatherSample;
  const w = (timeS - lower.timeS) / (upper.timeS - lower.timeS);
  const sample: WeatherSample = {
    timeS,
    airTemperatureK: between(w, lower.airTemperatureK, upper.airTemperatureK),
    relativeHumidity: between(w, lower.relativeHumidity, upper.relativeHumidity),
    windMS: between(w, lower.windMS, upper.windMS),
    surfaceTemperatureK: between(w, lower.surfaceTemperatureK, upper.surfaceTemperatureK),
  };
  if (
    lower.probeTemperatures !== undefined &&
    upper.probeTemperatures !== undefined &&
    lower.probeTemperatures.length === upper.probeTemperatures.length
  ) {
    sample.probeTemperatures = lower.probeTemperatures.map((probe, index) => ({
      depthM: probe.depthM,
      temperatureK: between(
        w,
        probe.temperatureK,
        (upper.probeTemperatures?.[index] ?? probe).temperatureK,
      ),
    }));
  } else if (lower.probeTemperatures !== undefined) {
    sample.probeTemperatures = lower.probeTemperatures;
  }
  if (
    lower.measuredEvaporationKgM2s !== undefined &&
    upper.measuredEvaporationKgM2s !== undefined
  ) {
    sample.measuredEvaporationKgM2s = between(
      w,
      lower.measuredEvaporationKgM2s,
      upper.measuredEvaporationKgM2s,
    );
  }
  return sample;
}

/**
 * Simulates `durationS` seconds from placement (or from `initialState`). The inputs of each
 * interval are the weather at its midpoint and the measures active at its midpoint; intervals
 * end at every output time, profile time, measure start and end, and are at most
 * `maxInputIntervalS` long. Throws what `advanceTo` throws (refused inputs, no convergence).
 */
export function simulateElement(request: SimulationRequest): SimulationResult {
  const { model } = request;
  const state = request.initialState ?? model.initialState(request.weather[0]?.surfaceTemperatureK);
  const startS = state.transport.timeS;
  const endS = startS + request.durationS;
  const outputIntervalS = request.outputIntervalS ?? 900;
  const maxInputIntervalS = request.maxInputIntervalS ?? 900;
  const measures = request.measures ?? [];
  const outputTimes = new Set<number>();
  for (let t = startS + outputIntervalS; t < endS; t += outputIntervalS) outputTimes.add(t);
  outputTimes.add(endS);
  const profileTimes = new Set(
    (request.profileTimesS ?? []).filter((t) => t > startS && t <= endS),
  );
  const breaks = new Set<number>([...outputTimes, ...profileTimes]);
  for (const measure of measures) {
    for (const ms of [measure.startMs, measure.endMs]) {
      if (ms !== undefined && ms / 1000 > startS && ms / 1000 < endS) breaks.add(ms / 1000);
    }
  }
  const sortedBreaks = [...breaks].sort((a, b) => a - b);
  const evaluate = (): ElementFigures =>
    request.targetCompressiveStrengthMPa === undefined
      ? evaluateElement(model, state)
      : evaluateElement(
          model,
          state,
          DEFAULT_UTILIZATION_THRESHOLDS,
          request.targetCompressiveStrengthMPa,
        );
  const series: ElementFigures[] = [evaluate()];
  const profiles: SimulationResult['profiles'] = [];
  if ((request.profileTimesS ?? []).includes(startS)) {
    profiles.push({
      timeS: startS,
      profiles: series[0]?.profiles ?? evaluate().profiles,
    });
  }
  let timeS = startS;
  for (const breakS of sortedBreaks) {
    while (timeS < breakS) {
      const nextS = Math.min(breakS, timeS + maxInputIntervalS);
      const midS = 0.5 * (timeS + nextS);
      const weather = weatherAt(request.weather, midS);
      const inputs: BoundaryInputs = {
        airTemperatureK: weather.airTemperatureK,
        relativeHumidity: weather.relativeHumidity,
        windMS: weather.windMS,
        surfaceTemperatureK: weather.surfaceTemperatureK,
        activeMeasures: curingMeasuresActiveAt(measures, midS * 1000),
      };
      if (weather.probeTemperatures !== undefined)
        inputs.probeTemperatures = weather.probeTemperatures;
      if (weather.measuredEvaporationKgM2s !== undefined) {
        inputs.measuredEvaporationKgM2s = weather.measuredEvaporationKgM2s;
      }
      model.advanceTo(state, nextS, inputs);
      timeS = nextS;
    }
    if (outputTimes.has(breakS) || profileTimes.has(breakS)) {
      const figures = evaluate();
      if (outputTimes.has(breakS)) series.push(figures);
      if (profileTimes.has(breakS)) profiles.push({ timeS: breakS, profiles: figures.profiles });
      request.onProgress?.((breakS - startS) / request.durationS);
    }
  }
  let maxSurfaceStressPa = Number.NEGATIVE_INFINITY;
  let minMarginPa = Number.NaN;
  let maxUtilization = Number.NEGATIVE_INFINITY;
  for (const figures of series) {
    maxSurfaceStressPa = Math.max(maxSurfaceStressPa, figures.surfaceStressPa);
    maxUtilization = Math.max(maxUtilization, figures.utilization);
    if (figures.phase === 'hardening' && !(figures.marginPa >= minMarginPa))
      minMarginPa = figures.marginPa;
  }
  return {
    series,
    profiles,
    state,
    maxSurfaceStressPa,
    minMarginPa,
    maxUtilization,
    waterLossKgM2: state.evaporatedKgM2,
  };
}
