/**
 * Known-source mixtures for the ICA tests (Amari index checks, docs/methods.md §7.5): seeded Laplace (super-Gaussian),
 * uniform (sub-Gaussian) and sinusoid (sub-Gaussian, bimodal) sources, unit variance, mixed by a seeded
 * random matrix with entries N(0, 1).
 */
import { createPrng } from '../../../src/core/ica/prng.ts';

export interface Mixture {
  readonly S: Float64Array;
  /** n × k true mixing, row-major. */
  readonly A: Float64Array;
  /** n × T channel-major mixtures. */
  readonly X: Float32Array;
  readonly n: number;
  readonly k: number;
  readonly T: number;
}

export function laplaceUniformSineMixture(k: number, T: number, seed: number, n = k): Mixture {
  const rng = createPrng(seed);
  const S = new Float64Array(k * T);
  for (let i = 0; i < k; i++) {
    const kind = i % 3;
    const f = 0.013 + 0.0071 * i; // cycles per sample, distinct per source
    const ph = rng.next() * 2 * Math.PI;
    for (let t = 0; t < T; t++) {
      let v: number;
      if (kind === 0) {
        const u = rng.next() - 0.5;
        v = (-Math.sign(u) * Math.log(1 - 2 * Math.abs(u))) / Math.SQRT2; // Laplace, unit variance
      } else if (kind === 1) v = (rng.next() - 0.5) * Math.sqrt(12);
      else v = Math.SQRT2 * Math.sin(2 * Math.PI * f * t + ph);
      S[i * T + t] = v;
    }
  }
  const A = new Float64Array(n * k);
  for (let i = 0; i < n * k; i++) A[i] = rng.normal();
  const X = new Float32Array(n * T);
  for (let c = 0; c < n; c++)
    for (let j = 0; j < k; j++) {
      const a = A[c * k + j];
      for (let t = 0; t < T; t++) X[c * T + t] += a * S[j * T + t];
    }
  return { S, A, X, n, k, T };
}
