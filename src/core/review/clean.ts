/**
 * Removing components (docs/methods.md §7.6): S = W (X − m), X_clean = X − A[:,R] S[R,:] for the removed set R.
 * Written as one channel × channel projector so the per-sample work is a single product:
 *
 *   P = A[:,R] W[R,:]   (n × n),   X_clean = X − P (X − m) = X − P X + P m.
 *
 * The part of the data outside the decomposition's subspace and every channel the decomposition does not
 * use are left untouched; with nothing removed the output equals the input, and removing every component
 * of a full-rank decomposition (A W = I) leaves only the channel means m.
 */
import { multiplyChannelMajor } from '../linalg/matmul.ts';
import type { Decomposition } from '../decomposition.ts';
import type { LoadedRecording, RecordingInfo, SignalBlock } from '../recording.ts';
import type { EdfWriteChannel, EdfWriteInput } from '../formats/edf-writer.ts';

export interface CleaningPlan {
  /** 1-based indices of the removed components, ascending. */
  readonly removed: readonly number[];
  /** Number of channels of the signal block being cleaned. */
  readonly nSignalChannels: number;
  /** Row in the signal block of each decomposition channel (length = decomposition.nChannels). */
  readonly rows: Int32Array;
  /** P = A[:,R] W[R,:], nD × nD row-major. */
  readonly projector: Float64Array;
  /** P m (µV per decomposition channel); 0 when the decomposition carries no means. */
  readonly offset: Float64Array;
}

export type CleaningPlanResult =
  | { readonly ok: true; readonly plan: CleaningPlan }
  | { readonly ok: false; readonly message: string };

/**
 * Builds the projector for removing `removed` (1-based component indices) from a signal block whose rows
 * are labelled `signalLabels`. Decomposition channels are matched to signal rows by label (exact, then
 * case-insensitive). Out-of-range indices and unknown channels give `ok: false` with a message.
 */
export function createCleaningPlan(decomposition: Decomposition, signalLabels: readonly string[], removed: readonly number[]): CleaningPlanResult {
  const n = decomposition.nChannels;
  const k = decomposition.nComponents;
  const rows = new Int32Array(n);
  const exact = new Map(signalLabels.map((l, i) => [l, i] as const));
  const folded = new Map(signalLabels.map((l, i) => [l.toLowerCase(), i] as const));
  for (let c = 0; c < n; c++) {
    const label = decomposition.channels[c];
    const row = exact.get(label) ?? folded.get(label.toLowerCase());
    if (row === undefined) return { ok: false, message: `decomposition channel "${label}" is not in the recording` };
    rows[c] = row;
  }
  const sorted = [...new Set(removed)].sort((a, b) => a - b);
  for (const r of sorted) {
    if (!Number.isInteger(r) || r < 1 || r > k) return { ok: false, message: `component ${r} does not exist (the decomposition has ${k})` };
  }
  const projector = new Float64Array(n * n);
  const { mixing: A, unmixing: W } = decomposition;
  for (const r1 of sorted) {
    const r = r1 - 1;
    for (let i = 0; i < n; i++) {
      const a = A[i * k + r];
      if (a === 0) continue;
      const pi = i * n;
      const wr = r * n;
      for (let j = 0; j < n; j++) projector[pi + j] += a * W[wr + j];
    }
  }
  const offset = new Float64Array(n);
  const m = decomposition.channelMeans;
  if (m) {
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += projector[i * n + j] * m[j];
      offset[i] = s;
    }
  }
  return { ok: true, plan: { removed: sorted, nSignalChannels: signalLabels.length, rows, projector, offset } };
}

/** Scratch buffers for cleaning in chunks of at most `chunk` samples (allocated once per job). */
export interface CleaningScratch {
  readonly chunk: number;
  readonly gathered: Float32Array;
  readonly product: Float64Array;
}

export function createCleaningScratch(plan: CleaningPlan, chunk = 4096): CleaningScratch {
  const n = plan.rows.length;
  return { chunk, gathered: new Float32Array(n * chunk), product: new Float64Array(n * chunk) };
}

/**
 * Writes the cleaned samples [start, end) of the channel-major block X (nSignalChannels × nSamples) into
 * `out` (same shape; may be X itself for in-place cleaning). Rows not used by the decomposition are copied.
 */
export function cleanSignalRange(
  plan: CleaningPlan,
  X: Float32Array,
  nSamples: number,
  out: Float32Array,
  start = 0,
  end = nSamples,
  scratch: CleaningScratch = createCleaningScratch(plan, Math.min(4096, Math.max(1, end - start))),
): void {
  const n = plan.rows.length;
  const used = new Uint8Array(plan.nSignalChannels);
  for (let c = 0; c < n; c++) used[plan.rows[c]] = 1;
  if (out !== X) {
    for (let r = 0; r < plan.nSignalChannels; r++) {
      if (!used[r]) out.set(X.subarray(r * nSamples + start, r * nSamples + end), r * nSamples + start);
    }
  }
  if (plan.removed.length === 0) {
    if (out !== X) for (let c = 0; c < n; c++) { const r = plan.rows[c]; out.set(X.subarray(r * nSamples + start, r * nSamples + end), r * nSamples + start); }
    return;
  }
  const { gathered, product } = scratch;
  for (let t0 = start; t0 < end; t0 += scratch.chunk) {
    const t1 = Math.min(end, t0 + scratch.chunk);
    const len = t1 - t0;
    for (let c = 0; c < n; c++) {
      const r = plan.rows[c];
      gathered.set(X.subarray(r * nSamples + t0, r * nSamples + t1), c * len);
    }
    multiplyChannelMajor(plan.projector, n, n, gathered, len, product, 0, len);
    for (let c = 0; c < n; c++) {
      const base = plan.rows[c] * nSamples + t0;
      const g = c * len;
      const off = plan.offset[c];
      for (let t = 0; t < len; t++) out[base + t] = gathered[g + t] - product[g + t] + off;
    }
  }
}

/** The whole block cleaned into a new array (convenience for tests and small recordings). */
export function cleanSignals(plan: CleaningPlan, X: Float32Array, nSamples: number): Float32Array {
  const out = new Float32Array(X.length);
  cleanSignalRange(plan, X, nSamples, out);
  return out;
}

/**
 * The recording's main-rate signal block with `removed` (1-based) components taken out, computed in chunks
 * of about one second so `onProgress` (0…1) can be reported. Throws a RangeError when the decomposition does
 * not fit the recording (a caller's contract fault: the loader already matched them).
 */
export function cleanedRecordingSamples(
  recording: LoadedRecording,
  decomposition: Decomposition,
  removed: readonly number[],
  onProgress?: (fraction: number) => void,
): Float32Array {
  const { labels, data, nSamples } = recording.signals;
  const made = createCleaningPlan(decomposition, labels, removed);
  if (!made.ok) throw new RangeError(made.message);
  const out = new Float32Array(data.length);
  const step = Math.max(4096, Math.ceil(nSamples / 50));
  const scratch = createCleaningScratch(made.plan, Math.min(4096, Math.max(1, nSamples)));
  for (let t0 = 0; t0 < nSamples; t0 += step) {
    const t1 = Math.min(nSamples, t0 + step);
    cleanSignalRange(made.plan, data, nSamples, out, t0, t1, scratch);
    onProgress?.(t1 / nSamples);
  }
  if (nSamples === 0) onProgress?.(1);
  return out;
}

/**
 * Writer input for a cleaned copy of a recording: every channel of `info` in the file's order, each taken
 * from the signal block (one per sampling rate) that holds it, the same record duration, start time,
 * record onsets (discontinuous files stay discontinuous) and annotations (gap boundaries are carried by the
 * record onsets, not written as annotations). Channels not in `cleanedLabels` (lower-case) keep their
 * physical and digital ranges when the output family (EDF/BDF) is the input's, so their samples come back
 * exactly; cleaned channels get a range fitted to the new values (the writer's symmetric default).
 * Identifying header fields become the EDF+ anonymous forms unless `keepIdentity`.
 * Throws a RangeError naming the channel when a channel of `info` is in no block (a caller's contract fault).
 */
export function cleanedEdfInput(
  info: RecordingInfo,
  blocks: readonly SignalBlock[],
  cleanedLabels: ReadonlySet<string>,
  family: 'EDF' | 'BDF',
  keepIdentity: boolean,
): EdfWriteInput {
  const discontinuous = info.format.endsWith('+D');
  const sameFamily = info.format.startsWith(family);
  const channels: EdfWriteChannel[] = info.channels.map((c) => {
    const block = blocks.find((b) => b.sampleRate === c.sampleRate && b.labels.includes(c.label));
    if (!block) throw new RangeError(`channel "${c.label}" (${c.sampleRate} Hz) is in none of the signal blocks`);
    const row = block.labels.indexOf(c.label);
    const touched = cleanedLabels.has(c.label.toLowerCase());
    return {
      label: c.label,
      unit: c.unit,
      sampleRate: c.sampleRate,
      transducer: c.transducer,
      prefilter: c.prefilter,
      ...(touched || !sameFamily ? {} : { physicalMin: c.physicalMin, physicalMax: c.physicalMax, digitalMin: c.digitalMin, digitalMax: c.digitalMax }),
      data: block.data.subarray(row * block.nSamples, (row + 1) * block.nSamples),
    };
  });
  return {
    format: family === 'BDF' ? (discontinuous ? 'BDF+D' : 'BDF+C') : discontinuous ? 'EDF+D' : 'EDF+C',
    patientId: info.header.patientId,
    recordingId: info.header.recordingId,
    keepIdentity,
    start: info.header.start,
    recordDurationSeconds: info.header.recordDurationSeconds,
    ...(discontinuous ? { recordOnsets: info.header.recordOnsets } : {}),
    channels,
    annotations: info.events.filter((e) => e.source !== 'boundary').map((e) => ({ onset: e.onset, duration: e.duration, label: e.label })),
  };
}
