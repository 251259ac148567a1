/** The methods text states the recording's reference and the decomposition seed, and names the high-pass once. */
import { describe, expect, it } from 'vitest';
import { methodsText } from '../../../src/core/review/methods-text.ts';
import { defaultThresholds } from '../../../src/core/review/thresholds.ts';

const base = {
  software: 'winnow 0.1.0',
  recordingFileName: 'sub-01_task-oddball_eeg.edf',
  recordingSha256: 'c'.repeat(64),
  aim: 'erp' as const,
  decisions: {},
  thresholds: defaultThresholds,
};
const decomposition = {
  method: 'picard' as const, nComponents: 4, nChannels: 4, rank: 4, converged: true, iterations: 87,
  preprocessing: { filter: 'high-pass 1 Hz, windowed-sinc FIR (Hamming), zero phase', highpassHz: 1, lowpassHz: null, reference: 'as recorded', excludedChannels: [] },
};

describe('methodsText: reference and seed', () => {
  it('states the seed and the reference from channels.tsv (BIDS channels.tsv `reference` column)', () => {
    const text = methodsText({ ...base, decomposition: { ...decomposition, seed: 7 }, recordingReference: { channels: 'Cz', eegJson: 'vertex (Cz)' } });
    expect(text).toContain('with random seed 7');
    expect(text).toContain("the recording's reference was Cz (channels.tsv)");
  });
  it('falls back to EEGReference of the *_eeg.json, and says when neither states it or no seed was recorded', () => {
    expect(methodsText({ ...base, decomposition, recordingReference: { channels: null, eegJson: 'linked mastoids' } })).toContain(
      "the recording's reference was linked mastoids (EEGReference in the *_eeg.json)",
    );
    const bare = methodsText({ ...base, decomposition });
    expect(bare).toContain("the recording's sidecars did not state its reference");
    expect(bare).toContain('(random seed not recorded)');
  });
  it('names the high-pass once when the filter description already does', () => {
    const text = methodsText({ ...base, decomposition: { ...decomposition, seed: 1 } });
    expect(text.match(/high-pass/g)).toHaveLength(1);
  });
});
