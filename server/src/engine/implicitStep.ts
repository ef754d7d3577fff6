/**
 * One backward-Euler step of the mixed form of the moisture balance (physics.md section 3),
 *   d(phi S)/dt + S_s dp/dt = -dq/dx,   q = -K dp/dx,   K = k(S)/eta (+ vapour),
 * written as d theta / dt = -dq/dx with theta(p) the water content the hydraulics report
 * (phi S plus the specific-storage water),
 * on a cell-centred grid, solved with the modified Picard iteration of Celia, Bouloutas and
 * Zarba (1990), Water Resources Research 26(7), 1483-1496: the water content at the new level is
 * expanded as theta(p^{m+1}) = theta(p^m) + C^m (p^{m+1} - p^m), which conserves mass exactly at
 * convergence; K is lagged one iteration. Each iteration is one tridiagonal (Thomas) solve,
 * eliminated as it is assembled (tridiagonal.ts holds the plain solver).
 */
import type { DepthGrid } from './grid.ts';
import type { CellHydraulics } from './hydraulics.ts';

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
  /** Most Picard iterations before the step is declared failed; default 40 (our assumption). */
  maxIterations?: number;
  /**
   * Relative pressure-change tolerance; default 1e-4 (our assumption: four significant digits of
   * the capillary pressure, finer than any figure derived from it, which are shown to three and
   * carry a discretisation error of about 1 %; the mass balance is held by its own test, below).
   */
  pressureRelativeTolerance?: number;
  /**
   * Absolute pressure-change tolerance, Pa; default 1 (our assumption: 1e-3 of a 1 kPa air entry,
   * the lowest of the presets).
   */
  pressureAbsoluteTolerancePa?: number;
  /**
   * Largest factor by which the suction of a cell may grow in one iteration (a damping that
   * keeps the iteration inside the range where the linearisation holds); default 10
   * (our assumption). Suctions below 1 kPa are treated as 1 kPa for this limit.
   */
  suctionGrowthLimit?: number;
  /**
   * 'newton' (default) adds the derivative of the conductivity to the Jacobian (finite
   * difference per cell), converging in a few iterations where drying makes K steep;
   * 'picard' lags K one iteration (the modified Picard scheme of Celia et al. 1990 as published).
   * Both conserve mass exactly at convergence.
   */
  linearisation?: 'newton' | 'picard';
}

/** Outcome of one step. Volumes are m3 of liquid per m2 of surface (m). */
export interface StepResult {
  converged: boolean;
  iterations: number;
  /** Water that entered through the surface during the step, m (negative when drying). */
  surfaceInflowM: number;
  /** Change of the water held by the specific storage during the step, m. */
  storageWaterM: number;
  /** Change of all water held (theta summed over cells) during the step, m. */
  waterChangeM: number;
  /** Mass defect: waterChange - surfaceInflow, m (0 at exact balance). */
  massDefectM: number;
}

/**
 * Preallocated arrays for {@link implicitStep}; build once per grid with {@link createWorkspace}.
 * After a converged step, `water` holds the water content theta (m3/m3) of every cell at the new
 * pressures, evaluated with the hydraulics of the step (the element model reuses it).
 */
export interface StepWorkspace {
  waterOld: Float64Array;
  water: Float64Array;
  storageOld: Float64Array;
  storage: Float64Array;
  capacity: Float64Array;
  conductivity: Float64Array;
  iterate: Float64Array;
  increment: Float64Array;
  scratch: Float64Array;
  /** The pressures a trial step computes, for advanceTransport (implicitStep never reads it). */
  trialPressurePa: Float64Array;
  perturbed: Float64Array;
  waterPerturbed: Float64Array;
  capacityPerturbed: Float64Array;
  conductivityPerturbed: Float64Array;
  conductivitySlope: Float64Array;
  /** 1 / centre spacing of each face, 1/m (filled for `spacingOf`). */
  inverseSpacing: Float64Array;
  /** The grid `inverseSpacing` was filled for (null: not yet). */
  spacingOf: DepthGrid | null;
}

/** Allocates the workspace of a grid with `cellCount` cells. */
export function createWorkspace(cellCount: number): StepWorkspace {
  const make = (): Float64Array => new Float64Array(cellCount);
  return {
    waterOld: make(),
    water: make(),
    storageOld: make(),
    storage: make(),
    capacity: make(),
    conductivity: make(),
    iterate: make(),
    increment: make(),
    scratch: make(),
    trialPressurePa: make(),
    perturbed: make(),
    waterPerturbed: make(),
    capacityPerturbed: make(),
    conductivityPerturbed: make(),
    conductivitySlope: make(),
    inverseSpacing: make(),
    spacingOf: null,
  };
}

/**
 * Advances liquid pressure from `pressureOldPa` by `stepS` seconds (backward Euler) and writes the
 * result into `pressureNewPa`. The balance counts from `heldWater` (theta, m3/m3, per cell) when
 * given: the water the cells hold, which differs from that of `pressureOldPa` on the current
 * curves when the curves changed since the pressures were solved (refinement, temperature);
 * otherwise from the water of `pressureOldPa`. Does not throw: a step that does not converge within
 * `maxIterations` returns `converged: false` and leaves `pressureNewPa` undefined in meaning (the
 * step controller then retries with a shorter step).
 *
 * Convergence needs both the pressure change below tolerance and the mass defect below
 * 1e-9 of the step's surface exchange plus 1e-13 of the water held (plus a floor of 1e-16 m
 * per m of depth). Summed over a run the defects stay below 1e-9 of all the water that crossed
 * the surface plus 1e-13 of the water held per step (some 2.5e-15 m a step in a 150 mm slab), so
 * the whole run's balance closes well within 1e-8 (physics.md section 3).
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
  heldWater?: Float64Array,
): StepResult {
  const maxIterations = options.maxIterations ?? 40;
  const relativeTolerance = options.pressureRelativeTolerance ?? 1e-4;
  const absoluteTolerancePa = options.pressureAbsoluteTolerancePa ?? 1;
  const growthLimit = options.suctionGrowthLimit ?? 10;
  const newton = (options.linearisation ?? 'newton') === 'newton';
  const { perturbed, waterPerturbed, capacityPerturbed, conductivityPerturbed, conductivitySlope } =
    workspace;
  const n = grid.cellCount;
  const widths = grid.widthsM;
  const spacing = grid.centreSpacingM;
  const { waterOld, water, storageOld, storage, capacity, conductivity, iterate } = workspace;
  const { increment, scratch } = workspace;

  // The first iterate is the old pressure, so one evaluation serves both the old water content
  // (unless the cells hold other water) and the first iteration's coefficients.
  let analyticSlope =
    hydraulics.evaluate(
      pressureOldPa,
      water,
      capacity,
      conductivity,
      storageOld,
      newton ? conductivitySlope : undefined,
    ) === true;
  waterOld.set(heldWater ?? water);
  let waterHeldM = 0;
  for (let i = 0; i < n; i += 1)
    waterHeldM += (widths[i] as number) * Math.abs(waterOld[i] as number);
  iterate.set(pressureOldPa);
  const inverseStepS = 1 / stepS;
  const inverseSpacingPerM = workspace.inverseSpacing;
  if (workspace.spacingOf !== grid) {
    for (let face = 0; face < n - 1; face += 1)
      inverseSpacingPerM[face] = 1 / (spacing[face] as number);
    workspace.spacingOf = grid;
  }

  let surfaceInflowM = 0;
  let pendingCheck = false;
  // The convergence check needs only the water content; the coefficients at an iterate are
  // computed after it, and only when the step goes on.
  for (let iteration = 1; iteration <= maxIterations + 1; iteration += 1) {
    if (pendingCheck) {
      hydraulics.waterContents(iterate, water, storage);
      let waterChangeM = 0;
      let storageWaterM = 0;
      for (let i = 0; i < n; i += 1) {
        const width = widths[i] as number;
        waterChangeM += width * ((water[i] as number) - (waterOld[i] as number));
        storageWaterM += width * ((storage[i] as number) - (storageOld[i] as number));
      }
      const massDefectM = waterChangeM - surfaceInflowM;
      // The floor (1e-16 m of water per m of depth) keeps an almost dry layer, which holds next
      // to no water, from asking for a defect below rounding.
      const massTolerance =
        1e-13 * waterHeldM + 1e-9 * Math.abs(surfaceInflowM) + 1e-16 * grid.depthM;
      if (Math.abs(massDefectM) <= massTolerance) {
        pressureNewPa.set(iterate);
        return {
          converged: true,
          iterations: iteration - 1,
          surfaceInflowM,
          storageWaterM,
          waterChangeM,
          massDefectM,
        };
      }
    }
    if (iteration > 1) {
      // The first iteration uses the evaluation at the old pressure, made above.
      analyticSlope =
        hydraulics.evaluate(
          iterate,
          water,
          capacity,
          conductivity,
          undefined,
          newton ? conductivitySlope : undefined,
        ) === true;
    }
    if (iteration > maxIterations) break;

    if (newton && !analyticSlope) {
      for (let i = 0; i < n; i += 1) {
        const pressure = iterate[i] as number;
        perturbed[i] = pressure - Math.max(1, 1e-6 * Math.abs(pressure));
      }
      hydraulics.evaluate(perturbed, waterPerturbed, capacityPerturbed, conductivityPerturbed);
      for (let i = 0; i < n; i += 1) {
        conductivitySlope[i] =
          ((conductivity[i] as number) - (conductivityPerturbed[i] as number)) /
          ((iterate[i] as number) - (perturbed[i] as number));
      }
    } else if (!newton) {
      conductivitySlope.fill(0);
    }

    // The surface condition first: it enters the first row of the system.
    const surfacePressure = iterate[0] as number;
    let inflowRate: number;
    let inflowSlope: number;
    if (surface.kind === 'pressure') {
      const halfWidth = 0.5 * (widths[0] as number);
      const conductance = (conductivity[0] as number) / halfWidth;
      inflowRate = conductance * (surface.pressurePa - surfacePressure);
      inflowSlope =
        -conductance +
        ((conductivitySlope[0] as number) / halfWidth) * (surface.pressurePa - surfacePressure);
    } else {
      const outflow = surface.volumeFluxMs(surfacePressure);
      const probe = Math.max(1, 1e-6 * Math.abs(surfacePressure));
      const slope = (outflow - surface.volumeFluxMs(surfacePressure - probe)) / probe;
      inflowRate = -outflow;
      inflowSlope = -slope;
    }
    // Assemble the tridiagonal system for the increment delta = p^{m+1} - p^m and eliminate it
    // (Thomas) in the same pass over the cells: row i is complete once face i (between cells i
    // and i + 1) is added, and its forward elimination needs only row i - 1. Face i is added to
    // cell i here and carried to cell i + 1. Back substitution follows.
    let carriedDiagonal = -inflowSlope;
    let carriedRightHandSide = inflowRate;
    let lowerOfRow = 0; // a_i, coupling of row i to cell i - 1
    let upperOverPivot = 0; // c_{i-1} / pivot_{i-1}
    let eliminated = 0; // the forward-eliminated right-hand side of row i - 1
    for (let i = 0; i < n; i += 1) {
      const width = widths[i] as number;
      let diagonalTerm = width * (capacity[i] as number) * inverseStepS + carriedDiagonal;
      let rightHandSideTerm =
        -(width * ((water[i] as number) - (waterOld[i] as number))) * inverseStepS +
        carriedRightHandSide;
      let upperTerm = 0;
      let lowerOfNext = 0;
      if (i < n - 1) {
        const inverseSpacing = inverseSpacingPerM[i] as number;
        const conductance =
          0.5 * ((conductivity[i] as number) + (conductivity[i + 1] as number)) * inverseSpacing;
        const difference = (iterate[i + 1] as number) - (iterate[i] as number);
        const flow = conductance * difference;
        // Newton terms: d(flow)/dp through the face conductivity (zero for Picard).
        const lever = 0.5 * difference * inverseSpacing;
        const slopeLeft = lever * (conductivitySlope[i] as number);
        const slopeRight = lever * (conductivitySlope[i + 1] as number);
        diagonalTerm += conductance - slopeLeft;
        rightHandSideTerm += flow;
        upperTerm = -conductance - slopeRight;
        lowerOfNext = -conductance + slopeLeft;
        carriedDiagonal = conductance + slopeRight;
        carriedRightHandSide = -flow;
      }
      const inversePivot = 1 / (diagonalTerm - lowerOfRow * upperOverPivot);
      eliminated = (rightHandSideTerm - lowerOfRow * eliminated) * inversePivot;
      increment[i] = eliminated;
      upperOverPivot = upperTerm * inversePivot;
      scratch[i] = upperOverPivot;
      lowerOfRow = lowerOfNext;
    }
    for (let i = n - 2; i >= 0; i -= 1) {
      increment[i] =
        (increment[i] as number) - (scratch[i] as number) * (increment[i + 1] as number);
    }
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
    waterChangeM: Number.NaN,
    massDefectM: Number.NaN,
  };
}
