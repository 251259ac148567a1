/**
 * Derived values, never stored. Selectors returning arrays or objects must be used with `useShallow`
 * (or memoised by the caller): they build a new value on each call.
 */
import { UNDECIDED } from '../core/review/decisions-file.ts';
import type { ReviewDecision, WorkbenchState } from './types.ts';

export const selectRecording = (s: WorkbenchState) => s.recording;
export const selectDecomposition = (s: WorkbenchState) => s.decomposition;
export const selectEvidence = (s: WorkbenchState) => s.evidence;
export const selectAim = (s: WorkbenchState) => s.aim;
export const selectDecisions = (s: WorkbenchState) => s.decisions;
export const selectSelected = (s: WorkbenchState) => s.selected;
export const selectScreen = (s: WorkbenchState) => s.screen;
export const selectRoi = (s: WorkbenchState) => s.roi;
export const selectProgress = (s: WorkbenchState) => s.progress;

/** Number of components (0 before a decomposition is loaded). */
export const selectComponentCount = (s: WorkbenchState) => s.decomposition?.nComponents ?? 0;

/** The decision of a 1-based component (undecided when none was made). Stable object per index. */
export const selectDecision = (index: number) => (s: WorkbenchState): ReviewDecision => s.decisions[index] ?? UNDECIDED;

/** The evidence of a 1-based component, or null. */
export const selectComponentEvidence = (index: number) => (s: WorkbenchState) =>
  s.evidence?.find((e) => e.index === index) ?? null;

/**
 * 1-based indices of the components marked remove, ascending. The reference changes only when decisions
 * change, so this may be used without useShallow when the caller memoises on `decisions`.
 */
export const selectRemovedIndices = (s: WorkbenchState): number[] => {
  const out: number[] = [];
  for (const [k, d] of Object.entries(s.decisions)) if (d.verdict === 'remove') out.push(Number(k));
  return out.sort((a, b) => a - b);
};

/** 1-based indices still undecided (no verdict yet), ascending. */
export const selectUndecidedIndices = (s: WorkbenchState): number[] => {
  const n = selectComponentCount(s);
  const out: number[] = [];
  for (let i = 1; i <= n; i++) if ((s.decisions[i]?.verdict ?? 'undecided') === 'undecided') out.push(i);
  return out;
};

/** Components with a keep or remove verdict. */
export const selectDecidedCount = (s: WorkbenchState): number => {
  const n = selectComponentCount(s);
  let c = 0;
  for (const [k, d] of Object.entries(s.decisions)) if (d.verdict !== 'undecided' && Number(k) <= n) c++;
  return c;
};

export const selectCanUndo = (s: WorkbenchState) => s.past.length > 0;
export const selectCanRedo = (s: WorkbenchState) => s.future.length > 0;
