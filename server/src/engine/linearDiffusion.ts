/**
 * Linear-diffusion mode of the transport solver (constant diffusivity), for verification against
 * closed-form solutions (physics.md section 3).
 */
import type { CellHydraulics } from './hydraulics.ts';

/** Options of the linear-diffusion (verification) mode. */
export interface LinearDiffusionOptions {
  /** Constant diffusivity D, m2/s (> 0). */
  diffusivityM2s: number;
  /** Number of cells. */
  cellCount: number;
  /** Porosity, default 1 (our choice: makes water volume equal the concentration integral). */
  porosity?: number;
  /**
   * Pressure scale P, Pa: S = 1 + p / P is linear in p, so dS/dp = 1 / P. Default 1e6 Pa
   * (any positive value gives the same saturation field; our choice).
   */
  pressureScalePa?: number;
}

/**
 * Hydraulics of a linear diffusion problem: S = 1 + p / P and K = D phi / P, so the mixed form
 * phi dS/dt = d/dx (K dp/dx) becomes dS/dt = D d2S/dx2 exactly (no storage, no saturation
 * bound: S is not clipped to 0..1 so the mode stays linear). Used to verify the solver against
 * the plane-sheet series of Crank (1975), The Mathematics of Diffusion, 2nd ed., chapter 4.
 */
export function linearDiffusionHydraulics(options: LinearDiffusionOptions): CellHydraulics {
  const porosityValue = options.porosity ?? 1;
  const pressureScalePa = options.pressureScalePa ?? 1e6;
  const conductivityValue = (options.diffusivityM2s * porosityValue) / pressureScalePa;
  const porosity = new Float64Array(options.cellCount).fill(porosityValue);
  const specificStoragePerPa = new Float64Array(options.cellCount);
  return {
    porosity,
    specificStoragePerPa,
    evaluate(pressurePa, saturation, capacityPerPa, conductivity) {
      for (let i = 0; i < pressurePa.length; i += 1) {
        saturation[i] = 1 + (pressurePa[i] as number) / pressureScalePa;
        capacityPerPa[i] = 1 / pressureScalePa;
        conductivity[i] = conductivityValue;
      }
    },
    pressureFromSaturation(_cell, saturationValue) {
      return (saturationValue - 1) * pressureScalePa;
    },
  };
}
