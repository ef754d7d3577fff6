/**
 * Reference for the linear-Gaussian tests: the Kalman filter update written out with explicit
 * matrix inverses (Kalman 1960; e.g. Evensen 2009, *Data Assimilation*, 2nd ed., on the
 * Kalman filter, from memory), an ensemble drawn from a known Gaussian, and sample moments.
 * It uses ml-matrix's general inverse and Cholesky factor, not the code under test.
 */
import { CholeskyDecomposition, inverse, Matrix } from 'ml-matrix';
import type { EnsembleMember } from '../../server/src/calibration/ensemble.ts';
import type { EnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';

/** Posterior mean and covariance: K = P H^T (H P H^T + R)^-1, m_a = m + K (y - H m), P_a = (I - K H) P. */
export function kalmanPosterior(
  mean: number[],
  covariance: number[][],
  observationMatrix: number[][],
  observed: number[],
  errorSd: number[],
): { mean: number[]; covariance: number[][] } {
  const m = Matrix.columnVector(mean);
  const p = new Matrix(covariance);
  const h = new Matrix(observationMatrix);
  const r = Matrix.diag(errorSd.map((sd) => sd * sd));
  const gain = p.mmul(h.transpose()).mmul(inverse(h.mmul(p).mmul(h.transpose()).add(r)));
  const innovation = Matrix.columnVector(observed).sub(h.mmul(m));
  const posteriorMean = m.add(gain.mmul(innovation));
  const posteriorCovariance = Matrix.eye(mean.length).sub(gain.mmul(h)).mmul(p);
  return { mean: posteriorMean.to1DArray(), covariance: posteriorCovariance.to2DArray() };
}

/** Augmented vector of a member: state entries then parameters. */
export function augmented(member: EnsembleMember): number[] {
  return [...member.state, ...member.parameters];
}

/** Sample mean and covariance (divisor N - 1) of vectors. */
export function sampleMoments(vectors: number[][]): { mean: number[]; covariance: number[][] } {
  const n = vectors[0]?.length ?? 0;
  const count = vectors.length;
  const mean = Array.from(
    { length: n },
    (_, i) => vectors.reduce((sum, v) => sum + (v[i] ?? 0), 0) / count,
  );
  const covariance = Array.from({ length: n }, (_, i) =>
    Array.from(
      { length: n },
      (_, j) =>
        vectors.reduce(
          (sum, v) => sum + ((v[i] ?? 0) - (mean[i] ?? 0)) * ((v[j] ?? 0) - (mean[j] ?? 0)),
          0,
        ) /
        (count - 1),
    ),
  );
  return { mean, covariance };
}

/** Draws `count` vectors from N(mean, covariance) as L z, L the Cholesky factor. */
export function drawGaussian(
  mean: number[],
  covariance: number[][],
  count: number,
  random: EnsembleRandom,
): number[][] {
  const factor = new CholeskyDecomposition(new Matrix(covariance)).lowerTriangularMatrix;
  return Array.from({ length: count }, () => {
    const z = mean.map(() => random.normal());
    return mean.map((mu, i) => mu + z.reduce((sum, zj, j) => sum + factor.get(i, j) * zj, 0));
  });
}
