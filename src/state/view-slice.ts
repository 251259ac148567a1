/** What the reviewer is looking at: screen, selected component, region of interest, progress, notices. */
import type { StateCreator } from 'zustand';
import type { Roi, ViewSlice, WorkbenchState } from './types.ts';

/** Default ROI: the preview picks channels; P300-like window 0.25–0.5 s (common practice); alpha band 8–13 Hz. */
export const DEFAULT_ROI: Roi = { channels: [], windowS: [0.25, 0.5], bandHz: [8, 13], epochEvent: null };

export const createViewSlice: StateCreator<WorkbenchState, [], [], ViewSlice> = (set, get) => ({
  selected: null,
  boardSort: 'index',
  boardFilter: { verdict: 'all', reason: 'all' },
  setBoardSort: (boardSort) => set({ boardSort }),
  setBoardFilter: (patch) => set((s) => ({ boardFilter: { ...s.boardFilter, ...patch } })),
  screen: 'start',
  roi: DEFAULT_ROI,
  progress: null,
  notice: null,
  resumeOffer: null,
  select: (index) => {
    const n = get().decomposition?.nComponents ?? 0;
    if (index !== null && (!Number.isInteger(index) || index < 1 || (n > 0 && index > n))) return;
    set({ selected: index });
  },
  setScreen: (screen) => set({ screen }),
  setRoi: (patch) => set((s) => ({ roi: { ...s.roi, ...patch } })),
  setProgress: (progress) => set({ progress }),
  setNotice: (notice) => set({ notice }),
  setResumeOffer: (resumeOffer) => set({ resumeOffer }),
});
