/**
 * Offers the saved review of this participant (same recording and decomposition hashes). The board stays
 * usable meanwhile, and what is decided before answering is saved as its own snapshot. Both answers ask
 * first, saying what they replace; nothing is deleted either way (the start page lists every snapshot).
 */
import { useEffect } from 'react';
import { useStore } from 'zustand';
import { useWorkbench, workbenchStore } from '../../state/index.ts';
import { askFirst, persistenceStore } from '../../state/persistence.ts';
import { hasWork } from '../../state/review-snapshot.ts';
import { countOf } from '../../state/replace-guards.ts';
import { formatWhen, refreshSavedReviews } from '../../state/review-history.ts';
import { reviewKey } from '../../state/services.ts';

export function ResumeBanner() {
  const offer = useWorkbench((s) => s.resumeOffer);
  const resume = useWorkbench((s) => s.resume);
  const key = useWorkbench((s) => (s.recordingSha256 !== null && s.decompositionSha256 !== null ? reviewKey(s.recordingSha256, s.decompositionSha256) : null));
  const others = useStore(persistenceStore, (p) => p.saved.filter((x) => x.key === key).length);
  useEffect(() => {
    if (offer) void refreshSavedReviews();
  }, [offer]);
  if (!offer) return null;
  const when = formatWhen(offer.savedAt);

  const accept = async () => {
    const s = workbenchStore.getState();
    if (hasWork(s.decisions)) {
      const ok = await askFirst({
        title: 'Resume the saved review?',
        replaces: `It replaces the ${countOf(s.decisions)} made on the board since this page opened. Those are saved as their own snapshot: reopen them from the start page.`,
        confirmLabel: 'Resume saved review',
      });
      if (!ok) return;
    }
    if (workbenchStore.getState().resumeOffer === offer) resume(true);
  };

  const decline = async () => {
    const ok = await askFirst({
      title: 'Start afresh?',
      replaces: `The saved review (${offer.decidedCount} decided, saved ${when}) is not put on the board. It is not deleted: it stays in this participant's saved history, and the start page (Open) restores it.`,
      confirmLabel: 'Start afresh',
    });
    if (ok && workbenchStore.getState().resumeOffer === offer) resume(false);
  };

  return (
    <div className="resume-banner" role="region" aria-label="Saved review found" data-testid="resume-banner">
      <span>
        A saved review of this participant was found ({offer.decidedCount} decided, aim {offer.aim}, saved {when})
        {others > 1 ? `; ${others} saved snapshots of it are listed on the start page` : ''}. Decisions made before you answer are saved too.
      </span>
      <button type="button" onClick={() => void accept()} data-testid="resume-accept" autoFocus>Resume saved review</button>
      <button type="button" onClick={() => void decline()} data-testid="resume-decline">Start afresh</button>
    </div>
  );
}
