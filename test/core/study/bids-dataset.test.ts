import { describe, expect, it } from 'vitest';
import { derivativePath, entityStem, findRecordings, normaliseParticipantLabel, parseBidsName, sidecarFor } from '../../../src/core/study/bids-dataset.ts';

// File names and layout from the BIDS specification v1.10 ("Common principles": entities, inheritance;
// "Electroencephalography": sub-<label>/[ses-<label>/]eeg/, the _eeg suffix, .edf/.bdf).
const dataset = [
  'dataset_description.json',
  'participants.tsv',
  'task-oddball_events.json',
  'sub-01/eeg/sub-01_task-oddball_eeg.edf',
  'sub-01/eeg/sub-01_task-oddball_channels.tsv',
  'sub-01/eeg/sub-01_task-oddball_events.tsv',
  'sub-01/eeg/sub-01_electrodes.tsv',
  'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-1_eeg.bdf',
  'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-2_eeg.bdf',
  'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_channels.tsv',
  'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-2_channels.tsv',
  'sub-03/eeg/sub-03_task-oddball_eeg.vhdr',
  'derivatives/other/sub-01/eeg/sub-01_task-oddball_eeg.edf',
  'sourcedata/sub-01_task-oddball_eeg.edf',
];

describe('BIDS names', () => {
  it('parses entities, suffix and extension', () => {
    expect(parseBidsName('sub-02_ses-a_task-oddball_run-1_eeg.bdf')).toEqual({ entities: { sub: '02', ses: 'a', task: 'oddball', run: '1' }, suffix: 'eeg', extension: '.bdf' });
    expect(parseBidsName('recording.edf')).toEqual({ entities: {}, suffix: 'recording', extension: '.edf' });
    expect(parseBidsName('sub-01 task-x_eeg.edf')).toBeNull();
  });
  it('writes entities in the specification order', () => {
    expect(entityStem({ run: '1', task: 'x', sub: '01', ses: 'a' })).toBe('sub-01_ses-a_task-x_run-1');
  });
  it('accepts participant labels with or without "sub-" (BIDS Apps convention)', () => {
    expect(normaliseParticipantLabel('sub-07')).toBe('07');
    expect(normaliseParticipantLabel('07')).toBe('07');
  });
});

describe('a dataset', () => {
  const recs = findRecordings(dataset);
  it('finds EDF and BDF recordings under sub-*/[ses-*/]eeg, not derivatives or sourcedata', () => {
    expect(recs.map((r) => r.path)).toEqual([
      'sub-01/eeg/sub-01_task-oddball_eeg.edf',
      'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-1_eeg.bdf',
      'sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-2_eeg.bdf',
    ]);
    expect(recs[1].stem).toBe('sub-02_ses-a_task-oddball_run-1');
    expect(recs[1].folder).toBe('sub-02/ses-a/eeg');
  });
  it('pairs sidecars by the inheritance principle: the most specific applicable file wins', () => {
    expect(sidecarFor(recs[0], 'electrodes', '.tsv', dataset)).toBe('sub-01/eeg/sub-01_electrodes.tsv');
    expect(sidecarFor(recs[0], 'events', '.json', dataset)).toBe('task-oddball_events.json');
    expect(sidecarFor(recs[1], 'channels', '.tsv', dataset)).toBe('sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_channels.tsv');
    expect(sidecarFor(recs[2], 'channels', '.tsv', dataset)).toBe('sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-2_channels.tsv');
    expect(sidecarFor(recs[1], 'events', '.tsv', dataset)).toBeNull();
  });
  it('names derivatives with the desc entity in the same folders', () => {
    expect(derivativePath(recs[1], 'winnow', 'decomposition', '.json')).toBe('sub-02/ses-a/eeg/sub-02_ses-a_task-oddball_run-1_desc-winnow_decomposition.json');
  });
});
