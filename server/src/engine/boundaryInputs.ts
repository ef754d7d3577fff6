/**
 * What the element model takes from outside over an interval of event time: the weather at the
 * surface, the concrete temperatures by depth, a measured evaporation rate when one exists, and
 * the curing measures in place.
 */
import type { CuringMeasure } from '../physics/curingMeasures.ts';
import { kelvinToCelsius } from '../physics/units.ts';

/** One temperature probe reading at a depth. */
export interface ProbeTemperature {
  /** Depth below the exposed surface, m. */
  depthM: number;
  temperatureK: number;
}

/** Inputs held over one `advanceTo` interval. SI units. */
export interface BoundaryInputs {
  /** Air temperature, K. */
  airTemperatureK: number;
  /** Relative humidity of the air, fraction 0..1. */
  relativeHumidity: number;
  /** Wind speed about 0.5 m above the surface, m/s (convert mast readings with windProfile.ts). */
  windMS: number;
  /** Concrete surface temperature, K. */
  surfaceTemperatureK: number;
  /**
   * Concrete temperatures by depth (probes). Cells take the linear interpolation between probe
   * depths, constant beyond the first and last probe; absent: every cell at the surface
   * temperature.
   */
  probeTemperatures?: readonly ProbeTemperature[];
  /** Measured evaporation (pan or weighing sensor), kg/(m2 s); replaces the estimate. */
  measuredEvaporationKgM2s?: number;
  /** Curing measures active over the interval (see physics/curingMeasures.ts). */
  activeMeasures?: readonly CuringMeasure[];
}

/** Raised for inputs the model refuses; names the field, the rule and the value. */
export class BoundaryInputError extends Error {
  readonly field: string;
  constructor(field: string, rule: string, received: number) {
    super(`${field} ${rule}: got ${received}`);
    this.name = 'BoundaryInputError';
    this.field = field;
  }
}

/** Lowest concrete temperature the model accepts, degC (documented refusal of freezing). */
export const MIN_CONCRETE_TEMPERATURE_C = 0;

/**
 * Checks inputs before they reach the model. Freezing is refused, not modelled: a concrete
 * temperature (surface or probe) below 0 degC would freeze pore water, which the transport and
 * stress model do not represent (ice formation, frost pressure), so the model stops with a clear
 * message instead of returning numbers it cannot stand behind. The air may be below 0 degC.
 * Throws {@link BoundaryInputError}.
 */
export function checkBoundaryInputs(inputs: BoundaryInputs): void {
  checkFinite('airTemperatureK', inputs.airTemperatureK);
  checkFinite('windMS', inputs.windMS);
  checkFinite('relativeHumidity', inputs.relativeHumidity);
  if (inputs.relativeHumidity < 0 || inputs.relativeHumidity > 1) {
    throw new BoundaryInputError(
      'relativeHumidity',
      'must be between 0 and 1',
      inputs.relativeHumidity,
    );
  }
  if (inputs.windMS < 0)
    throw new BoundaryInputError('windMS', 'must not be negative', inputs.windMS);
  checkConcreteTemperature('surfaceTemperatureK', inputs.surfaceTemperatureK);
  const probes = inputs.probeTemperatures ?? [];
  for (let index = 0; index < probes.length; index += 1) {
    checkConcreteTemperature(
      `probeTemperatures[${index}].temperatureK`,
      (probes[index] as ProbeTemperature).temperatureK,
    );
  }
  if (inputs.measuredEvaporationKgM2s !== undefined) {
    checkFinite('measuredEvaporationKgM2s', inputs.measuredEvaporationKgM2s);
  }
}

/** Throws {@link BoundaryInputError} unless `value` is a finite number. */
function checkFinite(field: string, value: number): void {
  if (!Number.isFinite(value))
    throw new BoundaryInputError(field, 'must be a finite number', value);
}

/** Throws {@link BoundaryInputError} for a concrete temperature that is not finite or freezes. */
function checkConcreteTemperature(field: string, temperatureK: number): void {
  checkFinite(field, temperatureK);
  if (kelvinToCelsius(temperatureK) < MIN_CONCRETE_TEMPERATURE_C) {
    throw new BoundaryInputError(
      field,
      `must be at or above ${MIN_CONCRETE_TEMPERATURE_C} degC (freezing of the pore water is not modelled; protect the element from frost) (K)`,
      temperatureK,
    );
  }
}

/**
 * Cell temperatures from the inputs: linear interpolation between probe depths (sorted by depth),
 * constant beyond the ends; no probes: the surface temperature everywhere.
 */
export function fillCellTemperatures(
  inputs: BoundaryInputs,
  centresM: Float64Array,
  temperatureK: Float64Array,
): void {
  if (inputs.probeTemperatures === undefined || inputs.probeTemperatures.length === 0) {
    temperatureK.fill(inputs.surfaceTemperatureK, 0, centresM.length);
    return;
  }
  const probes = [...inputs.probeTemperatures].sort((a, b) => a.depthM - b.depthM);
  for (let i = 0; i < centresM.length; i += 1) {
    const depth = centresM[i] as number;
    const first = probes[0];
    const last = probes[probes.length - 1];
    if (first === undefined || last === undefined) {
      temperatureK[i] = inputs.surfaceTemperatureK;
    } else if (depth <= first.depthM) {
      temperatureK[i] = first.temperatureK;
    } else if (depth >= last.depthM) {
      temperatureK[i] = last.temperatureK;
    } else {
      let j = 1;
      while ((probes[j] as ProbeTemperature).depthM < depth) j += 1;
      const upper = probes[j] as ProbeTemperature;
      const lower = probes[j - 1] as ProbeTemperature;
      const weight = (depth - lower.depthM) / (upper.depthM - lower.depthM);
      temperatureK[i] = lower.temperatureK + weight * (upper.temperatureK - lower.temperatureK);
    }
  }
}
