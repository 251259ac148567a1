/**
 * Workbench state: `useWorkbench(selector)` in components (select one value per call; wrap selectors that
 * build arrays/objects in `useShallow`), `workbenchStore` (vanilla API: getState/setState/subscribe/
 * getInitialState) elsewhere. Derived values live in ./selectors.ts.
 *
 * State: recording, recordingSha256, decompositionSha256, decomposition, evidence (1-based index), aim,
 * decisions (key = 1-based index), selected (1-based), screen, roi, progress, notice, resumeOffer.
 * Actions: decide(index, patch), select(index | null), setScreen, setAim, setRoi(patch), undo, redo,
 * loadParticipant(input), loadDemo(), importDecisions(file), resume(accept), closeParticipant().
 */
import { useStore } from 'zustand';
import { workbenchStore } from './store.ts';
import type { WorkbenchState } from './types.ts';

export { workbenchStore } from './store.ts';
export * from './types.ts';
export * from './selectors.ts';

/** Selects one value from the workbench store; the component re-renders only when that value changes. */
export function useWorkbench<T>(selector: (state: WorkbenchState) => T): T {
  return useStore(workbenchStore, selector);
}
