/**
 * A small Levenberg-Marquardt least-squares solver, private to the physics folder.
 *
 * Minimises `sum r_i(theta)^2` with the damped Gauss-Newton step
 * `(J^T J + lambda diag(J^T J)) delta = -J^T r` (Marquardt's scaling), raising lambda tenfold
 * after a rejected step and lowering it tenfold after an accepted one.
 * Sources: Levenberg (1944), Quarterly of Applied Mathematics 2(2); Marquardt (1963), SIAM
 * Journal on Applied Mathematics 11(2); Nocedal and Wright, Numerical Optimization (2006), 10.3.
 *
 * Meant for a handful of parameters (the normal equations are solved by Gaussian elimination).
 * A residual vector holding a non-finite value marks the parameters as infeasible: the step is
 * rejected, which lets a caller keep parameters inside bounds without a constrained solver.
 */

/** The problem: residuals and their Jacobian (rows: residuals, columns: parameters). */
export interface LeastSquaresProblem {
  residuals(parameters: readonly number[]): number[];
  jacobian(parameters: readonly number[]): number[][];
}

/** Solver options; every field has a default. */
export interface LevenbergMarquardtOptions {
  /** Iteration cap. Default 200 (common practice for small problems). */
  readonly maxIterations: number;
  /** Stop when the relative cost decrease of an accepted step is below this. Default 1e-12. */
  readonly relativeTolerance: number;
  /** Initial damping. Default 1e-3 (Marquardt 1963 suggests a small start). */
  readonly initialDamping: number;
}

export const DEFAULT_LEVENBERG_MARQUARDT_OPTIONS: LevenbergMarquardtOptions = {
  maxIterations: 200,
  relativeTolerance: 1e-12,
  initialDamping: 1e-3,
};

export interface LeastSquaresSolution {
  readonly parameters: number[];
  /** Sum of squared residuals at the solution. */
  readonly cost: number;
  readonly iterations: number;
  /** True when the tolerance was met before the iteration cap or the damping limit. */
  readonly converged: boolean;
}

function sumOfSquares(values: readonly number[]): number {
  let sum = 0;
  for (const value of values) sum += value * value;
  return Number.isFinite(sum) ? sum : Number.POSITIVE_INFINITY;
}

/** Solves `A x = b` by Gaussian elimination with partial pivoting; NaN entries if singular. */
export function solveLinearSystem(matrix: readonly number[][], rhs: readonly number[]): number[] {
  const n = rhs.length;
  const a = matrix.map((row, i) => [...row, rhs[i] ?? Number.NaN]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) {
      if (Math.abs(a[row]?.[col] ?? 0) > Math.abs(a[pivot]?.[col] ?? 0)) pivot = row;
    }
    const pivotRow = a[pivot];
    const colRow = a[col];
    if (pivotRow === undefined || colRow === undefined || pivotRow[col] === 0) {
      return new Array<number>(n).fill(Number.NaN);
    }
    a[pivot] = colRow;
    a[col] = pivotRow;
    for (let row = col + 1; row < n; row++) {
      const target = a[row];
      if (target === undefined) continue;
      const factor = (target[col] ?? 0) / (pivotRow[col] ?? 1);
      for (let k = col; k <= n; k++) target[k] = (target[k] ?? 0) - factor * (pivotRow[k] ?? 0);
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let row = n - 1; row >= 0; row--) {
    const r = a[row] ?? [];
    let sum = r[n] ?? 0;
    for (let k = row + 1; k < n; k++) sum -= (r[k] ?? 0) * (x[k] ?? 0);
    x[row] = sum / (r[row] ?? Number.NaN);
  }
  return x;
}

/**
 * Minimises the sum of squared residuals from `initial`.
 *
 * @returns the best parameters found, their cost, the iterations used and whether the relative
 *   tolerance was met. An infeasible start returns the start with cost Infinity.
 */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  initial: readonly number[],
  options: LevenbergMarquardtOptions = DEFAULT_LEVENBERG_MARQUARDT_OPTIONS,
): LeastSquaresSolution {
  let parameters = [...initial];
  let residuals = problem.residuals(parameters);
  let cost = sumOfSquares(residuals);
  if (!Number.isFinite(cost)) return { parameters, cost, iterations: 0, converged: false };
  let damping = options.initialDamping;
  const n = parameters.length;
  for (let iteration = 1; iteration <= options.maxIterations; iteration++) {
    const jacobian = problem.jacobian(parameters);
    const normal = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const gradient = new Array<number>(n).fill(0);
    jacobian.forEach((row, i) => {
      for (let p = 0; p < n; p++) {
        gradient[p] = (gradient[p] ?? 0) + (row[p] ?? 0) * (residuals[i] ?? 0);
        for (let q = 0; q < n; q++) {
          const line = normal[p] ?? [];
          line[q] = (line[q] ?? 0) + (row[p] ?? 0) * (row[q] ?? 0);
        }
      }
    });
    let accepted = false;
    while (!accepted && damping < 1e16) {
      const damped = normal.map((line, p) =>
        line.map((value, q) => (p === q ? value * (1 + damping) + 1e-300 : value)),
      );
      const step = solveLinearSystem(
        damped,
        gradient.map((g) => -g),
      );
      const trial = parameters.map((value, p) => value + (step[p] ?? Number.NaN));
      const trialResiduals = problem.residuals(trial);
      const trialCost = sumOfSquares(trialResiduals);
      if (trialCost < cost) {
        const decrease = (cost - trialCost) / Math.max(cost, Number.MIN_VALUE);
        parameters = trial;
        residuals = trialResiduals;
        cost = trialCost;
        damping = Math.max(damping / 10, 1e-12);
        accepted = true;
        if (decrease < options.relativeTolerance || cost === 0) {
          return { parameters, cost, iterations: iteration, converged: true };
        }
      } else {
        damping *= 10;
      }
    }
    // No downhill step at any damping: we are at a (numerical) minimum.
    if (!accepted) return { parameters, cost, iterations: iteration, converged: true };
  }
  return { parameters, cost, iterations: options.maxIterations, converged: false };
}
