/**
 * Amari separation index (Amari, Cichocki & Yang 1996, NIPS 8, "A new learning algorithm for blind signal
 * separation", performance index; docs/methods.md §7.5). For P = W_est A_true (n × n):
 *   E(P) = Σ_i (Σ_j |p_ij| / max_k |p_ik| − 1) + Σ_j (Σ_i |p_ij| / max_k |p_kj| − 1)
 * E = 0 iff P is a scaled permutation. Normalised: E / (2n(n−1)) ∈ [0, 1] (the form quoted in this project).
 * `squared` uses p_ij² in place of |p_ij| (a variant some authors use).
 */
export interface AmariIndex {
  readonly raw: number;
  /** raw / (2 n (n − 1)); 0 for n = 1. */
  readonly normalised: number;
}

/** Amari index of P (n × n, row-major). A row or column of zeros gives NaN (no separation to measure). */
export function amariIndex(P: Float64Array, n: number, opts: { squared?: boolean } = {}): AmariIndex {
  const sq = opts.squared === true;
  const a = (v: number) => (sq ? v * v : Math.abs(v));
  let raw = 0;
  for (let i = 0; i < n; i++) {
    let sum = 0;
    let max = 0;
    for (let j = 0; j < n; j++) {
      const v = a(P[i * n + j]);
      sum += v;
      if (v > max) max = v;
    }
    raw += sum / max - 1;
  }
  for (let j = 0; j < n; j++) {
    let sum = 0;
    let max = 0;
    for (let i = 0; i < n; i++) {
      const v = a(P[i * n + j]);
      sum += v;
      if (v > max) max = v;
    }
    raw += sum / max - 1;
  }
  return { raw, normalised: n > 1 ? raw / (2 * n * (n - 1)) : 0 };
}

/** Amari index of P = W (k × n) · A (n × k): estimated unmixing times true mixing in the same space. */
export function amariIndexOf(W: Float64Array, A: Float64Array, k: number, n: number, opts: { squared?: boolean } = {}): AmariIndex {
  const P = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let c = 0; c < n; c++) s += W[i * n + c] * A[c * k + j];
      P[i * k + j] = s;
    }
  return amariIndex(P, k, opts);
}
