/**
 * Seeded pseudo-random numbers for the decomposition engine, so the same seed gives the same result bit for
 * bit. Generator: mulberry32 (Tommy Ettinger, 2017, public domain), a 32-bit state with a Weyl increment
 * 0x6D2B79F5 and an xorshift-multiply output mix; period 2^32, adequate for shuffling and initial matrices.
 */
export interface Prng {
  /** Uniform double in [0, 1) with 32 random bits. */
  next(): number;
  /** Standard normal deviate (Box–Muller, cosine branch only: one uniform pair per call). */
  normal(): number;
  /** Uniform integer in [0, n). */
  int(n: number): number;
}

/** Creates a mulberry32 generator; `seed` is reduced to 32 bits (non-integers are truncated). */
export function createPrng(seed: number): Prng {
  let a = (Math.trunc(seed) >>> 0) ^ 0x9e3779b9;
  const next = (): number => {
    a = (a + 0x6d2b79f5) | 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    normal() {
      const u1 = 1 - next(); // (0, 1]: log is finite
      const u2 = next();
      return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
    },
    int(n: number) {
      return Math.floor(next() * n);
    },
  };
}

/** Fisher–Yates shuffle of `out` in place (Knuth, TAOCP vol. 2, Algorithm P). */
export function shuffleInPlace(out: Uint32Array, rng: Prng): Uint32Array {
  for (let i = out.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    const t = out[i];
    out[i] = out[j];
    out[j] = t;
  }
  return out;
}
