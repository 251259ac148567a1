/**
 * The simulator's own pseudo-random numbers. Every source and every part of the scenario draws from its
 * own stream, named by a string and derived from the session seed, so adding a source never changes the
 * activations of the others and the whole session is a pure function of (seed, options).
 *
 * Generator: xoshiro128** 1.1 (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4):36, 2021; reference C code at prng.di.unimi.it). 128-bit state, period 2^128 − 1, 32-bit
 * output. The state is filled from the 32-bit stream seed with splitmix32 (the 32-bit variant of Steele,
 * Lea & Flood 2014, "Fast splittable pseudorandom number generators", OOPSLA; constants of Vigna's
 * splitmix64 reduced to 32 bits as in common practice), which never yields the all-zero state in practice
 * and is checked for it below.
 *
 * Stream names are hashed with 32-bit FNV-1a (Fowler–Noll–Vo; offset basis 2166136261, prime 16777619).
 * Gaussian deviates use the 128-layer ziggurat method (Marsaglia & Tsang 2000, "The ziggurat method for
 * generating random variables", J. Stat. Softw. 5(8), with their constants r = 3.442619855899 and
 * v = 9.91256303526217e-3), which needs no logarithm or trigonometry in ~99 % of draws — a session draws
 * tens of millions of deviates. Unlike their listing, the layer index and the signed value come from two
 * different 32-bit outputs (the shared-bits weakness pointed out by Doornik 2005, "An improved ziggurat
 * method to generate normal random samples", Univ. of Oxford working paper; citation from memory).
 */

/** 32-bit FNV-1a hash of a string's UTF-16 code units (unsigned). */
export function fnv1a32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}

/** One splitmix32 step: returns [next state, output], both unsigned 32-bit. */
function splitmix32(state: number): [number, number] {
  const next = (state + 0x9e3779b9) >>> 0;
  let z = next;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
  z = (z ^ (z >>> 16)) >>> 0;
  return [next, z];
}

/** The 32-bit seed of the stream `name` within session `seed` (any finite number; truncated to uint32). */
export function streamSeed(seed: number, name: string): number {
  const s = (Math.trunc(Number.isFinite(seed) ? seed : 0) >>> 0) ^ fnv1a32(name);
  return splitmix32(s >>> 0)[1];
}

/** A seeded stream of uniform and Gaussian deviates. */
export interface Rng {
  /** Next raw 32-bit unsigned output. */
  nextUint32(): number;
  /** Uniform on [0, 1) with 32 random bits. */
  uniform(): number;
  /** Uniform on [lo, hi). */
  between(lo: number, hi: number): number;
  /** Standard normal (mean 0, variance 1), ziggurat method. */
  normal(): number;
  /** Fills `out` with independent normal deviates times `scale` (same sequence as repeated `normal()`). */
  fillNormal(out: Float64Array | Float32Array, scale?: number): void;
}

const TWO_POW_M32 = 1 / 4294967296;

// Ziggurat tables (Marsaglia & Tsang 2000, procedure zigset, 128 layers), built once.
const ZIG_R = 3.442619855899;
const ZIG_V = 9.91256303526217e-3;
const ZIG_M1 = 2147483648;
const zigK = new Float64Array(128);
const zigW = new Float64Array(128);
const zigF = new Float64Array(128);
{
  let dn = ZIG_R;
  let tn = dn;
  const q = ZIG_V / Math.exp(-0.5 * dn * dn);
  zigK[0] = Math.floor((dn / q) * ZIG_M1);
  zigK[1] = 0;
  zigW[0] = q / ZIG_M1;
  zigW[127] = dn / ZIG_M1;
  zigF[0] = 1;
  zigF[127] = Math.exp(-0.5 * dn * dn);
  for (let i = 126; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(ZIG_V / dn + Math.exp(-0.5 * dn * dn)));
    zigK[i + 1] = Math.floor((dn / tn) * ZIG_M1);
    tn = dn;
    zigF[i] = Math.exp(-0.5 * dn * dn);
    zigW[i] = dn / ZIG_M1;
  }
}

/** xoshiro128** seeded from `seed` (uint32) through splitmix32. */
export function createRng(seed: number): Rng {
  let sm = Math.trunc(seed) >>> 0;
  const st = new Uint32Array(4);
  for (let i = 0; i < 4; i++) {
    const [next, out] = splitmix32(sm);
    sm = next;
    st[i] = out;
  }
  if ((st[0] | st[1] | st[2] | st[3]) === 0) st[0] = 1; // the one forbidden state

  const nextUint32 = (): number => {
    const s0 = st[0];
    const s1 = st[1];
    const s2 = st[2];
    const s3 = st[3];
    // result = rotl(s1 * 5, 7) * 9
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = s1 << 9;
    const n2 = s2 ^ s0;
    const n3 = s3 ^ s1;
    const n1 = s1 ^ n2;
    const n0 = s0 ^ n3;
    st[0] = n0;
    st[1] = n1;
    st[2] = n2 ^ t;
    st[3] = (n3 << 11) | (n3 >>> 21);
    return result;
  };

  const uniform = (): number => nextUint32() * TWO_POW_M32;

  /** The slow path of the ziggurat (base strip or wedge), Marsaglia & Tsang's nfix. */
  const normalTail = (hz: number, iz: number): number => {
    for (;;) {
      const x = hz * zigW[iz];
      if (iz === 0) {
        let xt: number;
        let yt: number;
        do {
          xt = -Math.log(1 - uniform()) / ZIG_R;
          yt = -Math.log(1 - uniform());
        } while (yt + yt < xt * xt);
        return hz > 0 ? ZIG_R + xt : -ZIG_R - xt;
      }
      if (zigF[iz] + uniform() * (zigF[iz - 1] - zigF[iz]) < Math.exp(-0.5 * x * x)) return x;
      iz = nextUint32() & 127;
      hz = nextUint32() | 0;
      if (Math.abs(hz) < zigK[iz]) return hz * zigW[iz];
    }
  };

  const normal = (): number => {
    const iz = nextUint32() & 127;
    const hz = nextUint32() | 0;
    return Math.abs(hz) < zigK[iz] ? hz * zigW[iz] : normalTail(hz, iz);
  };

  return {
    nextUint32,
    uniform,
    between: (lo, hi) => lo + (hi - lo) * uniform(),
    normal,
    fillNormal(out, scale = 1) {
      for (let i = 0; i < out.length; i++) out[i] = scale * normal();
    },
  };
}
/** The stream `name` of session `seed`. */
export function streamRng(seed: number, name: string): Rng {
  return createRng(streamSeed(seed, name));
}
