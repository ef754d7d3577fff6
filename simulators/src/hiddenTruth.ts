/**
 * The hidden truth behind the simulated probes: the element as it "really" is, with its own
 * parameters that the server never sees. The probe strings sample it at their depths; it is
 * advanced in event time under the scripted weather and the crew's measure log, so the probe
 * readings are consistent with both.
 *
 * Two implementations:
 * - engineTruth.ts: the server's element drying model (server/src/engine) on a finer grid with
 *   the scenario's hidden parameters. The demo and its acceptance test use only this one.
 * - standInTruth.ts: a documented simple stand-in, NOT a drying model, so the simulators'
 *   plumbing can be tested on its own. Never used by the demo.
 */
import type { CuringMeasure } from '../../server/src/physics/index.ts';

/** Weather the truth is exposed to over one step (mean values, before sensor noise). */
export interface TruthWeather {
  airTemperatureC: number;
  relativeHumidityPercent: number;
  /** Mean wind at the mast, m/s, and the mast height, m. */
  windAtMastMS: number;
  mastHeightM: number;
  solarWm2: number;
  rainMmH: number;
}

/** Risk figures of the truth at its current time. */
export interface TruthRiskFigures {
  phase: string;
  /** Utilization U of the phase: >= 1 means the margin has closed. */
  utilization: number;
  /** fct - sigma_s, Pa (NaN in the plastic phase). */
  marginPa: number;
}

/** What a probe sensor at a depth would read if it were perfect. */
export interface HiddenTruth {
  /** Which implementation: `engine` or `stand-in`. */
  readonly kind: 'engine' | 'stand-in';
  /** Event time reached, ms since the Unix epoch. */
  readonly timeMs: number;
  /**
   * Advances to `timeMs` with `weather` and `activeMeasures` held over the interval. A time at
   * or before the current one does nothing.
   */
  advanceTo(timeMs: number, weather: TruthWeather, activeMeasures: readonly CuringMeasure[]): void;
  /** Relative humidity of the pore air at `depthMm` below the exposed surface, %. */
  relativeHumidityPercentAt(depthMm: number): number;
  /** Concrete temperature at `depthMm`, degC. */
  temperatureCAt(depthMm: number): number;
  /** Evaporation from the surface over the last step, kg/(m2 h). */
  evaporationKgM2h(): number;
  /**
   * Capillary suction of the pore water in the surface cell, Pa (0 while saturated or under a
   * bleed film): the plastic-phase risk figure's numerator (physics.md section 7). NaN for the
   * stand-in, which has no pore water.
   */
  surfaceSuctionPa(): number;
  /**
   * The truth's own risk figures now (physics.md section 7), from the engine's evaluation:
   * phase, utilization U and margin. Null for the stand-in.
   */
  riskFigures(): TruthRiskFigures | null;
}
