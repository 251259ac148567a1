/**
 * Picard-O: maximum-likelihood ICA under an orthogonal constraint, with the extended (sub/super-Gaussian)
 * density, solved by preconditioned L-BFGS.
 *
 * Sources: Ablin, Cardoso & Gramfort (2018), "Faster independent component analysis by preconditioning with
 * Hessian approximations", IEEE Trans. Signal Process. 66:4040–4049 (relative L-BFGS with a Hessian-
 * approximation preconditioner); Ablin, Cardoso & Gramfort (2018), "Faster ICA under orthogonal constraint",
 * ICASSP (the orthogonal variant, and density switching as in extended Infomax); Lee, Girolami & Sejnowski
 * (1999) for the switching statistic. docs/methods.md §7.1, §7.4.
 *
 * Model on whitened Z (k × T): Y = W Z with W orthogonal. Per-row negative log-density
 *   −ln p_i(y) = s_i·ln cosh(y) + y²/2,   score ψ_i(y) = s_i·tanh(y) + y,   s_i ∈ {+1 super, −1 sub}
 * (s = −1 is the score of ½N(1,1)+½N(−1,1), docs/methods.md §7.2). Loss L(W) = E[Σ_i −ln p_i(y_i)] (ln|det W| = 0).
 * Updates W ← expm(E) W with E antisymmetric. Relative gradient G = E[ψ(Y) Yᵀ]; its antisymmetric part
 * Gₛ = (G − Gᵀ)/2 is the gradient on the constraint manifold; the solver stops when max|Gₛ| < tol, by default
 * picardTolerance(T) = max(1e-6, 0.01/√T), 1 % of the gradient's sampling error (docs/methods.md §7.7).
 * Hessian approximation on antisymmetric E (derived as in the ICASSP paper, assuming independent outputs and
 * E[y²] = 1): with Y → (I + E + E²/2) Y the loss changes by
 *   Σ_ij E_ij G_ij + ½ Σ_i Σ_j E_ij² (E[ψ_i'] E[y_j²] − E[ψ_i y_i]) = Σ_{i<j} [2 Gₛ_ij E_ij + ½ E_ij² (κ_i + κ_j)],
 *   κ_i = E[ψ_i'(y_i)] − E[ψ_i(y_i) y_i] = s_i (E[sech² y_i]E[y_i²] − E[tanh(y_i) y_i]),
 * so the Newton step is E_ij = −2 Gₛ_ij / (κ_i + κ_j) (each pair enters the double sum twice; an earlier version
 * missed that factor 2 and took half steps, which doubled the iterations: docs/methods.md §7.7). Pair curvature
 * sums κ_i + κ_j are floored at λ_min = 1e-2 to stay positive.
 * s_i = sign of the switching statistic (so κ_i = |statistic| ≥ 0). The L-BFGS memory (m = 7) is cleared
 * whenever a sign changes. Line search: step 1, halved up to 10 times until the loss decreases (or, inside the
 * loss's arithmetic resolution, the gradient norm does); if it fails the memory is cleared and the
 * preconditioned gradient is tried; if that fails too the solver stops.
 *
 * One pass over the data computes, tile by tile, Y = W Z, tanh, ln cosh and E[tanh(Y) Yᵀ], so a line-search
 * trial that is accepted already holds the next gradient: one pass per iteration in the usual case.
 */
import { activeKernels } from '../kernels/kernels.ts';
import { frobeniusDot, matrixExponential, matrixMultiply, matrixTranspose } from '../linalg/dense.ts';
import type { IcaThreads } from './pass-threads.ts';
import { createPassSums, singleThreadEvaluator, type PassEvaluator, type PassSums } from './picard-pass.ts';
import { createPrng } from './prng.ts';
import { cancellationError, type IcaMonitor, type IcaResult } from './ica-types.ts';

export interface PicardOptions {
  /** Maximum L-BFGS iterations (default 500). */
  maxIter?: number;
  /**
   * Stop when max |antisymmetric relative gradient| < tol (default picardTolerance(T) = max(1e-6, 0.01/√T): 1 % of
   * the gradient's sampling error, and not below the float32 floor of the SIMD kernels; docs/methods.md §7.7).
   */
  tol?: number;
  /** L-BFGS memory (default 7). */
  memory?: number;
  /** Line-search halvings (default 10). */
  lsTries?: number;
  /** Floor of the pair curvatures (default 1e-2). */
  lambdaMin?: number;
  /** Seed of the random orthogonal starting point; undefined → identity. */
  seed?: number;
  /** Starting unmixing (k × k, orthogonal); overrides `seed`. */
  initialW?: Float64Array;
  monitor?: IcaMonitor;
  /** Computes the data pass (default: this thread, all samples); see pass-threads.ts for two threads. */
  evaluator?: PassEvaluator;
}

/**
 * Floor of Picard-O's gradient tolerance. python-picard's 1e-7 (Ablin et al. 2018) assumes float64 passes; our
 * SIMD passes run in float32, where plain loss comparisons stopped resolving line-search decreases near 5e-7
 * (measured on a simulated 32-channel recording; ours, docs/methods.md §7.7).
 */
export const PICARD_TOL = 1e-6;

/** Fraction of the gradient's sampling standard error 1/√T at which Picard-O stops by default (ours). */
export const PICARD_SAMPLING_FRACTION = 0.01;

/**
 * Default stopping tolerance for T samples: max(PICARD_TOL, 0.01/√T). Each entry of the relative gradient is a
 * mean over T samples of products of unit-variance outputs, so its standard error is about 1/√T; once the
 * gradient is 1 % of that, a Newton step would move W by 1 % of its own statistical uncertainty in every
 * direction — also along the near-flat rotations between noise-like components, where realistic recordings
 * otherwise spend most of their iterations (ours, docs/methods.md §7.7).
 */
export function picardTolerance(T: number): number {
  return Math.max(PICARD_TOL, PICARD_SAMPLING_FRACTION / Math.sqrt(Math.max(1, T)));
}

/** Pass sums normalised by T: E[ln cosh y_i], E[sech² y_i], E[tanh(Y) Yᵀ]. */
type PassStats = PassSums;
const newStats = createPassSums;

/** max |Gₛ| of the gradient G = diag(s) E[tanh(Y)Yᵀ] + E[YYᵀ] from normalised pass statistics. */
function maxAntisymmetricGradient(st: PassStats, signs: Int8Array, cy: Float64Array, k: number): number {
  let g = 0;
  for (let i = 0; i < k; i++)
    for (let j = i + 1; j < k; j++) {
      const v = 0.5 * (signs[i] * st.gTanh[i * k + j] + cy[i * k + j] - signs[j] * st.gTanh[j * k + i] - cy[j * k + i]);
      if (Math.abs(v) > g) g = Math.abs(v);
    }
  return g;
}

/** A seeded random orthogonal k × k matrix (Gram–Schmidt on Gaussian rows), or the identity without a seed. */
export function initialRotation(k: number, seed: number | undefined): Float64Array {
  const W = new Float64Array(k * k);
  if (seed === undefined) {
    for (let i = 0; i < k; i++) W[i * k + i] = 1;
    return W;
  }
  const rng = createPrng(seed);
  for (let i = 0; i < k * k; i++) W[i] = rng.normal();
  for (let i = 0; i < k; i++) {
    for (let pass = 0; pass < 2; pass++) {
      for (let j = 0; j < i; j++) {
        let d = 0;
        for (let c = 0; c < k; c++) d += W[i * k + c] * W[j * k + c];
        for (let c = 0; c < k; c++) W[i * k + c] -= d * W[j * k + c];
      }
    }
    let nrm = 0;
    for (let c = 0; c < k; c++) nrm += W[i * k + c] ** 2;
    nrm = Math.sqrt(nrm);
    for (let c = 0; c < k; c++) W[i * k + c] /= nrm;
  }
  return W;
}

/**
 * Runs Picard-O with the extended density on whitened data Z (k × T channel-major Float32, unit covariance).
 * Returns the k × k orthogonal unmixing W (Y = W Z). Throws an AbortError when the monitor's poll says stop.
 */
export function picardOrthogonal(Z: Float32Array, k: number, T: number, opts: PicardOptions = {}): IcaResult {
  const maxIter = opts.maxIter ?? 500;
  const tol = opts.tol ?? picardTolerance(T);
  const mem = opts.memory ?? 7;
  const lsTries = opts.lsTries ?? 10;
  const lambdaMin = opts.lambdaMin ?? 1e-2;
  const monitor = opts.monitor;
  const kk = k * k;
  const warnings: string[] = [];

  // C = Z Zᵀ / T, so E[Y Yᵀ] = W C Wᵀ without another pass.
  const C = new Float64Array(kk);
  activeKernels().accumulateGram(Z, k, T, 0, T, C);
  for (let i = 0; i < kk; i++) C[i] /= T;

  const evaluator = opts.evaluator ?? singleThreadEvaluator(Z, k, T);
  // Resolution of the mean loss once the weight rounding is taken off (lossOf): per-sample rounding (unit
  // roundoff u) adds up like a random walk over T samples and k rows; 16u√(k/T) is ~4× the jitter measured with
  // float32 kernels at k = 32, T = 150 000 (ours, docs/methods.md §7.7).
  const lossResolution = 16 * activeKernels().unitRoundoff * Math.sqrt(k / T);
  const poll = monitor?.poll ? () => monitor.poll!() : undefined;
  /** One fused pass: statistics of Y = Wc Z, normalised by T. */
  const evaluate = (Wc: Float64Array, out: PassStats): void => {
    if ((poll && poll()) || !evaluator(Wc, out, poll)) throw cancellationError();
    for (let i = 0; i < k; i++) {
      out.logcosh[i] /= T;
      out.sech2[i] /= T;
    }
    for (let i = 0; i < kk; i++) out.gTanh[i] /= T;
  };

  const covY = (Wc: Float64Array, out: Float64Array, tmp: Float64Array, tmpT: Float64Array): Float64Array => {
    matrixMultiply(Wc, C, k, k, k, tmp);
    matrixTranspose(Wc, k, k, tmpT);
    return matrixMultiply(tmp, tmpT, k, k, k, out);
  };
  // Kernels with float32 arithmetic see W rounded, W + ρ, off the orthogonal manifold, where the loss has an O(1)
  // slope: to first order the ln cosh part changes by Σ_ij s_i E[tanh(y_i) y_j] (ρ Wᵀ)_ij (as Z = Wᵀ Y), which is
  // taken off again, so that loss differences along the manifold stay resolved (ours, docs/methods.md §7.7).
  const roundsWeights = activeKernels().unitRoundoff > 1e-12;
  const rho = new Float64Array(kk);
  const lossOf = (st: PassStats, sg: Int8Array, cy: Float64Array, Wc: Float64Array): number => {
    let L = 0;
    for (let i = 0; i < k; i++) L += sg[i] * st.logcosh[i] + 0.5 * cy[i * k + i];
    if (roundsWeights) {
      for (let i = 0; i < kk; i++) rho[i] = Math.fround(Wc[i]) - Wc[i];
      for (let i = 0; i < k; i++)
        for (let j = 0; j < k; j++) {
          let m = 0;
          for (let c = 0; c < k; c++) m += rho[i * k + c] * Wc[j * k + c];
          L -= sg[i] * st.gTanh[i * k + j] * m;
        }
    }
    return L;
  };

  let W = opts.initialW ? Float64Array.from(opts.initialW) : initialRotation(k, opts.seed);
  let cur = newStats(k);
  let trial = newStats(k);
  evaluate(W, cur);

  const signs = new Int8Array(k).fill(1);
  const oldSigns = new Int8Array(k);
  const kappa = new Float64Array(k);
  const cy = new Float64Array(kk);
  const cyTrial = new Float64Array(kk);
  const tmp = new Float64Array(kk);
  const tmpT = new Float64Array(kk);
  const G = new Float64Array(kk);
  const Gold = new Float64Array(kk);
  const dir = new Float64Array(kk);
  const q = new Float64Array(kk);
  const Estep = new Float64Array(kk);
  const sMem: Float64Array[] = [];
  const yMem: Float64Array[] = [];
  const rhoMem: number[] = [];
  const alphaTmp = new Float64Array(mem + 1);

  let lastStep: Float64Array | null = null;
  let converged = false;
  let gradNorm = Infinity;
  let it = 0;
  covY(W, cy, tmp, tmpT);

  for (it = 0; it < maxIter; it++) {
    // Switching statistic and signs (Lee et al. 1999), curvature κ_i = |statistic|.
    let signChange = false;
    for (let i = 0; i < k; i++) {
      const stat = cur.sech2[i] * cy[i * k + i] - cur.gTanh[i * k + i];
      const s: 1 | -1 = stat >= 0 ? 1 : -1;
      if (it > 0 && s !== oldSigns[i]) signChange = true;
      signs[i] = s;
      oldSigns[i] = s;
      kappa[i] = Math.abs(stat);
    }
    // G = diag(s) E[tanh(Y)Yᵀ] + E[YYᵀ], antisymmetrised.
    gradNorm = 0;
    for (let i = 0; i < k; i++)
      for (let j = 0; j < k; j++) {
        const gij = signs[i] * cur.gTanh[i * k + j] + cy[i * k + j];
        const gji = signs[j] * cur.gTanh[j * k + i] + cy[j * k + i];
        const v = 0.5 * (gij - gji);
        G[i * k + j] = v;
        if (Math.abs(v) > gradNorm) gradNorm = Math.abs(v);
      }
    monitor?.iteration?.(it + 1, gradNorm, tol);
    if (!Number.isFinite(gradNorm)) {
      warnings.push('Picard stopped: the gradient became non-finite');
      break;
    }
    if (gradNorm < tol) {
      converged = true;
      break;
    }
    if (lastStep) {
      const yv = new Float64Array(kk);
      for (let i = 0; i < kk; i++) yv[i] = G[i] - Gold[i];
      const sy = frobeniusDot(lastStep, yv);
      if (sy > 0) {
        sMem.push(lastStep);
        yMem.push(yv);
        rhoMem.push(1 / sy);
        if (sMem.length > mem) {
          sMem.shift();
          yMem.shift();
          rhoMem.shift();
        }
      }
    }
    Gold.set(G);
    if (signChange) {
      sMem.length = 0;
      yMem.length = 0;
      rhoMem.length = 0;
    }

    const precondition = (v: Float64Array) => {
      for (let i = 0; i < k; i++)
        for (let j = 0; j < k; j++) {
          if (i === j) {
            v[i * k + j] = 0;
            continue;
          }
          // Newton step −2 Gₛ_ij / (κ_i + κ_j): see the module comment.
          const h = Math.max(kappa[i] + kappa[j], lambdaMin);
          v[i * k + j] *= 2 / h;
        }
    };
    const lbfgsDirection = (useMemory: boolean) => {
      q.set(G);
      const m = useMemory ? sMem.length : 0;
      for (let l = m - 1; l >= 0; l--) {
        const a = rhoMem[l] * frobeniusDot(sMem[l], q);
        alphaTmp[l] = a;
        const yl = yMem[l];
        for (let i = 0; i < kk; i++) q[i] -= a * yl[i];
      }
      precondition(q);
      for (let l = 0; l < m; l++) {
        const b = rhoMem[l] * frobeniusDot(yMem[l], q);
        const sl = sMem[l];
        const c = alphaTmp[l] - b;
        for (let i = 0; i < kk; i++) q[i] += c * sl[i];
      }
      for (let i = 0; i < kk; i++) dir[i] = -q[i];
    };

    const currentLoss = lossOf(cur, signs, cy, W);
    const lineSearch = (): { W: Float64Array; step: Float64Array } | null => {
      let alpha = 1;
      for (let tr = 0; tr < lsTries; tr++) {
        for (let i = 0; i < kk; i++) Estep[i] = alpha * dir[i];
        const R = matrixExponential(Estep, k);
        const Wt = matrixMultiply(R, W, k, k, k);
        evaluate(Wt, trial);
        covY(Wt, cyTrial, tmp, tmpT);
        const L = lossOf(trial, signs, cyTrial, Wt);
        if (L < currentLoss) return { W: Wt, step: Float64Array.from(Estep) };
        // Within the loss's arithmetic resolution a decrease cannot be seen; the (accurate) gradient decides.
        if (L < currentLoss + lossResolution && maxAntisymmetricGradient(trial, signs, cyTrial, k) < gradNorm) return { W: Wt, step: Float64Array.from(Estep) };
        alpha /= 2;
      }
      return null;
    };

    lbfgsDirection(true);
    let accepted = lineSearch();
    if (!accepted) {
      sMem.length = 0;
      yMem.length = 0;
      rhoMem.length = 0;
      lbfgsDirection(false);
      accepted = lineSearch();
    }
    if (!accepted) {
      warnings.push(`Picard stopped at iteration ${it + 1}: no decrease of the loss along the gradient (max gradient ${gradNorm.toExponential(2)})`);
      break;
    }
    W = accepted.W;
    lastStep = accepted.step;
    const sw = cur;
    cur = trial;
    trial = sw;
    cy.set(cyTrial);
  }
  if (!converged && it >= maxIter) warnings.push(`Picard did not converge in ${maxIter} iterations (max gradient ${gradNorm.toExponential(2)} > ${tol})`);
  return { W, iterations: Math.min(it, maxIter), converged, convergence: gradNorm, signs: Int8Array.from(signs), warnings };
}

export interface PicardWarmStartOptions extends PicardOptions {
  /** Two-thread data passes for both stages (pass-threads.ts); Z must then come from threads.allocate. */
  threads?: IcaThreads;
  /** Keep every `stride`-th sample in the first stage (default 4); 1 = no warm start. */
  stride?: number;
  /**
   * Gradient tolerance of the first stage (default max(1e-4, 0.3/√T_sub): below the sampling difference between
   * the subsample and the full data, ~1/√T_sub, more first-stage iterations buy nothing; docs/methods.md §7.7).
   */
  warmTol?: number;
}

/** Runs `run` with a two-thread evaluator over Z when `threads` is given (one thread otherwise), always releasing it. */
function withEvaluator<R>(threads: IcaThreads | undefined, Z: Float32Array, k: number, T: number, run: (evaluator: PassEvaluator | undefined) => R): R {
  const ev = threads ? threads.evaluator(Z, k, T) : undefined;
  try {
    return run(ev);
  } finally {
    ev?.release();
  }
}

/**
 * Picard-O with a subsampled warm start (our speed-up, not from the papers): stage 1 runs on every
 * `stride`-th sample (a k × T/stride copy) to a loose tolerance; stage 2 starts from its unmixing on all
 * samples and runs to `tol`. The fixed point is that of the full data, as stage 2 is plain Picard-O; only
 * the route there is cheaper (stage-1 iterations cost 1/stride of a full pass). Used when the subsample
 * still holds ≥ 5·k² samples; otherwise this is plain picardOrthogonal. `iterations` counts both stages.
 */
export function picardWarmStarted(Z: Float32Array, k: number, T: number, opts: PicardWarmStartOptions = {}): IcaResult {
  const stride = Math.max(1, Math.floor(opts.stride ?? 4));
  const Ts = Math.floor(T / stride);
  if (stride === 1 || Ts < 5 * k * k || Ts < 1000) {
    return withEvaluator(opts.threads, Z, k, T, (evaluator) => picardOrthogonal(Z, k, T, { ...opts, evaluator }));
  }
  const threads = opts.threads;
  const Zs = threads ? threads.allocate(k * Ts) : new Float32Array(k * Ts);
  for (let i = 0; i < k; i++) {
    const src = i * T;
    const dst = i * Ts;
    for (let t = 0; t < Ts; t++) Zs[dst + t] = Z[src + t * stride];
  }
  const maxIter = opts.maxIter ?? 500;
  const first = withEvaluator(threads, Zs, k, Ts, (evaluator) =>
    picardOrthogonal(Zs, k, Ts, {
      ...opts,
      evaluator,
      tol: opts.warmTol ?? Math.max(1e-4, 0.3 / Math.sqrt(Ts)),
      maxIter,
      monitor: opts.monitor ? { poll: opts.monitor.poll, iteration: (it, c) => opts.monitor?.iteration?.(it, c, opts.tol ?? picardTolerance(T)) } : undefined,
    }),
  );
  const offset = first.iterations;
  const second = withEvaluator(threads, Z, k, T, (evaluator) =>
    picardOrthogonal(Z, k, T, {
      ...opts,
      evaluator,
      initialW: first.W,
      maxIter: Math.max(1, maxIter - offset),
      monitor: opts.monitor ? { poll: opts.monitor.poll, iteration: (it, c, tol) => opts.monitor?.iteration?.(offset + it, c, tol) } : undefined,
    }),
  );
  return { ...second, iterations: offset + second.iterations, warnings: [...first.warnings.filter((w) => !/did not converge/.test(w)), ...second.warnings] };
}
