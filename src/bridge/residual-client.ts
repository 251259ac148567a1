/**
 * Client of workers/residual.worker.ts: what remains on the cleaned channels after the decisions
 * (src/core/review/residual.ts). One worker per call, terminated when the call ends or is aborted.
 */
import { wrap } from 'comlink';
import { rethrowFromWorker } from '../core/coded-error.ts';
import type { Decomposition } from '../core/decomposition.ts';
import type { LoadedRecording } from '../core/recording.ts';
import type { ResidualResult } from '../core/review/residual.ts';
import type { ResidualApi } from '../../workers/residual.worker.ts';

function abortError(): Error {
  const e = new Error('residual check cancelled');
  e.name = 'AbortError';
  return e;
}

/** Rejects with an Error named 'AbortError' when `signal` aborts, or with the worker's fault as a CodedError (code kept). */
export async function computeResidualInWorker(
  recording: LoadedRecording,
  decomposition: Decomposition,
  removed: readonly number[],
  signal: AbortSignal,
): Promise<ResidualResult> {
  if (signal.aborted) throw abortError();
  const worker = new Worker(new URL('../../workers/residual.worker.ts', import.meta.url), { type: 'module', name: 'residual' });
  let onAbort: (() => void) | null = null;
  const aborted = new Promise<never>((_, reject) => {
    onAbort = () => {
      worker.terminate();
      reject(abortError());
    };
    signal.addEventListener('abort', onAbort, { once: true });
  });
  try {
    const remote = wrap<ResidualApi>(worker);
    return await Promise.race([remote.residual(recording, decomposition, [...removed]).catch(rethrowFromWorker), aborted]);
  } finally {
    if (onAbort) signal.removeEventListener('abort', onAbort);
    worker.terminate();
  }
}
