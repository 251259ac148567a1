/** Offers the autosaved review of this participant (same recording and decomposition hashes). */
import { useWorkbench } from '../../state/index.ts';

export function ResumeBanner() {
  const offer = useWorkbench((s) => s.resumeOffer);
  const resume = useWorkbench((s) => s.resume);
  if (!offer) return null;
  const when = new Date(offer.savedAt);
  return (
    <div className="resume-banner" role="region" aria-label="Saved review found" data-testid="resume-banner">
      <span>
        A saved review of this participant was found ({offer.decidedCount} decided, aim {offer.aim}, saved{' '}
        {Number.isNaN(when.getTime()) ? offer.savedAt : when.toLocaleString()}).
      </span>
      <button type="button" onClick={() => resume(true)} data-testid="resume-accept" autoFocus>Resume saved review</button>
      <button type="button" onClick={() => resume(false)} data-testid="resume-decline">Start afresh</button>
    </div>
  );
}
