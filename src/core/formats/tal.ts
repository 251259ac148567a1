/**
 * EDF+ Time-stamped Annotation Lists (TALs) [Kemp & Olivan 2003, EDF+ specification §2.2.2–2.2.4]:
 *
 *   TAL        = onset [ 0x15 duration ] 0x14 *( annotation 0x14 ) 0x00
 *   onset      = ("+" / "-") 1*DIGIT [ "." 1*DIGIT ]     seconds relative to the file's start date/time
 *   duration   = 1*DIGIT [ "." 1*DIGIT ]                  seconds, no sign
 *   annotation = UTF-8 text without 0x14 and 0x00
 *
 * TALs follow one another directly inside one data record's annotation signal; unused bytes are 0x00.
 */
import { parseFail, parseOk, type ParseResult } from './parse-result.ts';

export interface Tal {
  /** Seconds relative to the file's start date/time (as written; not shifted). */
  readonly onset: number;
  /** Seconds, or null when the TAL has no duration. */
  readonly duration: number | null;
  /** UTF-8 texts; the time-keeping TAL's first annotation is the empty string. */
  readonly annotations: string[];
}

const TAL_SEP = 0x14;
const TAL_DUR = 0x15;
const utf8 = new TextDecoder('utf-8');

function isDigit(b: number): boolean {
  return b >= 0x30 && b <= 0x39;
}

/** Shows a byte as the user would find it in a hex viewer. */
function describeByte(b: number | undefined): string {
  if (b === undefined) return 'the end of the record';
  if (b >= 0x20 && b <= 0x7e) return `"${String.fromCharCode(b)}"`;
  return `byte 0x${b.toString(16).padStart(2, '0')}`;
}

/**
 * Parses the annotation-signal bytes of one data record into TALs.
 * @param bytes the `2·n` (EDF) or `3·n` (BDF) bytes of one annotation signal in one record
 * @param recordIndex zero-based data record number, for messages
 * @param fileName first word of error messages
 * @param fileOffset byte offset of `bytes[0]` in the file, so errors point into the file
 */
export function parseTals(
  bytes: Uint8Array,
  recordIndex: number,
  fileName = 'annotations',
  fileOffset = 0,
): ParseResult<Tal[]> {
  const out: Tal[] = [];
  const n = bytes.length;
  let pos = 0;
  const fail = (at: number, what: string) =>
    parseFail<Tal[]>({
      code: 'bad-tal',
      message: `${fileName}: malformed annotation (TAL) in data record ${recordIndex} at byte ${fileOffset + at}: ${what}`,
      file: fileName,
      byteOffset: fileOffset + at,
    });

  // Reads 1*DIGIT [ "." 1*DIGIT ] starting at pos; returns the end index or -1.
  const scanNumber = (from: number): number => {
    let p = from;
    if (p >= n || !isDigit(bytes[p])) return -1;
    while (p < n && isDigit(bytes[p])) p++;
    if (p < n && bytes[p] === 0x2e) {
      p++;
      if (p >= n || !isDigit(bytes[p])) return -1;
      while (p < n && isDigit(bytes[p])) p++;
    }
    return p;
  };
  const ascii = (a: number, b: number) => String.fromCharCode(...bytes.subarray(a, b));

  while (pos < n) {
    if (bytes[pos] === 0) {
      pos++; // padding between or after TALs
      continue;
    }
    const start = pos;
    const sign = bytes[pos];
    if (sign !== 0x2b && sign !== 0x2d) return fail(pos, `onset must start with "+" or "-", found ${describeByte(sign)}`);
    const onsetEnd = scanNumber(pos + 1);
    if (onsetEnd < 0) return fail(pos + 1, `onset needs digits after the sign, found ${describeByte(bytes[pos + 1])}`);
    const onset = Number(ascii(start, onsetEnd));
    pos = onsetEnd;
    let duration: number | null = null;
    if (bytes[pos] === TAL_DUR) {
      const durEnd = scanNumber(pos + 1);
      if (durEnd < 0) return fail(pos + 1, `duration needs digits after 0x15, found ${describeByte(bytes[pos + 1])}`);
      duration = Number(ascii(pos + 1, durEnd));
      pos = durEnd;
    }
    if (bytes[pos] !== TAL_SEP) return fail(pos, `expected 0x14 after the time stamp, found ${describeByte(bytes[pos])}`);
    pos++;
    const annotations: string[] = [];
    for (;;) {
      if (pos >= n) return fail(pos, 'the TAL is not closed by 0x00 before the end of the record');
      if (bytes[pos] === 0) {
        pos++;
        break;
      }
      const textStart = pos;
      while (pos < n && bytes[pos] !== TAL_SEP && bytes[pos] !== 0) pos++;
      if (pos >= n) return fail(textStart, 'annotation text runs past the end of the record');
      if (bytes[pos] === 0) return fail(pos, 'annotation text must end with 0x14 before the closing 0x00');
      annotations.push(utf8.decode(bytes.subarray(textStart, pos)));
      pos++; // past 0x14
    }
    out.push({ onset, duration, annotations });
  }
  return parseOk(out);
}

/**
 * Formats seconds for a TAL: no exponent, no grouping, at most 9 decimals, trailing zeros dropped.
 * `signed` adds the mandatory "+"/"-" of an onset.
 */
export function formatTalSeconds(v: number, signed: boolean): string {
  const abs = Math.abs(v);
  let s = abs.toFixed(9);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  if (!signed) return s;
  return (v < 0 && s !== '0' ? '-' : '+') + s;
}

/**
 * Encodes TALs as bytes (UTF-8 texts). Bytes 0x00/0x14/0x15 inside a text would break the grammar, so they
 * become spaces, as do other C0 controls apart from TAB, LF and CR (EDF+ §2.2.4).
 */
export function encodeTal(onset: number, duration: number | null, annotations: readonly string[]): Uint8Array {
  let s = formatTalSeconds(onset, true);
  if (duration !== null && duration > 0) s += '\u0015' + formatTalSeconds(duration, false);
  s += '\u0014';
  for (const a of annotations) s += a.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g, ' ') + '\u0014';
  s += '\u0000';
  return new TextEncoder().encode(s);
}
