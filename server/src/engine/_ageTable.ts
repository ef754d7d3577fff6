/**
 * A lazily filled table of a smooth function of equivalent age, for the element model's per-step
 * loop: the specific storage and the pore-refinement factor of every cell are functions of that
 * cell's equivalent age alone, and evaluating the strength, hydration and Powers-Brownyard laws
 * for every cell after every step cost more than the transport step itself. The table is uniform
 * in ln(age) and interpolated linearly; a node is computed the first time a look-up needs it, so
 * building costs nothing and a run computes only the nodes its ages pass through.
 */

/** Options of {@link createAgeTable}. */
export interface AgeTableOptions {
  /** Youngest tabulated age, s; younger ages call the function itself. Default 600 (our choice). */
  minAgeS?: number;
  /** Oldest tabulated age, s; older ages call the function itself. Default 1e9 (about 32 years). */
  maxAgeS?: number;
  /**
   * Node spacing in ln(age), default 0.002 (0.2 % of the age; our choice): the linear
   * interpolation error is below h^2/8 |f''(ln t)|, about 5e-7 of the value for laws whose
   * logarithmic slope stays below a few, far below the 1e-3 update threshold of the model.
   */
  logStep?: number;
}

/**
 * Wraps `law` (a function of equivalent age in s) in a look-up table uniform in ln(age):
 *   f(t) ~ f_j + w (f_{j+1} - f_j),  j + w = (ln t - ln t_min) / h.
 * Exact (the law itself) outside [minAgeS, maxAgeS]. NaN ages give the law's answer for NaN.
 * The law must be pure (same answer for the same age).
 */
export function createAgeTable(
  law: (ageS: number) => number,
  options: AgeTableOptions = {},
): (ageS: number) => number {
  const minAgeS = options.minAgeS ?? 600;
  const maxAgeS = options.maxAgeS ?? 1e9;
  const logStep = options.logStep ?? 0.002;
  const logStart = Math.log(minAgeS);
  const inverseStep = 1 / logStep;
  const lastNode = Math.ceil((Math.log(maxAgeS) - logStart) * inverseStep);
  const values = new Float64Array(lastNode + 1).fill(Number.NaN);
  const nodeValue = (node: number): number => {
    let value = values[node] as number;
    if (Number.isNaN(value)) {
      value = law(Math.exp(logStart + node * logStep));
      values[node] = value;
    }
    return value;
  };
  return (ageS: number): number => {
    if (!(ageS >= minAgeS && ageS <= maxAgeS)) return law(ageS);
    const position = (Math.log(ageS) - logStart) * inverseStep;
    const node = Math.min(lastNode - 1, Math.floor(position));
    const weight = position - node;
    const low = nodeValue(node);
    return low + weight * (nodeValue(node + 1) - low);
  };
}
