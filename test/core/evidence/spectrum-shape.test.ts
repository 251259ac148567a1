import { describe, expect, it } from 'vitest';
import { bandPowerAt, DEFAULT_MIN_FIT_R2, findAlphaPeak, fitOneOverF, oneOverFFitR2, percentile, spectrumShares } from '../../../src/core/evidence/spectrum-shape.ts';
// Synthetic Donoghue-style spectrum and numpy.polyfit / closed-form fits by test/fixtures/evidence/one_over_f_alpha.py.
import fixture from '../../fixtures/evidence/one_over_f_alpha.json';

function grid(): Float64Array {
  const f = new Float64Array(89);
  for (let i = 0; i < 89; i++) f[i] = 1 + 0.5 * i;
  return f;
}

function modelSpectrum(f: Float64Array, peaks: number[][]): Float64Array {
  const { b, chi } = fixture.model;
  return f.map((x) => {
    let lp = b - chi * Math.log10(x);
    for (const [a, c, w] of peaks) lp += a * Math.exp(-((x - c) ** 2) / (2 * w * w));
    return 10 ** lp;
  });
}

describe('fitOneOverF', () => {
  const f = grid();
  const p = modelSpectrum(f, fixture.model.peaks_a_c_w);

  it('recovers χ = 1.8 and b = 1.5 exactly from a pure power law', () => {
    const fit = fitOneOverF(f, modelSpectrum(f, []));
    expect(fit.exponent).toBeCloseTo(1.8, 12);
    expect(fit.offset).toBeCloseTo(1.5, 12);
  });

  it('matches numpy.polyfit on all bins of the peaked spectrum (one_over_f_alpha.json)', () => {
    const fit = fitOneOverF(f, p, { rule: 'all' });
    expect(fit.exponent).toBeCloseTo(fixture.one_over_f_A_polyfit.fit_all.chi, 10);
    expect(fit.offset).toBeCloseTo(fixture.one_over_f_A_polyfit.fit_all.b, 10);
  });

  it('matches the band-excluded fit when 7–14 and 15–30 Hz are left out', () => {
    const fit = fitOneOverF(f, p, { rule: 'all', excludeHz: [[7, 14], [15, 30]] });
    expect(fit.exponent).toBeCloseTo(fixture.one_over_f_A_polyfit.fit_excl.chi, 10);
  });

  it('matches the robust two-pass fit, keeping 53 of 77 bins (docs/methods.md §2)', () => {
    const fit = fitOneOverF(f, p);
    expect(fit.exponent).toBeCloseTo(fixture.one_over_f_A_polyfit.fit_robust.chi, 10);
    expect(fit.offset).toBeCloseTo(fixture.one_over_f_A_polyfit.fit_robust.b, 10);
    expect(fit.nKept).toBe(fixture.one_over_f_A_polyfit.fit_robust.n_kept);
    expect(fit.nBins).toBe(fixture.one_over_f_A_polyfit.fit_robust.n_range);
  });

  it('computes percentiles with numpy’s linear interpolation', () => {
    expect(percentile([1, 2, 3, 4], 50)).toBe(2.5);
    expect(percentile([0, 10], 2.5)).toBeCloseTo(0.25, 12);
  });
});

describe('findAlphaPeak', () => {
  const f = grid();
  const p = modelSpectrum(f, fixture.model.peaks_a_c_w);

  it('finds 10.3038 Hz on the flattened spectrum (true centre 10.3; one_over_f_alpha.json)', () => {
    const fit = fitOneOverF(f, p);
    const peak = findAlphaPeak(f, p, fit);
    expect(peak.frequencyHz).toBeCloseTo(fixture.alpha.flattened_parabolic_Hz, 8);
    expect(peak.prominence).toBeGreaterThan(0.5);
  });

  it('reports no alpha peak for a pure power law', () => {
    const pure = modelSpectrum(f, []);
    expect(findAlphaPeak(f, pure, fitOneOverF(f, pure)).frequencyHz).toBeNull();
  });

  it('reports the fit quality: R² = 1 for the exact power law, high for the fixture spectrum outside 7–14 Hz', () => {
    const pure = modelSpectrum(f, []);
    const exact = findAlphaPeak(f, pure, fitOneOverF(f, pure));
    expect(exact.fitR2).toBeCloseTo(1, 12); // residuals are zero by construction
    expect(exact.rejected).toBe('not prominent');
    const peak = findAlphaPeak(f, p, fitOneOverF(f, p));
    expect(peak.rejected).toBeNull();
    expect(peak.fitR2).toBeGreaterThan(0.8); // the fixture's beta bump (15–30 Hz) is the only misfit left
    expect(peak.fitR2).toBeCloseTo(oneOverFFitR2(f, p, fitOneOverF(f, p), [2, 40], [7, 14]), 12);
  });

  it('needs a true local maximum: a spectrum rising through the band (maximum on the band edge) has no peak', () => {
    // Flattened spectrum rising linearly from 0 to 1 log10 across 7–14 Hz: the largest bin is the band edge,
    // no bin is above both neighbours (ours: the rule of findAlphaPeak).
    const fit = { exponent: 1.8, offset: 1.5 };
    const rising = f.map((x) => 10 ** (1.5 - 1.8 * Math.log10(x) + (x >= 7 && x <= 14 ? (x - 7) / 7 : x > 14 ? 1 : 0)));
    const r = findAlphaPeak(f, rising, fit);
    expect(r).toMatchObject({ frequencyHz: null, rejected: 'no local maximum' });
    // A real bump in the middle beats a higher band edge: the interior local maximum is reported.
    const bumpAndEdge = f.map((x) => 10 ** (1.5 - 1.8 * Math.log10(x) + 0.5 * Math.exp(-((x - 10) ** 2) / 0.5) + (x > 13.75 && x <= 14 ? 1 : 0))); // only the edge bin (14 Hz) is higher
    expect(findAlphaPeak(f, bumpAndEdge, fit).frequencyHz).toBeCloseTo(10, 1);
  });

  it('drops a prominent peak when the 1/f line fits the rest of the spectrum poorly (R² < −0.5, ours)', () => {
    // A flat spectrum with a zig-zag of ±0.5 log10 outside the band and a 0.3 log10 bump at 10 Hz, measured
    // against a steep line that does not describe it.
    const fit = { exponent: 1, offset: 0.5 };
    const zig = f.map((x, i) => 10 ** (0.5 - Math.log10(x) * (x >= 7 && x <= 14 ? 1 : 0) + (x >= 7 && x <= 14 ? 0.3 * Math.exp(-((x - 10) ** 2) / 0.5) : i % 2 ? 0.5 : -0.5)));
    const r = findAlphaPeak(f, zig, fit);
    expect(r.fitR2).toBeLessThan(DEFAULT_MIN_FIT_R2);
    expect(r).toMatchObject({ frequencyHz: null, prominence: 0, rejected: 'poor fit' });
    // The same peak is reported when the caller accepts any fit.
    expect(findAlphaPeak(f, zig, fit, [7, 14], 0.1, { minFitR2: -Infinity }).frequencyHz).toBeCloseTo(10, 1);
  });
});

describe('spectrumShares', () => {
  it('puts all power of a 50 Hz line in the line share and ~0 elsewhere', () => {
    const f = grid().map((x) => x + 20); // 21 … 65 Hz
    const p = f.map((x) => (Math.abs(x - 50) < 0.1 ? 100 : 1e-6));
    const s = spectrumShares(f, p, 50, 65);
    expect(s.mainsShare).toBeGreaterThan(0.99);
    expect(s.linePeakRatio).toBeGreaterThan(1e6);
  });

  it('gives a flat spectrum a high-frequency share of (48 − 20)/(48 − 2) by bin count and slope 0', () => {
    const f = new Float64Array(201).map((_, i) => i * 0.5);
    const p = new Float64Array(201).fill(1);
    const s = spectrumShares(f, p, 50, 100);
    // inclusive bins: 20…48 Hz = 57 bins; 2…48 Hz = 93 bins
    expect(s.highFrequencyShare).toBeCloseTo(57 / 93, 12);
    expect(s.highFrequencySlope).toBeCloseTo(0, 12);
    expect(bandPowerAt(f, p, 1, 4)).toBeCloseTo(7 * 0.5, 12);
  });
});
