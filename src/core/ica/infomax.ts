/**
 * Extended Infomax ICA with natural-gradient block updates.
 *
 * Source: Lee, Girolami & Sejnowski (1999), "Independent component analysis using an extended infomax
 * algorithm for mixed sub-Gaussian and super-Gaussian sources", Neural Computation 11:417–441; natural
 * gradient: Amari, Cichocki & Yang (1996), NIPS 8; Bell & Sejnowski (1995). docs/methods.md §7.2:
 *   U = W X,  ΔW = η [I − K E{tanh(U) Uᵀ} − E{U Uᵀ}] W,  K = diag(k_i)
 *   k_i = sign(E{sech² u_i} E{u_i²} − E{tanh(u_i) u_i})   (+1 super-, −1 sub-Gaussian)
 * Expectations are block means. Practice followed here (docs/methods.md §7.2, [c]: the paper gives the update, these
 * settings are ours):
 * - The samples are put in a seeded random order once (ICA ignores temporal order), so contiguous blocks of
 *   the shuffled data are random mini-batches; each pass visits the blocks in a fresh seeded order.
 * - Block size b = clamp(round(√(T/3)), 32, 512) samples; initial rate η₀ = 0.04 on whitened data with block-
 *   mean gradients (0.01 left 32 Laplace/uniform sources partly unseparated: annealing froze components whose
 *   density sign was still wrong; 0.04 separated them to Amari 0.002, see bench/ica.bench.ts).
 * - k_i is re-estimated every 8 blocks from the statistics accumulated over those blocks.
 * - Annealing: after each pass, if the angle between this pass's weight change and the previous one exceeds
 *   60°, η ← 0.9 η (oscillation means the rate is too large for the remaining error) — but not when a density
 *   sign switched decidedly (|statistic| ≥ 0.01) in this pass or the one before, during the first 50 passes: a
 *   switch turns the direction by itself, and annealing then froze 64 Laplace/uniform sources half-separated
 *   (Amari 0.058) in the bench. After 50 passes the plain rule applies, so near-Gaussian outputs whose sign
 *   keeps flipping cannot stop the annealing.
 * - Stopping rule: the squared Frobenius norm of one pass's weight change ‖ΔW‖²_F < tol (default 1e-7)·k,
 *   or maxIter passes (default 512). One iteration = one pass over all samples.
 * - Divergence guard: if W becomes non-finite or max|W_ij| > 1e4, restart from W = I with η ← 0.8 η
 *   (at most 8 restarts).
 */
import { accumulateProductTransposed, multiplyChannelMajor } from '../linalg/matmul.ts';
import { matrixMultiply } from '../linalg/dense.ts';
import { fastTanh } from './fast-tanh.ts';
import { createPrng, shuffleInPlace } from './prng.ts';
import { cancellationError, type IcaMonitor, type IcaResult } from './ica-types.ts';
import { activeKernels } from '../kernels/kernels.ts';
import { WASM_TILE } from '../kernels/wasm-kernels.ts';

export interface InfomaxOptions {
  /** Maximum passes over the data (default 512). */
  maxIter?: number;
  /** Stopping threshold on ‖ΔW_pass‖²_F / k (default 1e-7). */
  tol?: number;
  /** Initial learning rate (default 0.04). */
  learningRate?: number;
  /** Block size in samples (default clamp(round(√(T/3)), 32, 512)). */
  blockSize?: number;
  /** Seed of the sample order and block order (default 0). */
  seed?: number;
  monitor?: IcaMonitor;
}

/**
 * Runs extended Infomax on whitened Z (k × T channel-major Float32, unit covariance). NOTE: reorders the
 * samples of Z in place (the same seeded permutation for every row); callers pass a buffer they own.
 */
export function extendedInfomax(Z: Float32Array, k: number, T: number, opts: InfomaxOptions = {}): IcaResult {
  const maxIter = opts.maxIter ?? 512;
  const tol = (opts.tol ?? 1e-7) * k;
  const eta0 = opts.learningRate ?? 0.04;
  const b = Math.min(T, opts.blockSize ?? Math.max(32, Math.min(512, Math.round(Math.sqrt(T / 3)))));
  const monitor = opts.monitor;
  const rng = createPrng(opts.seed ?? 0);
  const kk = k * k;
  const warnings: string[] = [];

  // One seeded permutation of the samples, applied row by row.
  const perm = new Uint32Array(T);
  for (let t = 0; t < T; t++) perm[t] = t;
  shuffleInPlace(perm, rng);
  const rowTmp = new Float32Array(T);
  for (let i = 0; i < k; i++) {
    const row = Z.subarray(i * T, (i + 1) * T);
    for (let t = 0; t < T; t++) rowTmp[t] = row[perm[t]];
    row.set(rowTmp);
  }

  const nBlocks = Math.max(1, Math.floor(T / b));
  const order = new Uint32Array(nBlocks);
  const scratch = createBlockScratch(k, b);
  const Wprev = new Float64Array(kk);
  const delta = new Float64Array(kk);
  const deltaPrev = new Float64Array(kk);
  const stats = { sech2: new Float64Array(k), u2: new Float64Array(k), tanhU: new Float64Array(k) };
  const { sech2: sumSech2, u2: sumU2, tanhU: sumThU } = stats;
  let statCount = 0;
  const K = new Float64Array(k).fill(1);
  const W = new Float64Array(kk);
  const resetW = () => {
    W.fill(0);
    for (let i = 0; i < k; i++) W[i * k + i] = 1;
  };
  resetW();

  const updateSigns = () => {
    if (statCount === 0) return;
    for (let i = 0; i < k; i++) {
      const stat = (sumSech2[i] / statCount) * (sumU2[i] / statCount) - sumThU[i] / statCount;
      const ki = stat >= 0 ? 1 : -1;
      // Only decided flips count for the annealing guard: a near-Gaussian output flips on noise alone.
      if (ki !== K[i] && Math.abs(stat) >= 0.01) signFlips++;
      K[i] = ki;
    }
    sumSech2.fill(0);
    sumU2.fill(0);
    sumThU.fill(0);
    statCount = 0;
  };

  let eta = eta0;
  let restarts = 0;
  let converged = false;
  let change = Infinity;
  let havePrev = false;
  let signFlips = 0;
  let flipsLastPass = 0;
  let it = 0;
  let blocksSinceSign = 0;
  let pollCounter = 0;

  while (it < maxIter) {
    Wprev.set(W);
    signFlips = 0;
    for (let i = 0; i < nBlocks; i++) order[i] = i;
    shuffleInPlace(order, rng);
    let blewUp = false;
    for (let bi = 0; bi < nBlocks; bi++) {
      const t0 = order[bi] * b;
      naturalGradientBlockStep(W, k, Z, T, t0, b, K, eta, scratch, stats);
      statCount += b;
      for (let i = 0; i < kk; i++) {
        if (!(Math.abs(W[i]) <= 1e4)) blewUp = true; // also true for NaN
      }
      if (blewUp) break;
      if (++blocksSinceSign >= 8) {
        updateSigns();
        blocksSinceSign = 0;
      }
      if (monitor?.poll && ++pollCounter % 16 === 0 && monitor.poll()) throw cancellationError();
    }
    if (blewUp) {
      if (++restarts > 8) {
        warnings.push('extended Infomax diverged after 8 restarts with smaller learning rates');
        resetW();
        break;
      }
      eta *= 0.8;
      warnings.push(`extended Infomax restarted with learning rate ${eta.toExponential(2)} after the weights blew up`);
      resetW();
      K.fill(1);
      havePrev = false;
      it = 0;
      continue;
    }
    it++;
    let dot = 0;
    let n1 = 0;
    let n0 = 0;
    for (let i = 0; i < kk; i++) {
      const d = W[i] - Wprev[i];
      delta[i] = d;
      n1 += d * d;
      n0 += deltaPrev[i] * deltaPrev[i];
      dot += d * deltaPrev[i];
    }
    change = n1;
    if (havePrev && n0 > 0 && n1 > 0) {
      const cos = dot / Math.sqrt(n0 * n1);
      // angle > 60°; not while densities are still switching (a flip turns the direction by itself)
      const switching = it <= 50 && (signFlips > 0 || flipsLastPass > 0);
      if (cos < 0.5 && !switching) eta *= 0.9;
    }
    deltaPrev.set(delta);
    havePrev = true;
    flipsLastPass = signFlips;
    monitor?.iteration?.(it, change / k, tol / k);
    if (change < tol) {
      converged = true;
      break;
    }
  }
  if (!converged && it >= maxIter)
    warnings.push(`extended Infomax did not converge in ${maxIter} passes (weight change ${(change / k).toExponential(2)} > ${(tol / k).toExponential(2)})`);
  updateSigns();
  const signs = new Int8Array(k);
  for (let i = 0; i < k; i++) signs[i] = K[i] > 0 ? 1 : -1;
  return { W: Float64Array.from(W), iterations: it, converged, convergence: change / k, signs, warnings };
}

/** Scratch buffers of one block update (allocated once per run). */
export interface BlockScratch {
  readonly U: Float64Array;
  readonly F: Float64Array;
  readonly M: Float64Array;
  readonly D: Float64Array;
  readonly dW: Float64Array;
}

export function createBlockScratch(k: number, b: number): BlockScratch {
  return {
    U: new Float64Array(k * b),
    F: new Float64Array(k * b),
    M: new Float64Array(k * k),
    D: new Float64Array(k * k),
    dW: new Float64Array(k * k),
  };
}

/**
 * One natural-gradient block update of extended Infomax, in place on W (k × k), over samples [t0, t0 + b) of
 * Z (k × T channel-major):  U = W Z_b,  W ← W + η [I − K E{tanh(U)Uᵀ} − E{UUᵀ}] W  (docs/methods.md §7.2).
 * Adds Σ sech²(u_i), Σ u_i², Σ tanh(u_i) u_i of the block (taken at the W before the update) to `stats`,
 * from which the switching statistic is formed.
 */
export function naturalGradientBlockStep(
  W: Float64Array,
  k: number,
  Z: Float32Array,
  T: number,
  t0: number,
  b: number,
  K: Float64Array,
  eta: number,
  scratch: BlockScratch,
  stats: { sech2: Float64Array; u2: Float64Array; tanhU: Float64Array },
): void {
  const { U, F, M, D, dW } = scratch;
  const kk = k * k;
  const kern = activeKernels();
  // WebAssembly SIMD path (src/core/kernels) from 16 components: below that the per-block copies cost more than
  // they save (measured: k = 12 no gain, k = 32 2.4× faster per pass; ours).
  if (kern.infomaxBlock && b <= WASM_TILE && k >= 16) {
    // M = Σ (K tanh U + U) Uᵀ and the row sums, in one block call.
    const th2 = F.subarray(0, k);
    const u2 = F.subarray(k, 2 * k);
    const tu = F.subarray(2 * k, 3 * k);
    kern.infomaxBlock(W, k, Z, T, t0, b, K, M, th2, u2, tu);
    for (let i = 0; i < k; i++) {
      stats.sech2[i] += b - th2[i];
      stats.u2[i] += u2[i];
      stats.tanhU[i] += tu[i];
    }
  } else {
    multiplyChannelMajor(W, k, k, Z, T, U, t0, t0 + b);
    for (let i = 0; i < k; i++) {
      const o = i * b;
      const ki = K[i];
      let s2 = 0;
      let u2 = 0;
      let tu = 0;
      for (let t = 0; t < b; t++) {
        const u = U[o + t];
        const th = fastTanh(u);
        F[o + t] = ki * th + u;
        s2 += th * th;
        u2 += u * u;
        tu += th * u;
      }
      stats.sech2[i] += b - s2;
      stats.u2[i] += u2;
      stats.tanhU[i] += tu;
    }
    // D = I − E[(K tanh U + U) Uᵀ]
    M.fill(0);
    accumulateProductTransposed(F, b, k, U, b, k, b, M);
  }
  for (let i = 0; i < kk; i++) D[i] = -M[i] / b;
  for (let i = 0; i < k; i++) D[i * k + i] += 1;
  matrixMultiply(D, W, k, k, k, dW);
  for (let i = 0; i < kk; i++) W[i] += eta * dW[i];
}

/** Switching statistic E{sech² u}E{u²} − E{tanh(u) u} of one sample row (Lee et al. 1999; > 0 super-Gaussian). */
export function switchingStatistic(u: ArrayLike<number>): number {
  let s2 = 0;
  let u2 = 0;
  let tu = 0;
  for (let t = 0; t < u.length; t++) {
    const th = Math.tanh(u[t]);
    s2 += 1 - th * th;
    u2 += u[t] * u[t];
    tu += th * u[t];
  }
  const n = u.length;
  return (s2 / n) * (u2 / n) - tu / n;
}
