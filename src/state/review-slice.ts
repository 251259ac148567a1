/**
 * The review itself: aim, decisions and their undo/redo history. Each decision map is immutable; a change
 * builds a new map, and the previous one goes on the undo stack (one pointer per step).
 */
import type { StateCreator } from 'zustand';
import { UNDECIDED } from '../core/review/decisions-file.ts';
import type { ReviewDecision, ReviewSlice, WorkbenchState } from './types.ts';

/** Undo depth; older steps are dropped. */
export const UNDO_LIMIT = 500;

const sameDecision = (a: ReviewDecision, b: ReviewDecision) => a.verdict === b.verdict && a.reason === b.reason && a.note === b.note;

function pushPast(past: ReviewSlice['past'], decisions: ReviewSlice['decisions']): ReviewSlice['past'] {
  const next = past.length >= UNDO_LIMIT ? past.slice(past.length - UNDO_LIMIT + 1) : past.slice();
  next.push(decisions);
  return next;
}

export const createReviewSlice: StateCreator<WorkbenchState, [], [], ReviewSlice> = (set, get) => ({
  aim: 'erp',
  thresholds: {},
  setThresholds: (thresholds) => set({ thresholds }),
  decisions: {},
  reviewer: '',
  past: [],
  future: [],
  decide: (index, patch) => {
    if (!Number.isInteger(index) || index < 1) return;
    const { decisions, past } = get();
    const before = decisions[index] ?? UNDECIDED;
    const after: ReviewDecision = { ...before, ...patch };
    if (sameDecision(before, after)) return;
    set({ decisions: { ...decisions, [index]: after }, past: pushPast(past, decisions), future: [] });
  },
  setAim: (aim) => set({ aim }),
  setReviewer: (reviewer) => set({ reviewer }),
  replaceDecisions: (decisions, aim, thresholds) => {
    const s = get();
    set({ decisions: { ...decisions }, past: pushPast(s.past, s.decisions), future: [], ...(aim ? { aim } : {}), ...(thresholds ? { thresholds } : {}) });
  },
  undo: () => {
    const { past, future, decisions } = get();
    if (past.length === 0) return;
    set({ decisions: past[past.length - 1], past: past.slice(0, -1), future: [...future, decisions] });
  },
  redo: () => {
    const { past, future, decisions } = get();
    if (future.length === 0) return;
    set({ decisions: future[future.length - 1], future: future.slice(0, -1), past: pushPast(past, decisions) });
  },
});
