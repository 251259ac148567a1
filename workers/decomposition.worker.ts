/**
 * Decomposition worker (wiring only): runs src/core/ica/decompose.ts off the main thread. Progress goes back
 * through a comlink-proxied callback (the core reports at most every `progressIntervalMs`, default 250 ms, so
 * at least twice a second while it works). Cancel: the client may pass an Int32Array over a SharedArrayBuffer
 * whose element 0 it sets to 1 (the core polls it between tiles of work), and in any case terminates the
 * worker on abort. The result's matrices are transferred, not copied.
 *
 * When the page is cross-origin isolated (SharedArrayBuffer available), Picard's data passes are split with a
 * nested helper worker (decomposition-helper.worker.ts, src/core/ica/pass-threads.ts): both cores work.
 */
import { expose, transfer } from 'comlink';
import { guardWorkerApi } from '../src/core/coded-error.ts';
import { createIcaThreads, type IcaThreads } from '../src/core/ica/pass-threads.ts';
import { decomposeRecording, type DecomposeInput, type DecomposeOptions, type DecomposeProgress, type DecomposeResult } from '../src/core/ica/decompose.ts';
import { installKernelModule } from '../src/core/kernels/kernels.ts';
import kernelsUrl from '../build/wasm/kernels.wasm?url';

let kernels: Promise<unknown> | null = null;
/**
 * Loads and installs the WebAssembly SIMD kernels once (src/core/kernels); on any failure (no SIMD, or a
 * Content-Security-Policy without 'wasm-unsafe-eval') the JS kernels stay. Vite inlines the small module as a
 * data: URL, decoded here rather than fetched (connect-src allows only the page's origin).
 */
function ensureKernels(): Promise<unknown> {
  const bytes = kernelsUrl.startsWith('data:')
    ? Promise.resolve(Uint8Array.from(atob(kernelsUrl.slice(kernelsUrl.indexOf(',') + 1)), (c) => c.charCodeAt(0)))
    : fetch(kernelsUrl).then((r) => r.arrayBuffer());
  kernels ??= bytes
    .then((b) => WebAssembly.compile(b))
    .then((m) => installKernelModule(m))
    .catch(() => installKernelModule(null));
  return kernels;
}

/** Options that cross to the worker (callbacks, the abort signal and threads are supplied on the worker side). */
export type DecomposeJobOptions = Omit<DecomposeOptions, 'onProgress' | 'signal' | 'threads'>;

let helper: Promise<IcaThreads | null> | null = null;

/** Starts the helper once per worker life; null where SharedArrayBuffer or nested workers are unavailable. */
function helperThreads(): Promise<IcaThreads | null> {
  if (!helper) {
    helper = new Promise((resolve) => {
      if (typeof SharedArrayBuffer === 'undefined' || globalThis.crossOriginIsolated !== true || typeof Worker === 'undefined') {
        resolve(null);
        return;
      }
      try {
        const w = new Worker(new URL('./decomposition-helper.worker.ts', import.meta.url), { type: 'module', name: 'decomposition-helper' });
        const timer = setTimeout(() => resolve(null), 5000);
        w.addEventListener('message', (e) => {
          if (e.data !== 'ready') return;
          clearTimeout(timer);
          resolve(createIcaThreads((setup) => w.postMessage(setup)));
        });
        w.addEventListener('error', () => resolve(null));
      } catch {
        resolve(null);
      }
    });
  }
  return helper;
}

const api = {
  async decompose(
    input: DecomposeInput,
    opts: DecomposeJobOptions,
    onProgress: ((p: DecomposeProgress) => void) | null,
    cancelFlag: Int32Array | null,
  ): Promise<DecomposeResult> {
    await ensureKernels();
    const threads = opts.method === 'picard' ? await helperThreads() : null;
    const signal = {
      get aborted() {
        return cancelFlag !== null && Atomics.load(cancelFlag, 0) !== 0;
      },
    };
    const result = decomposeRecording(input, {
      ...opts,
      signal,
      threads: threads ?? undefined,
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
// Faults cross as WireErrors (code kept); the bridge client rethrows them as CodedError.
expose(guardWorkerApi(api));
