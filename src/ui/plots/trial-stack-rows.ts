/**
 * Row order, smoothing and colour limits of an trial stack (trials × time, docs/methods.md §5; the sorted,
 * vertically smoothed display follows Jung et al. 2001, Hum. Brain Mapp. 14:166–185). The arithmetic is
 * the evidence core's (src/core/signal/epochs.ts); this file only chooses what to call.
 */
import { reorderEpochRows, smoothEpochRows, sortOrderByKey } from '../../core/signal/epochs.ts';

/** How the trials are ordered top to bottom. */
export type EpochSort = 'order' | 'response-time' | 'amplitude';

export interface TrialStackInput {
  readonly nEpochs: number;
  readonly length: number;
  /** nEpochs × length, row-major, event order. */
  readonly data: Float32Array | Float64Array;
  /** Seconds relative to the event, per column. */
  readonly times: Float64Array;
  /** Response time (s) per epoch, or null. */
  readonly responseTimes: Float64Array | null;
}

export interface TrialStackRows {
  /** Sorted, smoothed rows (nEpochs × length). */
  readonly rows: Float64Array;
  /** Event-order index of each displayed row. */
  readonly order: number[];
  /** The sort key of each displayed row (response time in s, or mean amplitude), NaN for 'order'. */
  readonly keys: Float64Array;
  /** Whether the requested sort could be applied ('response-time' without response times falls back). */
  readonly sortApplied: EpochSort;
}

/** Per-row mean over columns whose time lies in [t0S, t1S]; NaN when the window holds no column. */
export function rowWindowMeans(input: TrialStackInput, t0S: number, t1S: number): Float64Array {
  const { nEpochs, length, data, times } = input;
  const out = new Float64Array(nEpochs);
  const cols: number[] = [];
  for (let j = 0; j < length; j++) if (times[j] >= t0S - 1e-12 && times[j] <= t1S + 1e-12) cols.push(j);
  for (let r = 0; r < nEpochs; r++) {
    let s = 0;
    for (const j of cols) s += data[r * length + j];
    out[r] = cols.length ? s / cols.length : NaN;
  }
  return out;
}

/**
 * Orders and smooths the rows: `sort` chooses the key (event order, response time ascending, or mean
 * amplitude in `amplitudeWindowS` ascending); `smoothing` is the width of the centred moving average over
 * trials (1 = none). Sorting comes first so smoothing mixes neighbours in the displayed order.
 */
export function trialStackRows(
  input: TrialStackInput,
  sort: EpochSort,
  smoothing: number,
  amplitudeWindowS: readonly [number, number] = [0, 0.5],
): TrialStackRows {
  const n = input.nEpochs;
  let keys: Float64Array = new Float64Array(n).fill(NaN);
  let applied: EpochSort = sort;
  if (sort === 'response-time' && input.responseTimes && input.responseTimes.length === n) keys = input.responseTimes;
  else if (sort === 'amplitude') keys = rowWindowMeans(input, amplitudeWindowS[0], amplitudeWindowS[1]);
  else applied = 'order';
  const order = applied === 'order' ? Array.from({ length: n }, (_, i) => i) : sortOrderByKey(keys);
  const sorted = reorderEpochRows(input.data, input.length, order);
  const rows = smoothing > 1 ? smoothEpochRows(sorted, n, input.length, smoothing) : sorted;
  const sortedKeys = Float64Array.from(order, (i) => keys[i]);
  return { rows, order, keys: sortedKeys, sortApplied: applied };
}

/**
 * Colour limit for an trial stack: the `q` quantile of |value| (default 0.98), so a few extreme trials
 * do not wash the picture out. NaN skipped; 1 when nothing finite and non-zero.
 */
export function robustLimit(values: ArrayLike<number>, q = 0.98): number {
  const abs: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const v = Math.abs(values[i]);
    if (Number.isFinite(v)) abs.push(v);
  }
  if (abs.length === 0) return 1;
  abs.sort((a, b) => a - b);
  const pos = q * (abs.length - 1);
  const lo = Math.floor(pos);
  const hi = Math.min(abs.length - 1, lo + 1);
  const v = abs[lo] + (pos - lo) * (abs[hi] - abs[lo]);
  return v > 0 ? v : abs[abs.length - 1] > 0 ? abs[abs.length - 1] : 1;
}
