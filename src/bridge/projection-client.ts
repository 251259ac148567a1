/**
 * Client of workers/projection.worker.ts. One worker serves the preview; calls queue in order (comlink
 * handles one message at a time per worker). The worker is shut down after 10 s idle and started again on
 * the next call. An AbortSignal cannot cross to the worker: a caller whose inputs changed simply ignores
 * the stale result (the jobs are a few milliseconds long).
 */
import { wrap, type Remote } from 'comlink';
import type { ProjectionApi } from '../../workers/projection.worker.ts';
import type { WindowActivationsInput } from '../core/review/preview-projection.ts';

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
  }, IDLE_MS);
}

/**
 * S_w = W (X_w − m) for one window, computed in the worker. `window` and `unmixing` are copied to the
 * worker (the caller keeps them); the result is transferred back.
 */
export async function windowActivationsInWorker(...input: WindowActivationsInput): Promise<Float64Array> {
  pending++;
  try {
    return await api().activations(...input);
  } finally {
    pending--;
    scheduleIdleShutdown();
  }
}
