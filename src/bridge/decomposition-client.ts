/**
 * Client of workers/decomposition.worker.ts. Each decomposition gets its own worker (a run lasts seconds to
 * minutes), which is terminated when the run ends or is aborted: terminating is the only way to stop a call
 * that is already running (squoosh's worker-bridge pattern). Where SharedArrayBuffer is available
 * (cross-origin isolated pages) the abort is also signalled through a shared flag first, so the core stops
 * between tiles even if termination were delayed.
 *
 * The recording samples are structured-cloned into the worker unless `input.data` lives on a
 * SharedArrayBuffer, in which case the worker reads the same memory (no copy).
 */
import { proxy, wrap } from 'comlink';
import { rethrowFromWorker } from '../core/coded-error.ts';
import type { Decomposition } from '../core/decomposition.ts';
import type { DecomposeInput, DecomposeProgress, DecomposeResult } from '../core/ica/decompose.ts';
import type { DecompositionApi, DecomposeJobOptions } from '../../workers/decomposition.worker.ts';

function abortError(): Error {
  const e = new Error('decomposition cancelled');
  e.name = 'AbortError';
  return e;
}

/**
 * Runs a decomposition in a dedicated worker and resolves with the full result (decomposition, rank reason,
 * warnings, variance shares). Rejects with an Error named 'AbortError' when `signal` aborts (the worker is
 * terminated), or with the worker's error as a CodedError (code, name and message kept; src/core/coded-error.ts).
 */
export async function runDecompositionDetailed(
  input: DecomposeInput,
  opts: DecomposeJobOptions,
  signal: AbortSignal,
  onProgress: (p: DecomposeProgress) => void,
): Promise<DecomposeResult> {
  if (signal.aborted) throw abortError();
  const worker = new Worker(new URL('../../workers/decomposition.worker.ts', import.meta.url), { type: 'module', name: 'decomposition' });
  const remote = wrap<DecompositionApi>(worker);
  const flag = typeof SharedArrayBuffer !== 'undefined' && globalThis.crossOriginIsolated === true ? new Int32Array(new SharedArrayBuffer(4)) : null;
  let onAbort: (() => void) | null = null;
  const aborted = new Promise<never>((_, reject) => {
    onAbort = () => {
      if (flag) Atomics.store(flag, 0, 1);
      worker.terminate();
      reject(abortError());
    };
    signal.addEventListener('abort', onAbort, { once: true });
  });
  try {
    return await Promise.race([remote.decompose(input, opts, proxy(onProgress), flag).catch(rethrowFromWorker), aborted]);
  } finally {
    if (onAbort) signal.removeEventListener('abort', onAbort);
    worker.terminate();
  }
}

/** The contract: the decomposition only (see runDecompositionDetailed for rank reason and warnings). */
export async function runDecomposition(
  input: DecomposeInput,
  opts: DecomposeJobOptions,
  signal: AbortSignal,
  onProgress: (p: DecomposeProgress) => void,
): Promise<Decomposition> {
  return (await runDecompositionDetailed(input, opts, signal, onProgress)).decomposition;
}
