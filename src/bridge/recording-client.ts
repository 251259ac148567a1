/**
 * Client of workers/recording.worker.ts. Each call gets its own worker, terminated when the call ends or
 * its AbortSignal fires (terminating is the only way to stop a parse or an export already running). A bad file
 * comes back as a parse result; a fault in the worker rejects as a CodedError with its code (src/core/coded-error.ts).
 */
import { proxy, wrap, type Remote } from 'comlink';
import { rethrowFromWorker } from '../core/coded-error.ts';
import type { CleanedExportRequest, LoadResult, RecordingWorkerApi } from '../../workers/recording.worker.ts';

export type { CleanedExportRequest, LoadResult } from '../../workers/recording.worker.ts';

async function withWorker<T>(signal: AbortSignal, run: (api: Remote<RecordingWorkerApi>) => Promise<T>): Promise<T> {
  signal.throwIfAborted();
  const worker = new Worker(new URL('../../workers/recording.worker.ts', import.meta.url), { type: 'module', name: 'recording' });
  const api = wrap<RecordingWorkerApi>(worker);
  let onAbort: (() => void) | null = null;
  const aborted = new Promise<never>((_, reject) => {
    onAbort = () => reject(signal.reason ?? new DOMException('Aborted', 'AbortError'));
    signal.addEventListener('abort', onAbort, { once: true });
  });
  try {
    return await Promise.race([run(api).catch(rethrowFromWorker), aborted]);
  } finally {
    if (onAbort) signal.removeEventListener('abort', onAbort);
    worker.terminate();
  }
}

/** Parses a recording and its sidecars in a worker; samples come back in shared memory when isolated. */
export function readRecordingInWorker(files: readonly File[], signal: AbortSignal, onProgress: (f: number) => void): Promise<LoadResult> {
  return withWorker<LoadResult>(signal, async (api) => (await api.load([...files], proxy(onProgress))) as LoadResult);
}

/** Writes the cleaned recording (EDF+/BDF+ bytes) in a worker, with warnings about channels it could not copy. */
export function writeCleanedInWorker(req: CleanedExportRequest, signal: AbortSignal, onProgress: (f: number) => void): Promise<{ bytes: Uint8Array; warnings: string[] }> {
  return withWorker(signal, (api) => api.writeCleaned(req, proxy(onProgress)));
}
