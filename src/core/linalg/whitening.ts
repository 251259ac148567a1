/**
 * Covariance, rank detection and PCA whitening (docs/methods.md §6):
 *   X_c = X − rowmean(X);  C = X_c X_cᵀ / (T − 1);  C = E diag(λ) Eᵀ, λ₁ ≥ … ≥ λ_n
 *   rank r = #{λ_i > τ λ₁}, and a sharp gap λ_i/λ_{i−1} < 1e-4 also ends the signal subspace
 *   PCA whitening to k ≤ r: Ww = diag(λ_1..k)^(−1/2) E_kᵀ (k × n), de-whitening E_k diag(λ_1..k)^(1/2) (n × k).
 * All arithmetic in float64; samples stay Float32Array, channel-major.
 */
import { accumulateProductTransposed, multiplyChannelMajor, SAMPLE_TILE } from './matmul.ts';
import { symmetricEigen } from './eigen.ts';

/** Sample ranges [start, end) taken into the statistics; default: the whole recording. */
export type SampleRanges = readonly (readonly [number, number])[];

export interface CovarianceResult {
  /** Channel means over the ranges (length n). */
  readonly means: Float64Array;
  /** n × n, row-major, normalised by (count − 1). */
  readonly covariance: Float64Array;
  /** Number of samples used. */
  readonly count: number;
}

/**
 * Mean and covariance of channel-major X (n × nSamples) over `segments` (default all samples), in float64.
 * Fewer than two samples give a zero covariance. `poll` is called every 64 tiles (16 384 samples), e.g. to
 * report progress or throw on cancel.
 */
export function covariance(
  X: Float32Array,
  n: number,
  nSamples: number,
  segments?: SampleRanges,
  poll?: () => void,
): CovarianceResult {
  const ranges: SampleRanges = segments ?? [[0, nSamples]];
  const means = new Float64Array(n);
  let count = 0;
  for (const [s0, s1] of ranges) {
    const a = Math.max(0, s0);
    const b = Math.min(nSamples, s1);
    if (b <= a) continue;
    count += b - a;
    for (let c = 0; c < n; c++) {
      let s = 0;
      const off = c * nSamples;
      for (let t = a; t < b; t++) s += X[off + t];
      means[c] += s;
    }
  }
  const cov = new Float64Array(n * n);
  if (count === 0) return { means, covariance: cov, count };
  for (let c = 0; c < n; c++) means[c] /= count;
  const tile = new Float64Array(n * SAMPLE_TILE);
  for (const [s0, s1] of ranges) {
    const a = Math.max(0, s0);
    const b = Math.min(nSamples, s1);
    for (let t0 = a; t0 < b; t0 += SAMPLE_TILE) {
      const len = Math.min(SAMPLE_TILE, b - t0);
      for (let c = 0; c < n; c++) {
        const src = c * nSamples + t0;
        const dst = c * SAMPLE_TILE;
        const mu = means[c];
        for (let t = 0; t < len; t++) tile[dst + t] = X[src + t] - mu;
      }
      accumulateProductTransposed(tile, SAMPLE_TILE, n, tile, SAMPLE_TILE, n, len, cov);
      if (poll && ((t0 - a) / SAMPLE_TILE) % 64 === 63) poll();
    }
  }
  const norm = count > 1 ? 1 / (count - 1) : 0;
  for (let i = 0; i < n * n; i++) cov[i] *= norm;
  return { means, covariance: cov, count };
}

/** Default relative tolerance τ of the rank rule (docs/methods.md §6: float64 linear dependence leaves ~1e-16 λ₁). */
export const RANK_TOLERANCE = 1e-10;
/** Sharp-gap ratio λ_i/λ_{i−1} below which the remaining eigenvalues count as noise (docs/methods.md §6 [b/c]). */
export const RANK_GAP_RATIO = 1e-4;

export interface RankResult {
  readonly rank: number;
  /** One sentence saying which rule set the rank, with the numbers. */
  readonly reason: string;
}

/** Rank of a covariance from its descending eigenvalues: relative tolerance `tol` (default 1e-10), then the sharp-gap rule. */
export function detectRank(values: Float64Array, tol = RANK_TOLERANCE): RankResult {
  const n = values.length;
  if (n === 0) return { rank: 0, reason: 'no channels' };
  const top = values[0];
  if (!(top > 0)) return { rank: 0, reason: 'the covariance is zero (flat or empty data)' };
  let byTol = 0;
  while (byTol < n && values[byTol] > tol * top) byTol++;
  let byGap = byTol;
  for (let i = 1; i < byTol; i++) {
    if (values[i] / values[i - 1] < RANK_GAP_RATIO) {
      byGap = i;
      break;
    }
  }
  const fmt = (v: number) => v.toExponential(2);
  if (byGap < byTol) {
    return {
      rank: byGap,
      reason:
        `rank ${byGap} of ${n}: eigenvalue ${byGap + 1} is ${fmt(values[byGap] / values[byGap - 1])} × eigenvalue ${byGap} ` +
        `(sharp gap below ${RANK_GAP_RATIO}), typical of re-referencing or interpolation before quantisation`,
    };
  }
  if (byTol < n) {
    return {
      rank: byTol,
      reason:
        `rank ${byTol} of ${n}: ${n - byTol} eigenvalue(s) at or below ${tol} × the largest ` +
        `(largest such ratio ${fmt(Math.max(values[byTol], 0) / top)}), as from an average reference or interpolated channels`,
    };
  }
  return { rank: n, reason: `full rank ${n}: all eigenvalues exceed ${tol} × the largest and no gap below ${RANK_GAP_RATIO}` };
}

export interface PcaWhitening {
  /** Number of whitened dimensions. */
  readonly k: number;
  readonly n: number;
  /** Detected rank of the covariance (k ≤ rank). */
  readonly rank: number;
  readonly rankReason: string;
  /** Descending eigenvalues of the covariance (length n). */
  readonly values: Float64Array;
  /** k × n row-major: diag(λ)^(−1/2) E_kᵀ. */
  readonly whitening: Float64Array;
  /** n × k row-major: E_k diag(λ)^(1/2). */
  readonly dewhitening: Float64Array;
  readonly warnings: string[];
}

/**
 * PCA whitening of a covariance (n × n) to k dimensions: k = the detected rank unless `nComponents` asks for
 * fewer (a warning says how much variance that discards); more than the rank is refused (clamped, with a warning),
 * because ICA on rank-deficient input diverges or duplicates components (docs/methods.md §6).
 */
export function pcaWhitening(cov: Float64Array, n: number, opts: { nComponents?: number; tol?: number } = {}): PcaWhitening {
  const { values, vectors } = symmetricEigen(cov, n);
  const { rank, reason } = detectRank(values, opts.tol);
  const warnings: string[] = [];
  let k = rank;
  if (opts.nComponents !== undefined) {
    const want = Math.floor(opts.nComponents);
    if (want > rank) {
      warnings.push(`asked for ${want} components but the data have rank ${rank}; using ${rank}`);
    } else if (want >= 1 && want < rank) {
      let total = 0;
      let kept = 0;
      for (let i = 0; i < rank; i++) total += values[i];
      for (let i = 0; i < want; i++) kept += values[i];
      warnings.push(
        `reduced to ${want} of ${rank} dimensions before ICA: the ${rank - want} smallest principal components ` +
          `(${(100 * (1 - kept / total)).toFixed(2)} % of the variance) are discarded and cannot be reviewed`,
      );
      k = want;
    }
  }
  const whitening = new Float64Array(k * n);
  const dewhitening = new Float64Array(n * k);
  for (let j = 0; j < k; j++) {
    const s = Math.sqrt(values[j]);
    for (let i = 0; i < n; i++) {
      const e = vectors[i * n + j];
      whitening[j * n + i] = e / s;
      dewhitening[i * k + j] = e * s;
    }
  }
  return { k, n, rank, rankReason: reason, values, whitening, dewhitening, warnings };
}

/**
 * Z = Ww (X − means) for channel-major X (n × nSamples) into `out` (k × nSamples, channel-major, Float32).
 * Float32 storage of unit-variance whitened data keeps 7 significant digits, ample for ICA, and halves memory.
 * Works in chunks of 16 384 samples through a small buffer; `poll` is called after each chunk. `out` may be
 * X's own first k rows (k ≤ n, in place): a chunk is read for all channels before its rows are written.
 */
export function applyWhitening(
  Ww: Float64Array,
  k: number,
  n: number,
  means: Float64Array,
  X: Float32Array,
  nSamples: number,
  out: Float32Array = new Float32Array(k * nSamples),
  poll?: () => void,
): Float32Array {
  const offsets = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let off = 0;
    for (let c = 0; c < n; c++) off += Ww[i * n + c] * means[c];
    offsets[i] = off;
  }
  const CHUNK = 16384;
  const buf = new Float64Array(k * Math.min(CHUNK, nSamples));
  for (let a = 0; a < nSamples; a += CHUNK) {
    const b = Math.min(nSamples, a + CHUNK);
    const len = b - a;
    multiplyChannelMajor(Ww, k, n, X, nSamples, buf, a, b);
    for (let i = 0; i < k; i++) {
      const off = offsets[i];
      const src = i * len;
      const dst = i * nSamples + a;
      for (let t = 0; t < len; t++) out[dst + t] = buf[src + t] - off;
    }
    poll?.();
  }
  return out;
}
