/** `useStudy(selector)`: the study store in React components (see study-store.ts). */
import { useStore } from 'zustand';
import { studyStore, type StudyState } from './study-store.ts';

export { studyStore, selectStudyRows, selectAgreement, studyExport, studyZip, recordingKey } from './study-store.ts';
export type { StudyState, RecordingAgreement, BatchEvidence } from './study-store.ts';

export function useStudy<T>(selector: (state: StudyState) => T): T {
  return useStore(studyStore, selector);
}
