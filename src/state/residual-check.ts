/**
 * What the decomposition missed, for the current decisions (src/core/review/residual.ts): one result kept
 * per recording, for the decomposition and removed set it was measured on. The preview's notice fills it
 * from a worker; the methods text reads it, measuring here (synchronously) only when nothing matches.
 */
import type { Decomposition } from '../core/decomposition.ts';
import type { LoadedRecording } from '../core/recording.ts';
import { residualForReview, type ResidualResult } from '../core/review/residual.ts';
import { selectRemovedIndices } from './selectors.ts';
import type { WorkbenchState } from './types.ts';

const kept = new WeakMap<LoadedRecording, { decomposition: Decomposition; key: string; result: ResidualResult }>();

const keyOf = (removed: readonly number[]) => [...removed].sort((a, b) => a - b).join(',');

/** Stores a result measured elsewhere (the preview's worker) for 1-based `removed`. */
export function rememberResidual(recording: LoadedRecording, decomposition: Decomposition, removed: readonly number[], result: ResidualResult): void {
  kept.set(recording, { decomposition, key: keyOf(removed), result });
}

/** The stored result for exactly these inputs, or null. */
export function recalledResidual(recording: LoadedRecording, decomposition: Decomposition, removed: readonly number[]): ResidualResult | null {
  const hit = kept.get(recording);
  return hit && hit.decomposition === decomposition && hit.key === keyOf(removed) ? hit.result : null;
}

/** The residual check of the current decisions (stored, else measured now); null before a review is loaded or when it cannot run. */
export function residualFromState(s: Pick<WorkbenchState, 'recording' | 'decomposition' | 'decisions'>): ResidualResult | null {
  const { recording, decomposition } = s;
  if (!recording || !decomposition) return null;
  const removed = selectRemovedIndices(s as WorkbenchState).filter((i) => i <= decomposition.nComponents);
  const hit = recalledResidual(recording, decomposition, removed);
  if (hit) return hit;
  try {
    const result = residualForReview(recording, decomposition, removed);
    rememberResidual(recording, decomposition, removed, result);
    return result;
  } catch {
    return null;
  }
}
