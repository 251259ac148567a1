/** Offer to compute a decomposition of the loaded recording (method, seed, high-pass), or open one. */
import { useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { DEFAULT_DECOMPOSE } from '../../state/session-slice.ts';
import type { DecomposeOptions } from '../../state/types.ts';
import { formatEstimate } from '../../core/ica/time-estimate.ts';
import { TIMING_SECONDS, useMethodTimes, type MethodTimes } from './useMethodTimes.ts';

const METHOD_NAMES = { picard: 'Picard', infomax: 'extended Infomax' } as const;

/** "Picard — about 40 s here", "… — timing…" while the short run goes, or the bare name when it failed. */
export function methodLabel(method: keyof typeof METHOD_NAMES, times: MethodTimes, timing: boolean): string {
  const t = times[method];
  if (t === 'failed' || (!t && !timing)) return METHOD_NAMES[method];
  return `${METHOD_NAMES[method]} — ${t ? `${formatEstimate(t)} here` : 'timing…'}`;
}

export function DecomposeForm() {
  const decomposeCurrent = useWorkbench((s) => s.decomposeCurrent);
  const openDecomposition = useWorkbench((s) => s.openDecomposition);
  const busy = useWorkbench((s) => s.progress !== null);
  const [method, setMethod] = useState<DecomposeOptions['method']>(DEFAULT_DECOMPOSE.method);
  const [seed, setSeed] = useState<number>(DEFAULT_DECOMPOSE.seed);
  const [highpassHz, setHighpass] = useState<number>(DEFAULT_DECOMPOSE.highpassHz);
  const recording = useWorkbench((s) => s.recording);
  const times = useMethodTimes(recording, DEFAULT_DECOMPOSE.seed, DEFAULT_DECOMPOSE.highpassHz, !busy);
  const timing = recording !== null && !busy && typeof Worker !== 'undefined';
  return (
    <section className="decompose-form" aria-label="Decomposition" data-testid="decompose-form">
      <h2>No decomposition yet</h2>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          void decomposeCurrent({ method, seed: Number.isFinite(seed) ? Math.round(seed) : 1, highpassHz: Number.isFinite(highpassHz) ? highpassHz : 1 });
        }}
      >
        <label>
          Method{' '}
          <select value={method} onChange={(e) => setMethod(e.target.value as DecomposeOptions['method'])} data-testid="decompose-method">
            <option value="picard">{methodLabel('picard', times, timing)}</option>
            <option value="infomax">{methodLabel('infomax', times, timing)}</option>
          </select>
        </label>
        <p className="note" data-testid="decompose-times-note">
          Times: a short run of each method on the first {TIMING_SECONDS} s of this recording, scaled to its length.
        </p>
        <label>
          Seed <input type="number" value={seed} step={1} onChange={(e) => setSeed(e.target.valueAsNumber)} data-testid="decompose-seed" />
        </label>
        <label>
          High-pass before decomposing (Hz){' '}
          <input type="number" value={highpassHz} step={0.5} min={0} onChange={(e) => setHighpass(e.target.valueAsNumber)} data-testid="decompose-highpass" />
        </label>
        <button type="submit" disabled={busy} data-testid="decompose-run">Compute decomposition</button>
      </form>
      <label className="file-pick">
        …or open a decomposition file (our JSON, or a TSV/CSV matrix){' '}
        <input
          type="file"
          accept=".json,.tsv,.csv,.txt"
          multiple
          onChange={(e) => {
            const files = Array.from(e.target.files ?? []);
            if (files.length) void openDecomposition(files);
            e.target.value = '';
          }}
          data-testid="decomposition-input"
        />
      </label>
    </section>
  );
}
