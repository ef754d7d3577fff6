/**
 * An ensemble in analysis space as one row-major block: row i is one entry (a state variable, a
 * parameter or a predicted observation), column k one member. Rows are contiguous so the inner
 * loops of the analyses run over members.
 */
export interface EnsembleMatrix {
  rowCount: number;
  memberCount: number;
  /** values[i * memberCount + k]: entry i of member k. */
  values: Float64Array;
}

/** A zero-filled matrix. */
export function createEnsembleMatrix(rowCount: number, memberCount: number): EnsembleMatrix {
  return { rowCount, memberCount, values: new Float64Array(rowCount * memberCount) };
}

/** Splits each row into its mean (returned) and its perturbations (left in place). */
export function removeRowMeans(matrix: EnsembleMatrix): Float64Array {
  const { rowCount, memberCount, values } = matrix;
  const means = new Float64Array(rowCount);
  for (let i = 0; i < rowCount; i++) {
    const offset = i * memberCount;
    let sum = 0;
    for (let k = 0; k < memberCount; k++) sum += values[offset + k] ?? 0;
    const mean = sum / memberCount;
    means[i] = mean;
    for (let k = 0; k < memberCount; k++) values[offset + k] = (values[offset + k] ?? 0) - mean;
  }
  return means;
}

/** Adds the row means back to perturbations (inverse of {@link removeRowMeans}). */
export function addRowMeans(matrix: EnsembleMatrix, means: Float64Array): void {
  const { rowCount, memberCount, values } = matrix;
  for (let i = 0; i < rowCount; i++) {
    const mean = means[i] ?? 0;
    const offset = i * memberCount;
    for (let k = 0; k < memberCount; k++) values[offset + k] = (values[offset + k] ?? 0) + mean;
  }
}

/** Sample standard deviation of each row of perturbations (divisor N - 1). */
export function rowSpreads(perturbations: EnsembleMatrix): Float64Array {
  const { rowCount, memberCount, values } = perturbations;
  const spreads = new Float64Array(rowCount);
  for (let i = 0; i < rowCount; i++) {
    const offset = i * memberCount;
    let sum = 0;
    for (let k = 0; k < memberCount; k++) {
      const d = values[offset + k] ?? 0;
      sum += d * d;
    }
    spreads[i] = Math.sqrt(sum / (memberCount - 1));
  }
  return spreads;
}

/** Multiplies every perturbation of the given rows (all rows when omitted) by `factor`. */
export function scaleRows(matrix: EnsembleMatrix, factor: number | Float64Array): void {
  const { rowCount, memberCount, values } = matrix;
  for (let i = 0; i < rowCount; i++) {
    const f = typeof factor === 'number' ? factor : (factor[i] ?? 1);
    if (f === 1) continue;
    const offset = i * memberCount;
    for (let k = 0; k < memberCount; k++) values[offset + k] = (values[offset + k] ?? 0) * f;
  }
}
