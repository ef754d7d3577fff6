/**
 * The depth grid of an element: cell-centred finite volumes over the depth L measured from the
 * exposed surface, geometrically graded so the cells are thinnest where drying fronts are steep
 * (physics.md section 1).
 */

/** Drying case of an element (physics.md section 1). */
export type DryingCase = 'one-face' | 'two-face';

/** Options of {@link buildDepthGrid}. */
export interface DepthGridOptions {
  /** Number of cells; default 60 (physics.md section 1, our assumption). Integer >= 2. */
  cellCount?: number;
  /** Thickness of the first cell at the exposed surface, m; default 1e-4 (0.1 mm, physics.md 1). */
  firstCellM?: number;
}

/** A graded 1-D grid. Index 0 is the cell at the exposed surface. */
export interface DepthGrid {
  /** Depth of the modelled domain L, m (the thickness, or half of it for `two-face`). */
  readonly depthM: number;
  readonly cellCount: number;
  /** Face depths, m: faces[0] = 0 (the surface) ... faces[n] = L; length n + 1. */
  readonly facesM: Float64Array;
  /** Cell-centre depths, m; length n. */
  readonly centresM: Float64Array;
  /** Cell widths, m; length n. Sum equals L to rounding. */
  readonly widthsM: Float64Array;
  /** Distance between neighbouring centres, m; index i is between cells i and i+1; length n - 1. */
  readonly centreSpacingM: Float64Array;
  /** Growth ratio of consecutive widths (1 for a uniform grid). */
  readonly growthRatio: number;
}

/** Depth of the modelled domain: the thickness for `one-face`, half of it for `two-face`. */
export function domainDepthM(thicknessM: number, dryingCase: DryingCase): number {
  return dryingCase === 'two-face' ? thicknessM / 2 : thicknessM;
}

/**
 * Geometric growth ratio r such that w0 (1 + r + ... + r^(n-1)) = L, found by bisection on
 * [1, 10]. Returns 1 when a uniform grid is already at least as fine as w0 (n w0 >= L).
 */
function growthRatioFor(depthM: number, cellCount: number, firstCellM: number): number {
  if (firstCellM * cellCount >= depthM) return 1;
  const total = (ratio: number): number => firstCellM * ((ratio ** cellCount - 1) / (ratio - 1));
  let low = 1 + 1e-12;
  let high = 10;
  for (let iteration = 0; iteration < 200; iteration += 1) {
    const mid = 0.5 * (low + high);
    if (total(mid) > depthM) high = mid;
    else low = mid;
  }
  return 0.5 * (low + high);
}

/**
 * Builds a cell-centred grid over [0, L] whose widths grow geometrically from `firstCellM` at
 * the surface: w_i = w0 r^i with r solving sum(w_i) = L. The widths are rescaled so they sum to L
 * exactly.
 *
 * @param depthM L in m, > 0 (finite).
 * @param options cell count (default 60) and first-cell width (default 0.1 mm).
 * Edge cases: when n w0 >= L the grid is uniform (w = L / n). Non-positive or NaN depth, or a
 * cell count below 2, give a grid filled with NaN rather than a throw (validate at the edge).
 */
export function buildDepthGrid(depthM: number, options: DepthGridOptions = {}): DepthGrid {
  const cellCount = Math.max(2, Math.floor(options.cellCount ?? 60));
  const firstCellM = options.firstCellM ?? 1e-4;
  const valid = depthM > 0 && Number.isFinite(depthM) && firstCellM > 0;
  const growthRatio = valid ? growthRatioFor(depthM, cellCount, firstCellM) : Number.NaN;
  const widthsM = new Float64Array(cellCount);
  let sum = 0;
  for (let i = 0; i < cellCount; i += 1) {
    const width = growthRatio === 1 ? depthM / cellCount : firstCellM * growthRatio ** i;
    widthsM[i] = width;
    sum += width;
  }
  const facesM = new Float64Array(cellCount + 1);
  const centresM = new Float64Array(cellCount);
  for (let i = 0; i < cellCount; i += 1) {
    const width = ((widthsM[i] ?? 0) * depthM) / sum;
    widthsM[i] = width;
    facesM[i + 1] = (facesM[i] ?? 0) + width;
    centresM[i] = (facesM[i] ?? 0) + width / 2;
  }
  facesM[cellCount] = depthM;
  const centreSpacingM = new Float64Array(cellCount - 1);
  for (let i = 0; i < cellCount - 1; i += 1) {
    centreSpacingM[i] = (centresM[i + 1] ?? 0) - (centresM[i] ?? 0);
  }
  return { depthM, cellCount, facesM, centresM, widthsM, centreSpacingM, growthRatio };
}
