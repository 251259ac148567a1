/**
 * A small EDF file written byte by byte from the EDF specification (Kemp et al. 1992): 256-byte main header,
 * 256 bytes per signal, then data records of little-endian 16-bit two's-complement samples. Built here,
 * not by our writer, so the e2e test checks the page against the standard.
 */
const field = (text: string, width: number) => text.padEnd(width, ' ').slice(0, width);

export interface TinyEdfOptions {
  readonly labels: readonly string[];
  readonly sampleRate: number;
  readonly records: number;
  /** Add seeded noise (µV, uniform ±amplitude) so channels are not exactly sinusoidal; default 0. */
  readonly noiseUv?: number;
}

export function tinyEdf({ labels, sampleRate, records, noiseUv = 0 }: TinyEdfOptions): Uint8Array {
  let seed = 12345;
  const noise = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0; // Numerical Recipes LCG
    return (seed / 2 ** 32 - 0.5) * 2 * noiseUv;
  };
  const ns = labels.length;
  const headerBytes = 256 * (ns + 1);
  let h = '';
  h += field('0', 8); // version
  h += field('X X X X', 80); // local patient identification (EDF+ anonymous form)
  h += field('Startdate 01-JAN-2026 X X X', 80); // local recording identification
  h += field('01.01.26', 8) + field('10.00.00', 8);
  h += field(String(headerBytes), 8);
  h += field('', 44); // reserved (plain EDF)
  h += field(String(records), 8);
  h += field('1', 8); // duration of a data record, s
  h += field(String(ns), 4);
  const perSignal = (f: (label: string) => string, width: number) => labels.map((l) => field(f(l), width)).join('');
  h += perSignal((l) => l, 16);
  h += perSignal(() => 'AgAgCl electrode', 80);
  h += perSignal(() => 'uV', 8);
  h += perSignal(() => '-3276.8', 8);
  h += perSignal(() => '3276.7', 8);
  h += perSignal(() => '-32768', 8);
  h += perSignal(() => '32767', 8);
  h += perSignal(() => 'HP:0.1Hz LP:70Hz', 80);
  h += perSignal(() => String(sampleRate), 8);
  h += perSignal(() => '', 32);
  if (h.length !== headerBytes) throw new Error(`header is ${h.length} bytes, expected ${headerBytes}`);
  const out = new Uint8Array(headerBytes + records * ns * sampleRate * 2);
  for (let i = 0; i < h.length; i++) out[i] = h.charCodeAt(i);
  const view = new DataView(out.buffer);
  let p = headerBytes;
  for (let r = 0; r < records; r++) {
    for (let s = 0; s < ns; s++) {
      for (let k = 0; k < sampleRate; k++) {
        // 10 µV sine at (s + 1) Hz: digital = physical / 0.1 µV per step
        const t = r + k / sampleRate;
        const uv = 10 * Math.sin(2 * Math.PI * (s + 1) * t) + (noiseUv > 0 ? noise() : 0);
        view.setInt16(p, Math.max(-32768, Math.min(32767, Math.round(uv * 10))), true);
        p += 2;
      }
    }
  }
  return out;
}
