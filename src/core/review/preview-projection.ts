/**
 * Incremental back-projection for the live before/after preview (docs/methods.md §7.6, common practice):
 *
 *   X_clean = X − A[:,R] S[R,:],   S = W (X − m)
 *
 * For a window of L samples the activations S_w = W (X_w − m) are computed once (k × L). Removing
 * component i then subtracts the rank-one term a_i s_i (n × L) from the cleaned window and keeping it
 * again adds the term back, so a verdict toggle costs n·L multiply-adds instead of a full recomputation.
 * The cleaned window is held in Float64 so that a long series of toggles does not drift visibly; when the
 * removed set becomes empty the window is reset to the original exactly.
 *
 * Event-locked averages before and after at a region of interest, by the same linearity: region-erp.ts.
 */
import { multiplyChannelMajor } from '../linalg/matmul.ts';

/** A window of the recording in decomposition channel order, with its activations and cleaned copy. */
export interface PreviewWindow {
  readonly nChannels: number;
  readonly nComponents: number;
  /** Samples per channel in the window. */
  readonly length: number;
  /** X_w, channel-major n × L (µV). Never written. */
  readonly original: Float32Array;
  /** S_w = W (X_w − m), component-major k × L (arbitrary units). */
  readonly activations: Float64Array;
  /** X_w − A[:,R] S_w[R,:] for the current removed set R, channel-major n × L (µV). */
  readonly cleaned: Float64Array;
  /** 1 where component i (0-based) is currently subtracted from `cleaned`. */
  readonly removed: Uint8Array;
}

/**
 * Copies samples [start, end) of the recording rows `rows` (recording channel index for each decomposition
 * channel, in decomposition order) into a channel-major n × (end − start) window. Samples outside the
 * recording are 0 (the caller clamps the window; this only keeps the function total).
 */
export function extractWindow(
  data: Float32Array,
  nSamples: number,
  rows: ArrayLike<number>,
  start: number,
  end: number,
  out = new Float32Array(rows.length * Math.max(0, end - start)),
): Float32Array {
  const L = Math.max(0, end - start);
  for (let c = 0; c < rows.length; c++) {
    const dst = c * L;
    const src = rows[c] * nSamples;
    for (let t = 0; t < L; t++) {
      const j = start + t;
      out[dst + t] = j >= 0 && j < nSamples && rows[c] >= 0 ? data[src + j] : 0;
    }
  }
  return out;
}

/** What `windowActivations` takes (and what the projection worker receives from its client). */
export interface WindowActivationsInput {
  /** W, k × n row-major. */
  readonly unmixing: Float64Array;
  /** k, components (rows of W). */
  readonly nComponents: number;
  /** n, channels (columns of W, rows of the window). */
  readonly nChannels: number;
  /** X_w, n × L channel-major (µV). */
  readonly window: Float32Array;
  /** L, samples in the window. */
  readonly length: number;
  /** m, the channel means the decomposition subtracted, or null when it used the data as is. */
  readonly channelMeans: Float64Array | null;
}

/**
 * S_w = W (X_w − m) for a channel-major window X_w (n × L): W is k × n row-major, m the channel means
 * (or null when the decomposition was computed on the data as is). Uses the register-blocked kernel,
 * then subtracts W m once per component: W (X − m) = W X − W m. Returns k × L (in `out` when given).
 */
export function windowActivations(input: WindowActivationsInput, out?: Float64Array): Float64Array {
  return activationsOf(input, out);
}

function activationsOf(input: WindowActivationsInput, out?: Float64Array): Float64Array {
  const { unmixing, nComponents: k, nChannels: n, window, length, channelMeans } = input;
  const S = out ?? new Float64Array(k * length);
  multiplyChannelMajor(unmixing, k, n, window, length, S);
  if (channelMeans) {
    for (let i = 0; i < k; i++) {
      let wm = 0;
      for (let c = 0; c < n; c++) wm += unmixing[i * n + c] * channelMeans[c];
      if (wm === 0) continue;
      const row = i * length;
      for (let t = 0; t < length; t++) S[row + t] -= wm;
    }
  }
  return S;
}

/** A window of samples and its activations, as `createPreviewWindow` and `recomputeCleaned` take them. */
export interface WindowSamples {
  /** n × L, channel-major, decomposition channel order (µV). */
  readonly original: Float32Array;
  readonly nChannels: number;
  /** L, samples in the window. */
  readonly length: number;
  /** k × L, S_w = W (X_w − m). */
  readonly activations: Float64Array;
  readonly nComponents: number;
}

/** Starts a preview window with nothing removed (cleaned = original). */
export function createPreviewWindow(input: WindowSamples): PreviewWindow {
  const { original, nChannels, length, activations, nComponents } = input;
  if (original.length < nChannels * length) throw new RangeError(`createPreviewWindow: original has ${original.length} values, needs ${nChannels * length}`);
  if (activations.length < nComponents * length)
    throw new RangeError(`createPreviewWindow: activations has ${activations.length} values, needs ${nComponents * length}`);
  const cleaned = new Float64Array(nChannels * length);
  for (let i = 0; i < cleaned.length; i++) cleaned[i] = original[i];
  return { nChannels, nComponents, length, original, activations, cleaned, removed: new Uint8Array(nComponents) };
}

/**
 * Sets component `i` (0-based) removed or kept in `win`, updating `cleaned` by ∓ a_i s_i over the window.
 * `mixing` is n × k row-major (column i = the component's scalp map). Returns true when the window
 * changed. An index outside 0…k−1 changes nothing.
 */
export function setComponentRemoved(win: PreviewWindow, mixing: Float64Array, i: number, remove: boolean): boolean {
  const { nChannels: n, nComponents: k, length: L, activations, cleaned, removed } = win;
  if (!(i >= 0 && i < k) || (removed[i] === 1) === remove) return false;
  removed[i] = remove ? 1 : 0;
  if (!remove && removed.indexOf(1) === -1) {
    // Exact reset: the window with nothing removed is the original, bit for bit.
    const { original } = win;
    for (let j = 0; j < cleaned.length; j++) cleaned[j] = original[j];
    return true;
  }
  const sign = remove ? -1 : 1;
  const s = i * L;
  for (let c = 0; c < n; c++) {
    const a = sign * mixing[c * k + i];
    if (a === 0) continue;
    const row = c * L;
    for (let t = 0; t < L; t++) cleaned[row + t] += a * activations[s + t];
  }
  return true;
}

/**
 * Brings `win` to the removed set `removedSet` (0-based indices) by toggling only the components whose
 * state differs. Returns how many components were toggled.
 */
export function applyRemovedSet(win: PreviewWindow, mixing: Float64Array, removedSet: ReadonlySet<number>): number {
  let toggles = 0;
  for (let i = 0; i < win.nComponents; i++) {
    const want = removedSet.has(i);
    if ((win.removed[i] === 1) !== want && setComponentRemoved(win, mixing, i, want)) toggles++;
  }
  return toggles;
}

/**
 * Reference (non-incremental) cleaned window: X_w − A[:,R] S_w[R,:], computed from scratch. Used by the
 * tests and the bench to check the incremental path.
 */
export function recomputeCleaned(input: WindowSamples & { readonly mixing: Float64Array; readonly removed: ReadonlySet<number> }): Float64Array {
  const { original, nChannels, length, mixing, activations, nComponents, removed: removedSet } = input;
  const out = new Float64Array(nChannels * length);
  for (let c = 0; c < nChannels; c++) {
    for (let t = 0; t < length; t++) {
      let sub = 0;
      for (const i of removedSet) if (i >= 0 && i < nComponents) sub += mixing[c * nComponents + i] * activations[i * length + t];
      out[c * length + t] = original[c * length + t] - sub;
    }
  }
  return out;
}

/**
 * A short checksum of a cleaned window: each value rounded to 0.001 (µV) as a 64-bit integer split into
 * two 32-bit words, folded with the FNV-1a step (xor, then multiply by the FNV prime 16777619) applied to
 * whole words instead of bytes. Rounding noise of the incremental updates far below a nanovolt does not
 * change it; any visible change does (with the usual 2⁻³² chance of a collision). Returned as 8 hex digits.
 */
export function windowChecksum(values: ArrayLike<number>): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    const q = Number.isFinite(v) ? Math.round(v * 1000) : 0x7fffffff;
    const lo = q | 0;
    const hi = Math.floor(q / 4294967296) | 0;
    h = Math.imul(h ^ lo, 0x01000193);
    h = Math.imul(h ^ hi, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, '0');
}

/**
 * Share of each channel's window variance carried by the removed part, var(X_w − X_clean) / var(X_w)
 * per channel (0…1 for a removal uncorrelated with the rest; may exceed 1 when the removed part and the
 * kept part cancel). NaN for a flat channel.
 */
export function removedVarianceShare(win: PreviewWindow, out = new Float64Array(win.nChannels)): Float64Array {
  const { nChannels: n, length: L, original, cleaned } = win;
  for (let c = 0; c < n; c++) {
    const row = c * L;
    let mx = 0;
    let md = 0;
    for (let t = 0; t < L; t++) {
      mx += original[row + t];
      md += original[row + t] - cleaned[row + t];
    }
    mx /= L;
    md /= L;
    let vx = 0;
    let vd = 0;
    for (let t = 0; t < L; t++) {
      const x = original[row + t] - mx;
      const d = original[row + t] - cleaned[row + t] - md;
      vx += x * x;
      vd += d * d;
    }
    out[c] = vx > 0 ? vd / vx : NaN;
  }
  return out;
}
