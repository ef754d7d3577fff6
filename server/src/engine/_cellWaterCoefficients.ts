/**
 * The coefficients of the pore water in each cell at its temperature, for poreHydraulics.ts: the
 * surface-tension ratio that scales the retention curve (Young-Laplace), the inverse viscosity
 * of the liquid conductivity, the inverse Kelvin coefficient, and the vapour factor of
 * K_vapour = (D_air / tau) phi (1 - S) rho_v(T, h) / (rho_w A(T)) with rho_v = h p_sat M_w / (R T)
 * (physics.md section 3).
 *
 * A new temperature reads the shared table of water properties (_waterPropertyTable.ts: IAPWS
 * through the physics library, interpolated within 1e-7) straight into the cell's coefficients;
 * a cell at its neighbour's temperature copies the neighbour's (cells share one surface
 * temperature when no probe profile is given). No memo of objects per temperature: the weather
 * gives a new temperature every interval, so a memo missed and its objects fed the garbage
 * collector. Temperatures outside the water-property ranges give NaN coefficients.
 */
import { GAS_CONSTANT_J_PER_MOL_K, WATER_MOLAR_MASS_KG_PER_MOL } from '../physics/units.ts';
import { waterPropertiesAt, type WaterProperties } from './_waterPropertyTable.ts';

/** Options of {@link createCellWaterCoefficients}; every field is required. */
export interface CellWaterOptions {
  /** Temperature of each cell, K: read by `refreshCell`, written by the caller. */
  temperatureK: Float64Array;
  /** Surface tension of water at the retention curve's reference temperature, N/m. */
  referenceTensionNPerM: number;
  /** Vapour diffusion through drained pores; false: the vapour factor is 0. */
  vapourDiffusion: boolean;
  /** Diffusivity of water vapour in air, m2/s. */
  vapourDiffusivityM2s: number;
  /** Tortuosity tau >= 1 of the vapour paths. */
  tortuosity: number;
  /** Porosity phi, 0..1. */
  porosity: number;
  /** Liquid density that turns vapour mass flux into liquid volume, kg/m3. */
  liquidDensityKgPerM3: number;
}

/** Per-cell water coefficients (one entry per cell of `temperatureK`). */
export interface CellWaterCoefficients {
  /** gamma_ref / gamma(T_i). */
  readonly tensionRatio: Float64Array;
  /** 1 / eta(T_i), 1/(Pa s). */
  readonly inverseViscosity: Float64Array;
  /** 1 / A(T_i), 1/Pa: the Kelvin equation is h = exp(p / A). */
  readonly inverseKelvinPerPa: Float64Array;
  /** (D_air / tau) phi p_sat M_w / (R T rho_w A), m2/(Pa s): K_vapour = it (1 - S) h. */
  readonly vapourFactor: Float64Array;
  /**
   * Recomputes cell i's coefficients if `temperatureK[i]` changed since they were computed
   * (call for cells in order: cell i copies cell i - 1's at the same temperature).
   */
  readonly refreshCell: (cell: number) => void;
}

/** Coefficients for every cell of `options.temperatureK`, computed by `refreshCell`. */
export function createCellWaterCoefficients(options: CellWaterOptions): CellWaterCoefficients {
  const { temperatureK, referenceTensionNPerM, vapourDiffusion, tortuosity, porosity } = options;
  const airDiffusivity = options.vapourDiffusivityM2s;
  const liquidDensity = options.liquidDensityKgPerM3;
  const n = temperatureK.length;
  const tensionRatio = new Float64Array(n);
  const inverseViscosity = new Float64Array(n);
  const inverseKelvin = new Float64Array(n);
  const vapourFactor = new Float64Array(n);
  const computedForK = new Float64Array(n).fill(Number.NaN);
  const water: WaterProperties = {
    surfaceTensionNPerM: 0,
    viscosityPaS: 0,
    densityKgPerM3: 0,
    kelvinCoefficientPa: 0,
    saturationVapourPressurePa: 0,
  };
  const refreshCell = (i: number): void => {
    const temperature = temperatureK[i] as number;
    if (temperature === computedForK[i]) return;
    computedForK[i] = temperature;
    if (i > 0 && temperature === computedForK[i - 1]) {
      tensionRatio[i] = tensionRatio[i - 1] as number;
      inverseViscosity[i] = inverseViscosity[i - 1] as number;
      inverseKelvin[i] = inverseKelvin[i - 1] as number;
      vapourFactor[i] = vapourFactor[i - 1] as number;
      return;
    }
    waterPropertiesAt(temperature, water);
    const kelvinPa = water.kelvinCoefficientPa;
    tensionRatio[i] = referenceTensionNPerM / water.surfaceTensionNPerM;
    inverseViscosity[i] = 1 / water.viscosityPaS;
    inverseKelvin[i] = 1 / kelvinPa;
    vapourFactor[i] = vapourDiffusion
      ? ((airDiffusivity / tortuosity) *
          porosity *
          water.saturationVapourPressurePa *
          WATER_MOLAR_MASS_KG_PER_MOL) /
        (GAS_CONSTANT_J_PER_MOL_K * temperature * liquidDensity * kelvinPa)
      : 0;
  };
  return {
    tensionRatio,
    inverseViscosity,
    inverseKelvinPerPa: inverseKelvin,
    vapourFactor,
    refreshCell,
  };
}
