/**
 * The reviewer's evidence settings on the recording summary: the mains frequency (the *_eeg.json
 * PowerLineFrequency, else 50 Hz, unless overridden with 50 or 60 Hz) and the events.tsv column whose values
 * are each tested for time-locking. A change while evidence is shown computes the evidence again.
 */
import { useMemo } from 'react';
import { useStore } from 'zustand';
import { eventFactors } from '../../core/evidence/event-selection.ts';
import { mainsFrequency } from '../../core/formats/power-line.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { chooseEvidenceSettings, evidenceSettingsStore, NO_CHOICES } from '../../state/evidence-settings.ts';
import { useWorkbench } from '../../state/index.ts';

function useChoices(recording: LoadedRecording) {
  return useStore(evidenceSettingsStore, (s) => (s.recording === recording ? s.choices : NO_CHOICES));
}

/** "mains 60 Hz (from sub-01_eeg.json)", "mains 60 Hz (given)" once overridden: plain text. */
export function MainsText({ recording }: { recording: LoadedRecording }) {
  const choices = useChoices(recording);
  return mainsFrequency(recording.powerLine, choices.lineHz ?? undefined).text;
}

/** The 50/60 Hz override of the mains frequency used for evidence. */
export function MainsChoice({ recording }: { recording: LoadedRecording }) {
  const choices = useChoices(recording);
  const busy = useWorkbench((s) => s.progress !== null);
  const fromFile = mainsFrequency(recording.powerLine);
  return (
    <select
      value={choices.lineHz === null ? 'file' : String(choices.lineHz)}
      disabled={busy}
      onChange={(e) => void chooseEvidenceSettings({ lineHz: e.target.value === 'file' ? null : (Number(e.target.value) as 50 | 60) })}
      data-testid="mains-override"
      aria-label="Mains frequency used for evidence"
    >
      <option value="file">{fromFile.origin === 'sidecar' ? `as the recording says (${fromFile.hz} Hz)` : 'assumed (50 Hz)'}</option>
      <option value="50">50 Hz (override)</option>
      <option value="60">60 Hz (override)</option>
    </select>
  );
}

/** The events.tsv factor column whose values are each tested for time-locking (event-selection.ts eventFactors). */
export function LockColumnChoice({ recording }: { recording: LoadedRecording }) {
  const choices = useChoices(recording);
  const busy = useWorkbench((s) => s.progress !== null);
  const factors = useMemo(() => eventFactors(recording.events), [recording]);
  if (factors.length === 0) return null;
  return (
    <label className="lock-column" data-testid="lock-column">
      Time-locking tested for every event type and also for each value of{' '}
      <select
        value={choices.lockColumn ?? ''}
        disabled={busy}
        onChange={(e) => void chooseEvidenceSettings({ lockColumn: e.target.value || null })}
        data-testid="lock-column-select"
      >
        <option value="">no column (event types only)</option>
        {factors.map((f) => (
          <option key={f.column} value={f.column}>{f.column} ({f.values.join(', ')})</option>
        ))}
      </select>
    </label>
  );
}
