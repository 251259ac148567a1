/**
 * The region's spectra before/after over the whole recording, recomputed in the projection worker when the
 * removed set or the region changes (a short pause first, so a run of toggles costs one pass). Without
 * module workers (node tests) the same core function runs inline. A result for stale inputs is dropped;
 * the previous spectra stay on screen, marked pending, until the new ones arrive.
 */
import { useEffect, useState } from 'react';
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { removedRegionWeights, wholeRegionSpectra, type WholeRegionSpectra, type WholeRegionSpectraInput } from '../../core/review/whole-spectra.ts';
import { projectionWorkerAvailable, wholeRegionSpectraInWorker } from '../../bridge/projection-client.ts';

const PAUSE_MS = 120;

export function useWholeSpectra(
  enabled: boolean,
  recording: LoadedRecording,
  decomposition: Decomposition,
  rows: Int32Array,
  roiRows: readonly number[],
  removed: ReadonlySet<number>,
): { spectra: WholeRegionSpectra | null; pending: boolean; error: string | null } {
  const [state, setState] = useState<{ spectra: WholeRegionSpectra | null; key: unknown[] | null; error: string | null }>({
    spectra: null,
    key: null,
    error: null,
  });
  const key = [recording, decomposition, rows, roiRows, removed];
  useEffect(() => {
    if (!enabled) return;
    let stale = false;
    const thisKey = [recording, decomposition, rows, roiRows, removed];
    const timer = setTimeout(() => {
      const { signals } = recording;
      const input: WholeRegionSpectraInput = {
        data: signals.data,
        nSamples: signals.nSamples,
        sampleRate: signals.sampleRate,
        rows,
        roi: roiRows,
        removedWeights: removedRegionWeights(decomposition.unmixing, decomposition.mixing, decomposition.nChannels, decomposition.nComponents, roiRows, removed),
        channelMeans: decomposition.channelMeans,
      };
      const done = (spectra: WholeRegionSpectra) => {
        if (!stale) setState({ spectra, key: thisKey, error: null });
      };
      if (!projectionWorkerAvailable()) {
        done(wholeRegionSpectra(input));
        return;
      }
      wholeRegionSpectraInWorker(input).then(done, (e: unknown) => {
        if (!stale) setState((s) => ({ ...s, key: thisKey, error: `The whole-recording spectra could not be computed (${(e as Error)?.message ?? String(e)}).` }));
      });
    }, PAUSE_MS);
    return () => {
      stale = true;
      clearTimeout(timer);
    };
  }, [enabled, recording, decomposition, rows, roiRows, removed]);
  const current = state.key !== null && state.key.every((v, i) => v === key[i]);
  return { spectra: state.spectra, pending: !current, error: current ? state.error : null };
}
