/**
 * What happens to files the user drops or picks: a recording (with sidecars, decomposition, decisions)
 * opens a participant; a decisions file alone is imported into the review under way.
 */
import { workbenchStore } from '../../state/index.ts';
import { hasRecording, sortParticipantFiles } from '../../state/participant-files.ts';
import { confirmSwitchParticipant } from '../../state/review-history.ts';
import { studyStore } from '../../state/study-hooks.ts';

/** A whole BIDS dataset: dataset_description.json at the folder's root and at least one sub-* folder. */
function isDatasetFolder(files: readonly File[]): boolean {
  const rel = files.map((f) => f.webkitRelativePath || '');
  return rel.some((p) => /^[^/]+\/dataset_description\.json$/.test(p)) && rel.some((p) => /^[^/]+\/sub-[^/]+\//.test(p));
}

export interface OpenExtras {
  readonly decompositionFiles?: readonly File[];
  readonly decisionsFile?: File | null;
}

export function openFiles(files: readonly File[], extras: OpenExtras = {}): void {
  const s = workbenchStore.getState();
  if (files.length === 0) return;
  if (isDatasetFolder(files)) {
    void studyStore.getState().openFolder(files);
    return;
  }
  const sorted = sortParticipantFiles(files);
  if (!hasRecording(files)) {
    if (sorted.decisionsFile && s.decomposition) {
      void s.importDecisions(sorted.decisionsFile);
      return;
    }
    if (sorted.decompositionFiles.length > 0 && s.recording) {
      void s.openDecomposition(sorted.decompositionFiles);
      return;
    }
    s.setNotice({
      kind: 'error',
      text: `No EDF or BDF recording among ${files.length} file${files.length === 1 ? '' : 's'} (${files.slice(0, 5).map((f) => f.name).join(', ')}).`,
    });
    return;
  }
  const decompositionFiles = sorted.decompositionFiles.length > 0 ? sorted.decompositionFiles : [...(extras.decompositionFiles ?? [])];
  // Mid-review, opening another recording replaces the participant: ask first (the review stays saved).
  const name = sorted.recordingFiles.find((f) => /\.(edf|bdf|rec)$/i.test(f.name))?.name ?? sorted.recordingFiles[0]?.name ?? 'the recording';
  void confirmSwitchParticipant(name).then((ok) => {
    if (!ok) return;
    void workbenchStore.getState().loadParticipant({
      recordingFiles: sorted.recordingFiles,
      decompositionFiles,
      decisionsFile: sorted.decisionsFile ?? extras.decisionsFile ?? null,
      // Without a decomposition, stop after reading: the recording is listed and a decomposition offered.
      decompose: null,
    });
  });
}
