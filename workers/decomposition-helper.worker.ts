/**
 * Helper thread of the decomposition worker (wiring only): receives PassHelperSetup messages (arrays on
 * SharedArrayBuffers) and runs src/core/ica/pass-threads.ts runPassHelper on each, which blocks between
 * passes with Atomics.wait and returns when the run releases it. Posts 'ready' once loaded, so the parent
 * never blocks before this thread can take work.
 */
import { runPassHelper, type PassHelperSetup } from '../src/core/ica/pass-threads.ts';

self.addEventListener('message', (e: MessageEvent<PassHelperSetup>) => runPassHelper(e.data));
self.postMessage('ready');
