import { describe, expect, it } from 'vitest';
import { bandPowerAt, findAlphaPeak, fitOneOverF, percentile, spectrumShares } from '../../../src/core/evidence/spectrum-shape.ts';
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
