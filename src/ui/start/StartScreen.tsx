/**
 * Where a review begins: drop or pick a recording with its BIDS sidecars (or a whole participant folder),
 * optionally a decomposition and a decisions file to resume, or open the simulated demo participant.
 * Once a recording is read its channels, rates, duration and events are listed; without a decomposition
 * the page offers to compute one.
 */
import { useRef, useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { filesFromDataTransfer } from './collect-dropped.ts';
import { openFiles } from './open-files.ts';
import { RecordingSummary } from './RecordingSummary.tsx';
import { DecomposeForm } from './DecomposeForm.tsx';
import { SavedReviews } from './SavedReviews.tsx';
import { StudyStart } from '../study/StudyStart.tsx';
import { recomputeEvidence } from '../../state/recompute-evidence.ts';

export function StartScreen() {
  const recording = useWorkbench((s) => s.recording);
  const hasDecomposition = useWorkbench((s) => s.decomposition !== null);
  const hasEvidence = useWorkbench((s) => s.evidence !== null);
  const busy = useWorkbench((s) => s.progress !== null);
  const loadDemo = useWorkbench((s) => s.loadDemo);
  const setScreen = useWorkbench((s) => s.setScreen);
  const [over, setOver] = useState(false);
  const [extraDecomposition, setExtraDecomposition] = useState<File[]>([]);
  const [extraDecisions, setExtraDecisions] = useState<File | null>(null);
  const folderRef = useRef<HTMLInputElement>(null);

  const open = (files: File[]) => openFiles(files, { decompositionFiles: extraDecomposition, decisionsFile: extraDecisions });

  return (
    <section className="start-screen" aria-label="Open a participant" data-testid="start-screen">
      <div
        className={`drop-zone${over ? ' drop-over' : ''}`}
        data-testid="drop-zone"
        onDragOver={(e) => { e.preventDefault(); setOver(true); }}
        onDragLeave={() => setOver(false)}
        onDrop={(e) => {
          e.preventDefault();
          e.stopPropagation();
          setOver(false);
          void filesFromDataTransfer(e.dataTransfer).then(open);
        }}
      >
        <h2>Open a participant</h2>
        <p>
          Drop a recording (EDF, EDF+, BDF) with its BIDS sidecars — channels.tsv, electrodes.tsv, events.tsv — or a whole participant
          folder here. A decomposition file and a decisions file dropped with it are picked up too.
        </p>
        <p className="privacy-note">Files are read by this page only; nothing is uploaded.</p>
        <div className="pickers">
          <label className="file-pick">
            Choose files…{' '}
            <input
              type="file"
              multiple
              accept=".edf,.bdf,.rec,.tsv,.json,.csv,.txt"
              disabled={busy}
              data-testid="recording-input"
              onChange={(e) => { const f = Array.from(e.target.files ?? []); e.target.value = ''; if (f.length) open(f); }}
            />
          </label>
          <label className="file-pick">
            Choose a folder…{' '}
            <input
              ref={(el) => {
                folderRef.current = el;
                el?.setAttribute('webkitdirectory', '');
              }}
              type="file"
              multiple
              disabled={busy}
              data-testid="folder-input"
              onChange={(e) => { const f = Array.from(e.target.files ?? []); e.target.value = ''; if (f.length) open(f); }}
            />
          </label>
          <button type="button" onClick={() => void loadDemo()} disabled={busy} data-testid="open-demo">
            Open the demo participant (simulated)
          </button>
        </div>
        <details className="optional-files">
          <summary>Optional: a decomposition and a decisions file to resume</summary>
          <label className="file-pick">
            Decomposition (our JSON, or a TSV/CSV matrix){' '}
            <input type="file" multiple accept=".json,.tsv,.csv,.txt" onChange={(e) => setExtraDecomposition(Array.from(e.target.files ?? []))} data-testid="start-decomposition-input" />
          </label>
          <label className="file-pick">
            Decisions file (JSON or TSV){' '}
            <input type="file" accept=".json,.tsv" onChange={(e) => setExtraDecisions(e.target.files?.[0] ?? null)} data-testid="start-decisions-input" />
          </label>
        </details>
      </div>
      {recording && (
        <>
          {hasDecomposition && hasEvidence ? (
            <p className="back-to-board">
              <button type="button" onClick={() => setScreen('board')} data-testid="back-to-board">Back to the board</button>
            </p>
          ) : hasDecomposition ? (
            !busy && (
              <>
                <p className="recompute-evidence" data-testid="recompute-panel">
                  The recording and its decomposition are loaded, but the evidence for each component was not computed (the step was
                  cancelled or failed).{' '}
                  <button type="button" onClick={() => void recomputeEvidence()} data-testid="recompute-evidence">Compute evidence again</button>
                </p>
                <DecomposeForm />
              </>
            )
          ) : (
            !busy && <DecomposeForm />
          )}
          <RecordingSummary recording={recording} />
        </>
      )}
      <StudyStart />
      <SavedReviews />
    </section>
  );
}
