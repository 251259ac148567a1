/**
 * Small dense matrices (≤ a few hundred rows) as row-major Float64Array: products, transposes and the
 * matrix exponential used by the ICA updates. For per-sample work use matmul.ts instead.
 */

/** out (n × p) = A (n × m) · B (m × p). `out` must not alias A or B. */
export function matrixMultiply(A: Float64Array, B: Float64Array, n: number, m: number, p: number, out: Float64Array = new Float64Array(n * p)): Float64Array {
  out.fill(0, 0, n * p);
  for (let i = 0; i < n; i++) {
    for (let l = 0; l < m; l++) {
      const a = A[i * m + l];
      if (a === 0) continue;
      const bo = l * p;
      const oo = i * p;
      for (let j = 0; j < p; j++) out[oo + j] += a * B[bo + j];
    }
  }
  return out;
}

/** out (m × n) = Aᵀ for A (n × m). */
export function matrixTranspose(A: Float64Array, n: number, m: number, out: Float64Array = new Float64Array(n * m)): Float64Array {
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) out[j * n + i] = A[i * m + j];
  return out;
}

/** n × n identity. */
export function matrixIdentity(n: number, out: Float64Array = new Float64Array(n * n)): Float64Array {
  out.fill(0, 0, n * n);
  for (let i = 0; i < n; i++) out[i * n + i] = 1;
  return out;
}

/** Frobenius inner product Σ A_ij B_ij of two equally long arrays. */
export function frobeniusDot(A: Float64Array, B: Float64Array, len = A.length): number {
  let s = 0;
  for (let i = 0; i < len; i++) s += A[i] * B[i];
  return s;
}

/**
 * exp(A) for a small square matrix by scaling and squaring with a Taylor series (Moler & Van Loan 2003,
 * "Nineteen dubious ways…", method 3): scale so ‖A/2^s‖₁ ≤ 0.5, sum 18 Taylor terms (remainder < 1e-17 relative),
 * square s times. For the antisymmetric steps of Picard-O the result is orthogonal to rounding.
 */
export function matrixExponential(A: Float64Array, n: number): Float64Array {
  let norm = 0;
  for (let j = 0; j < n; j++) {
    let col = 0;
    for (let i = 0; i < n; i++) col += Math.abs(A[i * n + j]);
    if (col > norm) norm = col;
  }
  let s = 0;
  if (norm > 0.5) s = Math.ceil(Math.log2(norm / 0.5));
  const scale = 2 ** -s;
  const As = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) As[i] = A[i] * scale;
  let result: Float64Array = matrixIdentity(n);
  let term: Float64Array = matrixIdentity(n);
  let next: Float64Array = new Float64Array(n * n);
  for (let q = 1; q <= 18; q++) {
    matrixMultiply(term, As, n, n, n, next);
    for (let i = 0; i < n * n; i++) next[i] /= q;
    const t = term;
    term = next;
    next = t;
    for (let i = 0; i < n * n; i++) result[i] += term[i];
  }
  for (let r = 0; r < s; r++) {
    matrixMultiply(result, result, n, n, n, next);
    const t = result;
    result = next;
    next = t;
  }
  return result;
}
