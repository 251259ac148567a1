/**
 * Decomposition worker (wiring only): runs src/core/ica/decompose.ts off the main thread. Progress goes back
 * through a comlink-proxied callback (the core reports at most every `progressIntervalMs`, default 250 ms, so
 * at least twice a second while it works). Cancel: the client may pass an Int32Array over a SharedArrayBuffer
 * whose element 0 it sets to 1 (the core polls it between tiles of work), and in any case terminates the
 * worker on abort. The result's matrices are transferred, not copied.
 */
import { expose, transfer } from 'comlink';
import { decomposeRecording, type DecomposeInput, type DecomposeOptions, type DecomposeProgress, type DecomposeResult } from '../src/core/ica/decompose.ts';

export type DecomposeJobOptions = Omit<DecomposeOptions, 'onProgress' | 'signal'>;

const api = {
  decompose(
    input: DecomposeInput,
    opts: DecomposeJobOptions,
    onProgress: ((p: DecomposeProgress) => void) | null,
    cancelFlag: Int32Array | null,
  ): DecomposeResult {
    const signal = {
      get aborted() {
        return cancelFlag !== null && Atomics.load(cancelFlag, 0) !== 0;
      },
    };
    const result = decomposeRecording(input, {
      ...opts,
      signal,
      // The proxied call returns a promise we do not await: progress is fire-and-forget.
      onProgress: onProgress ? (p) => void onProgress(p) : undefined,
    });
    const d = result.decomposition;
    const buffers = [d.mixing.buffer, d.unmixing.buffer, result.varianceShare.buffer, result.eigenvalues.buffer] as ArrayBuffer[];
    if (d.channelMeans) buffers.push(d.channelMeans.buffer as ArrayBuffer);
    return transfer(result, buffers);
  },
};

export type DecompositionApi = typeof api;
expose(api);
