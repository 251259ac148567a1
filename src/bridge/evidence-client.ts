/**
 * Client of workers/evidence.worker.ts. One evidence job uses up to two workers (this machine class has two
 * cores; PERFORMANCE.md), each computing a contiguous half of the components; the halves are joined in
 * index order (src/core/evidence/partition.ts). Each job owns its workers and terminates them when it ends
 * or is aborted — terminating is the only way to stop a call that is already running.
 *
 * The recording samples are structured-cloned into each worker unless `input.data` lives on a
 * SharedArrayBuffer (cross-origin isolated pages), in which case both workers read the same memory.
 */
import { proxy, wrap } from 'comlink';
import { rethrowFromWorker } from '../core/coded-error.ts';
import type { EvidenceResult } from '../core/evidence/compute-evidence.ts';
import { mergeEvidenceResults, splitComponentRanges } from '../core/evidence/partition.ts';
import type { EvidenceApi, EvidenceJobInput } from '../../workers/evidence.worker.ts';

function abortError(): Error {
  const e = new Error('evidence cancelled');
  e.name = 'AbortError';
  return e;
}

export interface EvidenceWorkerOptions {
  /** Number of workers (default: min(2, hardwareConcurrency), and 1 for fewer than 8 components). */
  readonly workers?: number;
}

/**
 * Computes the evidence of every component (or of `input.componentRange`) in workers. `onProgress` gets the
 * overall fraction done (0–1) and the stage. Rejects with an Error named 'AbortError' when `signal` aborts,
 * or with the worker's fault as a CodedError (code kept; src/core/coded-error.ts).
 */
export async function computeEvidenceInWorker(
  input: EvidenceJobInput,
  signal: AbortSignal,
  onProgress: (fraction: number, stage: string) => void,
  options: EvidenceWorkerOptions = {},
): Promise<EvidenceResult> {
  if (signal.aborted) throw abortError();
  const [start, end] = input.componentRange ?? [0, input.decomposition.nComponents];
  const cores = typeof navigator !== 'undefined' && navigator.hardwareConcurrency ? navigator.hardwareConcurrency : 2;
  const wanted = options.workers ?? (end - start < 8 ? 1 : Math.min(2, cores));
  const ranges = splitComponentRanges(end - start, wanted).map(([a, b]) => [a + start, b + start] as [number, number]);
  const workers = ranges.map((_, i) => new Worker(new URL('../../workers/evidence.worker.ts', import.meta.url), { type: 'module', name: `evidence-${i + 1}` }));
  const fractions = ranges.map(() => 0);
  const total = Math.max(1, end - start);
  let onAbort: (() => void) | null = null;
  const aborted = new Promise<never>((_, reject) => {
    onAbort = () => {
      for (const w of workers) w.terminate();
      reject(abortError());
    };
    signal.addEventListener('abort', onAbort, { once: true });
  });
  try {
    const jobs = ranges.map((range, i) => {
      const remote = wrap<EvidenceApi>(workers[i]);
      const weight = (range[1] - range[0]) / total;
      return remote.computeEvidence(
        { ...input, componentRange: range },
        proxy((fraction: number, stage: string) => {
          fractions[i] = fraction * weight;
          if (!signal.aborted) onProgress(fractions.reduce((s, f) => s + f, 0), stage);
        }),
      ).catch(rethrowFromWorker);
    });
    const parts = await Promise.race([Promise.all(jobs), aborted]);
    return mergeEvidenceResults(parts);
  } finally {
    if (onAbort) signal.removeEventListener('abort', onAbort);
    for (const w of workers) w.terminate();
  }
}
