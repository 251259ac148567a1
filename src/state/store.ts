/**
 * The one workbench store (vanilla; no React here): the slices spread into a single bound store.
 * React components use `useWorkbench` from ./index.ts; workers and tests use `workbenchStore`.
 */
import { createStore } from 'zustand/vanilla';
import { createRecordingSlice } from './recording-slice.ts';
import { createReviewSlice } from './review-slice.ts';
import { createViewSlice } from './view-slice.ts';
import { createSessionSlice } from './session-slice.ts';
import type { WorkbenchState } from './types.ts';

export const workbenchStore = createStore<WorkbenchState>()((...a) => ({
  ...createRecordingSlice(...a),
  ...createReviewSlice(...a),
  ...createViewSlice(...a),
  ...createSessionSlice(...a),
}));
