/**
 * EDF+/BDF+ writer (continuous and discontinuous) [Kemp & Olivan 2003; BioSemi BDF; layout docs/methods.md §11].
 * Used for cleaned recordings and the simulated demo data. The output always carries one "EDF Annotations"
 * signal (last), whose first TAL in every record is the time-keeping TAL.
 *
 * Calls that break the writer's own contract (a rate that gives a fractional number of samples per record,
 * missing record onsets for +D, a range that does not fit the 8-character field) throw a RangeError naming
 * the option and the value. Data are never silently changed except for the documented quantisation
 * (half a digital step at most) and clipping to an explicitly given physical range.
 */
import { encodeTal } from './tal.ts';
import type { Hz, Lenient, Seconds } from '../units.ts';

export interface EdfWriteChannel {
  label: string;
  /** Unit text for the header, e.g. 'uV' (written as printable ASCII: µ/μ become u). */
  unit: string;
  /** Hz; sampleRate · recordDurationSeconds must be a whole number. */
  sampleRate: Lenient<Hz>;
  /** Default: −M where M is the data's max |value|, rounded outward to fit the 8-character field. */
  physicalMin?: number;
  /** Default: +M (see physicalMin). */
  physicalMax?: number;
  /** Default: −32768 (EDF) / −8388608 (BDF). */
  digitalMin?: number;
  /** Default: 32767 (EDF) / 8388607 (BDF). */
  digitalMax?: number;
  transducer?: string;
  prefilter?: string;
  /** Physical values in `unit`; length = records · samplesPerRecord (shorter data is zero-padded). */
  data: Float32Array;
}

export interface EdfWriteInput {
  format: 'EDF+C' | 'BDF+C' | 'EDF+D' | 'BDF+D';
  patientId?: string;
  recordingId?: string;
  /** Keep patientId/recordingId as given; otherwise the EDF+ anonymous forms are written. */
  keepIdentity?: boolean;
  /**
   * ISO local "YYYY-MM-DDTHH:MM:SS", optionally with a fraction ("…:30.214"): the header holds the whole
   * second and every TAL onset carries the fraction, so the first record's time-keeping TAL is "+0.214"
   * [Kemp & Olivan 2003 §2.2.4].
   */
  start: string;
  recordDurationSeconds: Lenient<Seconds>;
  /** Start of each record in seconds from the first sample (required for +D; ignored for +C). */
  recordOnsets?: Float64Array;
  channels: EdfWriteChannel[];
  /** Onsets in seconds from the first sample; duration 0 = no duration written. */
  annotations: { onset: Lenient<Seconds>; duration: Lenient<Seconds>; label: string }[];
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

/** Printable ASCII (32–126) only, as EDF+ §2.1.3 requires; µ/μ become "u", other characters "_". */
function asciiField(text: string, width: number): string {
  const clean = text.replace(/[µμ]/g, 'u').replace(/[^\x20-\x7e]/g, '_');
  return clean.length >= width ? clean.slice(0, width) : clean + ' '.repeat(width - clean.length);
}

/**
 * Shortest decimal text of at most `width` characters for `v`, rounded in `direction` when it does not fit
 * exactly ('up' never gives a smaller number, 'down' never a larger one).
 */
export function formatEdfNumber(v: number, width = 8, direction: 'up' | 'down' | 'nearest' = 'nearest'): string {
  if (!Number.isFinite(v)) throw new RangeError(`EDF header number must be finite, got ${v}`);
  const plain = String(v);
  if (plain.length <= width && !/e/i.test(plain)) return plain;
  for (let d = Math.min(width, 20); d >= 0; d--) {
    const f = 10 ** d;
    let r = direction === 'up' ? Math.ceil(v * f) / f : direction === 'down' ? Math.floor(v * f) / f : Math.round(v * f) / f;
    let s = r.toFixed(d);
    if (direction === 'up' && Number(s) < v) s = (r = r + 1 / f).toFixed(d);
    if (direction === 'down' && Number(s) > v) s = (r = r - 1 / f).toFixed(d);
    if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
    if (s === '-0') s = '0';
    if (s.length <= width) return s;
  }
  throw new RangeError(`EDF header number ${v} does not fit in ${width} characters`);
}

function startParts(start: string): { y: number; mo: number; d: number; h: number; mi: number; s: number; frac: number } {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(?:\.(\d{1,9}))?/.exec(start);
  if (!m) throw new RangeError(`start must be ISO local "YYYY-MM-DDTHH:MM:SS" (optionally ".fff"), got "${start}"`);
  return { y: +m[1], mo: +m[2], d: +m[3], h: +m[4], mi: +m[5], s: +m[6], frac: m[7] ? Number(`0.${m[7]}`) : 0 };
}

interface Prepared {
  header: Uint8Array;
  records: number;
  recordBytes: number;
  spr: number[];
  gains: { dmin: number; dmax: number; pmin: number; pmax: number }[];
  annBytesPerRecord: number;
  talsPerRecord: Uint8Array[][];
  bps: 2 | 3;
}

function prepare(input: EdfWriteInput): Prepared {
  const bdf = input.format.startsWith('BDF');
  const bps: 2 | 3 = bdf ? 3 : 2;
  const dur = input.recordDurationSeconds;
  if (!(dur > 0)) throw new RangeError(`recordDurationSeconds must be > 0, got ${dur}`);
  const spr = input.channels.map((c) => {
    const n = c.sampleRate * dur;
    const r = Math.round(n);
    if (r < 1 || Math.abs(n - r) > 1e-6 * Math.max(1, r))
      throw new RangeError(`channel "${c.label}": sampleRate ${c.sampleRate} Hz × record ${dur} s = ${n} samples, not a whole number ≥ 1`);
    return r;
  });
  let records = 0;
  input.channels.forEach((c, i) => (records = Math.max(records, Math.ceil(c.data.length / spr[i]))));
  const discontinuous = input.format.endsWith('+D');
  const onsets = new Float64Array(records);
  if (discontinuous) {
    if (!input.recordOnsets || input.recordOnsets.length < records)
      throw new RangeError(`recordOnsets must give ${records} record starts for ${input.format}, got ${input.recordOnsets?.length ?? 0}`);
    onsets.set(input.recordOnsets.subarray(0, records));
  } else for (let r = 0; r < records; r++) onsets[r] = r * dur;

  const ddef = bdf ? { dmin: -8388608, dmax: 8388607 } : { dmin: -32768, dmax: 32767 };
  const gains = input.channels.map((c) => {
    const dmin = c.digitalMin ?? ddef.dmin;
    const dmax = c.digitalMax ?? ddef.dmax;
    if (!(dmax > dmin)) throw new RangeError(`channel "${c.label}": digitalMax ${dmax} must exceed digitalMin ${dmin}`);
    let pmin = c.physicalMin;
    let pmax = c.physicalMax;
    if (pmin === undefined || pmax === undefined) {
      let m = 0;
      for (let i = 0; i < c.data.length; i++) {
        const a = Math.abs(c.data[i]);
        if (a > m) m = a;
      }
      if (!(m > 0)) m = 1;
      // The negative bound has the sign to fit in 8 characters, so it sets the rounding for both ends.
      const M = -Number(formatEdfNumber(-m, 8, 'down'));
      pmin ??= -M;
      pmax ??= M;
    }
    if (pmin === pmax) throw new RangeError(`channel "${c.label}": physicalMin equals physicalMax (${pmin})`);
    return { dmin, dmax, pmin: Number(formatEdfNumber(pmin, 8, 'nearest')), pmax: Number(formatEdfNumber(pmax, 8, 'nearest')) };
  });

  // TAL onsets count from the header's whole-second start: the start's fraction is added to each [EDF+ §2.2.4].
  const frac = startParts(input.start).frac;
  const tal = (t: number) => (frac === 0 ? t : Math.round((t + frac) * 1e9) / 1e9);
  // Annotations go into the last record whose start is ≤ their onset (record 0 for earlier onsets).
  const talsPerRecord: Uint8Array[][] = [];
  for (let r = 0; r < records; r++) talsPerRecord.push([encodeTal(tal(onsets[r]), null, [''])]);
  if (records === 0 && input.annotations.length > 0) throw new RangeError('annotations need at least one data record');
  const sorted = [...input.annotations].sort((a, b) => a.onset - b.onset);
  let r = 0;
  for (const a of sorted) {
    while (r + 1 < records && onsets[r + 1] <= a.onset) r++;
    talsPerRecord[r].push(encodeTal(tal(a.onset), a.duration > 0 ? a.duration : null, [a.label]));
  }
  let maxAnn = 0;
  for (const list of talsPerRecord) maxAnn = Math.max(maxAnn, list.reduce((s, b) => s + b.length, 0));
  const annSamples = Math.max(1, Math.ceil(maxAnn / bps));
  const annBytesPerRecord = annSamples * bps;

  const ns = input.channels.length + 1;
  const headerBytes = 256 * (ns + 1);
  const p = startParts(input.start);
  const p2 = (v: number) => String(v).padStart(2, '0');
  const dateAnon = `${p2(p.d)}-${MONTHS[p.mo - 1]}-${p.y}`;
  const keep = input.keepIdentity === true;
  const patient = keep && input.patientId !== undefined ? input.patientId : 'X X X X';
  const recording = keep && input.recordingId !== undefined ? input.recordingId : `Startdate ${dateAnon} X X X`;
  const yy = p.y >= 1985 && p.y <= 2084 ? p2(p.y % 100) : 'yy';

  let main = '';
  main += asciiField('0', 8);
  main += asciiField(patient, 80);
  main += asciiField(recording, 80);
  main += asciiField(`${p2(p.d)}.${p2(p.mo)}.${yy}`, 8);
  main += asciiField(`${p2(p.h)}.${p2(p.mi)}.${p2(p.s)}`, 8);
  main += asciiField(String(headerBytes), 8);
  main += asciiField(input.format, 44);
  main += asciiField(String(records), 8);
  main += asciiField(formatEdfNumber(dur, 8), 8);
  main += asciiField(String(ns), 4);

  const ann = { label: bdf ? 'BDF Annotations' : 'EDF Annotations', // BDF+ labels its annotation signal "BDF Annotations" [BioSemi BDF+]
  transducer: '', unit: '', pmin: '-1', pmax: '1', dmin: String(ddef.dmin), dmax: String(ddef.dmax), prefilter: '', spr: String(annSamples) };
  const sigs = input.channels.map((c, i) => ({
    label: c.label,
    transducer: c.transducer ?? '',
    unit: c.unit,
    pmin: formatEdfNumber(gains[i].pmin, 8),
    pmax: formatEdfNumber(gains[i].pmax, 8),
    dmin: formatEdfNumber(gains[i].dmin, 8),
    dmax: formatEdfNumber(gains[i].dmax, 8),
    prefilter: c.prefilter ?? '',
    spr: String(spr[i]),
  }));
  sigs.push(ann);
  let sh = '';
  for (const s of sigs) sh += asciiField(s.label, 16);
  for (const s of sigs) sh += asciiField(s.transducer, 80);
  for (const s of sigs) sh += asciiField(s.unit, 8);
  for (const s of sigs) sh += asciiField(s.pmin, 8);
  for (const s of sigs) sh += asciiField(s.pmax, 8);
  for (const s of sigs) sh += asciiField(s.dmin, 8);
  for (const s of sigs) sh += asciiField(s.dmax, 8);
  for (const s of sigs) sh += asciiField(s.prefilter, 80);
  for (const s of sigs) sh += asciiField(s.spr, 8);
  for (let i = 0; i < sigs.length; i++) sh += ' '.repeat(32);
  const text = main + sh;
  const header = new Uint8Array(headerBytes);
  for (let i = 0; i < text.length; i++) header[i] = text.charCodeAt(i);
  if (bdf) header.set([0xff, 0x42, 0x49, 0x4f, 0x53, 0x45, 0x4d, 0x49]); // 0xFF "BIOSEMI" [BioSemi BDF]
  if (text.length !== headerBytes) throw new RangeError(`internal: header is ${text.length} bytes, expected ${headerBytes}`);
  if (p.mo < 1 || p.mo > 12) throw new RangeError(`start month out of range in "${input.start}"`);

  const recordBytes = spr.reduce((s, n) => s + n * bps, 0) + annBytesPerRecord;
  return { header, records, recordBytes, spr, gains, annBytesPerRecord, talsPerRecord, bps };
}

/**
 * Yields the file in pieces: the header, then batches of data records (about 4 MB each), so a long
 * recording can be streamed to disk without one buffer of the whole file.
 */
export function* writeEdfChunks(input: EdfWriteInput): Generator<Uint8Array> {
  const pr = prepare(input);
  yield pr.header;
  const perBatch = Math.max(1, Math.floor((4 * 1024 * 1024) / pr.recordBytes));
  const scale = input.channels.map((_, i) => {
    const g = pr.gains[i];
    const gain = (g.pmax - g.pmin) / (g.dmax - g.dmin);
    return { ...g, gain };
  });
  for (let r0 = 0; r0 < pr.records; r0 += perBatch) {
    const count = Math.min(perBatch, pr.records - r0);
    const out = new Uint8Array(count * pr.recordBytes);
    let p = 0;
    for (let r = r0; r < r0 + count; r++) {
      for (let c = 0; c < input.channels.length; c++) {
        const data = input.channels[c].data;
        const n = pr.spr[c];
        const { dmin, dmax, pmin, gain } = scale[c];
        for (let k = 0; k < n; k++) {
          const i = r * n + k;
          const x = i < data.length ? data[i] : 0;
          // phys = pmin + (dig − dmin)·gain  ⇒  dig = dmin + (phys − pmin)/gain  [docs/methods.md §11]
          let d = Math.round(dmin + ((Number.isNaN(x) ? 0 : x) - pmin) / gain);
          if (d < dmin) d = dmin;
          else if (d > dmax) d = dmax;
          out[p] = d & 0xff;
          out[p + 1] = (d >> 8) & 0xff;
          if (pr.bps === 3) out[p + 2] = (d >> 16) & 0xff;
          p += pr.bps;
        }
      }
      let q = p;
      for (const tal of pr.talsPerRecord[r]) {
        out.set(tal, q);
        q += tal.length;
      }
      p += pr.annBytesPerRecord; // the rest stays 0x00 (unused annotation bytes)
    }
    yield out;
  }
}

/** Writes a whole EDF+/BDF+ file into one Uint8Array (see writeEdfChunks for the streaming form). */
export function writeEdf(input: EdfWriteInput): Uint8Array {
  const parts = [...writeEdfChunks(input)];
  const total = parts.reduce((s, b) => s + b.length, 0);
  const out = new Uint8Array(total);
  let o = 0;
  for (const b of parts) {
    out.set(b, o);
    o += b.length;
  }
  return out;
}
