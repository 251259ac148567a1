/** Offer to compute a decomposition of the loaded recording (method, seed, high-pass), or open one. */
import { useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { DEFAULT_DECOMPOSE } from '../../state/session-slice.ts';
import type { DecomposeOptions } from '../../state/types.ts';

export function DecomposeForm() {
  const decomposeCurrent = useWorkbench((s) => s.decomposeCurrent);
  const openDecomposition = useWorkbench((s) => s.openDecomposition);
  const busy = useWorkbench((s) => s.progress !== null);
  const [method, setMethod] = useState<DecomposeOptions['method']>(DEFAULT_DECOMPOSE.method);
  const [seed, setSeed] = useState<number>(DEFAULT_DECOMPOSE.seed);
  const [highpassHz, setHighpass] = useState<number>(DEFAULT_DECOMPOSE.highpassHz);
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
            <option value="picard">Picard (faster)</option>
            <option value="infomax">extended Infomax (slower)</option>
          </select>
        </label>
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
