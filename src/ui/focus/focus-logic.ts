/**
 * Plain functions behind the focus view: navigation between components, which sensor channels to show
 * beside a component's time course, and the component's own activation over a window.
 */
import { windowActivations } from '../../core/review/preview-projection.ts';

/** The 1-based index `step` away from `current`, kept within 1…n; null when there are no components. */
export function neighbourIndex(current: number | null, n: number, step: number): number | null {
  if (n <= 0) return null;
  const from = current ?? 1;
  return Math.min(n, Math.max(1, from + step));
}

/**
 * Decomposition channels sorted by |A[c, i]| (largest first), the first `count` of them: the sensors where
 * component i (0-based) shows most. Channels missing from the recording (rows[c] < 0) are skipped.
 */
export function strongestChannels(mixing: Float64Array, n: number, k: number, i: number, count: number, rows?: ArrayLike<number>): number[] {
  const idx: number[] = [];
  for (let c = 0; c < n; c++) if (!rows || rows[c] >= 0) idx.push(c);
  idx.sort((a, b) => Math.abs(mixing[b * k + i]) - Math.abs(mixing[a * k + i]) || a - b);
  return idx.slice(0, Math.max(0, count));
}

/**
 * Activation of component i (0-based) over a channel-major window (n × L), back-projected to channel c:
 * A[c, i] · s_i(t), in µV — the same convention as the evidence (spectra, trial stack at the strongest
 * channel), so it shares the sensor traces' unit.
 */
export function backProjectedActivation(
  unmixing: Float64Array,
  mixing: Float64Array,
  n: number,
  k: number,
  i: number,
  c: number,
  window: Float32Array,
  length: number,
  channelMeans: Float64Array | null,
): Float64Array {
  const s = windowActivations(unmixing.subarray(i * n, (i + 1) * n), 1, n, window, length, channelMeans);
  const a = mixing[c * k + i];
  for (let t = 0; t < length; t++) s[t] *= a;
  return s;
}

/** Column i (0-based) of the n × k mixing matrix: the component's scalp map. */
export function mixingColumn(mixing: Float64Array, n: number, k: number, i: number): Float64Array {
  const out = new Float64Array(n);
  for (let c = 0; c < n; c++) out[c] = mixing[c * k + i];
  return out;
}
