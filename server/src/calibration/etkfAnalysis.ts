/**
 * Ensemble transform Kalman filter analysis (ETKF) with the symmetric square root: a
 * deterministic square-root ensemble Kalman filter, computed in the space of the members.
 * Bishop, Etherton and Majumdar (2001), Monthly Weather Review 129; Hunt, Kostelich and Szunyogh
 * (2007), Physica D 230, section 2 (from memory); the symmetric root keeps the analysis mean at
 * the Kalman mean (Wang, Bishop and Julier 2004, MWR 132; Sakov and Oke 2008,
 * MWR 136).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { EnsembleMatrix } from './_ensembleMatrix.ts';

/**
 * Updates ensemble perturbations and means in place by the ETKF.
 *
 * With N members, X the state perturbations (n x N), Y the predicted-observation perturbations
 * (m x N), d = y_obs - mean prediction, R = diag(sd^2), write Yt = R^(-1/2) Y, dt = R^(-1/2) d and
 * S = Yt / sqrt(N - 1), and factor the m x m matrix S S^T = V diag(lambda) V^T. Then
 * - mean weights   `w = Yt^T V diag(1 / ((N - 1)(1 + lambda))) V^T dt`
 *   (= ((N-1) I + Yt^T Yt)^-1 Yt^T dt by the push-through identity),
 * - transform      `T = (I + S^T S)^(-1/2) = I + S^T V diag(g(lambda)) V^T S`,
 *   `g(l) = ((1 + l)^(-1/2) - 1) / l`, g(0) = -1/2 (continuous),
 * - analysis       `x_mean += X w`, `X <- X T`, evaluated as `X + (X Q) diag(g) Q^T` with
 *   `Q = S^T V`, never forming the N x N matrix.
 * For a linear observation operator the analysis mean and sample covariance equal the Kalman
 * filter update of the forecast sample mean and covariance exactly; T keeps the perturbations'
 * zero mean because T 1 = 1.
 *
 * Cost: O(m^3 + m^2 N + n N m); only an m x m eigenproblem, so a handful of probes is
 * cheap at any ensemble size.
 *
 * @param statePerturbations - X, overwritten with the analysis perturbations.
 * @param stateMeans - overwritten with the analysis means.
 * @param observationPerturbations - Y (unchanged).
 * @param innovations - d, in the observations' (transformed) unit.
 * @param errorSd - observation error standard deviations, > 0, same unit.
 */
export function etkfAnalysis(
  statePerturbations: EnsembleMatrix,
  stateMeans: Float64Array,
  observationPerturbations: EnsembleMatrix,
  innovations: Float64Array,
  errorSd: Float64Array,
): void {
  const memberCount = statePerturbations.memberCount;
  const m = observationPerturbations.rowCount;
  if (m === 0 || memberCount < 2) return;
  const scaleN = Math.sqrt(memberCount - 1);

  // S = R^-1/2 Y / sqrt(N - 1), and scaled innovations dt = R^-1/2 d.
  const s = new Float64Array(m * memberCount);
  const dt = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const inverseSd = 1 / (errorSd[j] ?? 1);
    dt[j] = (innovations[j] ?? 0) * inverseSd;
    const offset = j * memberCount;
    for (let k = 0; k < memberCount; k++) {
      s[offset + k] = ((observationPerturbations.values[offset + k] ?? 0) * inverseSd) / scaleN;
    }
  }

  // G = S S^T (m x m), symmetric; its eigen decomposition.
  const g = new Matrix(m, m);
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      let sum = 0;
      for (let k = 0; k < memberCount; k++)
        sum += (s[a * memberCount + k] ?? 0) * (s[b * memberCount + k] ?? 0);
      g.set(a, b, sum);
      g.set(b, a, sum);
    }
  }
  const decomposition = new EigenvalueDecomposition(g, { assumeSymmetric: true });
  const eigenvalues = decomposition.realEigenvalues.map((value) => Math.max(0, value));
  const vectors = decomposition.eigenvectorMatrix;

  // Q = S^T V (N x m), stored transposed (row c = (S^T v_c)^T) so the loops below run over
  // members on contiguous memory.
  const qT = new Float64Array(m * memberCount);
  for (let c = 0; c < m; c++) {
    for (let j = 0; j < m; j++) {
      const v = vectors.get(j, c);
      for (let k = 0; k < memberCount; k++) {
        qT[c * memberCount + k] =
          (qT[c * memberCount + k] ?? 0) + (s[j * memberCount + k] ?? 0) * v;
      }
    }
  }

  // Mean weights w = Yt^T V diag(1/((N-1)(1+l))) V^T dt = Q diag(1/(sqrt(N-1)(1+l))) V^T dt.
  const projected = new Float64Array(m);
  for (let c = 0; c < m; c++) {
    let sum = 0;
    for (let j = 0; j < m; j++) sum += vectors.get(j, c) * (dt[j] ?? 0);
    projected[c] = sum / (scaleN * (1 + (eigenvalues[c] ?? 0)));
  }
  const shrink = eigenvalues.map(squareRootShrink);

  // Row by row: with xq = X_i Q (1 x m), x_mean += xq . projected (= X_i w) and
  // X_i <- X_i T = X_i + (xq diag(g)) Q^T: O(n N m) instead of forming the N x N transform.
  const { rowCount, values } = statePerturbations;
  const coefficients = new Float64Array(m);
  for (let i = 0; i < rowCount; i++) {
    const offset = i * memberCount;
    let shift = 0;
    for (let c = 0; c < m; c++) {
      let xq = 0;
      for (let k = 0; k < memberCount; k++)
        xq += (values[offset + k] ?? 0) * (qT[c * memberCount + k] ?? 0);
      shift += xq * (projected[c] ?? 0);
      coefficients[c] = xq * (shrink[c] ?? 0);
    }
    stateMeans[i] = (stateMeans[i] ?? 0) + shift;
    for (let c = 0; c < m; c++) {
      const coefficient = coefficients[c] ?? 0;
      for (let k = 0; k < memberCount; k++) {
        values[offset + k] =
          (values[offset + k] ?? 0) + coefficient * (qT[c * memberCount + k] ?? 0);
      }
    }
  }
}

/** g(l) = ((1 + l)^(-1/2) - 1) / l, by a series below 1e-8 where the quotient loses digits. */
function squareRootShrink(lambda: number): number {
  if (lambda < 1e-8) return -0.5 + 0.375 * lambda;
  return (1 / Math.sqrt(1 + lambda) - 1) / lambda;
}
