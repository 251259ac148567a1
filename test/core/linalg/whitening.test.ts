import { describe, expect, it } from 'vitest';
import { applyWhitening, covariance, detectRank, pcaWhitening } from '../../../src/core/linalg/whitening.ts';
import { createPrng } from '../../../src/core/ica/prng.ts';
import fixture from '../../fixtures/ica/pca_ica.json' with { type: 'json' };

/** The sources of pca_ica.py (project reference checks, docs/methods.md §6), rebuilt exactly: T = 1000, t = n/100. */
function pcaIcaSources(): Float64Array[] {
  const T = 1000;
  const lcg = new Float64Array(T);
  let s = 777;
  for (let i = 0; i < T; i++) {
    lcg[i] = s / 2 ** 32 - 0.5;
    s = (1664525 * s + 1013904223) % 2 ** 32;
  }
  const rows = [new Float64Array(T), new Float64Array(T), new Float64Array(T), new Float64Array(T)];
  for (let j = 0; j < T; j++) {
    const t = j / 100;
    rows[0][j] = Math.sin(2 * Math.PI * 3 * t);
    rows[1][j] = Math.sqrt(12) * lcg[j];
    rows[2][j] = Math.sign(Math.sin(2 * Math.PI * 7 * t + 0.1));
    rows[3][j] = Math.cos(2 * Math.PI * 0.5 * t) * Math.sin(2 * Math.PI * 11 * t);
  }
  return rows;
}

function mix(A: number[][], S: Float64Array[], avgRef = false): Float32Array {
  const n = A.length;
  const T = S[0].length;
  const X64 = new Float64Array(n * T);
  for (let c = 0; c < n; c++) for (let j = 0; j < A[c].length; j++) for (let t = 0; t < T; t++) X64[c * T + t] += A[c][j] * S[j][t];
  if (avgRef)
    for (let t = 0; t < T; t++) {
      let m = 0;
      for (let c = 0; c < n; c++) m += X64[c * T + t];
      for (let c = 0; c < n; c++) X64[c * T + t] -= m / n;
    }
  return Float32Array.from(X64);
}

describe('covariance, detectRank and pcaWhitening on the pca_ica.json cases (numpy eigh/SVD reference)', () => {
  const S = pcaIcaSources();
  const cases = [
    ['rank3_mixture', mix(fixture.part1_pca.rank3_mixture.A, S.slice(0, 3)), fixture.part1_pca.rank3_mixture],
    ['avgref_4ch', mix(fixture.part1_pca.avgref_4ch.A, S, true), fixture.part1_pca.avgref_4ch],
    ['full_rank_4ch_before_avgref', mix(fixture.part1_pca.avgref_4ch.A, S), fixture.part1_pca.full_rank_4ch_before_avgref],
  ] as const;
  for (const [name, X, ref] of cases) {
    it(`finds the eigenvalues and rank ${ref['rank_rule_1e-10']} of ${name}`, () => {
      const cv = covariance(X, 4, 1000);
      const pw = pcaWhitening(cv.covariance, 4);
      const top = ref.eigenvalues_eigh_desc[0];
      for (let i = 0; i < 4; i++) {
        // 1e-6 relative to λ₁: the samples are stored as Float32 (7 significant digits), numpy used float64.
        expect(Math.abs(pw.values[i] - ref.eigenvalues_eigh_desc[i])).toBeLessThan(1e-6 * top);
      }
      expect(pw.rank).toBe(ref['rank_rule_1e-10']);
      expect(pw.k).toBe(pw.rank);
      // cov(Z) = I (reference: within 3e-15 in float64; our Z is Float32, so 1e-6).
      const Z = applyWhitening(pw.whitening, pw.k, 4, cv.means, X, 1000);
      const cz = covariance(Z, pw.k, 1000);
      for (let i = 0; i < pw.k; i++)
        for (let j = 0; j < pw.k; j++) expect(Math.abs(cz.covariance[i * pw.k + j] - (i === j ? 1 : 0))).toBeLessThan(1e-6);
    });
  }
});

/** n channels from nSrc independent Gaussian sources, µV scale. */
function randomChannels(n: number, nSrc: number, T: number, seed: number): Float64Array {
  const r = createPrng(seed);
  const A = Float64Array.from({ length: n * nSrc }, () => r.normal());
  const S = Float64Array.from({ length: nSrc * T }, () => 10 * r.normal());
  const X = new Float64Array(n * T);
  for (let c = 0; c < n; c++) for (let j = 0; j < nSrc; j++) for (let t = 0; t < T; t++) X[c * T + t] += A[c * nSrc + j] * S[j * T + t];
  return X;
}

describe('rank detection on re-referenced and interpolated recordings (common practice: each loses one dimension)', () => {
  const n = 60;
  const T = 4000;
  it('gives 58 for 60 channels of which 2 are interpolated from neighbours', () => {
    const X = randomChannels(n, 80, T, 11);
    // channel 10 := mean of 8, 9, 11, 12; channel 40 := 0.5·39 + 0.3·41 + 0.2·42 (interpolation weights sum to 1)
    for (let t = 0; t < T; t++) {
      X[10 * T + t] = (X[8 * T + t] + X[9 * T + t] + X[11 * T + t] + X[12 * T + t]) / 4;
      X[40 * T + t] = 0.5 * X[39 * T + t] + 0.3 * X[41 * T + t] + 0.2 * X[42 * T + t];
    }
    const cv = covariance(Float32Array.from(X), n, T);
    const pw = pcaWhitening(cv.covariance, n);
    expect(pw.rank).toBe(58);
    expect(pw.rankReason).toMatch(/rank 58 of 60/);
  });
  it('gives 57 after an average reference on top of the two interpolated channels', () => {
    const X = randomChannels(n, 80, T, 12);
    for (let t = 0; t < T; t++) {
      X[10 * T + t] = (X[8 * T + t] + X[9 * T + t]) / 2;
      X[40 * T + t] = (X[39 * T + t] + X[41 * T + t]) / 2;
      let m = 0;
      for (let c = 0; c < n; c++) m += X[c * T + t];
      for (let c = 0; c < n; c++) X[c * T + t] -= m / n;
    }
    const pw = pcaWhitening(covariance(Float32Array.from(X), n, T).covariance, n);
    expect(pw.rank).toBe(57);
  });
  it('uses the sharp-gap rule when the reference was applied before 16-bit quantisation (LSB 0.0977 µV)', () => {
    const m = 16;
    const X = randomChannels(m, 40, T, 13);
    const lsb = 0.0977;
    for (let t = 0; t < T; t++) {
      let s = 0;
      for (let c = 0; c < m; c++) s += X[c * T + t];
      for (let c = 0; c < m; c++) X[c * T + t] = Math.round((X[c * T + t] - s / m) / lsb) * lsb;
    }
    const pw = pcaWhitening(covariance(Float32Array.from(X), m, T).covariance, m);
    // The residual eigenvalue is of the order of LSB²/12 ≈ 8e-4 µV² (docs/methods.md §6), far above 1e-10 λ₁.
    expect(pw.values[m - 1]).toBeGreaterThan(1e-10 * pw.values[0]);
    expect(pw.rank).toBe(m - 1);
    expect(pw.rankReason).toMatch(/sharp gap/);
  });
  it('warns with the discarded variance when fewer components than the rank are requested', () => {
    const X = randomChannels(8, 8, 2000, 14);
    const pw = pcaWhitening(covariance(Float32Array.from(X), 8, 2000).covariance, 8, { nComponents: 5 });
    expect(pw.k).toBe(5);
    expect(pw.warnings[0]).toMatch(/3 smallest principal components .* % of the variance/);
  });
  it('reports rank 0 for flat data and for no channels instead of failing', () => {
    expect(detectRank(new Float64Array([0, 0])).rank).toBe(0);
    expect(detectRank(new Float64Array(0)).rank).toBe(0);
  });
});
