/**
 * LU factorisation with partial pivoting of a small dense square matrix, and the solve that uses it
 * (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 3.4.1 and §3.4.4). Factor once, solve many
 * right-hand sides: the spherical-spline interpolator solves one system per map, and the head-model fits
 * solve one small system per Levenberg–Marquardt step (`solveSmallSystem` in headmodel/least-squares.ts).
 */

/**
 * LU factorisation with partial pivoting of the n × n row-major `a` in place (unit lower-triangular L below
 * the diagonal, U on and above it); `perm` receives the row order, so that P A = L U.
 * Returns false for an exactly singular matrix (a zero or NaN pivot column).
 */
export function luFactor(a: Float64Array, n: number, perm: Int32Array): boolean {
  for (let i = 0; i < n; i++) perm[i] = i;
  for (let col = 0; col < n; col++) {
    let piv = col;
    let best = Math.abs(a[col * n + col]);
    for (let i = col + 1; i < n; i++) {
      const v = Math.abs(a[i * n + col]);
      if (v > best) {
        best = v;
        piv = i;
      }
    }
    if (!(best > 0)) return false;
    if (piv !== col) {
      for (let k = 0; k < n; k++) {
        const t = a[col * n + k];
        a[col * n + k] = a[piv * n + k];
        a[piv * n + k] = t;
      }
      const t = perm[col];
      perm[col] = perm[piv];
      perm[piv] = t;
    }
    const d = a[col * n + col];
    for (let i = col + 1; i < n; i++) {
      const f = (a[i * n + col] /= d);
      if (f === 0) continue;
      for (let k = col + 1; k < n; k++) a[i * n + k] -= f * a[col * n + k];
    }
  }
  return true;
}

/**
 * Solves A x = b from `luFactor`'s output (`lu`, `perm`): forward substitution with L on the permuted `b`,
 * then back substitution with U. `b` is left unchanged; `x` (length n) receives the solution.
 */
export function luSolve(lu: Float64Array, n: number, perm: Int32Array, b: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = b[perm[i]];
    for (let k = 0; k < i; k++) s -= lu[i * n + k] * x[k];
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= lu[i * n + k] * x[k];
    x[i] = s / lu[i * n + i];
  }
}
