import { describe, expect, it } from 'vitest';
import { createBlockScratch, extendedInfomax, naturalGradientBlockStep, switchingStatistic } from '../../../src/core/ica/infomax.ts';
import { amariIndexOf } from '../../../src/core/ica/amari.ts';
import { applyWhitening, covariance, pcaWhitening } from '../../../src/core/linalg/whitening.ts';
import { matrixMultiply } from '../../../src/core/linalg/dense.ts';
import fixture from '../../fixtures/ica/pca_ica.json' with { type: 'json' };
import { laplaceUniformSineMixture } from './mixtures.ts';

function whitened(k: number, T: number, seed: number) {
  const m = laplaceUniformSineMixture(k, T, seed);
  const cv = covariance(m.X, k, T);
  const pw = pcaWhitening(cv.covariance, k);
  return { m, pw, Z: applyWhitening(pw.whitening, pw.k, k, cv.means, m.X, T) };
}

describe('extended Infomax block step (Lee, Girolami & Sejnowski 1999; pca_ica.json, docs/methods.md §7.2)', () => {
  const ref = fixture.part2_ica_steps.extended_infomax;
  const X2 = fixture.part2_ica_steps.X2_centred;
  it('reproduces the switching statistics and k of the reference batch', () => {
    for (let i = 0; i < 2; i++) expect(switchingStatistic(X2[i])).toBeCloseTo(ref.switch_stat[i], 12);
  });
  it('reproduces W1 of one natural-gradient step from W0 = I with eta = 0.1', () => {
    const Z = Float32Array.from(X2.flat());
    const W = Float64Array.from([1, 0, 0, 1]);
    const stats = { sech2: new Float64Array(2), u2: new Float64Array(2), tanhU: new Float64Array(2) };
    naturalGradientBlockStep(W, 2, Z, 8, 0, 8, Float64Array.from(ref.k), ref.eta, createBlockScratch(2, 8), stats);
    // 1e-6: X2 enters as Float32 and tanh is the fast approximation (error < 3e-8).
    const W1 = ref.W1_matrix.flat();
    for (let i = 0; i < 4; i++) expect(Math.abs(W[i] - W1[i])).toBeLessThan(1e-6);
  });
  it('gives the reference signs of the statistic for unit-variance uniform (−), Laplace (+) and Gaussian (≈0) densities', () => {
    const part3 = fixture.part3_switching_statistic;
    // Deterministic quantile samples u_i = F⁻¹((i + 0.5)/M), as in pca_ica.py, M = 20001.
    const M = 20001;
    const uni = Float64Array.from({ length: M }, (_, i) => ((i + 0.5) / M - 0.5) * 2 * Math.sqrt(3));
    const lap = Float64Array.from({ length: M }, (_, i) => {
      const p = (i + 0.5) / M;
      return (p < 0.5 ? Math.log(2 * p) : -Math.log(2 - 2 * p)) / Math.SQRT2;
    });
    expect(switchingStatistic(uni)).toBeCloseTo(part3.uniform_unit_var.stat_quad, 4);
    expect(switchingStatistic(lap)).toBeCloseTo(part3.laplace_unit_var.stat_quad, 3);
    expect(Math.sign(switchingStatistic(uni))).toBe(part3.uniform_unit_var.k);
    expect(Math.sign(switchingStatistic(lap))).toBe(part3.laplace_unit_var.k);
  });
});

describe('extendedInfomax', () => {
  it('separates 6 Laplace/uniform/sinusoid sources to a normalised Amari index below 0.05 (issue 5 check)', () => {
    const { m, pw, Z } = whitened(6, 20000, 7);
    const r = extendedInfomax(Z, pw.k, 20000, { seed: 1 });
    const W = matrixMultiply(r.W, pw.whitening, pw.k, pw.k, 6);
    expect(amariIndexOf(W, m.A, 6, 6).normalised).toBeLessThan(0.05);
    expect(r.converged).toBe(true);
    // Laplace sources are sources 0 and 3: two super-Gaussian outputs, four sub-Gaussian.
    expect(Array.from(r.signs).filter((s) => s > 0).length).toBe(2);
  });
  it('gives a bit-identical unmixing for the same seed', () => {
    const a = whitened(4, 6000, 3);
    const b = whitened(4, 6000, 3);
    const ra = extendedInfomax(a.Z, 4, 6000, { seed: 42, maxIter: 20 });
    const rb = extendedInfomax(b.Z, 4, 6000, { seed: 42, maxIter: 20 });
    expect(Array.from(ra.W)).toEqual(Array.from(rb.W));
  });
  it('stops with an AbortError when the monitor asks to cancel', () => {
    const { Z } = whitened(4, 6000, 3);
    expect(() => extendedInfomax(Z, 4, 6000, { monitor: { poll: () => true } })).toThrowError(/cancelled/);
  });
});
