/**
 * Evidence settings the reviewer chooses for the recording under review, apart from the review itself:
 * the mains frequency (overriding the *_eeg.json PowerLineFrequency, else 50 Hz) and the events.tsv column
 * whose values are each tested for time-locking (EvidenceInput.lockColumn). Kept per recording object, so a
 * newly opened recording starts from what its files say. The browser services read them when computing
 * evidence; changing one while evidence is shown computes it again (recompute-evidence.ts).
 */
import { createStore } from 'zustand/vanilla';
import type { LoadedRecording } from '../core/recording.ts';
import { recomputeEvidence } from './recompute-evidence.ts';
import { workbenchStore } from './store.ts';

export interface EvidenceChoices {
  /** Mains frequency chosen by the reviewer; null = the recording's sidecar, else 50 Hz. */
  readonly lineHz: 50 | 60 | null;
  /** events.tsv column tested per value for time-locking; null = event types only. */
  readonly lockColumn: string | null;
}

export const NO_CHOICES: EvidenceChoices = Object.freeze({ lineHz: null, lockColumn: null });

interface EvidenceSettingsState {
  readonly recording: LoadedRecording | null;
  readonly choices: EvidenceChoices;
}

export const evidenceSettingsStore = createStore<EvidenceSettingsState>()(() => ({ recording: null, choices: NO_CHOICES }));

/** The choices made for `recording` (none for any other recording). */
export function evidenceChoicesFor(recording: LoadedRecording | null): EvidenceChoices {
  const s = evidenceSettingsStore.getState();
  return recording !== null && s.recording === recording ? s.choices : NO_CHOICES;
}

/**
 * Changes the choices for the loaded recording; when its evidence is already computed (or was cancelled),
 * computes it again with them. Returns the recomputation (resolved at once when none was needed).
 */
export function chooseEvidenceSettings(patch: Partial<EvidenceChoices>): Promise<void> {
  const w = workbenchStore.getState();
  if (!w.recording) return Promise.resolve();
  const before = evidenceChoicesFor(w.recording);
  const choices = { ...before, ...patch };
  if (choices.lineHz === before.lineHz && choices.lockColumn === before.lockColumn) return Promise.resolve();
  evidenceSettingsStore.setState({ recording: w.recording, choices });
  return w.decomposition !== null && w.progress === null ? recomputeEvidence() : Promise.resolve();
}
