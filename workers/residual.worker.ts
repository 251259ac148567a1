/**
 * Residual worker (wiring only): runs src/core/review/residual.ts residualForReview — clean the recording
 * of the removed components and measure what remains — off the main thread. Abort: the client terminates it.
 */
import { expose } from 'comlink';
import { guardWorkerApi } from '../src/core/coded-error.ts';
import type { Decomposition } from '../src/core/decomposition.ts';
import type { LoadedRecording } from '../src/core/recording.ts';
import { residualForReview, type ResidualResult } from '../src/core/review/residual.ts';

const api = {
  residual(recording: LoadedRecording, decomposition: Decomposition, removed: number[]): ResidualResult {
    return residualForReview(recording, decomposition, removed);
  },
};

export type ResidualApi = typeof api;
// Faults cross as WireErrors (code kept); the bridge client rethrows them as CodedError.
expose(guardWorkerApi(api));
