/**
 * Event-locked epochs, their average and standard error, and the rows of an trial stack (trials × time),
 * following docs/methods.md §5 (common practice): event sample e = round(onset · fs); window offsets
 * round(tmin · fs) … round(tmax · fs) inclusive; epochs that run past either end are dropped; baseline =
 * mean over offsets round(b0 · fs) … round(b1 · fs) subtracted per epoch; SEM = std(ddof 1) / √n.
 * One rounding rule everywhere: half away from zero, after adding 1e-9 to the magnitude so that
 * onset · fs landing a hair below .5 still rounds up.
 */
import type { Hz, Lenient, Seconds } from '../units.ts';

/** Round half away from zero with the 1e-9 guard of docs/methods.md §5. */
export function roundHalfAway(v: number): number {
  return Math.sign(v) * Math.floor(Math.abs(v) + 0.5 + 1e-9);
}

export interface Epochs {
  /** nEpochs × length, row-major, in the unit of the input (baseline removed when asked). */
  readonly epochs: Float64Array;
  readonly nEpochs: number;
  /** Samples per epoch. */
  readonly length: number;
  /** Index into `onsetsS` of each kept epoch, in row order. */
  readonly kept: number[];
  /** Time of each column relative to the event, in s. */
  readonly times: Float64Array;
  /** First offset (samples from the event) of the window. */
  readonly firstOffset: number;
  /** Event sample of each kept epoch. */
  readonly eventSamples: number[];
}

/**
 * Cuts `x` (one channel or one component activation, sampled at `fs` Hz) into epochs around
 * `onsetsS` (s from the first sample). `baseline` defaults to [tminS, 0]; pass null for none.
 * A baseline range outside the window is clipped to it; an empty one subtracts nothing.
 */
export function extractEpochs(
  x: Float32Array | Float64Array,
  fs: Lenient<Hz>,
  onsetsS: readonly Lenient<Seconds>[],
  tminS: Lenient<Seconds>,
  tmaxS: Lenient<Seconds>,
  baseline: readonly [Lenient<Seconds>, Lenient<Seconds>] | null = [tminS, 0],
): Epochs {
  const o0 = roundHalfAway(tminS * fs);
  const o1 = roundHalfAway(tmaxS * fs);
  const length = Math.max(0, o1 - o0 + 1);
  const times = new Float64Array(length);
  for (let j = 0; j < length; j++) times[j] = (o0 + j) / fs;
  const kept: number[] = [];
  const eventSamples: number[] = [];
  const n = x.length;
  if (length > 0) {
    for (let i = 0; i < onsetsS.length; i++) {
      const onset = onsetsS[i];
      if (!Number.isFinite(onset)) continue;
      const e = roundHalfAway(onset * fs);
      if (e + o0 < 0 || e + o1 > n - 1) continue;
      kept.push(i);
      eventSamples.push(e);
    }
  }
  const nEpochs = kept.length;
  const epochs = new Float64Array(nEpochs * length);
  let b0 = 0;
  let b1 = -1;
  if (baseline) {
    b0 = Math.max(roundHalfAway(baseline[0] * fs), o0) - o0;
    b1 = Math.min(roundHalfAway(baseline[1] * fs), o1) - o0;
  }
  for (let r = 0; r < nEpochs; r++) {
    const start = eventSamples[r] + o0;
    const row = r * length;
    for (let j = 0; j < length; j++) epochs[row + j] = x[start + j];
    if (b1 >= b0) {
      let mean = 0;
      for (let j = b0; j <= b1; j++) mean += epochs[row + j];
      mean /= b1 - b0 + 1;
      for (let j = 0; j < length; j++) epochs[row + j] -= mean;
    }
  }
  return { epochs, nEpochs, length, kept, times, firstOffset: o0, eventSamples };
}

/** Column means of an nEpochs × length matrix (the event-locked average); NaN columns when nEpochs = 0. */
export function epochMean(epochs: Float64Array, nEpochs: number, length: number, out = new Float64Array(length)): Float64Array {
  out.fill(0);
  for (let r = 0; r < nEpochs; r++) {
    const row = r * length;
    for (let j = 0; j < length; j++) out[j] += epochs[row + j];
  }
  for (let j = 0; j < length; j++) out[j] /= nEpochs;
  return out;
}

/** Standard error of the column means, std(ddof = 1) / √nEpochs; NaN when nEpochs < 2. */
export function epochSem(epochs: Float64Array, nEpochs: number, length: number, out = new Float64Array(length)): Float64Array {
  const mean = epochMean(epochs, nEpochs, length);
  out.fill(0);
  for (let r = 0; r < nEpochs; r++) {
    const row = r * length;
    for (let j = 0; j < length; j++) {
      const d = epochs[row + j] - mean[j];
      out[j] += d * d;
    }
  }
  for (let j = 0; j < length; j++) out[j] = nEpochs < 2 ? NaN : Math.sqrt(out[j] / (nEpochs - 1)) / Math.sqrt(nEpochs);
  return out;
}

/**
 * Centred moving average over `width` rows (trials) of an trial stack; at the edges only the available
 * rows are averaged (docs/methods.md §5; Jung et al. 2001, Hum. Brain Mapp. 14:166–185 for the display).
 * An even width w averages rows r − w/2 … r + w/2 − 1. Width ≤ 1 copies.
 */
export function smoothEpochRows(epochs: Float64Array | Float32Array, nEpochs: number, length: number, width: number): Float64Array {
  const out = new Float64Array(nEpochs * length);
  const w = Math.max(1, Math.floor(width));
  const before = Math.floor(w / 2);
  const after = w - 1 - before;
  // running sum over rows: O(nEpochs · length) whatever the width
  const acc = new Float64Array(length);
  let lo = 0;
  let hi = -1;
  for (let r = 0; r < nEpochs; r++) {
    const want0 = Math.max(0, r - before);
    const want1 = Math.min(nEpochs - 1, r + after);
    while (hi < want1) {
      hi++;
      for (let j = 0; j < length; j++) acc[j] += epochs[hi * length + j];
    }
    while (lo < want0) {
      for (let j = 0; j < length; j++) acc[j] -= epochs[lo * length + j];
      lo++;
    }
    const count = hi - lo + 1;
    for (let j = 0; j < length; j++) out[r * length + j] = acc[j] / count;
  }
  return out;
}

/** Row order that sorts epochs by a per-epoch key (ascending; NaN keys last, ties keep event order). */
export function sortOrderByKey(keys: ArrayLike<number>): number[] {
  const order = Array.from({ length: keys.length }, (_, i) => i);
  order.sort((a, b) => {
    const ka = keys[a];
    const kb = keys[b];
    const na = Number.isNaN(ka);
    const nb = Number.isNaN(kb);
    if (na || nb) return na === nb ? a - b : na ? 1 : -1;
    return ka - kb || a - b;
  });
  return order;
}

/** Per-epoch mean amplitude over the columns whose time lies in [t0S, t1S] (a key for sorting). */
export function epochWindowMeans(ep: Epochs, t0S: Seconds, t1S: Seconds): Float64Array {
  const out = new Float64Array(ep.nEpochs);
  let count = 0;
  for (let j = 0; j < ep.length; j++) if (ep.times[j] >= t0S - 1e-12 && ep.times[j] <= t1S + 1e-12) count++;
  for (let r = 0; r < ep.nEpochs; r++) {
    let sum = 0;
    for (let j = 0; j < ep.length; j++) if (ep.times[j] >= t0S - 1e-12 && ep.times[j] <= t1S + 1e-12) sum += ep.epochs[r * ep.length + j];
    out[r] = count > 0 ? sum / count : NaN;
  }
  return out;
}

/**
 * For each kept epoch, the latency (s) from its event to the first `otherOnsetsS` onset after it (within
 * `maxS`), NaN when there is none; used to sort an trial stack by another event's latency (e.g. a response).
 */
export function latencyToNextEvent(
  eventOnsetsS: readonly Lenient<Seconds>[],
  kept: readonly number[],
  otherOnsetsS: readonly Lenient<Seconds>[],
  maxS: Lenient<Seconds> = Infinity,
): Float64Array {
  const other = [...otherOnsetsS].filter(Number.isFinite).sort((a, b) => a - b);
  const out = new Float64Array(kept.length);
  for (let r = 0; r < kept.length; r++) {
    const t = eventOnsetsS[kept[r]];
    // binary search for the first onset > t
    let lo = 0;
    let hi = other.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (other[mid] <= t) lo = mid + 1;
      else hi = mid;
    }
    out[r] = lo < other.length && other[lo] - t <= maxS ? other[lo] - t : NaN;
  }
  return out;
}

/** Copies the rows of an epoch matrix into `order`'s sequence. */
export function reorderEpochRows(epochs: Float64Array | Float32Array, length: number, order: readonly number[]): Float64Array {
  const out = new Float64Array(order.length * length);
  for (let r = 0; r < order.length; r++) {
    const src = order[r] * length;
    for (let j = 0; j < length; j++) out[r * length + j] = epochs[src + j];
  }
  return out;
}
