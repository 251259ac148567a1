/**
 * Autosave: every change of decisions, aim or reviewer is written (in order) to the services' review store
 * under the recording + decomposition key. Writes are chained so a slow write never lands after a newer
 * one. Returns the function that stops autosaving.
 */
import type { StoreApi } from 'zustand/vanilla';
import { reviewKey, type WorkbenchServices } from './services.ts';
import type { WorkbenchState } from './types.ts';

export interface AutosaveHandle {
  stop(): void;
  /** Resolves when every write started so far has finished (tests, and before unload). */
  flush(): Promise<void>;
}

export function startAutosave(
  store: StoreApi<WorkbenchState>,
  services: () => Promise<Pick<WorkbenchServices, 'saveReview'>>,
  onError: (message: string) => void = () => {},
): AutosaveHandle {
  let chain: Promise<void> = Promise.resolve();
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.decisions === prev.decisions && s.aim === prev.aim && s.reviewer === prev.reviewer) return;
    if (s.recordingSha256 === null || s.decompositionSha256 === null) return;
    // While a saved review is offered and not yet answered, writing would overwrite it.
    if (s.resumeOffer !== null) return;
    // A new participant arriving resets decisions to {}: that is not a change worth writing over a saved review.
    if (s.decompositionSha256 !== prev.decompositionSha256 || s.recordingSha256 !== prev.recordingSha256) return;
    const key = reviewKey(s.recordingSha256, s.decompositionSha256);
    const review = { savedAt: new Date().toISOString(), aim: s.aim, reviewer: s.reviewer, decisions: s.decisions };
    chain = chain
      .then(async () => (await services()).saveReview(key, review))
      .catch((e: unknown) => onError(`Autosave failed: ${(e as Error)?.message ?? String(e)}`));
  });
  return { stop: unsubscribe, flush: () => chain };
}
