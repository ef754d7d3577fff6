/**
 * One backward-Euler step of the mixed form of the moisture balance (physics.md section 3),
 *   d(phi S)/dt + S_s dp/dt = -dq/dx,   q = -K dp/dx,   K = k(S)/eta (+ vapour),
 * on a cell-centred grid, solved with the modified Picard iteration of Celia, Bouloutas and
 * Zarba (1990), Water Resources Research 26(7), 1483-1496: the saturation at the new level is
 * expanded as S(p^{m+1}) = S(p^m) + C^m (p^{m+1} - p^m), which conserves mass exactly at
 * convergence; K is lagged one iteration. Each iteration is one tridiagonal (Thomas) solve.
 */
import type { DepthGrid } from './grid.ts';
import type { CellHydraulics } from './hydraulics.ts';
import { solveTridiagonal } from './tridiagonal.ts';

/** The condition at the exposed surface during one step. */
export type SurfaceCondition =
  /** The surface holds a given liquid pressure (bleed film, wet covering: 0 Pa). */
  | { kind: 'pressure'; pressurePa: number }
  /**
   * Water leaves through the surface at a volume flux (m/s of liquid, positive outwards) that
   * may depend on the liquid pressure of the surface cell (falling-rate evaporation).
   */
  | { kind: 'outflow'; volumeFluxMs: (surfacePressurePa: number) => number };

/** Iteration controls of {@link implicitStep}. */
export interface ImplicitStepOptions {
  /** Most Picard iterations before the step is declared failed; default 25 (our assumption). */
  maxIterations?: number;
  /** Relative pressure-change tolerance; default 1e-7 (our assumption). */
  pressureRelativeTolerance?: number;
  /** Absolute pressure-change tolerance, Pa; default 1e-3 (our assumption). */
  pressureAbsoluteTolerancePa?: number;
  /**
   * Largest factor by which the suction of a cell may grow in one iteration (a damping that
   * keeps the iteration inside the range where the linearisation holds); default 10
   * (our assumption). Suctions below 1 kPa are treated as 1 kPa for this limit.
   */
  suctionGrowthLimit?: number;
}

/** Outcome of one step. Volumes are m3 of liquid per m2 of surface (m). */
export interface StepResult {
  converged: boolean;
  iterations: number;
  /** Water that entered through the surface during the step, m (negative when drying). */
  surfaceInflowM: number;
  /** Water released into the pores by the storage term during the step, m (S_s dp summed). */
  storageWaterM: number;
  /** Change of pore water phi S during the step, m. */
  poreWaterChangeM: number;
  /** Mass defect: poreWaterChange + storageWater - surfaceInflow, m (0 at exact balance). */
  massDefectM: number;
}

/** Preallocated arrays for {@link implicitStep}; build once per grid with {@link createWorkspace}. */
export interface StepWorkspace {
  saturationOld: Float64Array;
  saturation: Float64Array;
  capacity: Float64Array;
  conductivity: Float64Array;
  iterate: Float64Array;
  lower: Float64Array;
  diagonal: Float64Array;
  upper: Float64Array;
  rightHandSide: Float64Array;
  increment: Float64Array;
  scratch: Float64Array;
}

/** Allocates the workspace of a grid with `cellCount` cells. */
export function createWorkspace(cellCount: number): StepWorkspace {
  const make = (): Float64Array => new Float64Array(cellCount);
  return {
    saturationOld: make(),
    saturation: make(),
    capacity: make(),
    conductivity: make(),
    iterate: make(),
    lower: make(),
    diagonal: make(),
    upper: make(),
    rightHandSide: make(),
    increment: make(),
    scratch: make(),
  };
}

/**
 * Advances liquid pressure from `pressureOldPa` by `stepS` seconds (backward Euler) and writes the
 * result into `pressureNewPa`. Does not throw: a step that does not converge within
 * `maxIterations` returns `converged: false` and leaves `pressureNewPa` undefined in meaning (the
 * step controller then retries with a shorter step).
 *
 * Convergence needs both the pressure change below tolerance and the mass defect below
 * 1e-13 of the pore volume plus 1e-10 of the step's surface exchange, so that a whole run's
 * balance closes to about 1e-8 (physics.md section 3).
 */
export function implicitStep(
  grid: DepthGrid,
  hydraulics: CellHydraulics,
  workspace: StepWorkspace,
  pressureOldPa: Float64Array,
  pressureNewPa: Float64Array,
  stepS: number,
  surface: SurfaceCondition,
  options: ImplicitStepOptions = {},
): StepResult {
  const maxIterations = options.maxIterations ?? 25;
  const relativeTolerance = options.pressureRelativeTolerance ?? 1e-7;
  const absoluteTolerancePa = options.pressureAbsoluteTolerancePa ?? 1e-3;
  const growthLimit = options.suctionGrowthLimit ?? 10;
  const n = grid.cellCount;
  const widths = grid.widthsM;
  const spacing = grid.centreSpacingM;
  const porosity = hydraulics.porosity;
  const storage = hydraulics.specificStoragePerPa;
  const { saturationOld, saturation, capacity, conductivity, iterate } = workspace;
  const { lower, diagonal, upper, rightHandSide, increment, scratch } = workspace;

  hydraulics.evaluate(pressureOldPa, saturationOld, capacity, conductivity);
  let poreVolumeM = 0;
  for (let i = 0; i < n; i += 1) poreVolumeM += (widths[i] as number) * (porosity[i] as number);
  iterate.set(pressureOldPa);

  let surfaceInflowM = 0;
  let pendingCheck = false;
  for (let iteration = 1; iteration <= maxIterations + 1; iteration += 1) {
    hydraulics.evaluate(iterate, saturation, capacity, conductivity);
    if (pendingCheck) {
      let poreWaterChangeM = 0;
      let storageWaterM = 0;
      for (let i = 0; i < n; i += 1) {
        const width = widths[i] as number;
        poreWaterChangeM +=
          width *
          (porosity[i] as number) *
          ((saturation[i] as number) - (saturationOld[i] as number));
        storageWaterM +=
          width * (storage[i] as number) * ((iterate[i] as number) - (pressureOldPa[i] as number));
      }
      const massDefectM = poreWaterChangeM + storageWaterM - surfaceInflowM;
      const massTolerance = 1e-13 * poreVolumeM + 1e-10 * Math.abs(surfaceInflowM);
      if (Math.abs(massDefectM) <= massTolerance) {
        pressureNewPa.set(iterate);
        return {
          converged: true,
          iterations: iteration - 1,
          surfaceInflowM,
          storageWaterM,
          poreWaterChangeM,
          massDefectM,
        };
      }
    }
    if (iteration > maxIterations) break;

    // Assemble the linear system for the increment delta = p^{m+1} - p^m.
    for (let i = 0; i < n; i += 1) {
      const width = widths[i] as number;
      const pressure = iterate[i] as number;
      diagonal[i] =
        (width * ((porosity[i] as number) * (capacity[i] as number) + (storage[i] as number))) /
        stepS;
      rightHandSide[i] =
        -(
          width *
          ((porosity[i] as number) * ((saturation[i] as number) - (saturationOld[i] as number)) +
            (storage[i] as number) * (pressure - (pressureOldPa[i] as number)))
        ) / stepS;
      lower[i] = 0;
      upper[i] = 0;
    }
    for (let face = 0; face < n - 1; face += 1) {
      const conductance =
        (0.5 * ((conductivity[face] as number) + (conductivity[face + 1] as number))) /
        (spacing[face] as number);
      const flow = conductance * ((iterate[face + 1] as number) - (iterate[face] as number));
      diagonal[face] = (diagonal[face] as number) + conductance;
      diagonal[face + 1] = (diagonal[face + 1] as number) + conductance;
      upper[face] = -conductance;
      lower[face + 1] = -conductance;
      rightHandSide[face] = (rightHandSide[face] as number) + flow;
      rightHandSide[face + 1] = (rightHandSide[face + 1] as number) - flow;
    }
    const surfacePressure = iterate[0] as number;
    let inflowRate: number;
    let inflowSlope: number;
    if (surface.kind === 'pressure') {
      const conductance = (conductivity[0] as number) / (0.5 * (widths[0] as number));
      inflowRate = conductance * (surface.pressurePa - surfacePressure);
      inflowSlope = -conductance;
    } else {
      const outflow = surface.volumeFluxMs(surfacePressure);
      const probe = Math.max(1, 1e-6 * Math.abs(surfacePressure));
      const slope = (outflow - surface.volumeFluxMs(surfacePressure - probe)) / probe;
      inflowRate = -outflow;
      inflowSlope = -slope;
    }
    diagonal[0] = (diagonal[0] as number) - inflowSlope;
    rightHandSide[0] = (rightHandSide[0] as number) + inflowRate;
    solveTridiagonal(lower, diagonal, upper, rightHandSide, increment, scratch);
    surfaceInflowM = stepS * (inflowRate + inflowSlope * (increment[0] as number));

    let small = true;
    for (let i = 0; i < n; i += 1) {
      const pressure = iterate[i] as number;
      let next = pressure + (increment[i] as number);
      const floorPa = growthLimit * Math.min(pressure, -1000);
      if (next < floorPa) {
        next = floorPa;
        small = false;
      }
      if (!Number.isFinite(next)) return failed(iteration, surfaceInflowM);
      if (
        Math.abs(next - pressure) >
        absoluteTolerancePa + relativeTolerance * Math.abs(pressure)
      ) {
        small = false;
      }
      iterate[i] = next;
    }
    pendingCheck = small;
  }
  return failed(maxIterations, surfaceInflowM);
}

function failed(iterations: number, surfaceInflowM: number): StepResult {
  return {
    converged: false,
    iterations,
    surfaceInflowM,
    storageWaterM: Number.NaN,
    poreWaterChangeM: Number.NaN,
    massDefectM: Number.NaN,
  };
}
