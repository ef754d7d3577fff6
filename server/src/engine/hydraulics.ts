/**
 * What the transport solver needs to know about the material in each cell, as one small
 * interface. The solver never computes physics itself: retention, storage, permeability,
 * viscosity and vapour transport come in through an implementation of {@link CellHydraulics}
 * (`poreHydraulics.ts` for the pore-structure model, `linearDiffusion.ts` for verification).
 */

/** Hydraulic properties of every cell of a grid, evaluated in bulk (one call per iteration). */
export interface CellHydraulics {
  /**
   * Fills, for every cell at liquid pressure `pressurePa[i]` (Pa): the water content theta
   * (m3 of liquid per m3 of bulk: phi S plus the water the specific storage holds), the capacity
   * d theta / dp (1/Pa, >= 0) and the conductivity K = k/eta plus any vapour contribution,
   * m2/(Pa s), so that the volume flux of liquid is q = -K dp/dx (m/s). When `storageContent`
   * is given, it receives the part of theta held by the specific storage (m3/m3). When
   * `conductivitySlope` is given and the implementation can, it receives dK/dp (m2/(Pa2 s)) and
   * the call returns true; otherwise the solver differentiates K numerically.
   */
  evaluate(
    pressurePa: Float64Array,
    waterContent: Float64Array,
    capacityPerPa: Float64Array,
    conductivity: Float64Array,
    storageContent?: Float64Array,
    conductivitySlope?: Float64Array,
  ): boolean;
  /**
   * Fills only the water content (and, when `storageContent` is given, the part the specific
   * storage holds) of every cell, with the same bits `evaluate()` gives for them: the solver's
   * convergence check needs nothing else.
   */
  waterContents(
    pressurePa: Float64Array,
    waterContent: Float64Array,
    storageContent?: Float64Array,
  ): void;
}
