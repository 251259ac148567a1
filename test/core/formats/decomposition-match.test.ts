import { describe, expect, it } from 'vitest';
import { matchDecompositionToRecording } from '../../../src/core/formats/decomposition-match.ts';
import { base } from './decomposition-fixture.ts';

describe('matchDecompositionToRecording', () => {
  it('accepts a decomposition whose channels are all in the recording and warns about the unused ones', () => {
    const r = matchDecompositionToRecording(base, ['FZ', 'Cz', 'Pz', 'HEOG'], 'd.json');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.channels).toEqual(['FZ', 'Cz', 'Pz']);
    expect(r.warnings[0]).toMatch(/HEOG/);
  });
  it('refuses a decomposition with channels the recording lacks, naming them', () => {
    const r = matchDecompositionToRecording(base, ['Fz', 'Cz'], 'd.json');
    expect(!r.ok && r.error.code).toBe('unknown-channel');
    expect(!r.ok && r.error.message).toMatch(/not in the recording: Pz/);
  });
  it('refuses wrong shapes and non-finite values', () => {
    const r1 = matchDecompositionToRecording({ ...base, mixing: new Float64Array(5) }, ['Fz', 'Cz', 'Pz'], 'd.json');
    expect(!r1.ok && r1.error.code).toBe('bad-shape');
    const W = base.unmixing.slice();
    W[4] = Infinity;
    const r2 = matchDecompositionToRecording({ ...base, unmixing: W }, ['Fz', 'Cz', 'Pz'], 'd.json');
    expect(!r2.ok && r2.error.message).toMatch(/unmixing value 5 is Infinity/);
  });
});

