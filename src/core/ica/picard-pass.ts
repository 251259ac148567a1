/**
 * The one data pass of Picard (picard.ts), split out so that it can run over any sample range: on one thread
 * over all samples, or on two threads over halves whose sums are added (pass-threads.ts). Over samples
 * [t0, t1) of whitened Z (k × T channel-major) and a k × k unmixing W it adds to `out`:
 *   logcosh_i += Σ_t ln cosh(y_i(t)),  sech2_i += Σ_t (1 − tanh² y_i(t)),  gTanh_ij += Σ_t tanh(y_i(t)) y_j(t)
 * with Y = W Z computed tile by tile (nothing of size T is allocated), by the kernels of src/core/kernels.
 */
import { activeKernels, type PassSums } from '../kernels/kernels.ts';

export type { PassSums };

export function createPassSums(k: number): PassSums {
  return { logcosh: new Float64Array(k), sech2: new Float64Array(k), gTanh: new Float64Array(k * k) };
}

export function clearPassSums(s: PassSums): void {
  s.logcosh.fill(0);
  s.sech2.fill(0);
  s.gTanh.fill(0);
}

/** Kept for callers that hold per-evaluator state; the kernels own their tile buffers. */
export interface PassScratch {
  readonly k: number;
}

export function createPassScratch(k: number): PassScratch {
  return { k };
}

/**
 * Adds the sums of samples [t0, t1) to `out`, with this thread's active kernels (src/core/kernels: the
 * WebAssembly SIMD kernels when installed, else plain JS). `poll` (if given) is called every 32 tiles; when it
 * returns true the pass stops early and the function returns false (the sums are then incomplete).
 */
export function accumulatePassSums(
  Z: Float32Array,
  k: number,
  T: number,
  W: Float64Array,
  t0: number,
  t1: number,
  _scratch: PassScratch,
  out: PassSums,
  poll?: () => boolean,
): boolean {
  return activeKernels().passSums(Z, k, T, W, t0, t1, out, poll);
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
