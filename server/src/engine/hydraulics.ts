/**
 * What the transport solver needs to know about the material in each cell, as one small
 * interface. The solver never computes physics itself: retention, permeability, viscosity and
 * vapour transport come in through an implementation of {@link CellHydraulics}
 * (see `poreHydraulics.ts` for the pore-structure model and {@link linearDiffusionHydraulics}
 * for the verification mode).
 */

/** Hydraulic properties of every cell of a grid, evaluated in bulk (one call per iteration). */
export interface CellHydraulics {
  /** Porosity phi of each cell (pore volume per bulk volume, 0..1). */
  readonly porosity: Float64Array;
  /** Specific storage S_s of each cell, 1/Pa (physics.md section 3). */
  readonly specificStoragePerPa: Float64Array;
  /**
   * Fills, for every cell at liquid pressure `pressurePa[i]` (Pa): the saturation S (0..1), the
   * capacity dS/dp (1/Pa, >= 0) and the conductivity K = k/eta plus any vapour contribution,
   * m2/(Pa s), so that the volume flux of liquid is q = -K dp/dx (m/s).
   */
  evaluate(
    pressurePa: Float64Array,
    saturation: Float64Array,
    capacityPerPa: Float64Array,
    conductivity: Float64Array,
  ): void;
  /** Liquid pressure (Pa) at which cell `cell` holds saturation `saturation`. */
  pressureFromSaturation(cell: number, saturation: number): number;
}
