/**
 * Export and import: the decisions file (JSON, TSV), the methods paragraph, the cleaned recording
 * (EDF/BDF, identifying header fields blanked unless asked to keep them), and importing a decisions file.
 * Before anything is saved it warns when components are still undecided and lists verdict/reason pairs that
 * contradict themselves (flagged, never refused; ui/decision/verdict-reason.ts).
 */
import { useEffect, useRef, useState } from 'react';
import { useWorkbench, workbenchStore } from '../../state/index.ts';
import {
  decisionsJsonFromState, decisionsTsvFromState, exportCleanedRecording, exportStem, methodsTextFromState,
} from '../../state/exports.ts';
import { componentRuns, conflictingDecisions, undecidedComponents } from '../decision/verdict-reason.ts';
import { downloadBlob } from './download.ts';
import './export-panel.css';

export function ExportPanel({ onClose }: { onClose: () => void }) {
  const reviewer = useWorkbench((s) => s.reviewer);
  const setReviewer = useWorkbench((s) => s.setReviewer);
  const importDecisions = useWorkbench((s) => s.importDecisions);
  const busy = useWorkbench((s) => s.progress !== null);
  const decompositionJson = useWorkbench((s) => s.decompositionJson);
  const decisions = useWorkbench((s) => s.decisions);
  const nComponents = useWorkbench((s) => s.decomposition?.nComponents ?? 0);
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
      <ExportChecks decisions={decisions} nComponents={nComponents} />
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

/** What to check before exporting: undecided components (kept when cleaning) and self-contradicting pairs. */
export function ExportChecks({ decisions, nComponents }: { decisions: Parameters<typeof undecidedComponents>[0]; nComponents: number }) {
  if (nComponents === 0) return null;
  const undecided = undecidedComponents(decisions, nComponents);
  const conflicts = conflictingDecisions(decisions, nComponents);
  if (undecided.length === 0 && conflicts.length === 0) return null;
  return (
    <div className="export-checks" role="status" data-testid="export-checks">
      {undecided.length > 0 ? (
        <p className="warning" data-testid="export-undecided-warning">
          ⚠ {undecided.length} of {nComponents} components {undecided.length === 1 ? 'is' : 'are'} undecided ({componentRuns(undecided)}): the
          decisions file lists {undecided.length === 1 ? 'it' : 'them'} as undecided and the cleaned recording keeps {undecided.length === 1 ? 'it' : 'them'}.
        </p>
      ) : null}
      {conflicts.length > 0 ? (
        <div className="warning" data-testid="export-conflicts">
          ⚑ Verdict and reason disagree (allowed; worth a second look):
          <ul>
            {conflicts.map((c) => (
              <li key={c.index}>component {c.index}: {c.why}</li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
