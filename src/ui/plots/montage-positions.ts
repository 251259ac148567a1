/**
 * Where each decomposition channel lives in the loaded recording: its row in the channel-major samples and
 * its electrode position. Cached per (decomposition, recording) pair so every map of a participant shares
 * one positions array, which in turn keys the one topography plan per montage.
 */
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';

export interface DecompositionMontage {
  /** Recording row of each decomposition channel (−1 when the recording lacks that label). */
  readonly rows: Int32Array;
  /** n × 3 unit vectors in decomposition channel order; NaN rows for unknown positions. */
  readonly positions: Float64Array;
  /** True when at least three channels have positions (enough to draw a map). */
  readonly drawable: boolean;
}

/** Matches labels case-insensitively after trimming; the first recording channel with a label wins. */
export function rowsForLabels(wanted: readonly string[], available: readonly string[]): Int32Array {
  const index = new Map<string, number>();
  available.forEach((l, i) => {
    const key = l.trim().toLowerCase();
    if (!index.has(key)) index.set(key, i);
  });
  return Int32Array.from(wanted, (l) => index.get(l.trim().toLowerCase()) ?? -1);
}

/** Picks rows `rows` (−1 → NaN) of an n × 3 positions array. */
export function positionsForRows(rows: Int32Array, positions: Float64Array | undefined): Float64Array {
  const out = new Float64Array(rows.length * 3).fill(NaN);
  if (!positions) return out;
  rows.forEach((r, c) => {
    if (r >= 0 && 3 * r + 2 < positions.length) out.set(positions.subarray(3 * r, 3 * r + 3), 3 * c);
  });
  return out;
}

const cache = new WeakMap<Decomposition, WeakMap<LoadedRecording, DecompositionMontage>>();

/** The montage of `decomposition` inside `recording` (cached; the same object for the same pair). */
export function decompositionMontage(recording: LoadedRecording, decomposition: Decomposition): DecompositionMontage {
  let byRec = cache.get(decomposition);
  if (!byRec) {
    byRec = new WeakMap();
    cache.set(decomposition, byRec);
  }
  let m = byRec.get(recording);
  if (!m) {
    const rows = rowsForLabels(decomposition.channels, recording.signals.labels);
    const positions = positionsForRows(rows, recording.positions);
    let known = 0;
    for (let c = 0; c < rows.length; c++) if (Number.isFinite(positions[3 * c])) known++;
    m = { rows, positions, drawable: known >= 3 };
    byRec.set(recording, m);
  }
  return m;
}
