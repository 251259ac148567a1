/**
 * Shape of a power spectrum: 1/f fit, alpha peak, and band-power shares (docs/methods.md §2–4).
 * All inputs are one-sided densities P[k] (any unit²/Hz) at frequencies f[k] Hz; band edges inclusive.
 */

export interface LineFit {
  /** Slope of log10 P on log10 f. */
  readonly slope: number;
  /** Intercept, log10 P at 1 Hz. */
  readonly intercept: number;
  readonly nBins: number;
}

/** Ordinary least squares of y on x over the entries where `use[i]` is true (closed form); NaN if < 2 points. */
function ols(x: Float64Array, y: Float64Array, use: Uint8Array): LineFit {
  let n = 0;
  let xm = 0;
  let ym = 0;
  for (let i = 0; i < x.length; i++) {
    if (!use[i]) continue;
    n++;
    xm += x[i];
    ym += y[i];
  }
  if (n < 2) return { slope: NaN, intercept: NaN, nBins: n };
  xm /= n;
  ym /= n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < x.length; i++) {
    if (!use[i]) continue;
    sxy += (x[i] - xm) * (y[i] - ym);
    sxx += (x[i] - xm) * (x[i] - xm);
  }
  const slope = sxx > 0 ? sxy / sxx : NaN;
  return { slope, intercept: ym - slope * xm, nBins: n };
}

/** Percentile with linear interpolation between order statistics (numpy's default rule). */
export function percentile(values: ArrayLike<number>, p: number): number {
  const a = Array.from(values).sort((u, v) => u - v);
  if (a.length === 0) return NaN;
  const pos = (p / 100) * (a.length - 1);
  const lo = Math.floor(pos);
  const hi = Math.min(a.length - 1, lo + 1);
  return a[lo] + (a[hi] - a[lo]) * (pos - lo);
}

export interface OneOverFResult {
  /** χ = −slope (positive for falling spectra). */
  readonly exponent: number;
  /** b = intercept, log10 power at 1 Hz. */
  readonly offset: number;
  readonly nBins: number;
  readonly nKept: number;
}

export interface OneOverFOptions {
  /** Fit range in Hz, inclusive (default 2–40 Hz, docs/methods.md §2: avoid < 2 Hz and the line band). */
  readonly rangeHz?: readonly [number, number];
  /** Bands (Hz, inclusive) left out of the fit, e.g. the line band. */
  readonly excludeHz?: readonly (readonly [number, number])[];
  /** 'robust' (two-pass rule of docs/methods.md §2, default), 'all' (plain OLS). */
  readonly rule?: 'robust' | 'all';
}

/**
 * 1/f exponent in log–log space (Donoghue et al. 2020, Nat. Neurosci. 23:1655 "fixed" model,
 * log10 P = b − χ log10 f), estimated with docs/methods.md §2's robust two-pass least squares: fit all bins;
 * keep the bins whose positive residual is at or below its 2.5th percentile (peaks stop pulling the
 * line); fit again. Bins with P ≤ 0 or non-finite are skipped.
 */
export function fitOneOverF(frequencies: ArrayLike<number>, psd: ArrayLike<number>, options: OneOverFOptions = {}): OneOverFResult {
  const [lo, hi] = options.rangeHz ?? [2, 40];
  const exclude = options.excludeHz ?? [];
  const xs: number[] = [];
  const ys: number[] = [];
  for (let k = 0; k < frequencies.length; k++) {
    const f = frequencies[k];
    if (f < lo - 1e-9 || f > hi + 1e-9 || f <= 0) continue;
    if (exclude.some(([a, b]) => f >= a - 1e-9 && f <= b + 1e-9)) continue;
    const p = psd[k];
    if (!(p > 0) || !Number.isFinite(p)) continue;
    xs.push(Math.log10(f));
    ys.push(Math.log10(p));
  }
  const x = Float64Array.from(xs);
  const y = Float64Array.from(ys);
  const all = new Uint8Array(x.length).fill(1);
  const first = ols(x, y, all);
  if (options.rule === 'all' || !Number.isFinite(first.slope))
    return { exponent: -first.slope, offset: first.intercept, nBins: x.length, nKept: first.nBins };
  const rPlus = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) rPlus[i] = Math.max(0, y[i] - (first.intercept + first.slope * x[i]));
  const threshold = percentile(rPlus, 2.5);
  const keep = new Uint8Array(x.length);
  for (let i = 0; i < x.length; i++) keep[i] = rPlus[i] <= threshold ? 1 : 0;
  const second = ols(x, y, keep);
  return { exponent: -second.slope, offset: second.intercept, nBins: x.length, nKept: second.nBins };
}

export interface AlphaPeak {
  /** Peak frequency, Hz (parabolic refinement on the flattened spectrum), or null. */
  readonly frequencyHz: number | null;
  /** Height above the 1/f fit at the peak bin, log10 units. 0 when none. */
  readonly prominence: number;
  /**
   * Quality of the 1/f fit the peak is measured against: R² = 1 − Σ r² / Σ (y − ȳ)² of log10 P about the
   * fitted line over `fitRangeHz` without the search band (the peak itself is not a misfit). 1 = perfect;
   * ≤ 0 = the line explains nothing (a flat, white spectrum). NaN with fewer than 3 bins.
   */
  readonly fitR2: number;
  /** Why there is no peak, or null when there is one. */
  readonly rejected: null | 'no fit' | 'poor fit' | 'no local maximum' | 'not prominent';
}

export interface AlphaPeakOptions {
  /** Range of the 1/f fit in Hz, over which `fitR2` is computed (default 2–40 Hz, as fitOneOverF). */
  readonly fitRangeHz?: readonly [number, number];
  /**
   * Smallest R² of the 1/f fit for which a peak above it is reported (default −0.5, ours). R² is a weak judge
   * of a nearly flat aperiodic floor — little variance is left for the line to explain, so a good fit can
   * score ≈ 0 — and our simulated alpha and mu components (χ ≈ 0.3–0.6 beneath a 2.4 log10 peak) reach only
   * −0.1…0.6 outside 7–14 Hz, brain background 0.9–1, while spurious "peaks" on line-noise components sit
   * near −0.8. Below −0.5 the line misses by more than half again the spread of log power about a constant.
   */
  readonly minFitR2?: number;
}

/** Default smallest R² of the 1/f fit for an alpha peak (ours; see AlphaPeakOptions.minFitR2). */
export const DEFAULT_MIN_FIT_R2 = -0.5;

/** R² of log10 P about the line log10 P = b − χ log10 f over [lo, hi] without `skip` (NaN if < 3 bins). */
export function oneOverFFitR2(
  frequencies: ArrayLike<number>,
  psd: ArrayLike<number>,
  fit: { exponent: number; offset: number },
  rangeHz: readonly [number, number] = [2, 40],
  skipHz: readonly [number, number] | null = null,
): number {
  const ys: number[] = [];
  const rs: number[] = [];
  for (let k = 0; k < frequencies.length; k++) {
    const f = frequencies[k];
    if (f < rangeHz[0] - 1e-9 || f > rangeHz[1] + 1e-9 || f <= 0) continue;
    if (skipHz && f >= skipHz[0] - 1e-9 && f <= skipHz[1] + 1e-9) continue;
    const p = psd[k];
    if (!(p > 0) || !Number.isFinite(p)) continue;
    const y = Math.log10(p);
    ys.push(y);
    rs.push(y - (fit.offset - fit.exponent * Math.log10(f)));
  }
  if (ys.length < 3) return NaN;
  const mean = ys.reduce((a, b) => a + b, 0) / ys.length;
  let ssTot = 0;
  let ssRes = 0;
  for (let i = 0; i < ys.length; i++) {
    ssTot += (ys[i] - mean) ** 2;
    ssRes += rs[i] ** 2;
  }
  return ssTot > 0 ? 1 - ssRes / ssTot : ssRes === 0 ? 1 : -Infinity;
}

/**
 * Alpha peak (docs/methods.md §3, after Klimesch 1999) on the flattened spectrum log10 P − (b − χ log10 f)
 * inside `searchHz` (default 7–14 Hz): the largest true local maximum — strictly higher than both its
 * neighbours, which must lie inside the band, so never a band-edge bin — at least `minProminence` log10 units
 * above the fit (default 0.1 ≈ ×1.26, docs/methods.md §3 [from memory]), refined with a parabola through the
 * peak bin and its neighbours. Dropped (null) when the 1/f fit itself is poor: R² over the fit range outside
 * the search band below `options.minFitR2` (default −0.5, ours; see AlphaPeakOptions).
 */
export function findAlphaPeak(
  frequencies: ArrayLike<number>,
  psd: ArrayLike<number>,
  fit: { exponent: number; offset: number },
  searchHz: readonly [number, number] = [7, 14],
  minProminence = 0.1,
  options: AlphaPeakOptions = {},
): AlphaPeak {
  if (!Number.isFinite(fit.exponent) || !Number.isFinite(fit.offset)) return { frequencyHz: null, prominence: 0, fitR2: NaN, rejected: 'no fit' };
  const fitR2 = oneOverFFitR2(frequencies, psd, fit, options.fitRangeHz ?? [2, 40], searchHz);
  const none = (rejected: AlphaPeak['rejected']): AlphaPeak => ({ frequencyHz: null, prominence: 0, fitR2, rejected });
  const flat = (k: number) => Math.log10(psd[k]) - (fit.offset - fit.exponent * Math.log10(frequencies[k]));
  let first = -1;
  let last = -1;
  for (let k = 0; k < frequencies.length; k++) {
    const f = frequencies[k];
    if (f < searchHz[0] - 1e-9 || f > searchHz[1] + 1e-9 || f <= 0) continue;
    if (first < 0) first = k;
    last = k;
  }
  if (first < 0) return none('no local maximum');
  let best = -1;
  let bestValue = -Infinity;
  for (let k = first + 1; k < last; k++) {
    const v = flat(k);
    if (v > flat(k - 1) && v > flat(k + 1) && v > bestValue) {
      bestValue = v;
      best = k;
    }
  }
  if (best < 0) return none('no local maximum');
  if (!(bestValue >= minProminence)) return none('not prominent');
  if (!(fitR2 >= (options.minFitR2 ?? DEFAULT_MIN_FIT_R2))) return none('poor fit');
  const ym = flat(best - 1);
  const y0 = bestValue;
  const yp = flat(best + 1);
  const denom = ym - 2 * y0 + yp;
  let delta = denom !== 0 ? (0.5 * (ym - yp)) / denom : 0;
  delta = Math.max(-0.5, Math.min(0.5, delta));
  const df = frequencies[best + 1] - frequencies[best];
  return { frequencyHz: frequencies[best] + delta * df, prominence: bestValue, fitR2, rejected: null };
}

/** Σ P[k] · df over lo ≤ f_k ≤ hi (inclusive), for frequencies on a uniform grid starting anywhere. */
export function bandPowerAt(frequencies: ArrayLike<number>, psd: ArrayLike<number>, lo: number, hi: number): number {
  if (frequencies.length < 2) return NaN;
  const df = frequencies[1] - frequencies[0];
  let sum = 0;
  for (let k = 0; k < frequencies.length; k++) {
    const f = frequencies[k];
    if (f >= lo - 1e-9 && f <= hi + 1e-9) sum += psd[k];
  }
  return sum * df;
}

export interface SpectrumShares {
  /** BP(20, hfTop) / BP(2, hfTop), hfTop = line − 2 Hz (or 45 Hz without a line frequency), capped at fmax. */
  readonly highFrequencyShare: number;
  /** Log–log OLS slope over 20 … hfTop Hz. */
  readonly highFrequencySlope: number;
  /** Σ_h BP(h f0 − 1, h f0 + 1) / BP(1, fmax). */
  readonly mainsShare: number;
  /** P(f0) / median P over f0 ± 5 Hz excluding ± 1 Hz; NaN if f0 ≥ fmax. */
  readonly linePeakRatio: number;
  /** BP(1, 4) / BP(1, 45). */
  readonly lowFrequencyShare: number;
  /** Band edges used, for exports. */
  readonly edges: { readonly hfTopHz: number; readonly fmaxHz: number };
}

/**
 * Band-power shares of docs/methods.md §4 (common practice): high-frequency share and slope (muscle-like),
 * mains share at f0 = `lineHz` and harmonics below `fmaxHz`, and the low-frequency (ocular) share.
 */
export function spectrumShares(frequencies: ArrayLike<number>, psd: ArrayLike<number>, lineHz: number | null, fmaxHz: number): SpectrumShares {
  const hfTop = Math.min(fmaxHz, lineHz ? lineHz - 2 : 45);
  const hf = bandPowerAt(frequencies, psd, 20, hfTop);
  const broad = bandPowerAt(frequencies, psd, 2, hfTop);
  const slope = fitOneOverF(frequencies, psd, { rangeHz: [20, hfTop], rule: 'all' });
  let line = 0;
  let linePeakRatio = NaN;
  if (lineHz) {
    for (let h = 1; h * lineHz < fmaxHz; h++) line += bandPowerAt(frequencies, psd, h * lineHz - 1, h * lineHz + 1);
    if (lineHz < fmaxHz) {
      const neighbours: number[] = [];
      let peak = 0;
      let peakDist = Infinity;
      for (let k = 0; k < frequencies.length; k++) {
        const d = Math.abs(frequencies[k] - lineHz);
        if (d < peakDist) {
          peakDist = d;
          peak = psd[k];
        }
        if (d <= 5 + 1e-9 && d > 1 + 1e-9) neighbours.push(psd[k]);
      }
      const med = percentile(neighbours, 50);
      linePeakRatio = med > 0 ? peak / med : NaN;
    }
  }
  const total = bandPowerAt(frequencies, psd, 1, fmaxHz);
  return {
    highFrequencyShare: broad > 0 ? hf / broad : NaN,
    highFrequencySlope: -slope.exponent,
    mainsShare: total > 0 ? line / total : NaN,
    linePeakRatio,
    lowFrequencyShare: bandPowerAt(frequencies, psd, 1, 4) / bandPowerAt(frequencies, psd, 1, Math.min(45, fmaxHz)),
    edges: { hfTopHz: hfTop, fmaxHz },
  };
}
