/**
 * Spectra of the region of interest before and after cleaning over the whole recording (not only the
 * window the preview shows). By the linearity of the back-projection (docs/methods.md §7.6),
 *
 *   region_after(t) = region_before(t) − Σ_{i∈R} ā_i s_i(t) = region_before(t) − Σ_c v_c (x_c(t) − m_c),
 *   v_c = Σ_{i∈R} ā_i W[i,c],
 *
 * where ā_i is the mean of A[c,i] over the region's channels, so one pass over the samples with a single
 * weight vector v gives the cleaned region signal for any removed set R, whatever the number of
 * components. Both signals then go through Welch's method (src/core/signal/welch.ts; Welch 1967).
 */
import { regionMixing, type RegionSamples } from './region-erp.ts';
import { createWelchPlan, welchFrequencies, welchPsd, welchSegmentLength } from '../signal/welch.ts';
import type { Hz, Lenient, Seconds } from '../units.ts';

export interface WholeRegionSpectra {
  readonly frequencies: Float64Array;
  /** µV²/Hz of the region's mean signal before cleaning. */
  readonly before: Float64Array;
  /** µV²/Hz after removing the components whose weights make up `removedWeights`. */
  readonly after: Float64Array;
  /** Bin spacing. */
  readonly df: Lenient<Hz>;
  /** Signal averaged. */
  readonly durationS: Lenient<Seconds>;
}

/**
 * v_c = Σ_{i∈R} ā_i W[i,c] (length n) for the removed set R (0-based component indices): the weights that
 * turn the centred channels into the removed part of the region's mean signal. All zero for an empty set.
 */
export function removedRegionWeights(
  unmixing: Float64Array,
  mixing: Float64Array,
  nChannels: number,
  nComponents: number,
  roi: readonly number[],
  removed: Iterable<number>,
): Float64Array {
  const a = regionMixing(mixing, nChannels, nComponents, roi);
  const v = new Float64Array(nChannels);
  for (const i of removed) {
    if (!(i >= 0 && i < nComponents) || !Number.isFinite(a[i]) || a[i] === 0) continue;
    for (let c = 0; c < nChannels; c++) v[c] += a[i] * unmixing[i * nChannels + c];
  }
  return v;
}

export interface WholeRegionSpectraInput extends RegionSamples {
  /** `removedRegionWeights` for the removed set, length n. */
  readonly removedWeights: Float64Array;
  /** m, the channel means removed before unmixing (null = 0). */
  readonly channelMeans: Float64Array | null;
}

/** Welch spectra of the region's mean signal over the whole recording, before and after cleaning. */
export function wholeRegionSpectra(input: WholeRegionSpectraInput): WholeRegionSpectra {
  const { data, nSamples: N, sampleRate: fs, rows, removedWeights: v, channelMeans } = input;
  const n = rows.length;
  const roi = input.roi.filter((c) => c >= 0 && c < n && rows[c] >= 0);
  const before = new Float64Array(N);
  const after = new Float64Array(N);
  if (roi.length === 0) {
    before.fill(NaN);
    after.fill(NaN);
  }
  for (const c of roi) {
    const x = data.subarray(rows[c] * N, (rows[c] + 1) * N);
    for (let t = 0; t < N; t++) before[t] += x[t];
  }
  if (roi.length) for (let t = 0; t < N; t++) before[t] /= roi.length;
  after.set(before);
  for (let c = 0; c < n; c++) {
    const w = v[c];
    if (w === 0 || rows[c] < 0) continue;
    const m = channelMeans ? channelMeans[c] : 0;
    const x = data.subarray(rows[c] * N, (rows[c] + 1) * N);
    for (let t = 0; t < N; t++) after[t] -= w * (x[t] - m);
  }
  const nfft = welchSegmentLength(fs, N);
  const plan = createWelchPlan(nfft);
  return {
    frequencies: welchFrequencies(plan, fs),
    before: welchPsd(plan, before, fs),
    after: welchPsd(plan, after, fs),
    df: fs / nfft,
    durationS: N / fs,
  };
}
