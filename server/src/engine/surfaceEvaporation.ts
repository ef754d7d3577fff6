/**
 * The exposed surface's evaporation as a function of the surface pore humidity, from the
 * boundary inputs and the curing measures (physics.md section 4). Composes the physics library:
 * Uno's formula with the falling-rate extension (evaporation.ts) and the measure rules
 * (curingMeasures.ts).
 */
import { evaporationFluxKgM2s } from '../physics/evaporation.ts';
import { curingBoundaryInputs, type CuringMeasureOptions } from '../physics/curingMeasures.ts';
import { msToKmh, kmhToMs } from '../physics/units.ts';
import type { BoundaryInputs } from './boundaryInputs.ts';

/** Options of the surface evaporation. */
export interface SurfaceEvaporationOptions {
  /** Multiplier on the evaporation estimate (calibrated exposure), default 1 (our assumption). */
  exposureMultiplier?: number;
  /** Allow condensation onto the surface (negative evaporation), default false (physics.md 4). */
  allowCondensation?: boolean;
  /** Defaults of curing measures that do not carry their own figures. */
  curing?: CuringMeasureOptions;
}

/** Evaporation at the surface over one interval. */
export interface SurfaceEvaporation {
  /** True while a wet covering or ponding holds the surface saturated (no evaporation). */
  heldSaturated: boolean;
  /** Evaporation rate from a wet surface (h_s = 1), kg/(m2 s), after measures. */
  potentialKgM2s: number;
  /**
   * Evaporation rate at surface pore humidity h (0..1), kg/(m2 s), after measures:
   * E(h) = m [E_0 + h (E_1 - E_0)] where E_h is Uno's estimate (or the measured rate scaled by
   * the estimate's falling-rate ratio), clamped at 0 unless condensation is allowed.
   */
  rateKgM2s(surfaceHumidity: number): number;
  /** The same before the clamp at zero (negative: the air would give water to the surface). */
  signedRateKgM2s(surfaceHumidity: number): number;
  /** Whether negative rates (condensation) are allowed (option `allowCondensation`). */
  allowCondensation: boolean;
}

/**
 * Builds the evaporation of one interval. Uno's formula is linear in the surface humidity h_s,
 * so it is evaluated at h_s = 1 and h_s = 0 once and interpolated. A measured rate replaces the
 * wet-surface estimate and keeps the estimate's falling-rate shape (our assumption: the pan
 * measures a free water surface). Curing compounds multiply, fogging raises the humidity,
 * windbreaks scale the wind (curingBoundaryInputs). Source: Uno (1998); physics.md section 4.
 */
export function surfaceEvaporation(
  inputs: BoundaryInputs,
  options: SurfaceEvaporationOptions = {},
): SurfaceEvaporation {
  const effective = curingBoundaryInputs(
    inputs.activeMeasures ?? [],
    { windKmH: msToKmh(inputs.windMS), relativeHumidity: inputs.relativeHumidity },
    options.curing ?? {},
  );
  const allowCondensation = options.allowCondensation ?? false;
  const weather = {
    airTemperatureK: inputs.airTemperatureK,
    concreteTemperatureK: inputs.surfaceTemperatureK,
    relativeHumidity: effective.relativeHumidity,
    windMS: kmhToMs(effective.windKmH),
  };
  const wet = evaporationFluxKgM2s(weather, { surfacePoreHumidity: 1, allowCondensation: true });
  const dry = evaporationFluxKgM2s(weather, { surfacePoreHumidity: 0, allowCondensation: true });
  return new LinearSurfaceEvaporation(
    effective.heldSaturated,
    dry,
    wet,
    inputs.measuredEvaporationKgM2s,
    (options.exposureMultiplier ?? 1) * effective.fluxMultiplier,
    allowCondensation,
  );
}

/**
 * E(h) of one interval, linear in h between the rates at h = 0 and h = 1 (a class, so that an
 * interval builds no closures: the model builds one per interval of event time).
 */
class LinearSurfaceEvaporation implements SurfaceEvaporation {
  readonly potentialKgM2s: number;
  constructor(
    readonly heldSaturated: boolean,
    private readonly dryKgM2s: number,
    private readonly wetKgM2s: number,
    private readonly measuredKgM2s: number | undefined,
    private readonly multiplier: number,
    readonly allowCondensation: boolean,
  ) {
    this.potentialKgM2s = this.rateKgM2s(1);
  }

  signedRateKgM2s(surfaceHumidity: number): number {
    if (this.heldSaturated) return 0;
    const estimate = this.dryKgM2s + surfaceHumidity * (this.wetKgM2s - this.dryKgM2s);
    let rate: number;
    if (this.measuredKgM2s === undefined) rate = estimate;
    else if (this.wetKgM2s > 0) rate = (this.measuredKgM2s * estimate) / this.wetKgM2s;
    else rate = this.measuredKgM2s; // the estimate sees no drive: trust the measurement as it is
    return rate * this.multiplier;
  }

  rateKgM2s(surfaceHumidity: number): number {
    const rate = this.signedRateKgM2s(surfaceHumidity);
    return this.allowCondensation ? rate : Math.max(0, rate);
  }
}
