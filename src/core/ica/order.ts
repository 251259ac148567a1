/**
 * Ordering and sign convention of components (docs/methods.md §6 display convention [b], issue 5):
 * - order: by the variance each component accounts for in the (preprocessed) channel data, largest first.
 *   Component i back-projects to a_i s_i, whose summed channel variance is ‖a_i‖² var(s_i), var(s_i) = (W C Wᵀ)_ii.
 *   Its "variance share" is that over trace(C). (Shares need not sum to 1: components are not orthogonal in
 *   channel space.)
 * - polarity: each component's sign is arbitrary; we flip map and activation together so that the map's
 *   largest-|weight| entry is positive. Ties go to the first channel.
 */

export interface OrderedComponents {
  /** n × k, row-major. */
  readonly mixing: Float64Array;
  /** k × n, row-major. */
  readonly unmixing: Float64Array;
  /** Per component, in the new order. */
  readonly varianceShare: Float64Array;
  /** order[newIndex] = old index. */
  readonly order: Int32Array;
  /** −1 where the component was flipped, +1 otherwise (new order). */
  readonly flipped: Int8Array;
}

/** Orders and sign-normalises a decomposition given the channel covariance C (n × n) it was computed on. */
export function orderComponents(mixing: Float64Array, unmixing: Float64Array, n: number, k: number, C: Float64Array): OrderedComponents {
  let trace = 0;
  for (let c = 0; c < n; c++) trace += C[c * n + c];
  const vaf = new Float64Array(k);
  const wc = new Float64Array(n);
  for (let i = 0; i < k; i++) {
    // var(s_i) = w_i C w_iᵀ
    wc.fill(0);
    for (let a = 0; a < n; a++) {
      const w = unmixing[i * n + a];
      if (w === 0) continue;
      for (let b = 0; b < n; b++) wc[b] += w * C[a * n + b];
    }
    let v = 0;
    for (let b = 0; b < n; b++) v += wc[b] * unmixing[i * n + b];
    let a2 = 0;
    for (let c = 0; c < n; c++) a2 += mixing[c * k + i] ** 2;
    vaf[i] = a2 * v;
  }
  const idx = Array.from({ length: k }, (_, i) => i).sort((a, b) => vaf[b] - vaf[a] || a - b);
  const outA = new Float64Array(n * k);
  const outW = new Float64Array(k * n);
  const share = new Float64Array(k);
  const order = new Int32Array(k);
  const flipped = new Int8Array(k);
  for (let j = 0; j < k; j++) {
    const src = idx[j];
    order[j] = src;
    let big = 0;
    for (let c = 0; c < n; c++) {
      const v = mixing[c * k + src];
      if (Math.abs(v) > Math.abs(big)) big = v;
    }
    const s = big < 0 ? -1 : 1;
    flipped[j] = s;
    for (let c = 0; c < n; c++) outA[c * k + j] = s * mixing[c * k + src];
    for (let c = 0; c < n; c++) outW[j * n + c] = s * unmixing[src * n + c];
    share[j] = trace > 0 ? vaf[src] / trace : 0;
  }
  return { mixing: outA, unmixing: outW, varianceShare: share, order, flipped };
}
