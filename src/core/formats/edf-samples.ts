/**
 * EDF/BDF samples: decodes the data records of the chosen channels into physical values, whole or streamed in
 * batches [Kemp et al. 1992; BioSemi BDF; docs/methods.md §11]. Conventions of the results: see edf.ts.
 */
import type { ByteSource } from './byte-source.ts';
import { parseFail, parseOk, type ParseError, type ParseResult } from './parse-result.ts';
import type { RecordingInfo, SignalBlock } from '../recording.ts';
import { BATCH_BYTES, ioFail, readEdfLayout, type EdfLayout, type EdfSignalLayout } from './edf-header.ts';
import type { Hz } from '../units.ts';

/** EDF/BDF samples are little-endian; typed-array views read them directly only on a little-endian host. */
const LITTLE_ENDIAN_HOST = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** Options of readEdfSignals / iterateEdfSignals. */
export interface EdfReadOptions {
  /** Labels (trimmed; exact, else case-insensitive). Default: every signal channel. */
  channels?: string[];
  /** Seconds from the first sample; samples at t ≥ startS are kept. Default 0. */
  startS?: number;
  /** Seconds; samples at t < startS + durationS are kept. Default: to the end. */
  durationS?: number;
  /** Called after each batch of records with the fraction done (0–1), for progress bars. */
  onProgress?: (fraction: number) => void;
  /**
   * readEdfSignals only: allocates the block's sample array of `length` floats (e.g. over a SharedArrayBuffer, so
   * a decomposition can filter it in place and share it with a helper thread without a copy). Default: a Float32Array.
   */
  allocate?: (length: number) => Float32Array;
}

/** A run of consecutive samples of one record that falls inside the requested time span. */
interface Segment {
  record: number;
  k0: number;
  k1: number;
}

interface Selection {
  indices: number[];
  labels: string[];
  sampleRate: Hz;
  spr: number;
  segments: Segment[];
  nSamples: number;
  discontinuous: boolean;
}

function selectSignals(
  layout: EdfLayout,
  info: RecordingInfo,
  opts: EdfReadOptions,
): ParseResult<Selection> {
  const name = layout.fileName;
  const dataSignals = layout.signals.map((s, i) => ({ s, i })).filter((x) => !x.s.isAnnotation);
  let chosen: { s: EdfSignalLayout; i: number }[];
  if (opts.channels && opts.channels.length > 0) {
    chosen = [];
    for (const want of opts.channels) {
      const w = want.trim();
      const hit = dataSignals.find((x) => x.s.label === w) ?? dataSignals.find((x) => x.s.label.toLowerCase() === w.toLowerCase());
      if (!hit)
        return parseFail({
          code: 'unknown-channel',
          message: `${name}: no channel "${w}"; the file has ${dataSignals.map((x) => x.s.label).join(', ')}`,
          file: name,
        });
      chosen.push(hit);
    }
  } else chosen = dataSignals;
  const dur = layout.recordDurationSeconds;
  if (chosen.length === 0)
    return parseOk({ indices: [], labels: [], sampleRate: 0 as Hz, spr: 0, segments: [], nSamples: 0, discontinuous: false });
  const rates = new Map<number, string[]>();
  for (const c of chosen) {
    const rate = c.s.samplesPerRecord / dur;
    rates.set(rate, [...(rates.get(rate) ?? []), c.s.label]);
  }
  if (rates.size > 1)
    return parseFail({
      code: 'bad-value',
      message: `${name}: the channels have different sampling rates (${[...rates].map(([r, ls]) => `${r} Hz: ${ls.join(', ')}`).join('; ')}); read channels of one rate at a time`,
      file: name,
    });
  const spr = chosen[0].s.samplesPerRecord;
  const fs = spr / dur;
  const discontinuous = layout.format.endsWith('+D');
  const startS = Math.max(0, opts.startS ?? 0);
  const endS = opts.durationS === undefined ? Infinity : startS + Math.max(0, opts.durationS);
  const segments: Segment[] = [];
  let nSamples = 0;
  const eps = 1e-7;
  if (!discontinuous) {
    const total = layout.records * spr;
    const g0 = Math.min(total, Math.max(0, Math.ceil(startS * fs - eps)));
    const g1 = endS === Infinity ? total : Math.min(total, Math.max(g0, Math.ceil(endS * fs - eps)));
    for (let g = g0; g < g1; ) {
      const r = Math.floor(g / spr);
      const k0 = g - r * spr;
      const k1 = Math.min(spr, g1 - r * spr);
      segments.push({ record: r, k0, k1 });
      nSamples += k1 - k0;
      g += k1 - k0;
    }
  } else {
    const onsets = info.header.recordOnsets;
    for (let r = 0; r < layout.records; r++) {
      const o = onsets[r];
      if (o + dur <= startS || o >= endS) continue;
      const k0 = Math.max(0, Math.ceil((startS - o) * fs - eps));
      const k1 = endS === Infinity ? spr : Math.min(spr, Math.max(0, Math.ceil((endS - o) * fs - eps)));
      if (k1 > k0) {
        segments.push({ record: r, k0, k1 });
        nSamples += k1 - k0;
      }
    }
  }
  return parseOk({
    indices: chosen.map((c) => c.i),
    labels: chosen.map((c) => c.s.label),
    // spr / dur of a header edf-header.ts accepted (dur > 0 when a channel holds samples).
    sampleRate: fs as Hz,
    spr,
    segments,
    nSamples,
    discontinuous,
  });
}

/** A chunk of samples in float64 (as produced by iterateEdfSignals). */
export interface EdfSignalChunk {
  readonly labels: readonly string[];
  readonly sampleRate: Hz;
  readonly nSamples: number;
  /** Channel-major physical values (normalised units), nChannels × nSamples. */
  readonly data: Float64Array;
  /** Time in seconds of each sample. */
  readonly sampleTimes: Float64Array;
}

/**
 * Decodes the samples of `sel` from the records of one batch into `write(channel, position, value)`.
 * Little-endian two's complement, 2 bytes (EDF) or 3 bytes (BDF) per sample [docs/methods.md §11].
 */
function decodeBatch(
  layout: EdfLayout,
  sel: Selection,
  bytes: Uint8Array,
  firstRecord: number,
  segs: Segment[],
  data: Float32Array | Float64Array,
  stride: number,
  pos0: number,
): number {
  const bps = layout.bytesPerSample;
  let pos = pos0;
  for (const seg of segs) {
    const base = (seg.record - firstRecord) * layout.recordBytes;
    const n = seg.k1 - seg.k0;
    for (let c = 0; c < sel.indices.length; c++) {
      const s = layout.signals[sel.indices[c]];
      const { gain, physicalMin: pmin, digitalMin: dmin, unitFactor: uf } = s;
      let p = base + s.byteOffsetInRecord + seg.k0 * bps;
      const out = c * stride + pos;
      if (bps === 2 && LITTLE_ENDIAN_HOST && ((bytes.byteOffset + p) & 1) === 0) {
        // aligned: read the samples through an Int16 view (same values, no byte assembly)
        const v16 = new Int16Array(bytes.buffer, bytes.byteOffset + p, n);
        for (let k = 0; k < n; k++) data[out + k] = (pmin + (v16[k] - dmin) * gain) * uf;
      } else if (bps === 2) {
        for (let k = 0; k < n; k++, p += 2) {
          const v = ((bytes[p] | (bytes[p + 1] << 8)) << 16) >> 16;
          data[out + k] = (pmin + (v - dmin) * gain) * uf;
        }
      } else {
        for (let k = 0; k < n; k++, p += 3) {
          const v = ((bytes[p] | (bytes[p + 1] << 8) | (bytes[p + 2] << 16)) << 8) >> 8;
          data[out + k] = (pmin + (v - dmin) * gain) * uf;
        }
      }
    }
    pos += n;
  }
  return pos;
}

function fillTimes(sel: Selection, onsets: Float64Array, segs: Segment[], times: Float64Array, pos0: number): void {
  let pos = pos0;
  for (const seg of segs) {
    for (let k = seg.k0; k < seg.k1; k++)
      times[pos++] = sel.discontinuous ? onsets[seg.record] + k / sel.sampleRate : (seg.record * sel.spr + k) / sel.sampleRate;
  }
}

/** Groups segments into batches of consecutive records of at most BATCH_BYTES. */
function batchSegments(layout: EdfLayout, segments: Segment[]): Segment[][] {
  const perBatch = Math.max(1, Math.floor(BATCH_BYTES / layout.recordBytes));
  const out: Segment[][] = [];
  let cur: Segment[] = [];
  for (const s of segments) {
    if (cur.length > 0 && s.record - cur[0].record >= perBatch) {
      out.push(cur);
      cur = [];
    }
    cur.push(s);
  }
  if (cur.length > 0) out.push(cur);
  return out;
}

async function readBatch(source: ByteSource, layout: EdfLayout, segs: Segment[]): Promise<Uint8Array | ParseError> {
  const first = segs[0].record;
  const last = segs[segs.length - 1].record;
  const want = (last - first + 1) * layout.recordBytes;
  const bytes = await source.read(layout.headerBytes + first * layout.recordBytes, want);
  if (bytes.length < want)
    return {
      code: 'truncated-record',
      message: `${layout.fileName}: the file ends inside data record ${first + Math.floor(bytes.length / layout.recordBytes)}`,
      file: layout.fileName,
      byteOffset: layout.headerBytes + first * layout.recordBytes + bytes.length,
    };
  return bytes;
}

/**
 * Reads the physical samples (normalised units, µV for voltages) of channels that share one sampling rate.
 * `sampleTimes` (seconds from the file's first sample) is set for EDF+D/BDF+D and whenever the block does not
 * start at the first sample (a `startS` window); otherwise sample j is at j / sampleRate.
 */
export async function readEdfSignals(
  source: ByteSource,
  info: RecordingInfo,
  opts: EdfReadOptions = {},
): Promise<ParseResult<SignalBlock>> {
  const head = await readEdfLayout(source);
  if (!head.ok) return head;
  const layout = head.value.layout;
  const selRes = selectSignals(layout, info, opts);
  if (!selRes.ok) return selRes;
  const sel = selRes.value;
  const N = sel.nSamples;
  const data = opts.allocate ? opts.allocate(sel.indices.length * N) : new Float32Array(sel.indices.length * N);
  // Times are implicit (j / fs) only for a continuous read from the first sample; otherwise they are given.
  const firstIsZero = sel.segments.length === 0 || (sel.segments[0].record === 0 && sel.segments[0].k0 === 0);
  const sampleTimes = sel.discontinuous || !firstIsZero ? new Float64Array(N) : undefined;
  let pos = 0;
  try {
    const batches = batchSegments(layout, sel.segments);
    for (const [b, segs] of batches.entries()) {
      opts.onProgress?.(b / batches.length);
      const bytes = await readBatch(source, layout, segs);
      if (bytes instanceof Uint8Array) {
        if (sampleTimes) fillTimes(sel, info.header.recordOnsets, segs, sampleTimes, pos);
        pos = decodeBatch(layout, sel, bytes, segs[0].record, segs, data, N, pos);
      } else return parseFail(bytes);
    }
  } catch (e) {
    return ioFail(source.name, e);
  }
  opts.onProgress?.(1);
  const block: SignalBlock = { labels: sel.labels, sampleRate: sel.sampleRate, nSamples: N, data, ...(sampleTimes ? { sampleTimes } : {}) };
  return parseOk(block, head.value.warnings);
}

/**
 * Like readEdfSignals, but yields float64 chunks of at most about 8 MB of records each, for streaming
 * consumers (the `winnow read` command). The first yielded item is the selection or its error.
 */
export async function* iterateEdfSignals(
  source: ByteSource,
  info: RecordingInfo,
  opts: EdfReadOptions = {},
): AsyncGenerator<ParseResult<EdfSignalChunk>> {
  const head = await readEdfLayout(source);
  if (!head.ok) {
    yield head;
    return;
  }
  const layout = head.value.layout;
  const selRes = selectSignals(layout, info, opts);
  if (!selRes.ok) {
    yield selRes;
    return;
  }
  const sel = selRes.value;
  if (sel.nSamples === 0) {
    yield parseOk({ labels: sel.labels, sampleRate: sel.sampleRate, nSamples: 0, data: new Float64Array(0), sampleTimes: new Float64Array(0) });
    return;
  }
  for (const segs of batchSegments(layout, sel.segments)) {
    let bytes: Uint8Array | ParseError;
    try {
      bytes = await readBatch(source, layout, segs);
    } catch (e) {
      yield ioFail(source.name, e);
      return;
    }
    if (!(bytes instanceof Uint8Array)) {
      yield parseFail(bytes);
      return;
    }
    let n = 0;
    for (const s of segs) n += s.k1 - s.k0;
    const data = new Float64Array(sel.indices.length * n);
    const sampleTimes = new Float64Array(n);
    fillTimes(sel, info.header.recordOnsets, segs, sampleTimes, 0);
    decodeBatch(layout, sel, bytes, segs[0].record, segs, data, n, 0);
    yield parseOk({ labels: sel.labels, sampleRate: sel.sampleRate, nSamples: n, data, sampleTimes });
  }
}
