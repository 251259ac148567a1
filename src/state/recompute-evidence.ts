/**
 * A way forward after a cancelled or failed evidence step: the recording and decomposition are still
 * loaded, so the evidence is computed again from them (no files picked again), then the board opens with
 * the saved review offered as on a first load. `startWayForwardWatch` sends a screen that needs evidence
 * back to the start page (where this action is offered) when a load ends without it.
 */
import { workbenchStore } from './store.ts';
import { getWorkbenchServices, resumeOfferFrom, reviewKey } from './services.ts';
import { progressAt } from './task-progress.ts';
import { hasWork } from './review-snapshot.ts';

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** True when a decomposition is loaded without its evidence (a cancelled or failed evidence step). */
export const needsEvidence = (s: ReturnType<typeof workbenchStore.getState>): boolean =>
  s.recording !== null && s.decomposition !== null && s.evidence === null && s.progress === null;

export async function recomputeEvidence(): Promise<void> {
  const s = workbenchStore.getState();
  const { recording, decomposition, recordingSha256, decompositionSha256 } = s;
  if (!recording || !decomposition || recordingSha256 === null || decompositionSha256 === null || s.progress !== null) return;
  const controller = new AbortController();
  const task = 'Computing evidence';
  const started = now();
  const cancel = () => controller.abort();
  workbenchStore.setState({ notice: null, progress: progressAt(task, 0, started, started, cancel) });
  let last = 0;
  try {
    const services = await getWorkbenchServices();
    const evidence = await services.computeEvidence(recording, decomposition, controller.signal, (f, eta) => {
      const t = now();
      if (controller.signal.aborted || workbenchStore.getState().progress?.cancel !== cancel) return;
      if (t - last < 50 && f < 1) return;
      last = t;
      workbenchStore.setState({ progress: progressAt(task, f, started, t, cancel, eta) });
    });
    controller.signal.throwIfAborted();
    const after = workbenchStore.getState();
    if (after.decomposition !== decomposition) return; // another participant was opened meanwhile
    const saved = hasWork(after.decisions) ? null : await services.loadReview(reviewKey(recordingSha256, decompositionSha256)).catch(() => null);
    workbenchStore.setState({
      evidence,
      selected: after.selected ?? (decomposition.nComponents > 0 ? 1 : null),
      progress: null,
      screen: 'board',
      resumeOffer: resumeOfferFrom(saved),
    });
  } catch (e) {
    if (workbenchStore.getState().progress?.cancel !== cancel) return;
    workbenchStore.setState({
      progress: null,
      notice: controller.signal.aborted
        ? { kind: 'info', text: 'Cancelled. The recording and decomposition are still loaded: compute the evidence again from the start page.' }
        : { kind: 'error', text: `Evidence could not be computed: ${(e as Error)?.message ?? String(e)}` },
    });
  }
}

/** Keeps the reviewer off screens that need evidence when there is none; returns the function that stops it. */
export function startWayForwardWatch(): () => void {
  return workbenchStore.subscribe((s) => {
    if (s.screen !== 'start' && s.screen !== 'study' && s.evidence === null && s.progress === null) workbenchStore.setState({ screen: 'start' });
  });
}
