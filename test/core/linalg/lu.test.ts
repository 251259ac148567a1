import { describe, expect, it } from 'vitest';
import { luFactor, luSolve } from '../../../src/core/linalg/lu.ts';

describe('luFactor / luSolve', () => {
  it('solves the 3 × 3 elimination example 2u+v+w=5, 4u−6v=−2, −2u+7v+2w=9 to u,v,w = 1,1,2', () => {
    // Worked example from Strang, Introduction to Linear Algebra, elimination chapter (from memory);
    // the answer is checked by substitution here: 2+1+2 = 5, 4−6 = −2, −2+7+4 = 9.
    const a = Float64Array.from([2, 1, 1, 4, -6, 0, -2, 7, 2]);
    const perm = new Int32Array(3);
    expect(luFactor(a, 3, perm)).toBe(true);
    const b = Float64Array.from([5, -2, 9]);
    const x = new Float64Array(3);
    luSolve(a, 3, perm, b, x);
    expect(x[0]).toBeCloseTo(1, 14);
    expect(x[1]).toBeCloseTo(1, 14);
    expect(x[2]).toBeCloseTo(2, 14);
    expect(Array.from(b)).toEqual([5, -2, 9]); // b is left unchanged
  });

  it('reproduces P A from L U (the factorisation invariant) on a matrix that needs pivoting', () => {
    const original = [0, 2, 1, 3, 1, 4, 1, 5, 2, 6, 8, 1, 9, 1, 3, 7];
    const a = Float64Array.from(original);
    const perm = new Int32Array(4);
    expect(luFactor(a, 4, perm)).toBe(true);
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        let s = 0;
        for (let k = 0; k <= Math.min(i, j); k++) s += (k === i ? 1 : a[i * 4 + k]) * a[k * 4 + j];
        expect(s).toBeCloseTo(original[perm[i] * 4 + j], 12);
      }
  });

  it('reports an exactly singular matrix instead of dividing by zero', () => {
    expect(luFactor(Float64Array.from([1, 2, 2, 4]), 2, new Int32Array(2))).toBe(false);
  });
});
