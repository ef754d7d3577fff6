/**
 * Thomas algorithm for a tridiagonal system, in place on preallocated arrays so the solver
 * allocates nothing per step.
 */

/**
 * Solves a_i x_{i-1} + b_i x_i + c_i x_{i+1} = d_i for i = 0..n-1 (a_0 and c_{n-1} ignored) by
 * the Thomas algorithm (forward elimination, back substitution): O(n), no pivoting.
 *
 * Valid for diagonally dominant systems (what the implicit finite-volume step produces); a zero
 * pivot yields Infinity/NaN in `solution` rather than a throw.
 *
 * @param lower a (length n), @param diagonal b, @param upper c, @param rightHandSide d
 * @param solution output x (length n); @param scratch workspace of length n (overwritten)
 * Source: Thomas (1949); any numerical-analysis text, e.g. Press et al., Numerical Recipes, 2.4.
 */
export function solveTridiagonal(
  lower: Float64Array,
  diagonal: Float64Array,
  upper: Float64Array,
  rightHandSide: Float64Array,
  solution: Float64Array,
  scratch: Float64Array,
): void {
  const n = diagonal.length;
  let pivot = diagonal[0] as number;
  solution[0] = (rightHandSide[0] as number) / pivot;
  for (let i = 1; i < n; i += 1) {
    scratch[i] = (upper[i - 1] as number) / pivot;
    pivot = (diagonal[i] as number) - (lower[i] as number) * (scratch[i] as number);
    solution[i] =
      ((rightHandSide[i] as number) - (lower[i] as number) * (solution[i - 1] as number)) / pivot;
  }
  for (let i = n - 2; i >= 0; i -= 1) {
    solution[i] =
      (solution[i] as number) - (scratch[i + 1] as number) * (solution[i + 1] as number);
  }
}
