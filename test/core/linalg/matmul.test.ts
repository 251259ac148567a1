import { describe, expect, it } from 'vitest';
import { accumulateProductTransposed, multiplyChannelMajor } from '../../../src/core/linalg/matmul.ts';
import { createPrng } from '../../../src/core/ica/prng.ts';

// Reference: the definition of the matrix product, computed by a naive triple loop.
function randomF64(len: number, seed: number) {
  const r = createPrng(seed);
  return Float64Array.from({ length: len }, () => r.normal());
}

describe('multiplyChannelMajor', () => {
  for (const [k, n, T, s0, s1] of [
    [5, 7, 1003, 0, 1003],
    [8, 8, 600, 13, 590],
    [3, 1, 9, 2, 9],
    [64, 64, 300, 0, 300],
  ]) {
    it(`equals the naive product for k=${k}, n=${n}, samples ${s0}..${s1} of ${T}`, () => {
      const W = randomF64(k * n, 1);
      const X = Float32Array.from(randomF64(n * T, 2));
      const m = s1 - s0;
      const out = new Float64Array(k * m);
      multiplyChannelMajor(W, k, n, X, T, out, s0, s1);
      let worst = 0;
      for (let i = 0; i < k; i++)
        for (let t = 0; t < m; t++) {
          let s = 0;
          for (let c = 0; c < n; c++) s += W[i * n + c] * X[c * T + s0 + t];
          worst = Math.max(worst, Math.abs(out[i * m + t] - s));
        }
      expect(worst).toBeLessThan(1e-12);
    });
  }
  it('writes Float32 output when given a Float32Array', () => {
    const out = new Float32Array(2 * 3);
    multiplyChannelMajor(Float64Array.from([1, 0, 0, 2]), 2, 2, Float32Array.from([1, 2, 3, 4, 5, 6]), 3, out);
    expect(Array.from(out)).toEqual([1, 2, 3, 8, 10, 12]);
  });
});

describe('accumulateProductTransposed', () => {
  it('adds A·Bᵀ over the given columns to out, for sizes that are not multiples of 4', () => {
    const k = 6, m = 7, len = 37, sa = 40, sb = 41;
    const A = randomF64(k * sa, 3);
    const B = randomF64(m * sb, 4);
    const out = new Float64Array(k * m).fill(1);
    accumulateProductTransposed(A, sa, k, B, sb, m, len, out);
    for (let i = 0; i < k; i++)
      for (let j = 0; j < m; j++) {
        let s = 1;
        for (let t = 0; t < len; t++) s += A[i * sa + t] * B[j * sb + t];
        expect(out[i * m + j]).toBeCloseTo(s, 12);
      }
  });
});
