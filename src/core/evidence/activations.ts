/**
 * Component activations S = W (X − μ) for a block of components at a time, and their moments. A block of
 * b components over the whole recording costs b · nSamples · 8 bytes, so long recordings are processed a
 * few components at a time instead of holding all of S (issue 6: "not all kept in memory at once").
 */
import type { Decomposition } from '../decomposition.ts';
import { multiplyChannelMajor } from '../linalg/matmul.ts';

/**
 * Writes the activations of components [c0, c1) (0-based) into `out` ((c1 − c0) × nSamples, row-major,
 * arbitrary units). Channel means are removed when the decomposition carries them (W μ subtracted per row).
 */
export function computeActivations(
  decomposition: Decomposition,
  data: Float32Array,
  nSamples: number,
  c0: number,
  c1: number,
  out: Float64Array = new Float64Array((c1 - c0) * nSamples),
): Float64Array {
  const n = decomposition.nChannels;
  const k = c1 - c0;
  const W = decomposition.unmixing.subarray(c0 * n, c1 * n);
  multiplyChannelMajor(W, k, n, data, nSamples, out);
  const mu = decomposition.channelMeans;
  if (mu) {
    for (let i = 0; i < k; i++) {
      let offset = 0;
      for (let c = 0; c < n; c++) offset += W[i * n + c] * mu[c];
      if (offset === 0) continue;
      const row = out.subarray(i * nSamples, (i + 1) * nSamples);
      for (let t = 0; t < nSamples; t++) row[t] -= offset;
    }
  }
  return out;
}

export interface Moments {
  readonly mean: number;
  /** Population variance (divide by n). */
  readonly variance: number;
  /** Excess kurtosis E[(s−μ)⁴]/σ⁴ − 3 (0 for a Gaussian; docs/methods.md §14). NaN for constant signals. */
  readonly kurtosis: number;
}

/** Mean, variance and excess kurtosis of a signal in two passes. */
export function signalMoments(x: ArrayLike<number>): Moments {
  const n = x.length;
  if (n === 0) return { mean: NaN, variance: NaN, kurtosis: NaN };
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  let m2 = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i] - mean;
    const d2 = d * d;
    m2 += d2;
    m4 += d2 * d2;
  }
  m2 /= n;
  m4 /= n;
  return { mean, variance: m2, kurtosis: m2 > 0 ? m4 / (m2 * m2) - 3 : NaN };
}

/** Per-channel means and population variances of channel-major data (nChannels × nSamples). */
export function channelMoments(data: Float32Array, nChannels: number, nSamples: number): { means: Float64Array; variances: Float64Array } {
  const means = new Float64Array(nChannels);
  const variances = new Float64Array(nChannels);
  for (let c = 0; c < nChannels; c++) {
    const row = data.subarray(c * nSamples, (c + 1) * nSamples);
    let s = 0;
    for (let t = 0; t < nSamples; t++) s += row[t];
    const m = s / nSamples;
    let v = 0;
    for (let t = 0; t < nSamples; t++) {
      const d = row[t] - m;
      v += d * d;
    }
    means[c] = m;
    variances[c] = v / nSamples;
  }
  return { means, variances };
}

/** Pearson correlation of two equally long signals; NaN when either is constant. */
export function pearson(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const n = Math.min(a.length, b.length);
  let ma = 0;
  let mb = 0;
  for (let i = 0; i < n; i++) {
    ma += a[i];
    mb += b[i];
  }
  ma /= n;
  mb /= n;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const da = a[i] - ma;
    const db = b[i] - mb;
    sab += da * db;
    saa += da * da;
    sbb += db * db;
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : NaN;
}
