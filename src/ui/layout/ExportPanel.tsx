/**
 * Export and import: the decisions file (JSON, TSV), the methods paragraph, the cleaned recording
 * (EDF/BDF, identifying header fields blanked unless asked to keep them), and importing a decisions file.
 */
import { useEffect, useRef, useState } from 'react';
import { useWorkbench, workbenchStore } from '../../state/index.ts';
import {
  decisionsJsonFromState, decisionsTsvFromState, exportCleanedRecording, exportStem, methodsTextFromState,
} from '../../state/exports.ts';
import { downloadBlob } from './download.ts';

export function ExportPanel({ onClose }: { onClose: () => void }) {
  const reviewer = useWorkbench((s) => s.reviewer);
  const setReviewer = useWorkbench((s) => s.setReviewer);
  const importDecisions = useWorkbench((s) => s.importDecisions);
  const busy = useWorkbench((s) => s.progress !== null);
  const decompositionJson = useWorkbench((s) => s.decompositionJson);
  const [format, setFormat] = useState<'EDF+C' | 'BDF+C'>('EDF+C');
  const [keepIdentity, setKeepIdentity] = useState(false);
  const [methods, setMethods] = useState<string | null>(null);
  const first = useRef<HTMLButtonElement>(null);
  useEffect(() => first.current?.focus(), []);

  const stem = exportStem(workbenchStore.getState());
  const saveText = (text: string | null, suffix: string, type: string) => {
    if (text !== null) downloadBlob(text, `${stem}${suffix}`, type);
  };

  return (
    <section className="export-panel" role="dialog" aria-label="Export and import" data-testid="export-panel">
      <h2>Export and import</h2>
      <label className="field">
        Reviewer (written into the decisions file){' '}
        <input type="text" value={reviewer} onChange={(e) => setReviewer(e.target.value)} data-testid="reviewer-input" />
      </label>
      <div className="export-group" role="group" aria-label="Decisions">
        <h3>Decisions</h3>
        <button ref={first} type="button" data-testid="export-decisions-json" onClick={() => saveText(decisionsJsonFromState(workbenchStore.getState()), '_decisions.json', 'application/json')}>
          Save decisions (JSON)
        </button>
        <button type="button" data-testid="export-decisions-tsv" onClick={() => saveText(decisionsTsvFromState(workbenchStore.getState()), '_decisions.tsv', 'text/tab-separated-values')}>
          Save decisions (TSV)
        </button>
        <label className="file-pick">
          Import a decisions file (JSON or TSV){' '}
          <input
            type="file"
            accept=".json,.tsv"
            data-testid="import-decisions"
            onChange={(e) => {
              const f = e.target.files?.[0];
              e.target.value = '';
              if (f) void importDecisions(f);
            }}
          />
        </label>
      </div>
      {decompositionJson !== null && (
        <div className="export-group" role="group" aria-label="Decomposition">
          <h3>Decomposition computed here</h3>
          <button type="button" data-testid="export-decomposition" onClick={() => saveText(decompositionJson, '_decomposition.json', 'application/json')}>
            Save decomposition (JSON)
          </button>
          <span className="hint">needed with the decisions file by <code>winnow clean</code></span>
        </div>
      )}
      <div className="export-group" role="group" aria-label="Methods paragraph">
        <h3>Methods paragraph</h3>
        <button type="button" data-testid="show-methods" onClick={() => setMethods(methodsTextFromState(workbenchStore.getState()))}>Show</button>
        <button type="button" data-testid="export-methods" onClick={() => saveText(methodsTextFromState(workbenchStore.getState()), '_methods.txt', 'text/plain')}>
          Save as text
        </button>
        {methods !== null && <p className="methods-text" data-testid="methods-text">{methods}</p>}
      </div>
      <div className="export-group" role="group" aria-label="Cleaned recording">
        <h3>Cleaned recording</h3>
        <label>
          Format{' '}
          <select value={format} onChange={(e) => setFormat(e.target.value as 'EDF+C' | 'BDF+C')} data-testid="cleaned-format">
            <option value="EDF+C">EDF+ (16-bit)</option>
            <option value="BDF+C">BDF+ (24-bit)</option>
          </select>
        </label>
        <label>
          <input type="checkbox" checked={keepIdentity} onChange={(e) => setKeepIdentity(e.target.checked)} data-testid="keep-identity" /> keep the
          patient and recording identification fields (blanked by default)
        </label>
        <button
          type="button"
          disabled={busy}
          data-testid="export-cleaned"
          onClick={async () => {
            const bytes = await exportCleanedRecording(format, keepIdentity);
            if (bytes) downloadBlob(bytes as Uint8Array<ArrayBuffer>, `${stem}_cleaned.${format.startsWith('BDF') ? 'bdf' : 'edf'}`, 'application/octet-stream');
          }}
        >
          Save cleaned recording
        </button>
      </div>
      <button type="button" onClick={onClose} data-testid="export-close">Close (Escape)</button>
    </section>
  );
}
