/**
 * The concrete temperatures of the hidden truth: a scripted field, not a heat-transfer model
 * (the drying model takes temperatures as inputs). The surface follows the air warmed by the sun
 * with a first-order lag; each depth follows the surface with the lag of heat diffusing to it.
 *
 *   T_target = T_air + g S / 1000          (g: K per kW/m2 of sun, scenario)
 *   dT_0/dt  = (T_target - T_0) / tau_s    (tau_s: surface lag, scenario)
 *   dT_d/dt  = (T_0 - T_d) / max(d^2 / alpha, 1 s)
 *
 * d^2 / alpha is the diffusion time to depth d (the scale of the semi-infinite solid's response to
 * a change of its surface temperature, Carslaw and Jaeger 1959, section 2.4): 36 s at 5 mm, 33 min
 * at 37.5 mm. The surface lag is the air-to-surface exchange and is not added again at depth (an
 * earlier version did, which made a 5 mm probe trail the surface by some 35 min).
 * alpha = 7e-7 m2/s, a thermal diffusivity of concrete (common practice: 0.5e-6 to 1e-6 m2/s,
 * from memory). Heat of hydration is left out (our assumption: a thin topping on a deck loses it
 * quickly). Steps are integrated exactly for held targets (exponential update), so any step is
 * stable.
 */

/** Thermal diffusivity of concrete, m2/s (common practice, from memory). */
export const CONCRETE_THERMAL_DIFFUSIVITY_M2S = 7e-7;

export interface ThermalFieldOptions {
  /** Depths tracked, mm, ascending; others are interpolated. */
  depthsMm: readonly number[];
  initialTemperatureC: number;
  /** Rise of the surface over the air per 1000 W/m2 of sun, K. */
  solarGainKPerKWm2: number;
  /** Surface lag time constant, s. */
  surfaceLagS: number;
}

/** A scripted temperature field over the depth. */
export class ThermalField {
  readonly #depthsMm: number[];
  readonly #temperaturesC: number[];
  readonly #options: ThermalFieldOptions;

  constructor(options: ThermalFieldOptions) {
    this.#options = options;
    this.#depthsMm = [...new Set([0, ...options.depthsMm])].sort((a, b) => a - b);
    this.#temperaturesC = this.#depthsMm.map(() => options.initialTemperatureC);
  }

  /**
   * Advances the field by `stepS` seconds under air temperature (degC) and sun (W/m2) held over
   * the step. Non-positive steps do nothing.
   */
  step(stepS: number, airTemperatureC: number, solarWm2: number): void {
    if (!(stepS > 0)) return;
    const target = airTemperatureC + (this.#options.solarGainKPerKWm2 * solarWm2) / 1000;
    const surfaceLagS = this.#options.surfaceLagS;
    const surfaceBefore = this.#temperaturesC[0] ?? target;
    const surfaceAfter = target + (surfaceBefore - target) * Math.exp(-stepS / surfaceLagS);
    this.#temperaturesC[0] = surfaceAfter;
    for (let index = 1; index < this.#depthsMm.length; index += 1) {
      const depthM = (this.#depthsMm[index] ?? 0) / 1000;
      const lagS = Math.max((depthM * depthM) / CONCRETE_THERMAL_DIFFUSIVITY_M2S, 1);
      const before = this.#temperaturesC[index] ?? surfaceAfter;
      this.#temperaturesC[index] = surfaceAfter + (before - surfaceAfter) * Math.exp(-stepS / lagS);
    }
  }

  /** Temperature at `depthMm`, degC: linear between tracked depths, constant beyond. */
  temperatureCAt(depthMm: number): number {
    return interpolate(this.#depthsMm, this.#temperaturesC, depthMm);
  }

  /** Tracked depths (mm) and temperatures (degC), surface first. */
  profile(): { depthMm: number; temperatureC: number }[] {
    return this.#depthsMm.map((depthMm, index) => ({
      depthMm,
      temperatureC: this.#temperaturesC[index] ?? Number.NaN,
    }));
  }
}

/**
 * Linear interpolation of `ys` over ascending `xs` at `x`, constant beyond the ends. NaN for an
 * empty table or a NaN `x`.
 */
export function interpolate(xs: readonly number[], ys: readonly number[], x: number): number {
  const count = Math.min(xs.length, ys.length);
  if (count === 0 || Number.isNaN(x)) return Number.NaN;
  if (x <= (xs[0] as number)) return ys[0] as number;
  if (x >= (xs[count - 1] as number)) return ys[count - 1] as number;
  let upper = 1;
  while ((xs[upper] as number) < x) upper += 1;
  const x0 = xs[upper - 1] as number;
  const x1 = xs[upper] as number;
  const y0 = ys[upper - 1] as number;
  const y1 = ys[upper] as number;
  return x1 === x0 ? y1 : y0 + ((x - x0) / (x1 - x0)) * (y1 - y0);
}
