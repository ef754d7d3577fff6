/**
 * The outlook of physics.md 9: every member run ahead over the horizon from a copy of its state,
 * under forecast weather (persistence of the recent mean, or the supplied series where it has
 * values), sampling utilization and margin at the output times; statistics over the members by
 * the calibration core. Copies only, and no random draws: an outlook never changes the filter.
 */
import { outlookStatistics } from '../calibration/index.ts';
import type { OutlookStatistics } from '../calibration/index.ts';
import { cloneElementState, evaluateRisk } from '../engine/index.ts';
import type { BoundaryInputs, ElementModel, ElementState } from '../engine/index.ts';
import { curingMeasuresActiveAt, windSpeedAtUnoHeight } from '../physics/index.ts';
import type { CuringMeasure } from '../physics/index.ts';
import type { ForecastPoint } from './types.ts';

const KELVIN_OFFSET = 273.15;

/** What one outlook needs. */
export interface OutlookRequest {
  model: ElementModel;
  members: readonly ElementState[];
  placedMs: number;
  /** Start of the outlook (the engine's event time), ms. */
  startMs: number;
  horizonS: number;
  stepS: number;
  /** Persistence inputs (recent means), without measures. */
  persistence: BoundaryInputs;
  /** Supplied forecast points, sorted by time (empty: persistence only). */
  forecast: readonly ForecastPoint[];
  mastHeightM: number;
  measures: readonly CuringMeasure[];
  thresholds: readonly number[];
}

/**
 * Forecast inputs at `timeMs`: the latest supplied point at or before it (else the first point
 * when it lies within one step ahead) overrides air temperature, humidity and wind where it has
 * them; everything else is persistence; measures of the log active then.
 */
export function forecastInputs(request: OutlookRequest, timeMs: number): BoundaryInputs {
  let point: ForecastPoint | undefined;
  for (const candidate of request.forecast) {
    if (candidate.timeMs <= timeMs) point = candidate;
    else break;
  }
  const base = request.persistence;
  const measures = curingMeasuresActiveAt(request.measures, timeMs);
  const inputs: BoundaryInputs = {
    airTemperatureK:
      point?.airTemperatureC === undefined
        ? base.airTemperatureK
        : point.airTemperatureC + KELVIN_OFFSET,
    relativeHumidity:
      point?.relativeHumidityPercent === undefined
        ? base.relativeHumidity
        : Math.min(1, Math.max(0, point.relativeHumidityPercent / 100)),
    windMS:
      point?.windSpeedMs === undefined
        ? base.windMS
        : Math.max(0, windSpeedAtUnoHeight(Math.max(0, point.windSpeedMs), request.mastHeightM)),
    surfaceTemperatureK: base.surfaceTemperatureK,
    ...(base.probeTemperatures === undefined ? {} : { probeTemperatures: base.probeTemperatures }),
    ...(measures.length > 0 ? { activeMeasures: measures } : {}),
  };
  return inputs;
}

/** Output times of the outlook, s after its start: 0, step, 2 step, ... horizon. */
export function outlookOffsetsS(horizonS: number, stepS: number): number[] {
  const offsets = [0];
  for (let t = stepS; t < horizonS - 1e-9; t += stepS) offsets.push(t);
  offsets.push(horizonS);
  return offsets;
}

/**
 * Runs every member ahead and returns the statistics (times in s after the start). A member whose
 * model refuses the inputs or fails to converge keeps NaN from then on (left out of the bands).
 */
export function runOutlook(request: OutlookRequest): OutlookStatistics {
  const offsets = outlookOffsetsS(request.horizonS, request.stepS);
  const startS = (request.startMs - request.placedMs) / 1000;
  const inputsAt = offsets.map((offset) =>
    forecastInputs(request, request.startMs + offset * 1000),
  );
  const utilization: number[][] = [];
  const marginMPa: number[][] = [];
  for (const member of request.members) {
    const state = cloneElementState(member);
    const u: number[] = [];
    const m: number[] = [];
    let failed = false;
    offsets.forEach((offset, j) => {
      if (j > 0 && !failed) {
        try {
          request.model.advanceTo(state, startS + offset, inputsAt[j - 1] as BoundaryInputs);
        } catch {
          failed = true;
        }
      }
      if (failed) {
        u.push(Number.NaN);
        m.push(Number.NaN);
        return;
      }
      // The utilization and margin alone: the whole figures (profiles, precautions, forecasts)
      // of every member at every output time cost about a quarter of a live cycle.
      const risk = evaluateRisk(request.model, state);
      u.push(risk.utilization);
      m.push(risk.marginPa / 1e6);
    });
    utilization.push(u);
    marginMPa.push(m);
  }
  return outlookStatistics({
    timesS: offsets,
    utilization,
    marginMPa,
    thresholds: request.thresholds,
  });
}
