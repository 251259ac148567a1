import { describe, expect, it } from 'vitest';
import { initialRotation, picardOrthogonal, picardWarmStarted, picardTolerance } from '../../../src/core/ica/picard.ts';
import { amariIndex } from '../../../src/core/ica/amari.ts';
import { amariIndexOf } from '../../../src/core/ica/amari.ts';
import { applyWhitening, covariance, pcaWhitening } from '../../../src/core/linalg/whitening.ts';
import { matrixExponential, matrixMultiply, matrixTranspose } from '../../../src/core/linalg/dense.ts';
import { laplaceUniformSineMixture } from './mixtures.ts';

function whitened(k: number, T: number, seed: number) {
  const m = laplaceUniformSineMixture(k, T, seed);
  const cv = covariance(m.X, k, T);
  const pw = pcaWhitening(cv.covariance, k);
  return { m, pw, Z: applyWhitening(pw.whitening, pw.k, k, cv.means, m.X, T) };
}

function maxOrthogonalityError(W: Float64Array, k: number) {
  const WWt = matrixMultiply(W, matrixTranspose(W, k, k), k, k, k);
  let e = 0;
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) e = Math.max(e, Math.abs(WWt[i * k + j] - (i === j ? 1 : 0)));
  return e;
}

describe('picardOrthogonal (Ablin, Cardoso & Gramfort 2018, orthogonal variant, extended density)', () => {
  it('separates 9 Laplace/uniform/sinusoid sources to a normalised Amari index below 0.05 (issue 5 check)', () => {
    const { m, pw, Z } = whitened(9, 20000, 7);
    const r = picardOrthogonal(Z, pw.k, 20000, { seed: 1 });
    const W = matrixMultiply(r.W, pw.whitening, pw.k, pw.k, 9);
    expect(r.converged).toBe(true);
    expect(r.convergence).toBeLessThan(picardTolerance(20000));
    expect(amariIndexOf(W, m.A, 9, 9).normalised).toBeLessThan(0.05);
    expect(Array.from(r.signs).filter((s) => s > 0).length).toBe(3);
  });
  it('keeps the unmixing orthogonal (the constraint of Picard-O) to 1e-12', () => {
    const { pw, Z } = whitened(5, 5000, 2);
    const r = picardOrthogonal(Z, pw.k, 5000, { seed: 3, maxIter: 15 });
    expect(maxOrthogonalityError(r.W, 5)).toBeLessThan(1e-12);
  });
  it('gives a bit-identical unmixing for the same seed and a different start for another seed', () => {
    const { pw, Z } = whitened(4, 5000, 4);
    const a = picardOrthogonal(Z, pw.k, 5000, { seed: 5, maxIter: 10 });
    const b = picardOrthogonal(Z, pw.k, 5000, { seed: 5, maxIter: 10 });
    expect(Array.from(a.W)).toEqual(Array.from(b.W));
    expect(Array.from(initialRotation(4, 5))).not.toEqual(Array.from(initialRotation(4, 6)));
  });
  it('reports each iteration with its gradient norm and stops with an AbortError on cancel', () => {
    const { pw, Z } = whitened(4, 5000, 4);
    const seen: number[] = [];
    picardOrthogonal(Z, pw.k, 5000, { maxIter: 5, monitor: { iteration: (i) => seen.push(i) } });
    expect(seen.slice(0, 3)).toEqual([1, 2, 3]);
    expect(() => picardOrthogonal(Z, pw.k, 5000, { monitor: { poll: () => true } })).toThrowError(/cancelled/);
  });
});

describe('picardWarmStarted', () => {
  it('reaches the same fixed point as plain Picard-O (W_warm W_plainᵀ is a signed permutation, Amari < 1e-3)', () => {
    const { pw, Z } = whitened(6, 16000, 11);
    const plain = picardOrthogonal(Z, pw.k, 16000, { seed: 2 });
    const warm = picardWarmStarted(Z, pw.k, 16000, { seed: 2 });
    expect(warm.converged).toBe(true);
    const P = matrixMultiply(warm.W, matrixTranspose(plain.W, 6, 6), 6, 6, 6);
    expect(amariIndex(P, 6).normalised).toBeLessThan(1e-3);
  });
});

describe('matrixExponential', () => {
  it('maps an antisymmetric matrix to a rotation: exp([[0, −θ], [θ, 0]]) = [[cos θ, −sin θ], [sin θ, cos θ]]', () => {
    const th = 2.3;
    const R = matrixExponential(Float64Array.from([0, -th, th, 0]), 2);
    expect(R[0]).toBeCloseTo(Math.cos(th), 14);
    expect(R[1]).toBeCloseTo(-Math.sin(th), 14);
    expect(R[2]).toBeCloseTo(Math.sin(th), 14);
  });
});
