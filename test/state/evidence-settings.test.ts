/**
 * The reviewer's evidence settings (mains override, lock column): kept per recording, computing the evidence
 * again when changed after it was shown, and handed to the evidence input (recording-input.ts). A plain
 * `eeg.json` beside a recording (no BIDS entities) is sorted with the recording's files, as `*_eeg.json` is,
 * and is paired by the loader (BIDS specification v1.11: sidecar of the data file; PowerLineFrequency).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { workbenchStore } from '../../src/state/index.ts';
import { setWorkbenchServices } from '../../src/state/services.ts';
import { chooseEvidenceSettings, evidenceChoicesFor, evidenceSettingsStore, NO_CHOICES } from '../../src/state/evidence-settings.ts';
import { sortParticipantFiles } from '../../src/state/participant-files.ts';
import { evidenceInputOf } from '../../src/core/recording-input.ts';
import { readPowerLine } from '../../src/core/formats/recording-loader.ts';
import { fakeServices, recording, decomposition } from './fake-services.ts';

const st = () => workbenchStore.getState();
afterEach(() => {
  workbenchStore.setState(workbenchStore.getInitialState(), true);
  evidenceSettingsStore.setState({ recording: null, choices: NO_CHOICES });
  setWorkbenchServices(null);
});

const source = (name: string, text: string) => {
  const bytes = new TextEncoder().encode(text);
  return { name, size: bytes.length, read: async (start: number, end: number) => bytes.slice(start, end) };
};

describe('evidence settings', () => {
  it('apply to the recording they were chosen for and compute the evidence again', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await st().loadParticipant({ recordingFiles: [new File([new Uint8Array(4)], 'sub-01_eeg.edf')], decompositionFiles: [new File(['{}'], 'sub-01_decomposition.json')] });
    expect(services.evidenceCalls).toBe(1);
    await chooseEvidenceSettings({ lineHz: 60 });
    expect(evidenceChoicesFor(st().recording)).toEqual({ lineHz: 60, lockColumn: null });
    expect(services.evidenceCalls).toBe(2);
    await chooseEvidenceSettings({ lineHz: 60 }); // unchanged: nothing computed
    expect(services.evidenceCalls).toBe(2);
    await chooseEvidenceSettings({ lockColumn: 'condition' });
    expect(services.evidenceCalls).toBe(3);
    expect(evidenceChoicesFor({ ...recording })).toEqual(NO_CHOICES); // another recording starts from its files
  });

  it('reach the evidence input: the override beats the sidecar, the lock column is passed through', () => {
    const withSidecar = { ...recording, powerLine: { hz: 50, sidecar: 'sub-01_eeg.json' } } as typeof recording;
    expect(evidenceInputOf(withSidecar, decomposition).input.lineHz).toBe(50);
    const { input, mains } = evidenceInputOf(withSidecar, decomposition, { lineHz: 60, lockColumn: 'condition' });
    expect(input.lineHz).toBe(60);
    expect(mains.origin).toBe('option');
    expect(input.lockColumn).toBe('condition');
  });
});

describe('plain eeg.json beside a recording', () => {
  it('is sorted with the recording files, like *_eeg.json', () => {
    const sorted = sortParticipantFiles([{ name: 'recording.edf' }, { name: 'eeg.json' }, { name: 'sub-01_eeg.json' }, { name: 'notes.json' }]);
    expect(sorted.recordingFiles.map((f) => f.name)).toEqual(['recording.edf', 'eeg.json', 'sub-01_eeg.json']);
    expect(sorted.ignored.map((f) => f.name)).toEqual(['notes.json']);
  });

  it('gives the loader its PowerLineFrequency', async () => {
    const r = await readPowerLine([source('recording.edf', ''), source('eeg.json', '{"PowerLineFrequency": 60}')], 'recording.edf');
    expect(r.powerLine).toEqual({ hz: 60, sidecar: 'eeg.json' });
  });
});
