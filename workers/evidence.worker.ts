/**
 * Evidence worker (wiring only): runs src/core/evidence/compute-evidence.ts for a range of components off
 * the main thread. Progress goes back through a comlink-proxied callback; the result's typed arrays are
 * transferred, not copied. Abort: the client terminates the worker.
 */
import { expose, transfer } from 'comlink';
import { guardWorkerApi } from '../src/core/coded-error.ts';
import { computeEvidence, type EvidenceInput, type EvidenceResult } from '../src/core/evidence/compute-evidence.ts';

/** What crosses to the worker: functions cannot be cloned, so progress is a separate proxied argument. */
export type EvidenceJobInput = Omit<EvidenceInput, 'onProgress' | 'dipoleFit'>;

/** Every distinct ArrayBuffer under the result (some arrays share one, e.g. an ERP's and its image's times). */
function resultBuffers(result: EvidenceResult): ArrayBuffer[] {
  const seen = new Set<ArrayBuffer>();
  const add = (a: ArrayBufferView | null | undefined) => {
    if (a && a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  };
  for (const c of result.components) {
    add(c.variancePerChannel);
    add(c.map);
    add(c.spectrum.frequencies);
    add(c.spectrum.power);
    add(c.spectrum.powerDb);
    if (c.erp) {
      add(c.erp.times);
      add(c.erp.mean);
      add(c.erp.band.lower);
      add(c.erp.band.upper);
    }
    if (c.trialStack) {
      add(c.trialStack.data);
      add(c.trialStack.times);
      add(c.trialStack.responseTimes);
    }
  }
  return [...seen];
}

const api = {
  computeEvidence(input: EvidenceJobInput, onProgress: ((fraction: number, stage: string) => void) | null): EvidenceResult {
    // The proxied call returns a promise we do not await: progress is fire-and-forget.
    const result = computeEvidence({ ...input, onProgress: onProgress ? (f, s) => void onProgress(f, s) : undefined });
    return transfer(result, resultBuffers(result));
  },
};

export type EvidenceApi = typeof api;
// Faults cross as WireErrors (code kept); the bridge client rethrows them as CodedError.
expose(guardWorkerApi(api));
