import { describe, expect, it } from 'vitest';
import { sortDecompositionFiles, sortParticipantFiles } from '../../src/state/participant-files.ts';

const f = (name: string) => ({ name });

describe('sortParticipantFiles', () => {
  it('separates the recording and its BIDS sidecars from a decomposition and a decisions file', () => {
    const s = sortParticipantFiles([
      f('sub-01_task-odd_eeg.edf'), f('sub-01_task-odd_channels.tsv'), f('sub-01_task-odd_events.tsv'), f('sub-01_electrodes.tsv'),
      f('sub-01_coordsystem.json'), f('sub-01_task-odd_eeg.json'), f('sub-01_decomposition.json'), f('sub-01_decisions.json'), f('notes.docx'),
    ]);
    expect(s.recordingFiles.map((x) => x.name)).toEqual([
      'sub-01_task-odd_eeg.edf', 'sub-01_task-odd_channels.tsv', 'sub-01_task-odd_events.tsv', 'sub-01_electrodes.tsv', 'sub-01_coordsystem.json', 'sub-01_task-odd_eeg.json',
    ]);
    expect(s.decompositionFiles.map((x) => x.name)).toEqual(['sub-01_decomposition.json']);
    expect(s.decisionsFile?.name).toBe('sub-01_decisions.json');
    expect(s.ignored.map((x) => x.name)).toEqual(['notes.docx']);
  });
});

describe('sortDecompositionFiles', () => {
  it('prefers our JSON, else reads a matrix as mixing or unmixing by its name', () => {
    expect(sortDecompositionFiles([f('a_unmixing.tsv'), f('a_decomposition.json')])?.kind).toBe('json');
    expect(sortDecompositionFiles([f('a_mixing.csv')])?.kind).toBe('mixing');
    expect(sortDecompositionFiles([f('a_unmixing.tsv')])?.kind).toBe('unmixing');
    expect(sortDecompositionFiles([f('weights.csv')])?.kind).toBe('unmixing');
    expect(sortDecompositionFiles([])).toBeNull();
  });
});
