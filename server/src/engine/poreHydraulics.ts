/**
 * Hydraulic properties of a porous material for the transport solver, per cell (physics.md
 * sections 2 and 3): the material's curves at the reference temperature with fresh pores
 * (_poreReferenceCurves.ts: Young-Laplace retention, capillary-bundle permeability), scaled in
 * each cell for its temperature (surface tension, viscosity and vapour diffusion:
 * _cellWaterCoefficients.ts) and its pore refinement (hydration).
 *
 * Scaling rule: in cell i, pore diameters are the fresh ones times `diameterScale[i]` and the
 * surface tension is gamma(T_i). Young-Laplace is linear in gamma / D, so
 *   p_i(S) = p_ref(S) / c_i,   c_i = diameterScale_i * gamma_ref / gamma(T_i),
 * with p_ref the curve at the reference temperature; capillary-bundle permeability scales with
 * D^2, so k_i(S) = k_ref(S) diameterScale_i^2.
 */
import type { PoreRetentionCurve } from '../physics/retention.ts';
import type { PoreSizeDistribution } from '../physics/retentionCurve.ts';
import type { CapillaryBundlePermeability } from '../physics/capillaryBundlePermeability.ts';
import type { CellHydraulics } from './hydraulics.ts';
import { pressureForSaturation, pressureOnSameSegment } from './_hydraulicTable.ts';
import { poreReferenceCurves } from './_poreReferenceCurves.ts';
import { log2Linear, log2LinearSlopeFactor } from './_log2Linear.ts';
import { createCellWaterCoefficients } from './_cellWaterCoefficients.ts';

/** Options of {@link createPoreHydraulics}. */
export interface PoreHydraulicsOptions {
  /** Pore-size distribution of the material as placed (fresh). */
  poreSizes: PoreSizeDistribution;
  /** Porosity phi, 0..1. */
  porosity: number;
  /** Tortuosity tau >= 1 of the capillary bundle and of vapour paths. */
  tortuosity: number;
  /**
   * Multiplier on the permeability, default 1. The calibration (physics.md section 8) adjusts
   * its logarithm; a measured saturated permeability sets it at the edge.
   */
  permeabilityMultiplier?: number;
  /**
   * Measured saturated permeability, m2: rescales the capillary-bundle curve k(S) to it
   * (physics.md section 3); default none, the bundle's own k(1).
   */
  saturatedPermeabilityM2?: number;
  /** Vapour diffusion through drained pores, default true (physics.md section 3). */
  vapourDiffusion?: boolean;
  /**
   * Diffusivity of water vapour in air, m2/s, default 2.5e-5 (about 20 degC and 1 atm; from
   * memory, e.g. Massman (1998) gives 2.18e-5 at 0 degC scaling with T^1.81).
   */
  vapourDiffusivityM2s?: number;
  /** Reference temperature of the curve, K; default 293.15 (20 degC, our choice). */
  referenceTemperatureK?: number;
  /** Liquid density used to turn vapour mass flux into liquid volume, kg/m3; default 998.2. */
  liquidDensityKgPerM3?: number;
  /** Number of cells. */
  cellCount: number;
}

/** Pore hydraulics with per-cell temperature and refinement; call a refresh after changes. */
export interface PoreHydraulics extends CellHydraulics {
  readonly retention: PoreRetentionCurve;
  readonly permeability: CapillaryBundlePermeability;
  /** Temperature of each cell, K (write, then refresh). */
  readonly temperatureK: Float64Array;
  /** Factor on the fresh pore diameters of each cell, (0, 1] (write, then refresh). */
  readonly diameterScale: Float64Array;
  /** c_i = diameterScale_i gamma_ref / gamma(T_i): p_ref = p c_i (derived). */
  readonly pressureScale: Float64Array;
  /**
   * Specific storage per cell, 1/Pa (writable). It acts while the cell is saturated
   * (p > p_ae): the storage water is S_s max(p, p_ae), so the storage term keeps the saturated
   * zone well posed without letting a soft skeleton release water without bound once the pores
   * drain (our assumption, physics.md section 3).
   */
  readonly specificStoragePerPa: Float64Array;
  /** Recomputes every coefficient after `temperatureK` (and `diameterScale`) changed. */
  refreshTemperature(): void;
  /** Recomputes the refinement-dependent coefficients after only `diameterScale` changed. */
  refreshScale(): void;
  /** Sets the multiplier on permeability (per ensemble member) and refreshes. */
  setPermeabilityMultiplier(multiplier: number): void;
  /** Saturation of cell i at liquid pressure p, 0..1. */
  saturationAt(cell: number, pressurePa: number): number;
  /** Water content theta of cell i at liquid pressure p, m3/m3 (phi S + S_s max(p, p_ae)). */
  waterContentAt(cell: number, pressurePa: number): number;
  /**
   * Liquid pressure (Pa) at which cell i holds water content theta: the exact inverse of the
   * tabulated forward curve (to rounding); theta above the saturated range gives p > 0. Where the
   * curve is flat (no specific storage while saturated, or beyond the driest tabulated node) any
   * pressure on the flat part holds theta and `guessPa` is kept when it lies there.
   */
  pressureForWaterContent(cell: number, waterContent: number, guessPa: number): number;
  /**
   * Liquid pressure (Pa) at which cell i holds water content theta after its curve changed
   * (temperature, refinement, storage), from its pressure `pressurePa` under the pressure scale
   * `previousScale` it had before: {@link pressureForWaterContent}'s answer (to rounding),
   * without its search when the saturation stays on the cell's table segment (a change of a few
   * per mil moves it little; _hydraulicTable.ts `pressureOnSameSegment`).
   */
  pressureKeepingWater(
    cell: number,
    waterContent: number,
    pressurePa: number,
    previousScale: number,
  ): number;
  /**
   * Gives cell i the pore-diameter factor `scale` and the specific storage `storage` (1/Pa): what
   * writing `diameterScale` and `specificStoragePerPa` and `refreshScale()` do, for one cell (for
   * each cell hydration refined; the next step's balance keeps its water, stepController.ts).
   */
  rescaleCell(cell: number, scale: number, storage: number): void;
  /**
   * Takes the cell temperatures `temperatures` (K): writing `temperatureK` and
   * `refreshTemperature()` for the cells whose temperature changed. Returns whether any did.
   */
  setTemperatures(temperatures: Float64Array): boolean;
  /**
   * Takes the cell temperatures `temperatures` (K) and moves `pressures` (Pa, read and written)
   * so every cell whose temperature changed keeps its water content: writing `temperatureK`,
   * `refreshTemperature()` and {@link pressureKeepingWater} for those cells in one pass (when the
   * weather changes the temperatures with no step to take). Returns whether any cell changed.
   */
  setTemperaturesKeepingWater(temperatures: Float64Array, pressures: Float64Array): boolean;
  /**
   * Fills, for every cell at `pressurePa[i]` (Pa), its saturation, pore relative humidity and
   * equivalent pore pressure (Pa): what saturationAt(), relativeHumidity() of min(0, p) and
   * equivalentPorePressurePa() give, in one pass (the figures' depth profiles).
   */
  fillProfiles(
    pressurePa: Float64Array,
    saturation: number[],
    relativeHumidity: number[],
    equivalentPressurePa: number[],
  ): void;
  /** Equivalent pore pressure pi of cell i at liquid pressure p, Pa (Coussy 2004). */
  equivalentPorePressurePa(cell: number, pressurePa: number): number;
  /** Air-entry pressure of cell i, Pa (< 0). */
  airEntryPressurePa(cell: number): number;
  /** Pore relative humidity of cell i at liquid pressure p (Kelvin), fraction. */
  relativeHumidity(cell: number, pressurePa: number): number;
  /** 1 / A(T_i) of cell i, 1/Pa: the Kelvin equation is h = exp(p / A). */
  inverseKelvinCoefficientPerPa(cell: number): number;
  /** 1 / A(T_i) of every cell, 1/Pa (derived, read only: refreshed with the temperatures). */
  readonly inverseKelvinPerPa: Float64Array;
}

/**
 * Builds the hydraulics of a material on a grid of `cellCount` cells, all at the reference
 * temperature with fresh pores until the caller writes `temperatureK` / `diameterScale` and
 * calls `refreshTemperature()`.
 *
 * K_i(p) = k_ref(S) s_i^2 m / eta(T_i) + (D_air / tau) phi (1 - S) rho_v(T_i, h) / (rho_w A(T_i)),
 * with A = rho_w R T / M_w the Kelvin coefficient (dh/dp = h / A) and rho_v = h p_sat M_w / (R T).
 * Temperatures outside the water-property ranges give NaN coefficients (the element model
 * refuses freezing temperatures at its edge).
 */
export function createPoreHydraulics(options: PoreHydraulicsOptions): PoreHydraulics {
  const n = options.cellCount;
  const referenceK = options.referenceTemperatureK ?? 293.15;
  // The curves and tables of the material at the reference temperature with fresh pores, shared
  // by every model of the same pores (_poreReferenceCurves.ts).
  const curves = poreReferenceCurves({
    poreSizes: options.poreSizes,
    porosity: options.porosity,
    tortuosity: options.tortuosity,
    saturatedPermeabilityM2: options.saturatedPermeabilityM2,
    referenceTemperatureK: referenceK,
  });
  const { retention, permeability, equivalentPressure, table } = curves;
  const tableSaturation = table.saturation;
  const tablePermeability = table.permeabilityM2;
  const lastNode = table.nodeCount - 1;
  const porosity = options.porosity;
  const inversePorosity = 1 / porosity;
  const saturatedPermeability = table.saturatedPermeabilityM2;
  const { coordinateStart, inverseStep } = table;
  // pi on the table's nodes and its look-up (_equivalentPressureTable.ts), bound to locals:
  // fillProfiles() reads the nodes for every cell.
  const equivalentAtNode = curves.equivalentTable.atNode;
  const equivalentAtReference = curves.equivalentTable.atPressurePa;
  /**
   * The saturation table at a reference pressure below the air entry (Pa): the one look-up of
   * the saturation alone, so that saturationAt(), waterContentAt() and waterContents() give the
   * same bits as evaluate().
   */
  const saturationBelowAirEntry = (referencePa: number): number => {
    const position = (log2Linear(-referencePa) - coordinateStart) * inverseStep;
    if (position >= lastNode) return tableSaturation[lastNode] as number;
    const node = position > 0 ? Math.floor(position) : 0;
    const s0 = tableSaturation[node] as number;
    return s0 + (position - node) * ((tableSaturation[node + 1] as number) - s0);
  };
  let multiplier = options.permeabilityMultiplier ?? 1;
  const specificStoragePerPa = new Float64Array(n);
  const temperatureK = new Float64Array(n).fill(referenceK);
  const diameterScale = new Float64Array(n).fill(1);
  const pressureScale = new Float64Array(n).fill(1);
  const inverseScale = new Float64Array(n).fill(1); // 1 / c_i
  const liquidFactor = new Float64Array(n); // s^2 m / eta
  // The water's coefficients of each cell at its temperature (_cellWaterCoefficients.ts).
  const cellWater = createCellWaterCoefficients({
    temperatureK,
    referenceTensionNPerM: curves.referenceTensionNPerM,
    vapourDiffusion: options.vapourDiffusion ?? true,
    vapourDiffusivityM2s: options.vapourDiffusivityM2s ?? 2.5e-5,
    tortuosity: options.tortuosity,
    porosity: options.porosity,
    liquidDensityKgPerM3: options.liquidDensityKgPerM3 ?? 998.2,
  });
  const { tensionRatio, inverseViscosity, vapourFactor, refreshCell } = cellWater;
  const inverseKelvin = cellWater.inverseKelvinPerPa;
  const airEntryRef = retention.airEntryPressurePa;

  /** The refinement-dependent coefficients of cell i for diameterScale[i] and its temperature. */
  const applyCellScale = (i: number): void => {
    const scale = diameterScale[i] as number;
    const pressureScaleOfCell = scale * (tensionRatio[i] as number);
    pressureScale[i] = pressureScaleOfCell;
    inverseScale[i] = 1 / pressureScaleOfCell;
    liquidFactor[i] = scale * scale * multiplier * (inverseViscosity[i] as number);
  };
  const refreshScale = (): void => {
    for (let i = 0; i < n; i += 1) applyCellScale(i);
  };
  /** Cell i at `temperature` (K): its temperature-dependent and refinement coefficients. */
  const setCellTemperature = (i: number, temperature: number): void => {
    temperatureK[i] = temperature;
    refreshCell(i);
    applyCellScale(i);
  };
  const refreshTemperature = (): void => {
    for (let i = 0; i < n; i += 1) refreshCell(i);
    refreshScale();
  };
  refreshTemperature();

  const waterContent = (cell: number, pressurePa: number): number => {
    const reference = pressurePa * (pressureScale[cell] as number);
    const storageCoefficient = specificStoragePerPa[cell] as number;
    if (reference >= airEntryRef) return porosity + storageCoefficient * pressurePa;
    const s = saturationBelowAirEntry(reference);
    return porosity * s + storageCoefficient * airEntryRef * (inverseScale[cell] as number);
  };

  const pressureForWaterContent = (cell: number, target: number, guessPa: number): number => {
    // Exact inverse of the same interpolant the forward curve uses: the storage line above the
    // air entry, else the table's inverse at the reference pressure, p = p_ref / c.
    const scale = pressureScale[cell] as number;
    const storageCoefficient = specificStoragePerPa[cell] as number;
    const airEntryWater = porosity + (storageCoefficient * airEntryRef) / scale;
    if (!(target < airEntryWater)) {
      if (storageCoefficient > 0) return (target - porosity) / storageCoefficient;
      return Math.max(guessPa, airEntryRef / scale);
    }
    const saturation = (target - (storageCoefficient * airEntryRef) / scale) / porosity;
    if (!(saturation > (tableSaturation[lastNode] as number))) {
      // At or below the driest tabulated saturation the curve is flat: keep a guess beyond it.
      const driestPa = table.driestPressurePa / scale;
      return guessPa < driestPa ? guessPa : driestPa;
    }
    return pressureForSaturation(table, saturation, guessPa * scale) / scale;
  };

  const keepWater = (
    cell: number,
    target: number,
    pressurePa: number,
    previousScale: number,
  ): number => {
    const inverseScaleOfCell = inverseScale[cell] as number;
    const previousReference = pressurePa * previousScale;
    const storedWater = (specificStoragePerPa[cell] as number) * airEntryRef * inverseScaleOfCell;
    const saturation = (target - storedWater) * inversePorosity;
    const onSegment = pressureOnSameSegment(table, saturation, previousReference);
    if (!Number.isNaN(onSegment)) return onSegment * inverseScaleOfCell;
    return pressureForWaterContent(cell, target, previousReference * inverseScaleOfCell);
  };

  return {
    retention,
    permeability,
    specificStoragePerPa,
    temperatureK,
    diameterScale,
    pressureScale,
    inverseKelvinPerPa: inverseKelvin,
    refreshTemperature,
    refreshScale,
    setPermeabilityMultiplier(value) {
      if (value === multiplier) return;
      multiplier = value;
      refreshScale();
    },
    saturationAt(cell, pressurePa) {
      const reference = pressurePa * (pressureScale[cell] as number);
      if (reference >= airEntryRef) return 1;
      return saturationBelowAirEntry(reference);
    },
    waterContentAt: waterContent,
    pressureForWaterContent,
    pressureKeepingWater: keepWater,
    setTemperaturesKeepingWater(temperatures, pressures) {
      let changed = false;
      for (let i = 0; i < n; i += 1) {
        const temperature = temperatures[i] as number;
        if (temperature === temperatureK[i]) continue;
        changed = true;
        const pressure = pressures[i] as number;
        const held = waterContent(i, pressure);
        const previousScale = pressureScale[i] as number;
        setCellTemperature(i, temperature);
        pressures[i] = keepWater(i, held, pressure, previousScale);
      }
      return changed;
    },
    setTemperatures(temperatures) {
      let changed = false;
      for (let i = 0; i < n; i += 1) {
        const temperature = temperatures[i] as number;
        if (temperature === temperatureK[i]) continue;
        changed = true;
        setCellTemperature(i, temperature);
      }
      return changed;
    },
    rescaleCell(cell, scale, storage) {
      diameterScale[cell] = scale;
      specificStoragePerPa[cell] = storage;
      applyCellScale(cell);
    },
    equivalentPorePressurePa(cell, pressurePa) {
      const scale = pressureScale[cell] as number;
      return equivalentAtReference(pressurePa * scale) / scale;
    },
    waterContents(pressurePa, water, storageContent) {
      // evaluate()'s water content and storage, term for term (the same bits), alone.
      const wantStorage = storageContent !== undefined;
      for (let i = 0; i < n; i += 1) {
        const pressure = pressurePa[i] as number;
        const scale = pressureScale[i] as number;
        const storageCoefficient = specificStoragePerPa[i] as number;
        if (pressure * scale >= airEntryRef) {
          const stored = storageCoefficient * pressure;
          water[i] = porosity + stored;
          if (wantStorage) storageContent[i] = stored;
          continue;
        }
        const stored = storageCoefficient * airEntryRef * (inverseScale[i] as number);
        water[i] = porosity * saturationBelowAirEntry(pressure * scale) + stored;
        if (wantStorage) storageContent[i] = stored;
      }
    },
    fillProfiles(pressurePa, saturation, relativeHumidity, equivalentPressurePa) {
      // saturationAt(), relativeHumidity() and equivalentPorePressurePa() of every cell, term for
      // term (the same bits), with one table position per cell for both tables.
      for (let i = 0; i < n; i += 1) {
        const pressure = pressurePa[i] as number;
        const scale = pressureScale[i] as number;
        relativeHumidity[i] = Math.exp(Math.min(0, pressure) * (inverseKelvin[i] as number));
        const reference = pressure * scale;
        if (reference >= airEntryRef) {
          saturation[i] = 1;
          equivalentPressurePa[i] = equivalentPressure.fromLiquidPressure(reference) / scale;
          continue;
        }
        const position = (log2Linear(-reference) - coordinateStart) * inverseStep;
        if (position >= lastNode) {
          saturation[i] = tableSaturation[lastNode] as number;
          equivalentPressurePa[i] = equivalentPressure.fromLiquidPressure(reference) / scale;
          continue;
        }
        const node = position > 0 ? Math.floor(position) : 0;
        const weight = position - node;
        const s0 = tableSaturation[node] as number;
        saturation[i] = s0 + weight * ((tableSaturation[node + 1] as number) - s0);
        const below = equivalentAtNode(node);
        equivalentPressurePa[i] = (below + weight * (equivalentAtNode(node + 1) - below)) / scale;
      }
    },
    evaluate(pressurePa, water, capacityPerPa, conductivity, storageContent, conductivitySlope) {
      const wantStorage = storageContent !== undefined;
      const wantSlope = conductivitySlope !== undefined;
      for (let i = 0; i < n; i += 1) {
        const pressure = pressurePa[i] as number;
        const scale = pressureScale[i] as number;
        const storageCoefficient = specificStoragePerPa[i] as number;
        const liquid = liquidFactor[i] as number;
        if (pressure * scale >= airEntryRef) {
          capacityPerPa[i] = storageCoefficient;
          const stored = storageCoefficient * pressure;
          water[i] = porosity + stored;
          if (wantStorage) storageContent[i] = stored;
          conductivity[i] = saturatedPermeability * liquid;
          if (wantSlope) conductivitySlope[i] = 0;
          continue;
        }
        // The table look-ups of S and k, inlined with locals: this loop runs for every cell in
        // every iteration.
        const coordinate = log2Linear(-pressure * scale);
        const position = (coordinate - coordinateStart) * inverseStep;
        let s: number;
        let permeabilityM2: number;
        let saturationPerU: number; // dS/dv
        let permeabilityPerU: number; // dk/dv
        if (position >= lastNode) {
          s = tableSaturation[lastNode] as number;
          permeabilityM2 = tablePermeability[lastNode] as number;
          saturationPerU = 0;
          permeabilityPerU = 0;
        } else {
          const node = position > 0 ? Math.floor(position) : 0;
          const weight = position - node;
          const s0 = tableSaturation[node] as number;
          const s1 = tableSaturation[node + 1] as number;
          const k0 = tablePermeability[node] as number;
          const k1 = tablePermeability[node + 1] as number;
          s = s0 + weight * (s1 - s0);
          saturationPerU = (s1 - s0) * inverseStep;
          permeabilityM2 = k0 + weight * (k1 - k0);
          permeabilityPerU = (k1 - k0) * inverseStep;
        }
        // d/dp = (d/dv) m / p with v = log2Linear(-p c) and m = dv / d ln(-p c) (_log2Linear.ts);
        // dS/dp > 0 as dS/dv < 0 and p < 0.
        const coordinatePerPa = log2LinearSlopeFactor(coordinate) / pressure;
        const saturationSlope = saturationPerU * coordinatePerPa;
        capacityPerPa[i] = porosity * saturationSlope;
        const stored = storageCoefficient * airEntryRef * (inverseScale[i] as number);
        const content = porosity * s + stored;
        water[i] = content;
        if (wantStorage) storageContent[i] = stored;
        // Kelvin h = exp(p / A) inline (p < 0 here): below about 1.35 MPa of suction (h > 0.99)
        // |p / A| < 0.01 and the series to x^3 is within 5e-10 of it (x^4 / 24), far inside
        // what the vapour conductivity is known to; beyond, Math.exp.
        const inverseA = inverseKelvin[i] as number;
        const x = pressure * inverseA;
        const humidity = x > -0.01 ? 1 + x * (1 + x * (0.5 + x * (1 / 6))) : Math.exp(x);
        const vapour = vapourFactor[i] as number;
        conductivity[i] = permeabilityM2 * liquid + vapour * (1 - s) * humidity;
        if (wantSlope) {
          conductivitySlope[i] =
            permeabilityPerU * liquid * coordinatePerPa +
            vapour * humidity * ((1 - s) * inverseA - saturationSlope);
        }
      }
      return conductivitySlope !== undefined;
    },

    airEntryPressurePa(cell) {
      return airEntryRef / (pressureScale[cell] as number);
    },
    inverseKelvinCoefficientPerPa(cell) {
      return inverseKelvin[cell] as number;
    },
    relativeHumidity(cell, pressurePa) {
      // Kelvin: h = exp(p / A(T)) with A cached per cell by refreshTemperature().
      return Math.exp(pressurePa * (inverseKelvin[cell] as number));
    },
  };
}
