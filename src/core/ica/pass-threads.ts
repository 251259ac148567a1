/**
 * Two threads for Picard's data pass (picard-pass.ts): the samples are split in halves; the calling thread
 * sums its half while a helper thread sums the other, over the same whitened data in a SharedArrayBuffer
 * (no copy), and the two sets of sums are added. PERFORMANCE.md measured ~2× for this split on the two cores.
 *
 * Protocol (one shared Int32 per evaluator; a fresh block per evaluator so an old helper loop can never pick
 * up new work): IDLE 0 → the caller writes W and sets WORK 1 + notify → the helper sums its half, writes the
 * sums, sets DONE 2 + notify → the caller adds them and sets IDLE. STOP 3 ends the helper's loop. The caller
 * blocks with Atomics.wait, which is allowed in workers and in Node's main thread (not a browser page's).
 *
 * Results are deterministic for a given number of threads; 1 and 2 threads differ at rounding level because
 * the sums are added in another order.
 *
 * Liveness: a browser may hold back the setup message to a nested worker while the posting thread is blocked
 * (observed in Chromium: the run hung at its first pass). The helper therefore acknowledges each setup through
 * control[1]; the caller waits at most `ackTimeoutMs` for it before the first pass, and if it never comes the
 * evaluator sums the helper's half itself and later evaluators stop posting (one thread, never a hang).
 */
import { accumulatePassSums, clearPassSums, createPassScratch, createPassSums, type PassEvaluator } from './picard-pass.ts';
import { installedKernelModule, installKernelModule } from '../kernels/kernels.ts';
import { WASM_TILE, type WasmModuleHandle } from '../kernels/wasm-kernels.ts';

const IDLE = 0;
const WORK = 1;
const DONE = 2;
const STOP = 3;

/** What the helper thread needs; every array lives on a SharedArrayBuffer (post it as is). */
export interface PassHelperSetup {
  readonly Z: Float32Array;
  readonly k: number;
  readonly T: number;
  readonly t0: number;
  readonly t1: number;
  readonly control: Int32Array;
  /** k × k, written by the caller before each pass. */
  readonly weights: Float64Array;
  /** [logcosh (k), sech2 (k), gTanh (k²)] written by the helper. */
  readonly sums: Float64Array;
  /** The caller's compiled kernel module (src/core/kernels), so the helper runs the same kernels; null: plain JS. */
  readonly kernelModule?: WasmModuleHandle | null;
}

/** The helper's loop: blocks between passes; returns when told to stop. */
export function runPassHelper(setup: PassHelperSetup): void {
  const { Z, k, T, t0, t1, control, weights, sums } = setup;
  if (setup.kernelModule !== undefined) installKernelModule(setup.kernelModule);
  const out = createPassSums(k);
  const scratch = createPassScratch(k);
  if (control.length > 1) {
    Atomics.store(control, 1, 1);
    Atomics.notify(control, 1);
  }
  for (;;) {
    Atomics.wait(control, 0, IDLE);
    const state = Atomics.load(control, 0);
    if (state === STOP) return;
    if (state !== WORK) {
      Atomics.wait(control, 0, state);
      continue;
    }
    clearPassSums(out);
    accumulatePassSums(Z, k, T, weights, t0, t1, scratch, out);
    sums.set(out.logcosh, 0);
    sums.set(out.sech2, k);
    sums.set(out.gTanh, 2 * k);
    Atomics.store(control, 0, DONE);
    Atomics.notify(control, 0);
  }
}

/** A data-pass evaluator that also has to be released (stops the helper's loop). */
export type ReleasableEvaluator = PassEvaluator & { release(): void };

/** Threads for the decomposition: shared allocation plus two-thread evaluators. */
export interface IcaThreads {
  /** A Float32Array the helper can read (on a SharedArrayBuffer). */
  allocate(length: number): Float32Array;
  /** An evaluator over Z (which must come from `allocate`), splitting the samples with the helper. */
  evaluator(Z: Float32Array, k: number, T: number): ReleasableEvaluator;
}

/**
 * Builds IcaThreads over a helper reached by `post` (e.g. a Worker's postMessage): each evaluator posts one
 * PassHelperSetup, on which the helper must call runPassHelper. `helperShare` is the fraction of samples the
 * helper takes (default 0.5).
 */
export function createIcaThreads(post: (setup: PassHelperSetup) => void, helperShare = 0.5, ackTimeoutMs = 1500): IcaThreads {
  /** null until the helper has answered (or failed to answer) one setup. */
  let helperResponsive: boolean | null = null;
  return {
    allocate: (length) => new Float32Array(new SharedArrayBuffer(4 * length)),
    evaluator(Z, k, T) {
      if (!(Z.buffer instanceof SharedArrayBuffer)) throw new RangeError('IcaThreads.evaluator needs Z allocated by IcaThreads.allocate');
      // Split on the kernels' tile grid (512 samples, a multiple of the JS tile): every tile is then summed exactly
      // as on one thread, and 1 and 2 threads differ only in the order the float64 tile sums are added.
      const split = Math.max(0, Math.min(T, Math.round((T * (1 - helperShare)) / WASM_TILE) * WASM_TILE));
      // control[0]: the pass state; control[1]: 1 once the helper has taken this setup.
      const control = new Int32Array(new SharedArrayBuffer(8));
      const weights = new Float64Array(new SharedArrayBuffer(8 * k * k));
      const sums = new Float64Array(new SharedArrayBuffer(8 * (2 * k + k * k)));
      const scratch = createPassScratch(k);
      let useHelper = helperResponsive !== false;
      let acknowledged = false;
      if (useHelper) post({ Z, k, T, t0: split, t1: T, control, weights, sums, kernelModule: installedKernelModule() });
      let released = false;
      const evaluate = ((W, out, poll) => {
        if (released) throw new RangeError('evaluator used after release');
        if (useHelper && !acknowledged) {
          if (Atomics.load(control, 1) === 0) Atomics.wait(control, 1, 0, ackTimeoutMs);
          acknowledged = Atomics.load(control, 1) === 1;
          helperResponsive = acknowledged;
          useHelper = acknowledged;
        }
        if (!useHelper) {
          clearPassSums(out);
          return accumulatePassSums(Z, k, T, W, 0, T, scratch, out, poll);
        }
        weights.set(W);
        Atomics.store(control, 0, WORK);
        Atomics.notify(control, 0);
        clearPassSums(out);
        const ok = accumulatePassSums(Z, k, T, W, 0, split, scratch, out, poll);
        // Wait for the helper even when cancelled: it is still reading the shared weights.
        while (Atomics.load(control, 0) === WORK) Atomics.wait(control, 0, WORK);
        for (let i = 0; i < k; i++) {
          out.logcosh[i] += sums[i];
          out.sech2[i] += sums[k + i];
        }
        for (let i = 0; i < k * k; i++) out.gTanh[i] += sums[2 * k + i];
        Atomics.store(control, 0, IDLE);
        return ok;
      }) as ReleasableEvaluator;
      evaluate.release = () => {
        if (released) return;
        released = true;
        Atomics.store(control, 0, STOP);
        Atomics.notify(control, 0);
      };
      return evaluate;
    },
  };
}
