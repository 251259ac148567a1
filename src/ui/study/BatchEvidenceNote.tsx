/**
 * The recording summary's "Evidence" line when a participant was opened from a study folder: the evidence
 * came from a batch run's file (with its date, and a way to compute it again here), or a batch run's file was
 * ignored and why. Nothing outside a study, or once the evidence was computed again.
 *
 * data-testid hooks: recording-evidence-origin (the line; data-origin "batch" or "ignored"),
 * recompute-evidence-batch (the "compute evidence again" button).
 */
import { useWorkbench } from '../../state/index.ts';
import { recomputeEvidence } from '../../state/recompute-evidence.ts';
import { useStudy } from '../../state/study-hooks.ts';

export function BatchEvidenceNote() {
  const evidence = useWorkbench((s) => s.evidence);
  const busy = useWorkbench((s) => s.progress !== null);
  const current = useStudy((s) => s.current);
  const batch = useStudy((s) => s.batchEvidence);
  const notice = useStudy((s) => s.batchEvidenceNotice);
  if (batch && batch.path === current && evidence !== null && batch.evidence === evidence) {
    return (
      <>
        <dt>Evidence</dt>
        <dd data-testid="recording-evidence-origin" data-origin="batch">
          evidence from batch run, {batch.date} <span className="source">({batch.file})</span>{' '}
          <button type="button" onClick={() => void recomputeEvidence()} disabled={busy} data-testid="recompute-evidence-batch">
            compute evidence again
          </button>
        </dd>
      </>
    );
  }
  if (notice && notice.path === current) {
    return (
      <>
        <dt>Evidence</dt>
        <dd data-testid="recording-evidence-origin" data-origin="ignored">{notice.text}</dd>
      </>
    );
  }
  return null;
}
