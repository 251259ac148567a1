/**
 * What the reviewer must know about keeping their work: a saving problem (storage full: export the
 * decisions now), another tab holding the same participant, and saved data that was damaged (what was lost;
 * the rest was recovered).
 */
import { useStore } from 'zustand';
import { persistenceStore } from '../../state/persistence.ts';
import { describeLost } from '../../state/review-snapshot.ts';
import { decisionsJsonFromState, exportStem } from '../../state/exports.ts';
import { workbenchStore } from '../../state/index.ts';
import { downloadBlob } from './download.ts';

function exportDecisions() {
  const s = workbenchStore.getState();
  const json = decisionsJsonFromState(s);
  if (json) downloadBlob(json, `${exportStem(s)}_decisions.json`, 'application/json');
}

export function SaveStatus() {
  const problem = useStore(persistenceStore, (s) => s.saveProblem);
  const clash = useStore(persistenceStore, (s) => s.tabClash);
  const lost = useStore(persistenceStore, (s) => s.lost);
  return (
    <>
      {problem && (
        <div className="notice notice-error" role="alert" data-testid="save-problem" data-kind={problem.kind}>
          <span>⚠ {problem.text}</span>
          <button type="button" onClick={exportDecisions} data-testid="save-problem-export">Export the decisions now</button>
        </div>
      )}
      {clash && (
        <div className={`notice${clash.thisTabOwns ? '' : ' notice-error'}`} role="status" data-testid="tab-clash" data-owner={clash.thisTabOwns ? 'this' : 'other'}>
          <span>
            {clash.thisTabOwns
              ? `This participant was opened in another tab too. This tab (${clash.ownerLabel.replace(/^the tab that /, '')}) owns the review; the other tab's changes are saved as their own snapshot.`
              : `This participant is already open in another tab: ${clash.ownerLabel} owns the review. Changes made here are saved as a separate snapshot and do not overwrite it; switch to that tab to go on with the review.`}
          </span>
        </div>
      )}
      {lost.length > 0 && (
        <div className="notice notice-error" role="alert" data-testid="lost-notice">
          <span>⚠ {describeLost(lost)}</span>
          <button type="button" onClick={() => persistenceStore.setState({ lost: [] })} aria-label="Dismiss message">Dismiss</button>
        </div>
      )}
    </>
  );
}
