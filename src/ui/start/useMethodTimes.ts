/**
 * Times each decomposition method on the loaded recording: a short run of the same pipeline on its first
 * 30 s in the decomposition worker (Picard first, then extended Infomax, one at a time), scaled to the
 * recording's length (src/core/ica/time-estimate.ts). Runs once per recording while the offer to decompose
 * is shown and nothing else is running; leaving the screen or starting a decomposition stops it (a stopped
 * timing starts again from the method not yet timed).
 */
import { useEffect, useState } from 'react';
import { runDecompositionDetailed } from '../../bridge/decomposition-client.ts';
import { estimateFullSeconds, timingSlice, type TimeEstimate } from '../../core/ica/time-estimate.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { decomposeInputOf } from '../../core/recording-input.ts';

export type MethodKey = 'picard' | 'infomax';
export type MethodTimes = Partial<Record<MethodKey, TimeEstimate | 'failed'>>;

/** Seconds of the recording timed, and the iteration cap of the timing runs. */
export const TIMING_SECONDS = 30;
const TIMING_MAX_ITER = 200;

const cache = new WeakMap<LoadedRecording, MethodTimes>();

export function useMethodTimes(recording: LoadedRecording | null, seed: number, highpassHz: number, enabled = true): MethodTimes {
  const [times, setTimes] = useState<MethodTimes>(() => (recording ? cache.get(recording) ?? {} : {}));
  useEffect(() => {
    if (!recording || !enabled || typeof Worker === 'undefined') return;
    const known = cache.get(recording);
    if (known && known.picard && known.infomax) {
      setTimes(known);
      return;
    }
    const controller = new AbortController();
    const full = decomposeInputOf(recording);
    const slice = timingSlice(full, TIMING_SECONDS);
    const out: MethodTimes = { ...known };
    void (async () => {
      for (const method of ['picard', 'infomax'] as const) {
        if (controller.signal.aborted) return;
        if (out[method]) continue;
        let t0: number | null = null;
        try {
          const r = await runDecompositionDetailed(
            slice,
            { method, seed, highpassHz: highpassHz > 0 ? highpassHz : null, maxIter: TIMING_MAX_ITER },
            controller.signal,
            () => {
              // From the pipeline's first report, so the worker's start-up is not scaled with the data.
              if (t0 === null) t0 = performance.now();
            },
          );
          const seconds = (performance.now() - (t0 ?? performance.now())) / 1000;
          out[method] = estimateFullSeconds(seconds, slice.nSamples, full.nSamples, !r.decomposition.converged);
        } catch (e) {
          if ((e as Error)?.name === 'AbortError') return;
          out[method] = 'failed';
        }
        cache.set(recording, { ...out });
        setTimes({ ...out });
      }
    })();
    return () => controller.abort();
    // The timing is for the method on this recording; seed and high-pass change it little.
  }, [recording, enabled]);
  return times;
}
