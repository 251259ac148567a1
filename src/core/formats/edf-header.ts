/**
 * EDF/EDF+/BDF/BDF+ header: the 256-byte main header and the ns·256-byte signal header [Kemp et al. 1992;
 * Kemp & Olivan 2003; BioSemi BDF; byte layout docs/methods.md §11], parsed into the layout the annotation and
 * sample readers share (edf-annotations.ts, edf-samples.ts). Conventions of the results: see edf.ts.
 */
import type { ByteSource } from './byte-source.ts';
import { parseFail, parseOk, type ParseError, type ParseErrorCode, type ParseResult } from './parse-result.ts';
import type { ChannelInfo, RecordingFormat } from '../recording.ts';
import { hz } from '../units.ts';

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
/** Records decoded per read are limited to about this many bytes. */
export const BATCH_BYTES = 8 * 1024 * 1024;

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

export interface ParsedHeader {
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
      sampleRate: hz(spr / recordDurationSeconds),
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

export function ioFail<T>(fileName: string, e: unknown): ParseResult<T> {
  return parseFail({ code: 'io', message: `${fileName}: read failed (${(e as Error)?.message ?? String(e)})`, file: fileName });
}

