/**
 * The one data pass of Picard (picard.ts), split out so that it can run over any sample range: on one thread
 * over all samples, or on two threads over halves whose sums are added (pass-threads.ts). Over samples
 * [t0, t1) of whitened Z (k × T channel-major) and a k × k unmixing W it adds to `out`:
 *   logcosh_i += Σ_t ln cosh(y_i(t)),  sech2_i += Σ_t (1 − tanh² y_i(t)),  gTanh_ij += Σ_t tanh(y_i(t)) y_j(t)
 * with Y = W Z computed tile by tile (nothing of size T is allocated).
 */
import { accumulateProductTransposed, multiplyChannelMajor, SAMPLE_TILE } from '../linalg/matmul.ts';
import { fastLogCosh, fastTanh } from './fast-tanh.ts';

/** Unnormalised sums of one pass (see the module comment). */
export interface PassSums {
  readonly logcosh: Float64Array;
  readonly sech2: Float64Array;
  readonly gTanh: Float64Array;
}

export function createPassSums(k: number): PassSums {
  return { logcosh: new Float64Array(k), sech2: new Float64Array(k), gTanh: new Float64Array(k * k) };
}

export function clearPassSums(s: PassSums): void {
  s.logcosh.fill(0);
  s.sech2.fill(0);
  s.gTanh.fill(0);
}

export interface PassScratch {
  readonly Ytile: Float64Array;
  readonly Ptile: Float64Array;
}

export function createPassScratch(k: number): PassScratch {
  return { Ytile: new Float64Array(k * SAMPLE_TILE), Ptile: new Float64Array(k * SAMPLE_TILE) };
}

/**
 * Adds the sums of samples [t0, t1) to `out`. `poll` (if given) is called every 32 tiles; when it returns
 * true the pass stops early and the function returns false (the sums are then incomplete).
 */
export function accumulatePassSums(
  Z: Float32Array,
  k: number,
  T: number,
  W: Float64Array,
  t0: number,
  t1: number,
  scratch: PassScratch,
  out: PassSums,
  poll?: () => boolean,
): boolean {
  const { Ytile, Ptile } = scratch;
  let tiles = 0;
  for (let a = t0; a < t1; a += SAMPLE_TILE) {
    const b = Math.min(t1, a + SAMPLE_TILE);
    const len = b - a;
    multiplyChannelMajor(W, k, k, Z, T, Ytile, a, b);
    // The kernel writes rows with stride `len`; the accumulation below reads stride SAMPLE_TILE.
    if (len !== SAMPLE_TILE) for (let i = k - 1; i >= 0; i--) Ytile.copyWithin(i * SAMPLE_TILE, i * len, i * len + len);
    for (let i = 0; i < k; i++) {
      let lc = 0;
      let s2 = 0;
      const o = i * SAMPLE_TILE;
      for (let t = 0; t < len; t++) {
        const y = Ytile[o + t];
        const th = fastTanh(y);
        Ptile[o + t] = th;
        s2 += th * th;
        lc += fastLogCosh(y);
      }
      out.logcosh[i] += lc;
      out.sech2[i] += len - s2;
    }
    accumulateProductTransposed(Ptile, SAMPLE_TILE, k, Ytile, SAMPLE_TILE, k, len, out.gTanh);
    if (poll && ++tiles % 32 === 0 && poll()) return false;
  }
  return true;
}

/**
 * Fills `out` with the sums over all T samples at W (clearing it first). Returns false when a poll asked to
 * stop. Single-threaded default: accumulatePassSums over [0, T).
 */
export type PassEvaluator = (W: Float64Array, out: PassSums, poll?: () => boolean) => boolean;

export function singleThreadEvaluator(Z: Float32Array, k: number, T: number): PassEvaluator {
  const scratch = createPassScratch(k);
  return (W, out, poll) => {
    clearPassSums(out);
    return accumulatePassSums(Z, k, T, W, 0, T, scratch, out, poll);
  };
}
