/**
 * EDF [Kemp et al. 1992], EDF+ continuous/discontinuous [Kemp & Olivan 2003] and BDF/BDF+ (24-bit, BioSemi)
 * reader over a ByteSource. Byte layout: docs/methods.md §11. The file is read in slices: the header, then
 * batches of whole data records (about 8 MB at a time), so a 500 MB recording is never one buffer.
 *
 * Conventions of the results:
 * - Voltage channels (uV, µV with U+00B5 or U+03BC, mV, V) come out in 'uV' with physical values, ranges
 *   included, scaled to microvolts; the header's own text stays in `headerUnit`.
 * - Times are seconds from the first stored sample (BIDS). EDF+ writes the first record's time-keeping TAL as
 *   `+0` or `+0.X` (the sub-second part of the start time); that first onset is subtracted from every record
 *   onset and annotation onset.
 * - EDF+D/BDF+D: record onsets come from the time-keeping TALs; each gap before a record becomes an event
 *   with source 'boundary', label 'boundary' and the gap length as its duration.
 * - Records = −1 (still recording) is replaced by the count of whole records in the file, with a warning.
 */
import type { ByteSource } from './byte-source.ts';
import { parseFail, parseOk, type ParseError, type ParseErrorCode, type ParseResult } from './parse-result.ts';
import { parseTals } from './tal.ts';
import type { ChannelInfo, RecordingEvent, RecordingFormat, RecordingInfo, SignalBlock } from '../recording.ts';

/**
 * The typed errors readEdfInfo/readEdfSignals return (ParseError.code), one per kind of bad input:
 * too-short (file shorter than the 256-byte header or than its own signal header), bad-version,
 * bad-number (a non-numeric header field; the message names the field and the signal),
 * header-size-mismatch (header bytes ≠ 256·(ns+1)), no-signals (ns ≤ 0), bad-scaling (physical min = max,
 * digital min ≥ max), truncated-record (fewer whole records than the header says), bad-tal (malformed TAL,
 * missing time-keeping TAL, overlapping EDF+D records; names the record and byte offset),
 * unknown-channel and bad-value (a read across channels of different rates; lists the rates), io.
 */
export type EdfErrorCode = Extract<
  ParseErrorCode,
  'too-short' | 'bad-version' | 'bad-number' | 'header-size-mismatch' | 'no-signals' | 'bad-scaling' | 'truncated-record' | 'bad-tal' | 'unknown-channel' | 'bad-value' | 'io'
>;

/** Bytes of the fixed main header. */
export const EDF_MAIN_HEADER_BYTES = 256;
/** EDF/BDF samples are little-endian; typed-array views read them directly only on a little-endian host. */
const LITTLE_ENDIAN_HOST = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
/** Records decoded per read are limited to about this many bytes. */
const BATCH_BYTES = 8 * 1024 * 1024;

/** One signal as the header describes it (annotation signals included). */
export interface EdfSignalLayout {
  readonly label: string;
  readonly isAnnotation: boolean;
  readonly samplesPerRecord: number;
  /** Byte offset of this signal's samples inside one data record. */
  readonly byteOffsetInRecord: number;
  /**
   * Physical value (normalised unit) = (physicalMin + (digital − digitalMin)·gain)·unitFactor, the spec's
   * formula in the spec's order [docs/methods.md §11], so values agree to the last bit with a direct evaluation.
   */
  readonly gain: number;
  readonly physicalMin: number;
  readonly digitalMin: number;
  readonly unitFactor: number;
}

/** What the sample decoder needs to know about a file; derived from the header. */
export interface EdfLayout {
  readonly fileName: string;
  readonly format: RecordingFormat;
  readonly bytesPerSample: 2 | 3;
  readonly headerBytes: number;
  readonly recordBytes: number;
  readonly records: number;
  readonly recordDurationSeconds: number;
  readonly signals: readonly EdfSignalLayout[];
}

interface ParsedHeader {
  layout: EdfLayout;
  patientId: string;
  recordingId: string;
  start: string;
  channels: ChannelInfo[];
  warnings: string[];
}

const latin1 = new TextDecoder('latin1');
const utf8Strict = new TextDecoder('utf-8', { fatal: true });

/** Header text: ASCII by the spec; UTF-8 or Latin-1 bytes (a µ in a unit) are read as such rather than refused. */
function headerText(bytes: Uint8Array): string {
  let ascii = true;
  for (let i = 0; i < bytes.length; i++) if (bytes[i] > 0x7e) ascii = false;
  if (ascii) return latin1.decode(bytes).trim();
  try {
    return utf8Strict.decode(bytes).trim();
  } catch {
    return latin1.decode(bytes).trim();
  }
}

/** Micro sign U+00B5 and Greek mu U+03BC both spell micro (BIDS accepts both). */
const VOLT_SCALE: Record<string, number> = { uv: 1, 'µv': 1, 'μv': 1, mv: 1e3, v: 1e6, nv: 1e-3 };

/**
 * Factor from the header's unit to microvolts, or null when the unit is not a voltage.
 * "uV", "µV", "μV" → 1; "mV" → 1000; "V" → 1e6; "nV" → 0.001. Case of the prefix matters only for "MV"
 * (megavolt), which is not accepted as a voltage.
 */
export function voltageScaleToMicrovolts(unit: string): number | null {
  const u = unit.trim();
  if (u === 'MV' || u === 'Mv') return null;
  const f = VOLT_SCALE[u.toLowerCase()];
  return f === undefined ? null : f;
}

const SIGNAL_FIELDS = [
  ['label', 16],
  ['transducer type', 80],
  ['physical dimension', 8],
  ['physical minimum', 8],
  ['physical maximum', 8],
  ['digital minimum', 8],
  ['digital maximum', 8],
  ['prefiltering', 80],
  ['number of samples per data record', 8],
  ['reserved', 32],
] as const;

/** Strict decimal number as EDF writes it (optional sign, digits, optional fraction, optional exponent). */
function edfNumber(text: string): number | null {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) return null;
  const v = Number(text);
  return Number.isFinite(v) ? v : null;
}

/**
 * Parses the 256-byte main header and the ns·256-byte signal header.
 * @param fileSize total bytes of the file, to count records and detect truncation
 */
export function parseEdfHeader(
  main: Uint8Array,
  readSignalHeader: null | Uint8Array,
  fileName: string,
  fileSize: number,
): ParseResult<ParsedHeader> | { needSignalHeaderBytes: number } {
  const fail = (code: ParseError['code'], message: string, byteOffset?: number) =>
    parseFail<ParsedHeader>({ code, message: `${fileName}: ${message}`, file: fileName, byteOffset });
  if (main.length < EDF_MAIN_HEADER_BYTES || fileSize < EDF_MAIN_HEADER_BYTES)
    return fail('too-short', `file is ${fileSize} bytes, shorter than the 256-byte EDF/BDF main header`, 0);

  let bdf: boolean;
  if (main[0] === 0xff && latin1.decode(main.subarray(1, 8)) === 'BIOSEMI') bdf = true;
  else if (latin1.decode(main.subarray(0, 8)).trim() === '0') bdf = false;
  else
    return fail(
      'bad-version',
      `version field is "${latin1.decode(main.subarray(0, 8)).replace(/[^\x20-\x7e]/g, '?')}", expected "0" (EDF) or 0xFF "BIOSEMI" (BDF)`,
      0,
    );
  const field = (offset: number, width: number) => headerText(main.subarray(offset, offset + width));
  const patientId = field(8, 80);
  const recordingId = field(88, 80);
  const dateText = field(168, 8);
  const timeText = field(176, 8);
  const reserved = field(192, 44);
  const warnings: string[] = [];

  const intField = (offset: number, width: number, name: string) => {
    const t = field(offset, width);
    const v = edfNumber(t);
    return v !== null && Number.isInteger(v) ? v : ({ bad: t, name, offset } as const);
  };
  const nsv = intField(252, 4, 'number of signals');
  if (typeof nsv !== 'number') return fail('bad-number', `header field "number of signals" is "${nsv.bad}", not a whole number`, 252);
  const ns = nsv;
  if (ns <= 0) return fail('no-signals', `header says the file has ${ns} signals; at least one is needed`, 252);
  const hbv = intField(184, 8, 'number of bytes in header');
  if (typeof hbv !== 'number')
    return fail('bad-number', `header field "number of bytes in header record" is "${hbv.bad}", not a whole number`, 184);
  const expectedHeader = EDF_MAIN_HEADER_BYTES * (ns + 1);
  if (hbv !== expectedHeader)
    return fail(
      'header-size-mismatch',
      `header says it is ${hbv} bytes but ${ns} signals need 256·(${ns}+1) = ${expectedHeader} bytes`,
      184,
    );
  if (fileSize < expectedHeader)
    return fail('too-short', `file is ${fileSize} bytes, shorter than its ${expectedHeader}-byte header (${ns} signals)`, fileSize);
  if (readSignalHeader === null) return { needSignalHeaderBytes: ns * 256 };
  const sig = readSignalHeader;
  if (sig.length < ns * 256) return fail('too-short', `file ends inside the signal header`, 256 + sig.length);

  const recv = intField(236, 8, 'number of data records');
  if (typeof recv !== 'number')
    return fail('bad-number', `header field "number of data records" is "${recv.bad}", not a whole number`, 236);
  const durText = field(244, 8);
  const recordDurationSeconds = edfNumber(durText);
  if (recordDurationSeconds === null || recordDurationSeconds < 0)
    return fail('bad-number', `header field "duration of a data record" is "${durText}", not a non-negative number`, 244);

  let format: RecordingFormat;
  if (bdf) format = reserved.startsWith('BDF+D') || reserved.startsWith('EDF+D') ? 'BDF+D' : reserved.startsWith('BDF+C') || reserved.startsWith('EDF+C') ? 'BDF+C' : 'BDF';
  else format = reserved.startsWith('EDF+D') ? 'EDF+D' : reserved.startsWith('EDF+C') ? 'EDF+C' : 'EDF';
  const plus = format.endsWith('+C') || format.endsWith('+D');

  const start = parseStart(dateText, timeText, recordingId);
  if (typeof start !== 'string') return fail('bad-number', start.message, start.offset);

  const bytesPerSample = bdf ? 3 : 2;
  const sfield = (fieldIndex: number, j: number) => {
    let base = 0;
    for (let f = 0; f < fieldIndex; f++) base += SIGNAL_FIELDS[f][1];
    const width = SIGNAL_FIELDS[fieldIndex][1];
    const off = base * ns + width * j;
    return { text: headerText(sig.subarray(off, off + width)), offset: 256 + off };
  };

  const signals: EdfSignalLayout[] = [];
  const channels: ChannelInfo[] = [];
  let byteOffsetInRecord = 0;
  for (let j = 0; j < ns; j++) {
    const label = sfield(0, j).text;
    const isAnnotation = plus && (label === 'EDF Annotations' || label === 'BDF Annotations');
    const name = `signal ${j + 1} ("${label}")`;
    if (isAnnotation && label !== (bdf ? 'BDF Annotations' : 'EDF Annotations'))
      warnings.push(`${fileName}: ${format} annotation signal ${j + 1} is labelled "${label}"; expected "${bdf ? 'BDF Annotations' : 'EDF Annotations'}" (read leniently)`);
    const nums: number[] = [];
    for (const f of [3, 4, 5, 6, 8]) {
      const { text, offset } = sfield(f, j);
      const v = edfNumber(text);
      if (v === null)
        return fail('bad-number', `${name} ${SIGNAL_FIELDS[f][0]} is "${text}", not a number`, offset);
      nums.push(v);
    }
    const [physicalMinH, physicalMaxH, digitalMin, digitalMax, spr] = nums;
    if (!Number.isInteger(spr) || spr <= 0)
      return fail('bad-number', `${name} number of samples per data record is ${spr}; it must be a whole number ≥ 1`, sfield(8, j).offset);
    if (!isAnnotation) {
      if (physicalMinH === physicalMaxH)
        return fail('bad-scaling', `${name} physical minimum equals physical maximum (${physicalMinH}); the scaling is undefined`, sfield(3, j).offset);
      const [dlo, dhi] = bdf ? [-8388608, 8388607] : [-32768, 32767];
      for (const [f, v] of [[5, digitalMin], [6, digitalMax]] as const)
        if (!Number.isInteger(v) || v < dlo || v > dhi)
          return fail('bad-scaling', `${name} ${SIGNAL_FIELDS[f][0]} is ${v}; it must be a whole number in ${dlo}…${dhi} [${bdf ? 'BioSemi BDF' : 'Kemp et al. 1992'}]`, sfield(f, j).offset);
      if (digitalMin >= digitalMax)
        return fail('bad-scaling', `${name} digital minimum ${digitalMin} is not below digital maximum ${digitalMax}`, sfield(5, j).offset);
    }
    const headerUnit = sfield(2, j).text;
    const scale = isAnnotation ? null : voltageScaleToMicrovolts(headerUnit);
    const unitFactor = scale ?? 1;
    const rawGain = isAnnotation ? 1 : (physicalMaxH - physicalMinH) / (digitalMax - digitalMin);
    signals.push({ label, isAnnotation, samplesPerRecord: spr, byteOffsetInRecord, gain: rawGain, physicalMin: physicalMinH, digitalMin, unitFactor });
    byteOffsetInRecord += spr * bytesPerSample;
    if (isAnnotation) continue;
    if (recordDurationSeconds === 0)
      return fail('bad-value', `duration of a data record is 0 but ${name} holds samples`, 244);
    channels.push({
      label,
      unit: scale === null ? headerUnit : 'uV',
      headerUnit,
      sampleRate: spr / recordDurationSeconds,
      samplesPerRecord: spr,
      // 15 significant digits drop binary noise of the decimal rescale (32.767 mV → 32767 µV, not …0004)
      physicalMin: Number((physicalMinH * unitFactor).toPrecision(15)),
      physicalMax: Number((physicalMaxH * unitFactor).toPrecision(15)),
      digitalMin,
      digitalMax,
      transducer: sfield(1, j).text,
      prefilter: sfield(7, j).text,
      type: 'EEG',
      status: 'good',
    });
  }
  const recordBytes = byteOffsetInRecord;
  const available = fileSize - expectedHeader;
  const whole = Math.floor(available / recordBytes);
  const rest = available - whole * recordBytes;
  let records = recv;
  if (records === -1) {
    records = whole;
    warnings.push(
      `${fileName}: header gives −1 data records (file not closed by the recorder); counted ${whole} from the file size` +
        (rest > 0 ? `, ignoring ${rest} trailing bytes` : ''),
    );
  } else if (records < 0) {
    return fail('bad-number', `header field "number of data records" is ${records}; it must be ≥ 0 (or −1 while recording)`, 236);
  } else if (records > whole) {
    return fail(
      'truncated-record',
      `header says ${records} data records of ${recordBytes} bytes but the file holds ${whole} and ${rest} bytes`,
      expectedHeader + whole * recordBytes,
    );
  } else if (available > records * recordBytes) {
    warnings.push(`${fileName}: ${available - records * recordBytes} bytes after the last of ${records} data records are ignored`);
  }
  if (plus && !signals.some((s) => s.isAnnotation))
    warnings.push(`${fileName}: ${format} file without an "EDF Annotations" signal; records are taken as contiguous`);

  const layout: EdfLayout = {
    fileName,
    format,
    bytesPerSample,
    headerBytes: expectedHeader,
    recordBytes,
    records,
    recordDurationSeconds,
    signals,
  };
  return parseOk({ layout, patientId, recordingId, start, channels, warnings });
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

/**
 * Start date/time as ISO 8601 without zone. Two-digit years clip at 1985 (85–99 → 19yy, 00–84 → 20yy);
 * an EDF+ recording field "Startdate dd-MMM-yyyy" supplies the four-digit year when present [EDF+ §2.1.3.2].
 */
function parseStart(dateText: string, timeText: string, recordingId: string): string | { message: string; offset: number } {
  const time = /^(\d{1,2})\D(\d{1,2})\D(\d{1,2})$/.exec(timeText);
  if (!time || +time[1] > 23 || +time[2] > 59 || +time[3] > 60)
    return { message: `header field "start time" is "${timeText}", expected hh.mm.ss`, offset: 176 };
  const fromRecording = /^Startdate (\d{2})-([A-Z]{3})-(\d{4})/i.exec(recordingId);
  let day: number, month: number, year: number;
  const date = /^(\d{1,2})\D(\d{1,2})\D(\d{2}|yy)$/i.exec(dateText);
  if (date && date[3].toLowerCase() !== 'yy') {
    day = +date[1];
    month = +date[2];
    const yy = +date[3];
    year = yy >= 85 ? 1900 + yy : 2000 + yy;
  } else if (fromRecording) {
    day = +fromRecording[1];
    month = MONTHS.indexOf(fromRecording[2].toUpperCase()) + 1;
    year = +fromRecording[3];
  } else {
    return { message: `header field "start date" is "${dateText}", expected dd.mm.yy`, offset: 168 };
  }
  if (fromRecording) {
    const m = MONTHS.indexOf(fromRecording[2].toUpperCase()) + 1;
    if (m > 0 && +fromRecording[1] === day && m === month && +fromRecording[3] % 100 === year % 100) year = +fromRecording[3];
  }
  if (day < 1 || day > 31 || month < 1 || month > 12)
    return { message: `header field "start date" is "${dateText}", not a valid dd.mm.yy date`, offset: 168 };
  const p2 = (v: number) => String(v).padStart(2, '0');
  return `${String(year).padStart(4, '0')}-${p2(month)}-${p2(day)}T${p2(+time[1])}:${p2(+time[2])}:${p2(+time[3])}`;
}

/** Reads and parses the header of `source` (no data records). */
export async function readEdfLayout(source: ByteSource): Promise<ParseResult<ParsedHeader>> {
  try {
    const main = await source.read(0, EDF_MAIN_HEADER_BYTES);
    const first = parseEdfHeader(main, null, source.name, source.size);
    if (!('needSignalHeaderBytes' in first)) return first;
    const sig = await source.read(EDF_MAIN_HEADER_BYTES, first.needSignalHeaderBytes);
    const second = parseEdfHeader(main, sig, source.name, source.size);
    return 'needSignalHeaderBytes' in second
      ? parseFail({ code: 'io', message: `${source.name}: could not read the signal header`, file: source.name })
      : second;
  } catch (e) {
    return ioFail(source.name, e);
  }
}

function ioFail<T>(fileName: string, e: unknown): ParseResult<T> {
  return parseFail({ code: 'io', message: `${fileName}: read failed (${(e as Error)?.message ?? String(e)})`, file: fileName });
}

/** Calls `onBatch` for consecutive batches of whole records [first, first + count) of `layout`. */
async function forEachRecordBatch(
  source: ByteSource,
  layout: EdfLayout,
  firstRecord: number,
  endRecord: number,
  onBatch: (bytes: Uint8Array, first: number, count: number) => ParseError | void,
  onProgress?: (fraction: number) => void,
): Promise<ParseError | void> {
  const perBatch = Math.max(1, Math.floor(BATCH_BYTES / layout.recordBytes));
  for (let r = firstRecord; r < endRecord; r += perBatch) {
    const count = Math.min(perBatch, endRecord - r);
    const want = count * layout.recordBytes;
    const bytes = await source.read(layout.headerBytes + r * layout.recordBytes, want);
    if (bytes.length < want)
      return {
        code: 'truncated-record',
        message: `${layout.fileName}: data record ${r + Math.floor(bytes.length / layout.recordBytes)} ends early (the file changed or is shorter than its header says)`,
        file: layout.fileName,
        byteOffset: layout.headerBytes + r * layout.recordBytes + bytes.length,
      };
    const err = onBatch(bytes, r, count);
    onProgress?.(Math.min(1, (r + count - firstRecord) / Math.max(1, endRecord - firstRecord)));
    if (err) return err;
  }
}

/**
 * Reads the header and every annotation (TAL) of an EDF/EDF+/BDF/BDF+ file. Data samples are not decoded.
 */
export async function readEdfInfo(
  source: ByteSource,
  opts: { onProgress?: (fraction: number) => void } = {},
): Promise<ParseResult<RecordingInfo>> {
  const head = await readEdfLayout(source);
  if (!head.ok) return head;
  const { layout, channels, patientId, recordingId, start } = head.value;
  const warnings = [...head.value.warnings];
  const { records, recordDurationSeconds: dur } = layout;
  const rawOnsets = new Float64Array(records);
  for (let r = 0; r < records; r++) rawOnsets[r] = r * dur;
  const tals: { onset: number; duration: number | null; text: string }[] = [];
  const annIdx = layout.signals.map((s, i) => (s.isAnnotation ? i : -1)).filter((i) => i >= 0);
  const discontinuous = layout.format.endsWith('+D');

  /** Parses the TALs of record r; `buf[0]` sits at byte `base` of that record. */
  const handleRecord = (r: number, buf: Uint8Array, base: number): ParseError | void => {
    for (let a = 0; a < annIdx.length; a++) {
      const s = layout.signals[annIdx[a]];
      const off = s.byteOffsetInRecord - base;
      const len = s.samplesPerRecord * layout.bytesPerSample;
      const fileOffset = layout.headerBytes + r * layout.recordBytes + s.byteOffsetInRecord;
      const res = parseTals(buf.subarray(off, off + len), r, layout.fileName, fileOffset);
      if (!res.ok) return res.error;
      let list = res.value;
      if (a === 0) {
        const keeper = list[0];
        if (!keeper || keeper.annotations.length === 0 || keeper.annotations[0] !== '')
          return {
            code: 'bad-tal',
            message: `${layout.fileName}: data record ${r} does not start with a time-keeping TAL ("+<seconds>" 0x14 0x14 0x00) at byte ${fileOffset}`,
            file: layout.fileName,
            byteOffset: fileOffset,
          };
        rawOnsets[r] = keeper.onset;
        list = [{ ...keeper, annotations: keeper.annotations.slice(1) }, ...list.slice(1)];
      }
      for (const t of list) for (const text of t.annotations) tals.push({ onset: t.onset, duration: t.duration, text });
    }
  };

  if (annIdx.length > 0 && records > 0) {
    // The annotation signals' byte span inside a record. When it is a small part of the record (the usual
    // case: EEG samples dominate), only that span of each record is read, in parallel groups; otherwise
    // whole batches of records are read.
    const annStart = Math.min(...annIdx.map((i) => layout.signals[i].byteOffsetInRecord));
    const annEnd = Math.max(...annIdx.map((i) => layout.signals[i].byteOffsetInRecord + layout.signals[i].samplesPerRecord * layout.bytesPerSample));
    const sparse = (annEnd - annStart) * 16 <= layout.recordBytes && layout.recordBytes >= 4096;
    try {
      let err: ParseError | void = undefined;
      if (sparse) {
        const GROUP = 64;
        const span = annEnd - annStart;
        for (let r0 = 0; r0 < records && !err; r0 += GROUP) {
          const r1 = Math.min(records, r0 + GROUP);
          const slices = await Promise.all(
            Array.from({ length: r1 - r0 }, (_, k) => source.read(layout.headerBytes + (r0 + k) * layout.recordBytes + annStart, span)),
          );
          for (let k = 0; k < slices.length && !err; k++) {
            if (slices[k].length < span)
              err = {
                code: 'truncated-record',
                message: `${layout.fileName}: data record ${r0 + k} ends early (the file changed or is shorter than its header says)`,
                file: layout.fileName,
              };
            else err = handleRecord(r0 + k, slices[k], annStart);
          }
          opts.onProgress?.(r1 / records);
        }
      } else {
        err = await forEachRecordBatch(
          source,
          layout,
          0,
          records,
          (bytes, first, count) => {
            for (let k = 0; k < count; k++) {
              const e = handleRecord(first + k, bytes.subarray(k * layout.recordBytes, (k + 1) * layout.recordBytes), 0);
              if (e) return e;
            }
          },
          opts.onProgress,
        );
      }
      if (err) return parseFail(err);
    } catch (e) {
      return ioFail(source.name, e);
    }
  }

  const t0 = records > 0 ? rawOnsets[0] : 0;
  if (t0 !== 0) warnings.push(`${layout.fileName}: first data record starts at +${t0} s after the header's start time; times count from the first sample`);
  const recordOnsets = new Float64Array(records);
  for (let r = 0; r < records; r++) recordOnsets[r] = rawOnsets[r] - t0;
  const events: RecordingEvent[] = tals.map((t) => ({
    onset: t.onset - t0,
    duration: t.duration ?? 0,
    label: t.text,
    source: 'annotation' as const,
  }));
  if (!discontinuous && annIdx.length > 0) {
    for (let r = 1; r < records; r++) {
      if (Math.abs(recordOnsets[r] - r * dur) > 1e-6 * Math.max(1, dur)) {
        warnings.push(`${layout.fileName}: ${layout.format} (continuous) but data record ${r} is time-stamped ${recordOnsets[r]} s instead of ${r * dur} s`);
        break;
      }
    }
  }
  if (discontinuous) {
    for (let r = 1; r < records; r++) {
      const gap = recordOnsets[r] - (recordOnsets[r - 1] + dur);
      if (gap < -1e-9 * Math.max(1, dur))
        return parseFail({
          code: 'bad-tal',
          message: `${layout.fileName}: data record ${r} starts at ${recordOnsets[r]} s, before the end of record ${r - 1} (${recordOnsets[r - 1] + dur} s); EDF+D records must not overlap`,
          file: layout.fileName,
          byteOffset: layout.headerBytes + r * layout.recordBytes,
        });
      if (gap > 1e-9 * Math.max(1, dur))
        events.push({ onset: recordOnsets[r], duration: gap, label: 'boundary', source: 'boundary' });
    }
  }
  events.sort((a, b) => a.onset - b.onset);
  const durationSeconds = records === 0 ? 0 : discontinuous ? recordOnsets[records - 1] + dur : records * dur;
  const info: RecordingInfo = {
    fileName: layout.fileName,
    format: layout.format,
    header: {
      patientId,
      recordingId,
      start,
      headerBytes: layout.headerBytes,
      records,
      recordDurationSeconds: dur,
      recordOnsets,
    },
    channels,
    durationSeconds,
    events,
  };
  return parseOk(info, warnings);
}

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
  sampleRate: number;
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
    return parseOk({ indices: [], labels: [], sampleRate: 0, spr: 0, segments: [], nSamples: 0, discontinuous: false });
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
    sampleRate: fs,
    spr,
    segments,
    nSamples,
    discontinuous,
  });
}

/** A chunk of samples in float64 (as produced by iterateEdfSignals). */
export interface EdfSignalChunk {
  readonly labels: readonly string[];
  readonly sampleRate: number;
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
  const data = new Float32Array(sel.indices.length * N);
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
