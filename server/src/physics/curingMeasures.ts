/**
 * How the curing measures in the measure log change the exposed surface's boundary condition
 * (physics.md section 4). Pure functions: the measures active at one instant plus the weather at
 * the surface go in, the effective inputs of the evaporation estimate come out.
 *
 * Combination rules (our assumption, stated so the engine and the tests agree):
 * - wet covering or ponding: the surface is held saturated (liquid pressure p = 0) and no water
 *   leaves the concrete (the covering's own water evaporates instead), whatever else is active;
 * - curing compounds: each passes a fraction (1 - efficiency) of the flux; several coats act in
 *   series, so their fractions multiply;
 * - fogging: raises the humidity of the air over the surface to at least the fogging humidity;
 *   it never lowers it; with several, the highest governs;
 * - windbreaks: scale the wind by a factor; with several, the most sheltering (smallest factor)
 *   governs; they are not assumed to compound;
 * - a measure that has ended no longer acts (removing a measure restores exposure).
 */

/** Kinds of curing measure the measure log records (terms of the trade, vocabulary.md). */
export type CuringMeasureKind =
  'wet-covering' | 'ponding' | 'curing-compound' | 'fogging' | 'windbreak';

/** One logged curing measure. Optional fields override the option defaults for this entry. */
export interface CuringMeasure {
  kind: CuringMeasureKind;
  /** Start of the measure, ms since the Unix epoch (inclusive). */
  startMs: number;
  /** End of the measure, ms since the Unix epoch (exclusive); absent while still in place. */
  endMs?: number;
  /** curing-compound only: fraction of evaporation it stops, 0..1. */
  efficiency?: number;
  /** fogging only: relative humidity it holds over the surface, fraction 0..1. */
  relativeHumidity?: number;
  /** windbreak only: ratio of sheltered to open wind speed, 0..1. */
  windFactor?: number;
}

/** Defaults for measure entries that do not carry their own figure. */
export interface CuringMeasureOptions {
  /**
   * Efficiency of a curing compound (fraction of evaporation stopped), default 0.8. Our
   * assumption: membrane compounds meeting ASTM C309 are often credited with 0.6 to 0.95 in the
   * literature, from memory; the calibration (physics.md section 8) adjusts it per run.
   */
  curingCompoundEfficiency?: number;
  /**
   * Relative humidity held over the surface by fogging, fraction, default 0.9. Our assumption;
   * fogging is used to raise the humidity above the surface (ACI 308R practice, common
   * practice); the figure it reaches depends on nozzles, wind and sun.
   */
  foggingRelativeHumidity?: number;
  /**
   * Ratio of sheltered to open wind speed behind a windbreak, default 0.5. Our assumption (a
   * porous fence shelters a zone a few times its height deep to roughly half the open wind
   * speed, from memory).
   */
  windbreakWindFactor?: number;
}

/** Weather at the surface before curing measures: wind at about 0.5 m and air humidity. */
export interface SurfaceWeather {
  /** Wind speed about 0.5 m above the surface, km/h. */
  windKmH: number;
  /** Relative humidity of the air, fraction 0..1. */
  relativeHumidity: number;
}

/** Effective boundary inputs after the curing measures. */
export interface CuringBoundaryInputs {
  /** Wind speed for the evaporation formula, km/h. */
  windKmH: number;
  /** Relative humidity for the evaporation formula, fraction 0..1. */
  relativeHumidity: number;
  /** Multiplier on the evaporation flux, 0..1 (0 while held saturated). */
  fluxMultiplier: number;
  /** True while wet covering or ponding holds the surface saturated at p = 0, no flux. */
  heldSaturated: boolean;
}

const clampFraction = (value: number): number => Math.min(1, Math.max(0, value));

/**
 * Measures in `log` that act at `timeMs` (ms epoch): startMs <= timeMs < endMs, or no end yet.
 * A NaN time matches nothing. The log's order is kept.
 */
export function curingMeasuresActiveAt(
  log: readonly CuringMeasure[],
  timeMs: number,
): CuringMeasure[] {
  return log.filter(
    (measure) =>
      measure.startMs <= timeMs && (measure.endMs === undefined || timeMs < measure.endMs),
  );
}

/**
 * Effective boundary inputs for the evaporation estimate under the active curing measures:
 *   heldSaturated = any wet covering or ponding (then fluxMultiplier = 0)
 *   fluxMultiplier = product over curing compounds of (1 - efficiency)
 *   relativeHumidity = max(weather r, fogging humidities)
 *   windKmH = weather V * min(windbreak factors)
 *
 * Units: wind km/h, humidities and factors fractions 0..1. Efficiencies, fogging humidities and
 * wind factors are clamped to 0..1 (validate at the edge; here a bad figure must not create
 * water). No active measure returns the weather unchanged with multiplier 1. NaN weather values
 * pass through as NaN; a NaN measure figure is ignored and the option default is used instead.
 * Source: combination rules are our assumption (see the file comment); the measures themselves
 * follow ACI 308R practice.
 */
export function curingBoundaryInputs(
  activeMeasures: readonly CuringMeasure[],
  weather: SurfaceWeather,
  options: CuringMeasureOptions = {},
): CuringBoundaryInputs {
  const defaultEfficiency = options.curingCompoundEfficiency ?? 0.8;
  const defaultFoggingHumidity = options.foggingRelativeHumidity ?? 0.9;
  const defaultWindFactor = options.windbreakWindFactor ?? 0.5;
  const figure = (value: number | undefined, fallback: number): number =>
    clampFraction(value === undefined || Number.isNaN(value) ? fallback : value);

  let heldSaturated = false;
  let fluxMultiplier = 1;
  let relativeHumidity = weather.relativeHumidity;
  let windFactor = 1;
  for (const measure of activeMeasures) {
    switch (measure.kind) {
      case 'wet-covering':
      case 'ponding':
        heldSaturated = true;
        break;
      case 'curing-compound':
        fluxMultiplier *= 1 - figure(measure.efficiency, defaultEfficiency);
        break;
      case 'fogging':
        relativeHumidity = Math.max(
          relativeHumidity,
          figure(measure.relativeHumidity, defaultFoggingHumidity),
        );
        break;
      case 'windbreak':
        windFactor = Math.min(windFactor, figure(measure.windFactor, defaultWindFactor));
        break;
    }
  }
  return {
    windKmH: weather.windKmH * windFactor,
    relativeHumidity,
    fluxMultiplier: heldSaturated ? 0 : fluxMultiplier,
    heldSaturated,
  };
}
