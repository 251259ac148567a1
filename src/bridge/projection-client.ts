/**
 * Client of workers/projection.worker.ts. One worker serves the preview; calls queue in order (comlink
 * handles one message at a time per worker). The worker is shut down after 10 s idle and started again on
 * the next call. An AbortSignal cannot cross to the worker: a caller whose inputs changed simply ignores
 * the stale result (the jobs are a few milliseconds long).
 */
import { wrap, type Remote } from 'comlink';
import { rethrowFromWorker } from '../core/coded-error.ts';
import type { ProjectionApi } from '../../workers/projection.worker.ts';
import type { WindowActivationsInput } from '../core/review/preview-projection.ts';
import type { WholeRegionSpectra, WholeRegionSpectraInput } from '../core/review/whole-spectra.ts';

const IDLE_MS = 10_000;

let worker: Worker | null = null;
let remote: Remote<ProjectionApi> | null = null;
let idleTimer: ReturnType<typeof setTimeout> | null = null;
let pending = 0;

/** True where module workers exist (the browser); false in node tests, where callers compute inline. */
export function projectionWorkerAvailable(): boolean {
  return typeof Worker !== 'undefined';
}

function api(): Remote<ProjectionApi> {
  if (idleTimer) {
    clearTimeout(idleTimer);
    idleTimer = null;
  }
  if (!remote) {
    worker = new Worker(new URL('../../workers/projection.worker.ts', import.meta.url), { type: 'module', name: 'projection' });
    remote = wrap<ProjectionApi>(worker);
  }
  return remote;
}

function scheduleIdleShutdown(): void {
  if (pending > 0) return;
  idleTimer = setTimeout(() => {
    worker?.terminate();
    worker = null;
    remote = null;
    idleTimer = null;
    sentSamples = null;
  }, IDLE_MS);
}

/**
 * S_w = W (X_w − m) for one window, computed in the worker. `window` and `unmixing` are copied to the
 * worker (the caller keeps them); the result is transferred back.
 */
export async function windowActivationsInWorker(input: WindowActivationsInput): Promise<Float64Array> {
  pending++;
  try {
    return await api().activations(input).catch(rethrowFromWorker);
  } finally {
    pending--;
    scheduleIdleShutdown();
  }
}

/** The samples the running worker holds, and their id. */
let sentSamples: { data: Float32Array; id: number } | null = null;
let nextSamplesId = 1;

/**
 * Region spectra before/after over the whole recording (src/core/review/whole-spectra.ts), computed in the
 * worker. The samples cross once per recording (shared, not copied, when they live on a
 * SharedArrayBuffer); later calls send only the weights of the removed set.
 */
export async function wholeRegionSpectraInWorker(input: WholeRegionSpectraInput): Promise<WholeRegionSpectra> {
  pending++;
  try {
    const { data, ...rest } = input;
    const plain = { ...rest, rows: Array.from(rest.rows), roi: [...rest.roi] };
    for (let attempt = 0; attempt < 2; attempt++) {
      const fresh = !sentSamples || sentSamples.data !== data;
      if (fresh) sentSamples = { data, id: nextSamplesId++ };
      const id = sentSamples!.id;
      const out = await api().wholeSpectra(id, fresh ? data : null, plain).catch(rethrowFromWorker);
      if (out) return out;
      sentSamples = null;
    }
    throw new Error('the projection worker did not keep the recording samples');
  } finally {
    pending--;
    scheduleIdleShutdown();
  }
}
