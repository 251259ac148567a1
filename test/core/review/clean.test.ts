import { describe, expect, it } from 'vitest';
import { cleanSignals, createCleaningPlan } from '../../../src/core/review/clean.ts';
import type { Decomposition } from '../../../src/core/decomposition.ts';

function decomposition(channels: string[], mixing: number[], unmixing: number[], means: number[] | null): Decomposition {
  const n = channels.length;
  return {
    channels, nChannels: n, nComponents: mixing.length / n,
    mixing: Float64Array.from(mixing), unmixing: Float64Array.from(unmixing),
    channelMeans: means ? Float64Array.from(means) : null,
    method: 'imported', rank: n, iterations: 0, converged: true,
    preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] },
    recordingSha256: '',
  };
}

// Hand-computed example (docs/methods.md §7.6: X_clean = X − A[:,R] S[R,:], S = W (X − m)):
// A = [[1, 0.5], [0, 1]], W = A⁻¹ = [[1, −0.5], [0, 1]], m = [1, 2], X = [[3, 5], [4, 2]]
// X − m = [[2, 4], [2, 0]]  ⇒  S = [[1, 4], [2, 0]].
const small = decomposition(['Fz', 'Cz'], [1, 0.5, 0, 1], [1, -0.5, 0, 1], [1, 2]);
const X = Float32Array.from([3, 5, 4, 2]);

/** Seeded linear congruential generator (Numerical Recipes constants), values in [−1, 1). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 31 - 1;
  };
}

/** Inverse of a small square matrix by Gauss–Jordan elimination with partial pivoting. */
function invert(a: number[], n: number): number[] {
  const m = a.slice();
  const inv: number[] = Array.from({ length: n * n }, (_, i) => (i % (n + 1) === 0 ? 1 : 0));
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r * n + c]) > Math.abs(m[p * n + c])) p = r;
    for (let j = 0; j < n; j++) {
      [m[c * n + j], m[p * n + j]] = [m[p * n + j], m[c * n + j]];
      [inv[c * n + j], inv[p * n + j]] = [inv[p * n + j], inv[c * n + j]];
    }
    const d = m[c * n + c];
    for (let j = 0; j < n; j++) { m[c * n + j] /= d; inv[c * n + j] /= d; }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r * n + c];
      for (let j = 0; j < n; j++) { m[r * n + j] -= f * m[c * n + j]; inv[r * n + j] -= f * inv[c * n + j]; }
    }
  }
  return inv;
}

describe('createCleaningPlan and cleanSignals', () => {
  it('removes the second component of the hand-computed 2 × 2 example', () => {
    const made = createCleaningPlan(small, ['Fz', 'Cz'], [2]);
    expect(made.ok).toBe(true);
    if (!made.ok) return;
    // A[:,2] S[2,:] = [[0.5·2, 0.5·0], [1·2, 1·0]] = [[1, 0], [2, 0]] ⇒ X_clean = [[2, 5], [2, 2]]
    expect(Array.from(cleanSignals(made.plan, X, 2))).toEqual([2, 5, 2, 2]);
  });

  it('removes the first component of the hand-computed 2 × 2 example', () => {
    const made = createCleaningPlan(small, ['Fz', 'Cz'], [1]);
    if (!made.ok) throw new Error(made.message);
    // A[:,1] S[1,:] = [[1, 4], [0, 0]] ⇒ X_clean = [[2, 1], [4, 2]]
    expect(Array.from(cleanSignals(made.plan, X, 2))).toEqual([2, 1, 4, 2]);
  });

  it('returns the input unchanged when nothing is removed', () => {
    const made = createCleaningPlan(small, ['Fz', 'Cz'], []);
    if (!made.ok) throw new Error(made.message);
    expect(Array.from(cleanSignals(made.plan, X, 2))).toEqual([3, 5, 4, 2]);
  });

  it('leaves only the channel means when every component of a full-rank decomposition is removed', () => {
    const n = 4;
    const T = 300;
    const rand = lcg(7);
    const A = Array.from({ length: n * n }, () => rand());
    for (let i = 0; i < n; i++) A[i * n + i] += 3; // diagonally dominant, so well conditioned
    const W = invert(A, n);
    const means = [10, -5, 0.5, 2];
    const labels = ['Fp1', 'Fp2', 'Cz', 'Oz'];
    const data = new Float32Array(n * T);
    for (let c = 0; c < n; c++) for (let t = 0; t < T; t++) data[c * T + t] = means[c] + 20 * rand();
    const made = createCleaningPlan(decomposition(labels, A, W, means), labels, [1, 2, 3, 4]);
    if (!made.ok) throw new Error(made.message);
    const out = cleanSignals(made.plan, data, T);
    for (let c = 0; c < n; c++) for (let t = 0; t < T; t += 37) expect(out[c * T + t]).toBeCloseTo(means[c], 3);
  });

  it('matches decomposition channels to recording rows by label and copies rows the decomposition does not use', () => {
    // Recording rows: EOG, Cz, Fz (the decomposition uses Fz, Cz only).
    const rec = Float32Array.from([7, 8, 4, 2, 3, 5]);
    const made = createCleaningPlan(small, ['EOG', 'cz', 'Fz'], [2]);
    if (!made.ok) throw new Error(made.message);
    expect(Array.from(cleanSignals(made.plan, rec, 2))).toEqual([7, 8, 2, 2, 2, 5]);
  });

  it('refuses components that do not exist and channels the recording lacks', () => {
    expect(createCleaningPlan(small, ['Fz', 'Cz'], [3]).ok).toBe(false);
    expect(createCleaningPlan(small, ['Fz', 'Pz'], [1]).ok).toBe(false);
  });
});
