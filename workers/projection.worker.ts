/**
 * Projection worker (wiring only): the activations S_w = W (X_w − m) of one preview window, computed with
 * the core's register-blocked kernel off the main thread. The result is transferred, not copied.
 */
import { expose, transfer } from 'comlink';
import { guardWorkerApi } from '../src/core/coded-error.ts';
import { windowActivations, type WindowActivationsInput } from '../src/core/review/preview-projection.ts';
import { wholeRegionSpectra, type WholeRegionSpectraInput } from '../src/core/review/whole-spectra.ts';

/** The recording samples last sent (kept so each verdict change sends only the weights). */
let samples: { id: number; data: Float32Array } | null = null;

const api = {
  /** k × length activations of a channel-major n × length window (see windowActivations). */
  activations(input: WindowActivationsInput): Float64Array {
    const out = windowActivations(input);
    return transfer(out, [out.buffer]);
  },
  /**
   * Whole-recording region spectra before/after (see wholeRegionSpectra). `data` is sent once per `dataId`
   * and null afterwards; returns null when the worker no longer holds the samples of `dataId` (the client
   * then sends them again).
   */
  wholeSpectra(dataId: number, data: Float32Array | null, input: Omit<WholeRegionSpectraInput, 'data'>) {
    if (data) samples = { id: dataId, data };
    if (!samples || samples.id !== dataId) return null;
    const out = wholeRegionSpectra({ ...input, data: samples.data });
    return transfer(out, [out.before.buffer, out.after.buffer, out.frequencies.buffer]);
  },
};

export type ProjectionApi = typeof api;
// Faults cross as WireErrors (code kept); the bridge client rethrows them as CodedError.
expose(guardWorkerApi(api));
