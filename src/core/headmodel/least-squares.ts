/**
 * Small dense least-squares pieces shared by the head-model fits: an orthonormal basis of a few columns
 * (modified Gram–Schmidt with one re-orthogonalisation pass, "twice is enough": Giraud, Langou & Rozložník
 * 2005, Comput. Math. Appl. 50:1069–1075), a pivoting solve of a small square system (LU, from linalg/lu.ts), and a
 * Levenberg–Marquardt loop with a central-difference Jacobian (Levenberg 1944, Q. Appl. Math. 2:164–168;
 * Marquardt 1963, J. SIAM 11:431–441; damping of diag(JᵀJ) and the ×10 / ÷10 schedule as in docs/methods.md §15).
 *
 * Everything here works on column-major scratch buffers handed in by the caller, so the fits' inner loops
 * allocate nothing.
 */
import { luFactor, luSolve } from '../linalg/lu.ts';

/**
 * Orthonormal basis of the columns of `a` (column-major, `rows × cols`), written column-major into `q`,
 * with the upper-triangular factor (row-major `cols × cols`) in `r`, so that A = Q R.
 * A column whose remaining norm falls below `relTol` × its original norm is treated as dependent: its
 * column of `q` is zero and `r[j][j] = 0`. Returns the rank found.
 */
export function gramSchmidtBasis(
  a: Float64Array,
  rows: number,
  cols: number,
  q: Float64Array,
  r: Float64Array,
  relTol = 1e-10,
): number {
  let rank = 0;
  r.fill(0, 0, cols * cols);
  for (let j = 0; j < cols; j++) {
    const qj = j * rows;
    let norm0 = 0;
    for (let i = 0; i < rows; i++) {
      const v = a[qj + i];
      q[qj + i] = v;
      norm0 += v * v;
    }
    norm0 = Math.sqrt(norm0);
    for (let pass = 0; pass < 2; pass++) {
      for (let k = 0; k < j; k++) {
        const qk = k * rows;
        let dot = 0;
        for (let i = 0; i < rows; i++) dot += q[qk + i] * q[qj + i];
        if (dot === 0) continue;
        r[k * cols + j] += dot;
        for (let i = 0; i < rows; i++) q[qj + i] -= dot * q[qk + i];
      }
    }
    let norm = 0;
    for (let i = 0; i < rows; i++) norm += q[qj + i] * q[qj + i];
    norm = Math.sqrt(norm);
    if (!(norm > relTol * norm0) || norm0 === 0) {
      for (let i = 0; i < rows; i++) q[qj + i] = 0;
      r[j * cols + j] = 0;
      continue;
    }
    r[j * cols + j] = norm;
    const inv = 1 / norm;
    for (let i = 0; i < rows; i++) q[qj + i] *= inv;
    rank++;
  }
  return rank;
}

/**
 * Solves R x = y for the upper-triangular `r` (row-major `n × n`) by back substitution; a zero pivot
 * (dependent column of `gramSchmidtBasis`) gives x_j = 0, i.e. the minimum-norm choice along that column.
 */
export function solveUpperTriangular(r: Float64Array, n: number, y: Float64Array, x: Float64Array): Float64Array {
  for (let i = n - 1; i >= 0; i--) {
    const d = r[i * n + i];
    if (d === 0) {
      x[i] = 0;
      continue;
    }
    let s = y[i];
    for (let k = i + 1; k < n; k++) s -= r[i * n + k] * x[k];
    x[i] = s / d;
  }
  return x;
}

/**
 * Solves the small square system A x = b (row-major `n × n`) by LU factorisation with partial pivoting
 * (`luFactor` / `luSolve` in linalg/lu.ts). `a` is overwritten by its factors; `b` is left unchanged.
 * `perm` (length ≥ n) is pivot scratch: pass one from a scratch object to keep a loop allocation-free.
 * Returns false when a pivot is exactly zero (singular).
 */
export function solveSmallSystem(
  a: Float64Array,
  b: Float64Array,
  n: number,
  x: Float64Array,
  perm: Int32Array = new Int32Array(n),
): boolean {
  if (!luFactor(a, n, perm)) return false;
  luSolve(a, n, perm, b, x);
  return true;
}

/** The problem handed to `levenbergMarquardt`. */
export interface LevenbergMarquardtProblem {
  /** Number of parameters (small: 3 for a dipole position). */
  readonly nParams: number;
  /** Number of residuals. */
  readonly nResiduals: number;
  /** Writes the residual vector at `p` into `out`. Must accept points a little outside `feasible`. */
  residual(p: Float64Array, out: Float64Array): void;
  /** Whether a trial step may be accepted (e.g. the dipole stays inside the brain shell). Default: always. */
  feasible?(p: Float64Array): boolean;
}

export interface LevenbergMarquardtOptions {
  /** Central-difference step per parameter, in parameter units (docs/methods.md §15: ≈ 1e-6 R). */
  readonly step: number;
  /** Iteration limit. Default 100. */
  readonly maxIterations?: number;
  /** Stop when the accepted relative cost decrease is below this. Default 1e-12 (docs/methods.md §15). */
  readonly relativeCostTol?: number;
  /** Stop when the step length is below this, in parameter units. Default 1e-10 × `step` / 1e-6. */
  readonly stepTol?: number;
  /** Initial damping. Default 1e-3. */
  readonly lambda0?: number;
}

export interface LevenbergMarquardtResult {
  /** Final parameters (a copy of the best point reached). */
  readonly p: Float64Array;
  /** Final sum of squared residuals. */
  readonly cost: number;
  /** Number of iterations (Jacobian evaluations). */
  readonly iterations: number;
  /** True when the last rejected step was refused only because it left the feasible region. */
  readonly blockedByBoundary: boolean;
}

/** Scratch for `levenbergMarquardt`, allocated once per problem size and reused over many fits. */
export interface LevenbergMarquardtScratch {
  readonly nParams: number;
  readonly nResiduals: number;
  readonly r: Float64Array;
  readonly rTrial: Float64Array;
  readonly rPlus: Float64Array;
  readonly rMinus: Float64Array;
  readonly jac: Float64Array;
  readonly jtj: Float64Array;
  readonly jtr: Float64Array;
  readonly sys: Float64Array;
  readonly rhs: Float64Array;
  /** Pivot order of the step's LU solve. */
  readonly perm: Int32Array;
  readonly delta: Float64Array;
  readonly p: Float64Array;
  readonly trial: Float64Array;
  readonly probe: Float64Array;
}

export function createLevenbergMarquardtScratch(nParams: number, nResiduals: number): LevenbergMarquardtScratch {
  return {
    nParams,
    nResiduals,
    r: new Float64Array(nResiduals),
    rTrial: new Float64Array(nResiduals),
    rPlus: new Float64Array(nResiduals),
    rMinus: new Float64Array(nResiduals),
    jac: new Float64Array(nParams * nResiduals),
    jtj: new Float64Array(nParams * nParams),
    jtr: new Float64Array(nParams),
    sys: new Float64Array(nParams * nParams),
    rhs: new Float64Array(nParams),
    perm: new Int32Array(nParams),
    delta: new Float64Array(nParams),
    p: new Float64Array(nParams),
    trial: new Float64Array(nParams),
    probe: new Float64Array(nParams),
  };
}

function sumSquares(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return s;
}

/**
 * Levenberg–Marquardt minimisation of |r(p)|² from `p0`: solve (JᵀJ + λ diag(JᵀJ)) δ = −Jᵀr, accept the
 * step if the cost falls and the new point is feasible (then λ ÷ 10), else λ × 10 (docs/methods.md §15). The
 * Jacobian is taken by central differences with step `opts.step`.
 */
export function levenbergMarquardt(
  problem: LevenbergMarquardtProblem,
  p0: ArrayLike<number>,
  opts: LevenbergMarquardtOptions,
  scratch: LevenbergMarquardtScratch = createLevenbergMarquardtScratch(problem.nParams, problem.nResiduals),
): LevenbergMarquardtResult {
  const n = problem.nParams;
  const m = problem.nResiduals;
  const { r, rTrial, rPlus, rMinus, jac, jtj, jtr, sys, rhs, perm, delta, p, trial, probe } = scratch;
  const maxIterations = opts.maxIterations ?? 100;
  const relTol = opts.relativeCostTol ?? 1e-12;
  const stepTol = opts.stepTol ?? opts.step * 1e-4;
  const h = opts.step;
  let lambda = opts.lambda0 ?? 1e-3;
  for (let i = 0; i < n; i++) p[i] = p0[i];
  problem.residual(p, r);
  let cost = sumSquares(r);
  let iterations = 0;
  let blockedByBoundary = false;
  if (!Number.isFinite(cost)) return { p: p.slice(), cost, iterations, blockedByBoundary };

  outer: while (iterations < maxIterations) {
    iterations++;
    // Jacobian, column k = (r(p + h e_k) − r(p − h e_k)) / 2h, stored column-major.
    for (let k = 0; k < n; k++) {
      for (let i = 0; i < n; i++) probe[i] = p[i];
      probe[k] = p[k] + h;
      problem.residual(probe, rPlus);
      probe[k] = p[k] - h;
      problem.residual(probe, rMinus);
      const inv = 1 / (2 * h);
      for (let i = 0; i < m; i++) jac[k * m + i] = (rPlus[i] - rMinus[i]) * inv;
    }
    for (let a = 0; a < n; a++) {
      let s = 0;
      for (let i = 0; i < m; i++) s += jac[a * m + i] * r[i];
      jtr[a] = s;
      for (let b = a; b < n; b++) {
        let t = 0;
        for (let i = 0; i < m; i++) t += jac[a * m + i] * jac[b * m + i];
        jtj[a * n + b] = t;
        jtj[b * n + a] = t;
      }
    }
    // Inner loop: raise the damping until a step is accepted or the step becomes negligible.
    for (;;) {
      for (let a = 0; a < n; a++) {
        for (let b = 0; b < n; b++) sys[a * n + b] = jtj[a * n + b];
        const d = jtj[a * n + a];
        sys[a * n + a] = d + lambda * (d > 0 ? d : 1e-300);
        rhs[a] = -jtr[a];
      }
      if (!solveSmallSystem(sys, rhs, n, delta, perm)) break outer;
      let stepLen = 0;
      for (let i = 0; i < n; i++) {
        trial[i] = p[i] + delta[i];
        stepLen += delta[i] * delta[i];
      }
      stepLen = Math.sqrt(stepLen);
      if (!(stepLen >= stepTol)) break outer;
      const feasible = problem.feasible ? problem.feasible(trial) : true;
      let trialCost = Infinity;
      if (feasible) {
        problem.residual(trial, rTrial);
        trialCost = sumSquares(rTrial);
      }
      if (trialCost < cost) {
        const decrease = (cost - trialCost) / cost;
        for (let i = 0; i < n; i++) p[i] = trial[i];
        r.set(rTrial);
        cost = trialCost;
        lambda = Math.max(lambda / 10, 1e-12);
        blockedByBoundary = false;
        if (decrease < relTol || stepLen < stepTol) break outer;
        break;
      }
      blockedByBoundary = !feasible;
      lambda *= 10;
      if (lambda > 1e16) break outer;
    }
  }
  return { p: p.slice(), cost, iterations, blockedByBoundary };
}
