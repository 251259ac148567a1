import { describe, expect, it } from 'vitest';
import { pseudoInverse, symmetricEigen } from '../../../src/core/linalg/eigen.ts';
import { matrixMultiply } from '../../../src/core/linalg/dense.ts';
import { createPrng } from '../../../src/core/ica/prng.ts';

describe('symmetricEigen', () => {
  it('returns descending eigenvalues and orthonormal eigenvectors with C = E diag(λ) Eᵀ (invariant)', () => {
    const n = 9;
    const r = createPrng(5);
    const B = Float64Array.from({ length: n * n }, () => r.normal());
    const C = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let l = 0; l < n; l++) C[i * n + j] += B[i * n + l] * B[j * n + l];
    const { values, vectors } = symmetricEigen(C, n);
    for (let j = 1; j < n; j++) expect(values[j]).toBeLessThanOrEqual(values[j - 1]);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let rec = 0;
        let ortho = 0;
        for (let l = 0; l < n; l++) {
          rec += vectors[i * n + l] * values[l] * vectors[j * n + l];
          ortho += vectors[l * n + i] * vectors[l * n + j];
        }
        expect(rec).toBeCloseTo(C[i * n + j], 10);
        expect(ortho).toBeCloseTo(i === j ? 1 : 0, 12);
      }
  });
  it('gives the closed-form eigenvalues 3 and 1 of [[2,1],[1,2]]', () => {
    const { values } = symmetricEigen(Float64Array.from([2, 1, 1, 2]), 2);
    expect(values[0]).toBeCloseTo(3, 14);
    expect(values[1]).toBeCloseTo(1, 14);
  });
});

describe('pseudoInverse', () => {
  it('satisfies the Moore–Penrose conditions A A⁺ A = A and A⁺ A A⁺ = A⁺ for a 5 × 3 matrix', () => {
    const r = createPrng(9);
    const A = Float64Array.from({ length: 15 }, () => r.normal());
    const P = pseudoInverse(A, 5, 3);
    const AP = matrixMultiply(A, P, 5, 3, 5);
    const APA = matrixMultiply(AP, A, 5, 5, 3);
    const PA = matrixMultiply(P, A, 3, 5, 3);
    const PAP = matrixMultiply(PA, P, 3, 3, 5);
    for (let i = 0; i < 15; i++) {
      expect(APA[i]).toBeCloseTo(A[i], 12);
      expect(PAP[i]).toBeCloseTo(P[i], 12);
    }
  });
});
