/**
 * Layout of stacked sensor traces: one row per channel, a shared µV-per-pixel gain, min/max decimation
 * when there are more samples than pixels, and which events fall in the window. Pure functions; the canvas
 * drawing lives in trace-draw.ts.
 */
import { matchesSelection, parseSelectionKey, type SelectableEvent } from '../../core/evidence/event-selection.ts';

/** Vertical centre (px) of each of `nRows` rows spread evenly between `top` and `bottom`. */
export function rowCentres(nRows: number, top: number, bottom: number): Float64Array {
  const out = new Float64Array(nRows);
  const step = nRows > 0 ? (bottom - top) / nRows : 0;
  for (let r = 0; r < nRows; r++) out[r] = top + (r + 0.5) * step;
  return out;
}

/**
 * A readable gain in µV per row spacing: the 95th percentile over rows of each row's robust spread
 * (1.4826 · median absolute deviation, the normal-consistent MAD, common practice) times 6, i.e. about ±3
 * robust SD fills one row. Rows are channel-major with `length` samples. Returns 1 for empty/flat data.
 */
export function robustRowSpan(data: ArrayLike<number>, nRows: number, length: number): number {
  const spreads: number[] = [];
  const buf = new Float64Array(length);
  for (let r = 0; r < nRows; r++) {
    let n = 0;
    for (let t = 0; t < length; t++) {
      const v = data[r * length + t];
      if (Number.isFinite(v)) buf[n++] = v;
    }
    if (n === 0) continue;
    const vals = buf.subarray(0, n).slice().sort();
    const med = median(vals);
    for (let i = 0; i < n; i++) vals[i] = Math.abs(vals[i] - med);
    vals.sort();
    const mad = 1.4826 * median(vals);
    if (mad > 0) spreads.push(mad);
  }
  if (spreads.length === 0) return 1;
  spreads.sort((a, b) => a - b);
  return 6 * spreads[Math.min(spreads.length - 1, Math.floor(0.95 * (spreads.length - 1) + 0.5))];
}

/**
 * A row span (µV per row spacing) that lets a trace's events show: 2.4 × the 99.5th percentile of
 * |x − median|, so the rare large deflections that make a component (a blink, a heartbeat) reach about 5/6
 * of the half-row at that percentile, their peaks near the row's edge, instead of crossing into the rows
 * beside it; on Gaussian noise it is 2.4 × 2.807 σ = 6.7 σ, close to the ±3 robust SD of `robustRowSpan`
 * (the 99.5th percentile of |N(0, 1)| is 2.807, a standard normal table). Ours; docs/methods.md §18.
 * Returns 1 for empty/flat data.
 */
export const PEAK_SPAN_FACTOR = 2.4;

export function peakRowSpan(data: ArrayLike<number>, length: number, offset = 0): number {
  const vals: number[] = [];
  for (let t = 0; t < length; t++) {
    const v = data[offset + t];
    if (Number.isFinite(v)) vals.push(v);
  }
  if (vals.length === 0) return 1;
  const sorted = Float64Array.from(vals).sort();
  const med = median(sorted);
  for (let i = 0; i < sorted.length; i++) sorted[i] = Math.abs(sorted[i] - med);
  sorted.sort();
  const q = sorted[Math.min(sorted.length - 1, Math.floor(0.995 * (sorted.length - 1) + 0.5))];
  return q > 0 ? PEAK_SPAN_FACTOR * q : 1;
}

const STEPS_125 = [1, 2, 5];

/** The smallest value of the 1-2-5 sequence (…, 0.5, 1, 2, 5, 10, 20, …) at or above `v` (> 0); 1 otherwise. */
export function niceScaleAbove(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  let e = Math.floor(Math.log10(v));
  for (let guard = 0; guard < 3; guard++, e++) {
    for (const m of STEPS_125) {
      const c = m * 10 ** e;
      if (c >= v * (1 - 1e-9)) return +c.toPrecision(3);
    }
  }
  return +(10 ** (e + 1)).toPrecision(3);
}

/** The largest value of the 1-2-5 sequence at or below `v` (> 0): the length of a scale bar that fits. */
export function niceScaleBelow(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  const above = niceScaleAbove(v);
  return above <= v * (1 + 1e-9) ? above : stepScale(above, -1);
}

/** The value of the 1-2-5 sequence nearest to `v` on a log scale (110 → 100, 160 → 200). */
export function niceScaleNearest(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  const lo = niceScaleBelow(v);
  const hi = niceScaleAbove(v);
  return Math.log(v / lo) <= Math.log(hi / v) ? lo : hi;
}

/** One step along the 1-2-5 sequence from `v` (itself on it): up (+1) or down (−1). */
export function stepScale(v: number, dir: 1 | -1): number {
  const e = Math.floor(Math.log10(v) + 1e-9);
  const m = Math.round(v / 10 ** e);
  const i = STEPS_125.indexOf(m);
  if (i < 0) return niceScaleAbove(v);
  const j = i + dir;
  if (j < 0) return +(5 * 10 ** (e - 1)).toPrecision(3);
  if (j >= STEPS_125.length) return +(10 ** (e + 1)).toPrecision(3);
  return +(STEPS_125[j] * 10 ** e).toPrecision(3);
}

/** A scale value with its unit for labels: "50 µV", "0.5 µV", "2000 µV". */
export function formatScale(v: number, unit = 'µV'): string {
  return `${+v.toPrecision(3)}\u00a0${unit}`;
}

function median(sorted: Float64Array): number {
  const n = sorted.length;
  return n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
}

/**
 * Min/max decimation of samples [start, end) of `x` into `nColumns` pixel columns: column j covers samples
 * start + floor(j·L/nColumns) … start + floor((j+1)·L/nColumns) − 1. Drawing a vertical line from min to max
 * per column shows every peak that a plain subsample would miss. NaN-only columns give NaN.
 */
export function minMaxColumns(
  x: ArrayLike<number>,
  start: number,
  end: number,
  nColumns: number,
  outMin = new Float64Array(nColumns),
  outMax = new Float64Array(nColumns),
): { min: Float64Array; max: Float64Array } {
  const L = Math.max(0, end - start);
  for (let j = 0; j < nColumns; j++) {
    const a = start + Math.floor((j * L) / nColumns);
    const b = Math.max(a + 1, start + Math.floor(((j + 1) * L) / nColumns));
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = a; i < b && i < end; i++) {
      const v = x[i];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    outMin[j] = lo === Infinity ? NaN : lo;
    outMax[j] = hi === -Infinity ? NaN : hi;
  }
  return { min: outMin, max: outMax };
}

export interface WindowEvent {
  readonly onset: number;
  readonly label: string;
}

/** Events whose onset (s) lies in [t0, t1), in time order. */
export function eventsInWindow(events: readonly WindowEvent[], t0: number, t1: number): WindowEvent[] {
  return events.filter((e) => e.onset >= t0 && e.onset < t1).sort((a, b) => a.onset - b.onset);
}

/**
 * Clamps a window start (s) so [start, start + lengthS] stays inside a recording of `durationS` seconds;
 * a window longer than the recording starts at 0.
 */
export function clampWindowStart(startS: number, lengthS: number, durationS: number): number {
  if (!(lengthS < durationS)) return 0;
  return Math.min(Math.max(0, startS), durationS - lengthS);
}

/**
 * Events shown as markers: all (null), none (empty set), or those matching one of the selections in `shown`
 * (event-selection.ts selectionKey: a trial_type, optionally with column = value filters).
 * Boundaries of discontinuous files are never drawn as events.
 */
export function markerEvents<E extends SelectableEvent>(events: readonly E[], shown: ReadonlySet<string> | null): E[] {
  const selections = shown === null ? null : [...shown].map(parseSelectionKey);
  return events.filter((e) => e.source !== 'boundary' && (selections === null || selections.some((sel) => matchesSelection(e, sel))));
}
