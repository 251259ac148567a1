/**
 * Eigen-decomposition of small symmetric matrices (covariances ≤ ~256 × 256) and the Moore–Penrose
 * pseudo-inverse. ml-matrix does the numerical work (Householder tridiagonalisation + implicit QL, the
 * EISPACK tred2/tql2 pair, and a one-sided SVD); PERFORMANCE.md keeps ml-matrix for exactly this size of job.
 */
import { EigenvalueDecomposition, Matrix, pseudoInverse as mlPseudoInverse } from 'ml-matrix';

export interface SymmetricEigen {
  /** Eigenvalues in descending order. */
  readonly values: Float64Array;
  /** n × n row-major; column j is the unit eigenvector of values[j]; its largest-|x| entry is positive. */
  readonly vectors: Float64Array;
}

function toMatrix(A: Float64Array, rows: number, cols: number): Matrix {
  const m = new Matrix(rows, cols);
  for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) m.set(i, j, A[i * cols + j]);
  return m;
}

/**
 * Eigenvalues (descending) and eigenvectors of the symmetric n × n matrix C (row-major; only symmetry is
 * assumed, the upper triangle is mirrored from the lower by averaging). Each eigenvector's sign is fixed so
 * its largest-magnitude entry is positive, which makes the output deterministic for a given input.
 */
export function symmetricEigen(C: Float64Array, n: number): SymmetricEigen {
  if (n === 0) return { values: new Float64Array(0), vectors: new Float64Array(0) };
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) m.set(i, j, 0.5 * (C[i * n + j] + C[j * n + i]));
  const evd = new EigenvalueDecomposition(m, { assumeSymmetric: true });
  const raw = evd.realEigenvalues;
  const V = evd.eigenvectorMatrix;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => raw[b] - raw[a] || a - b);
  const values = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    const src = order[j];
    values[j] = raw[src];
    let big = 0;
    for (let i = 0; i < n; i++) if (Math.abs(V.get(i, src)) > Math.abs(big)) big = V.get(i, src);
    const sign = big < 0 ? -1 : 1;
    for (let i = 0; i < n; i++) vectors[i * n + j] = sign * V.get(i, src);
  }
  return { values, vectors };
}

/**
 * Moore–Penrose pseudo-inverse (cols × rows, row-major) of A (rows × cols) by SVD; singular values below
 * max(rows, cols)·ε·σ_max are treated as zero (the numpy.linalg.pinv convention for rcond).
 */
export function pseudoInverse(A: Float64Array, rows: number, cols: number): Float64Array {
  if (rows === 0 || cols === 0) return new Float64Array(0);
  const p = mlPseudoInverse(toMatrix(A, rows, cols), Number.EPSILON);
  const out = new Float64Array(cols * rows);
  for (let i = 0; i < cols; i++) for (let j = 0; j < rows; j++) out[i * rows + j] = p.get(i, j);
  return out;
}
