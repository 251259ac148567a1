/** The loaded participant: recording, decomposition, their hashes and the per-component evidence. */
import type { StateCreator } from 'zustand';
import type { RecordingSlice, WorkbenchState } from './types.ts';

export const createRecordingSlice: StateCreator<WorkbenchState, [], [], RecordingSlice> = (set) => ({
  recording: null,
  recordingSha256: null,
  decompositionSha256: null,
  decomposition: null,
  decompositionJson: null,
  evidence: null,
  setLoaded: (patch) => set(patch),
});
