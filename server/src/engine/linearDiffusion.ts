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

/** Linear-mode hydraulics with the conversions a test needs. */
export interface LinearDiffusionHydraulics extends CellHydraulics {
  /** Pressure (Pa) that stands for saturation S. */
  pressureFromSaturation(saturation: number): number;
  /** Saturation S of a water content theta. */
  saturationFromWaterContent(waterContent: number): number;
}

/**
 * Hydraulics of a linear diffusion problem: S = 1 + p / P and K = D phi / P, so the mixed form
 * phi dS/dt = d/dx (K dp/dx) becomes dS/dt = D d2S/dx2 exactly (no specific storage, no saturation
 * bound: S is not clipped to 0..1 so the mode stays linear). Used to verify the solver against
 * the plane-sheet series of Crank (1975), The Mathematics of Diffusion, 2nd ed., chapter 4.
 */
export function linearDiffusionHydraulics(
  options: LinearDiffusionOptions,
): LinearDiffusionHydraulics {
  const porosityValue = options.porosity ?? 1;
  const pressureScalePa = options.pressureScalePa ?? 1e6;
  const conductivityValue = (options.diffusivityM2s * porosityValue) / pressureScalePa;
  return {
    evaluate(pressurePa, waterContent, capacityPerPa, conductivity, storageContent) {
      for (let i = 0; i < pressurePa.length; i += 1) {
        waterContent[i] = porosityValue * (1 + (pressurePa[i] as number) / pressureScalePa);
        capacityPerPa[i] = porosityValue / pressureScalePa;
        conductivity[i] = conductivityValue;
        if (storageContent !== undefined) storageContent[i] = 0;
      }
      return false;
    },
    waterContents(pressurePa, waterContent, storageContent) {
      for (let i = 0; i < pressurePa.length; i += 1) {
        waterContent[i] = porosityValue * (1 + (pressurePa[i] as number) / pressureScalePa);
        if (storageContent !== undefined) storageContent[i] = 0;
      }
    },
    pressureFromSaturation(saturationValue) {
      return (saturationValue - 1) * pressureScalePa;
    },
    saturationFromWaterContent(waterContent) {
      return waterContent / porosityValue;
    },
  };
}
