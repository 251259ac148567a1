/**
 * Projection worker (wiring only): the activations S_w = W (X_w − m) of one preview window, computed with
 * the core's register-blocked kernel off the main thread. The result is transferred, not copied.
 */
import { expose, transfer } from 'comlink';
import { windowActivations, type WindowActivationsInput } from '../src/core/review/preview-projection.ts';

const api = {
  /** k × length activations of a channel-major n × length window (see windowActivations). */
  activations(...input: WindowActivationsInput): Float64Array {
    const out = windowActivations(...input);
    return transfer(out, [out.buffer]);
  },
};

export type ProjectionApi = typeof api;
expose(api);
