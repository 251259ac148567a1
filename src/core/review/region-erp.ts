/**
 * Region ERP before and after cleaning, by linearity (docs/methods.md §7.6, common practice): the ERP of
 * the cleaned data at a region of interest equals the ERP before minus Σ_{i∈R} ā_i · ERP(s_i), where ā_i
 * is the mean of A[c,i] over the region's channels (averaging, baseline removal and the projection are all
 * linear). The live window toggling is preview-projection.ts.
 */
import { epochMean, extractEpochs } from '../signal/epochs.ts';
import type { Hz, Lenient, Seconds } from '../units.ts';

/**
 * Mean of A[c,i] over the region's channels for every component i: ā (length k). `roiRows` are
 * decomposition channel indices; an empty region gives NaN (there is nothing to average).
 */
export function regionMixing(mixing: Float64Array, nChannels: number, nComponents: number, roiRows: readonly number[]): Float64Array {
  const out = new Float64Array(nComponents);
  const rows = roiRows.filter((r) => r >= 0 && r < nChannels);
  if (rows.length === 0) return out.fill(NaN);
  for (const r of rows) for (let i = 0; i < nComponents; i++) out[i] += mixing[r * nComponents + i];
  for (let i = 0; i < nComponents; i++) out[i] /= rows.length;
  return out;
}

/**
 * The region's ERP after removing `removedSet`: before − Σ_{i∈R} ā_i · componentErps[i] (see the module
 * comment). `componentErps` is k × L row-major (the ERP of each activation, same epochs and baseline).
 */
export function regionErpAfter(
  erpBefore: Float64Array,
  componentErps: Float64Array,
  regionWeights: Float64Array,
  removedSet: ReadonlySet<number>,
  out = new Float64Array(erpBefore.length),
): Float64Array {
  const L = erpBefore.length;
  out.set(erpBefore);
  for (const i of removedSet) {
    const a = regionWeights[i];
    if (!(i >= 0 && i < regionWeights.length) || a === 0) continue;
    for (let t = 0; t < L; t++) out[t] -= a * componentErps[i * L + t];
  }
  return out;
}

/** What the region ERP before/after needs, computed once per recording, decomposition, region and event. */
export interface RegionErpPlan {
  /** Seconds relative to the event, per sample of the average. */
  readonly times: Float64Array;
  readonly nEpochs: number;
  /** Baseline-corrected average of the region's mean signal before cleaning (µV). */
  readonly before: Float64Array;
  /** k × L: baseline-corrected average of each activation, Σ_c W[i,c] · ERP_c (the means drop out in the baseline). */
  readonly componentErps: Float64Array;
  /** ā_i, the mean of A[c,i] over the region's channels. */
  readonly regionWeights: Float64Array;
}

/** The recording's samples and a region of interest in decomposition channel terms (what region measures read). */
export interface RegionSamples {
  /** Channel-major samples of the recording's signal block (µV), `nSamples` per row. */
  readonly data: Float32Array;
  readonly nSamples: number;
  readonly sampleRate: Lenient<Hz>;
  /** rows[c]: the recording row of decomposition channel c (−1 when absent). */
  readonly rows: ArrayLike<number>;
  /** Decomposition channel indices of the region. */
  readonly roi: readonly number[];
}

/** Inputs of `regionErpPlan`. */
export interface RegionErpPlanInput extends RegionSamples {
  /** k × n, components × decomposition channels. */
  readonly unmixing: Float64Array;
  /** n × k, decomposition channels × components. */
  readonly mixing: Float64Array;
  readonly nComponents: number;
  /** Event onsets, seconds from the first sample. */
  readonly onsetsS: readonly Lenient<Seconds>[];
  /** Epoch window [tmin, tmax] in seconds around each onset; default [−0.2, 0.8]; baseline [tmin, 0]. */
  readonly windowS?: readonly [Lenient<Seconds>, Lenient<Seconds>];
}

/**
 * Epochs every decomposition channel around the onsets (docs/methods.md §5, baseline [tmin, 0]), averages
 * them, and derives the region's ERP and each component's ERP by linearity. Returns null when no epoch fits.
 */
export function regionErpPlan(input: RegionErpPlanInput): RegionErpPlan | null {
  const { data, nSamples, sampleRate, rows, roi, unmixing, mixing, nComponents, onsetsS } = input;
  const [tminS, tmaxS] = input.windowS ?? [-0.2, 0.8];
  const n = rows.length;
  const k = nComponents;
  let times: Float64Array | null = null;
  let L = 0;
  let nEpochs = 0;
  let channelErps: Float64Array<ArrayBuffer> | null = null;
  for (let c = 0; c < n; c++) {
    if (rows[c] < 0) continue;
    const x = data.subarray(rows[c] * nSamples, (rows[c] + 1) * nSamples);
    const ep = extractEpochs(x, sampleRate, onsetsS, tminS, tmaxS);
    if (ep.nEpochs === 0) return null;
    if (!channelErps) {
      times = ep.times;
      L = ep.length;
      nEpochs = ep.nEpochs;
      channelErps = new Float64Array(n * L);
    }
    epochMean(ep.epochs, ep.nEpochs, ep.length, channelErps.subarray(c * L, (c + 1) * L));
  }
  if (!channelErps || !times) return null;
  const componentErps = new Float64Array(k * L);
  for (let i = 0; i < k; i++) {
    for (let c = 0; c < n; c++) {
      const w = unmixing[i * n + c];
      if (w === 0) continue;
      for (let t = 0; t < L; t++) componentErps[i * L + t] += w * channelErps[c * L + t];
    }
  }
  const roiRows = roi.filter((c) => c >= 0 && c < n && rows[c] >= 0);
  const before = new Float64Array(L);
  for (const c of roiRows) for (let t = 0; t < L; t++) before[t] += channelErps[c * L + t] / roiRows.length;
  if (roiRows.length === 0) before.fill(NaN);
  return { times, nEpochs, before, componentErps, regionWeights: regionMixing(mixing, n, k, roiRows) };
}

/** Mean over `roi` channels of a channel-major n × L buffer (the region's signal), NaN when empty. */
export function regionMean(values: ArrayLike<number>, length: number, roi: readonly number[], out = new Float64Array(length)): Float64Array {
  out.fill(0);
  if (roi.length === 0) return out.fill(NaN);
  for (const c of roi) for (let t = 0; t < length; t++) out[t] += values[c * length + t];
  for (let t = 0; t < length; t++) out[t] /= roi.length;
  return out;
}
