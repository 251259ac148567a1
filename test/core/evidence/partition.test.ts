import { describe, expect, it } from 'vitest';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { computeEvidence, type EvidenceInput } from '../../../src/core/evidence/compute-evidence.ts';
import { mergeEvidenceResults, splitComponentRanges } from '../../../src/core/evidence/partition.ts';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';

describe('splitComponentRanges', () => {
  it('covers all components in nearly equal contiguous pieces', () => {
    expect(splitComponentRanges(64, 2)).toEqual([
      [0, 32],
      [32, 64],
    ]);
    expect(splitComponentRanges(5, 2)).toEqual([
      [0, 3],
      [3, 5],
    ]);
    expect(splitComponentRanges(1, 4)).toEqual([[0, 1]]);
    expect(splitComponentRanges(0, 2)).toEqual([]);
  });
});

describe('mergeEvidenceResults', () => {
  it('gives the same components from two halves as from one run (worker split is exact)', () => {
    const fs = 100;
    const n = fs * 40;
    const k = 5;
    const rand = mulberry32(2);
    const data = new Float32Array(k * n).map(() => rand() - 0.5);
    for (let t = 0; t < n; t++) data[t] += Math.sin((2 * Math.PI * 10 * t) / fs);
    const labels = ['Fz', 'Cz', 'Pz', 'C3', 'C4'];
    const identity = new Float64Array(k * k).map((_, i) => (i % (k + 1) === 0 ? 1 : 0));
    const decomposition: Decomposition = { channels: labels, nChannels: k, nComponents: k, mixing: identity, unmixing: identity, channelMeans: null, method: 'imported', rank: k, iterations: 0, converged: true, preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] }, recordingSha256: '' };
    const events = Array.from({ length: 30 }, (_, i) => ({ onset: 1 + i * 1.2, duration: 0, label: 'cue' }));
    const input: EvidenceInput = { data, nChannels: k, nSamples: n, sampleRate: fs, labels, decomposition, events, dipoleFit: null, permutations: 9 };
    const whole = computeEvidence(input);
    const merged = mergeEvidenceResults(splitComponentRanges(k, 2).map((r) => computeEvidence({ ...input, componentRange: r })).reverse());
    expect(merged.components.map((c) => c.index)).toEqual([1, 2, 3, 4, 5]);
    expect(merged.components).toEqual(whole.components);
  });
});
