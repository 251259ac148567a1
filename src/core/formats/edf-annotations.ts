/**
 * EDF+/BDF+ annotations and record times: reads the time-keeping TAL of every data record and every annotation
 * [Kemp & Olivan 2003 §2.2], without decoding samples. Conventions of the results: see edf.ts.
 */
import type { ByteSource } from './byte-source.ts';
import { parseFail, parseOk, type ParseError, type ParseResult } from './parse-result.ts';
import { parseTals } from './tal.ts';
import type { RecordingEvent, RecordingInfo } from '../recording.ts';
import { BATCH_BYTES, ioFail, readEdfLayout, type EdfLayout } from './edf-header.ts';
import type { Seconds } from '../units.ts';

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

  // The first record's time-keeping onset is the start's sub-second part ("+0.214") [Kemp & Olivan 2003
  // §2.2.4]; the reported start is the time of the first sample, and every time counts from that sample.
  const t0 = records > 0 ? rawOnsets[0] : 0;
  if (t0 < 0 || t0 >= 1)
    warnings.push(`${layout.fileName}: first data record starts at ${t0 < 0 ? '' : '+'}${t0} s from the header's start time (expected a sub-second offset 0 ≤ t < 1); the start is reported as the time of the first sample and times count from it`);
  // TAL times are decimal text: subtracting t0 is rounded to nanoseconds so 5.214 − 0.214 is 5, not 5.000000000000001.
  const shift = (t: number) => (t0 === 0 ? t : Math.round((t - t0) * 1e9) / 1e9);
  const recordOnsets = new Float64Array(records);
  for (let r = 0; r < records; r++) recordOnsets[r] = shift(rawOnsets[r]);
  // TAL times are digit strings (finite); they are tagged as seconds without a further check.
  const events: RecordingEvent[] = tals.map((t) => ({
    onset: shift(t.onset) as Seconds,
    duration: (t.duration ?? 0) as Seconds,
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
        events.push({ onset: recordOnsets[r] as Seconds, duration: gap as Seconds, label: 'boundary', source: 'boundary' });
    }
  }
  events.sort((a, b) => a.onset - b.onset);
  const durationSeconds = (records === 0 ? 0 : discontinuous ? recordOnsets[records - 1] + dur : records * dur) as Seconds;
  const info: RecordingInfo = {
    fileName: layout.fileName,
    format: layout.format,
    header: {
      patientId,
      recordingId,
      start: t0 === 0 ? start : addSecondsToStart(start, t0),
      headerBytes: layout.headerBytes,
      records,
      recordDurationSeconds: dur as Seconds,
      recordOnsets,
    },
    channels,
    durationSeconds,
    events,
  };
  return parseOk(info, warnings);
}


/**
 * `start` ("YYYY-MM-DDTHH:MM:SS") plus `seconds`, as ISO 8601 local time with the fraction when there is one
 * (at most 9 decimals, trailing zeros dropped): ("2026-03-02T09:15:30", 0.214) → "2026-03-02T09:15:30.214".
 */
export function addSecondsToStart(start: string, seconds: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})$/.exec(start);
  if (!m || !Number.isFinite(seconds)) return start;
  const ns = Math.round(seconds * 1e9);
  const whole = Math.floor(ns / 1e9);
  const fracNs = ns - whole * 1e9;
  const d = new Date(Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) + whole * 1000);
  const p2 = (v: number) => String(v).padStart(2, '0');
  const base = `${String(d.getUTCFullYear()).padStart(4, '0')}-${p2(d.getUTCMonth() + 1)}-${p2(d.getUTCDate())}T${p2(d.getUTCHours())}:${p2(d.getUTCMinutes())}:${p2(d.getUTCSeconds())}`;
  return fracNs === 0 ? base : `${base}.${String(fracNs).padStart(9, '0').replace(/0+$/, '')}`;
}
