/**
 * The preview's window: the original samples of the decomposition channels for [start, end), their
 * activations S_w = W (X_w − m) (in the projection worker when it pays off, else inline), and the cleaned
 * copy that verdict changes update incrementally. A result that arrives after the inputs changed is
 * dropped.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { createPreviewWindow, extractWindow, windowActivations, type PreviewWindow } from '../../core/review/preview-projection.ts';
import { projectionWorkerAvailable, windowActivationsInWorker } from '../../bridge/projection-client.ts';

/** Below this many multiply-adds (k·n·L) the activations are computed inline: ~1 ms of work. */
const INLINE_LIMIT = 2_000_000;

export function usePreviewWindow(
  recording: LoadedRecording,
  decomposition: Decomposition,
  rows: Int32Array,
  start: number,
  end: number,
): { win: PreviewWindow | null; original: Float32Array; length: number } {
  const n = decomposition.nChannels;
  const k = decomposition.nComponents;
  const L = Math.max(0, end - start);
  const original = useMemo(
    () => extractWindow(recording.signals.data, recording.signals.nSamples, rows, start, end),
    [recording, rows, start, end],
  );
  const [state, setState] = useState<{ original: Float32Array; win: PreviewWindow } | null>(null);

  useEffect(() => {
    let stale = false;
    const { unmixing, channelMeans } = decomposition;
    const finish = (acts: Float64Array) => {
      if (!stale) setState({ original, win: createPreviewWindow({ original, nChannels: n, length: L, activations: acts, nComponents: k }) });
    };
    const input = { unmixing, nComponents: k, nChannels: n, window: original, length: L, channelMeans };
    if (!projectionWorkerAvailable() || k * n * L <= INLINE_LIMIT) {
      finish(windowActivations(input));
    } else {
      windowActivationsInWorker(input).then(finish, () => {
        // The worker failed (e.g. blocked by the host): compute here instead.
        finish(windowActivations(input));
      });
    }
    return () => {
      stale = true;
    };
  }, [original, decomposition, n, k, L]);

  // While a new window is being computed, show nothing stale: the window belongs to its own samples.
  const win = state && state.original === original ? state.win : null;
  return { win, original, length: L };
}
