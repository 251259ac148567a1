/**
 * Test-only EDF/BDF byte builder written straight from the specification's offset tables (Kemp et al. 1992
 * §2 main header; EDF+ Kemp & Olivan 2003; BioSemi BDF; docs/methods.md §11): every field is placed at its
 * documented offset, ASCII, left-justified and space-padded. It shares no code with src/core/formats so that
 * reader tests do not check the reader against our own writer.
 */
export interface SpecSignal {
  label: string;
  transducer?: string;
  unit?: string;
  pmin: string;
  pmax: string;
  dmin: string;
  dmax: string;
  prefilter?: string;
  spr: string;
}

export interface SpecFile {
  bdf?: boolean;
  patient?: string;
  recording?: string;
  date?: string;
  time?: string;
  /** Default: 256·(ns+1) as text. */
  headerBytes?: string;
  reserved?: string;
  records: string;
  duration: string;
  /** Default: signals.length as text. */
  ns?: string;
  signals: SpecSignal[];
  /** The data records, already encoded. */
  data?: Uint8Array;
}

function put(out: Uint8Array, offset: number, width: number, text: string): void {
  for (let i = 0; i < width; i++) out[offset + i] = i < text.length ? text.charCodeAt(i) : 0x20;
}

/** Main header: offsets 0, 8, 88, 168, 176, 184, 192, 236, 244, 252 (widths 8, 80, 80, 8, 8, 8, 44, 8, 8, 4). */
export function specHeader(f: SpecFile): Uint8Array {
  const ns = f.signals.length;
  const out = new Uint8Array(256 * (ns + 1));
  if (f.bdf) {
    out[0] = 0xff;
    put(out, 1, 7, 'BIOSEMI');
  } else put(out, 0, 8, '0');
  put(out, 8, 80, f.patient ?? 'X X X X');
  put(out, 88, 80, f.recording ?? 'Startdate 02-MAR-2026 X X X');
  put(out, 168, 8, f.date ?? '02.03.26');
  put(out, 176, 8, f.time ?? '09.15.30');
  put(out, 184, 8, f.headerBytes ?? String(256 * (ns + 1)));
  put(out, 192, 44, f.reserved ?? '');
  put(out, 236, 8, f.records);
  put(out, 244, 8, f.duration);
  put(out, 252, 4, f.ns ?? String(ns));
  // Signal header: field of signal j at 256 + base·ns + width·j, bases 0,16,96,104,112,120,128,136,216,224.
  const fields: [keyof SpecSignal | null, number, number][] = [
    ['label', 0, 16], ['transducer', 16, 80], ['unit', 96, 8], ['pmin', 104, 8], ['pmax', 112, 8],
    ['dmin', 120, 8], ['dmax', 128, 8], ['prefilter', 136, 80], ['spr', 216, 8], [null, 224, 32],
  ];
  f.signals.forEach((s, j) => {
    for (const [key, base, width] of fields) put(out, 256 + base * ns + width * j, width, key ? (s[key] ?? '') : '');
  });
  return out;
}

export function specFile(f: SpecFile): Uint8Array {
  const h = specHeader(f);
  const d = f.data ?? new Uint8Array(0);
  const out = new Uint8Array(h.length + d.length);
  out.set(h);
  out.set(d, h.length);
  return out;
}

/** 16-bit little-endian two's complement (EDF). */
export function le16(values: number[]): number[] {
  return values.flatMap((v) => [v & 0xff, (v >> 8) & 0xff]);
}

/** 24-bit little-endian two's complement (BDF). */
export function le24(values: number[]): number[] {
  return values.flatMap((v) => [v & 0xff, (v >> 8) & 0xff, (v >> 16) & 0xff]);
}

/** Bytes of a TAL string given with \x14/\x15/\x00 escapes, UTF-8 encoded, zero-padded to `size`. */
export function talBytes(text: string, size: number): number[] {
  const b = Array.from(new TextEncoder().encode(text));
  if (b.length > size) throw new Error(`TAL text of ${b.length} bytes does not fit ${size}`);
  return [...b, ...new Array(size - b.length).fill(0)];
}

export const annotationSignal = (spr: number): SpecSignal => ({
  label: 'EDF Annotations',
  pmin: '-1',
  pmax: '1',
  dmin: '-32768',
  dmax: '32767',
  spr: String(spr),
});
