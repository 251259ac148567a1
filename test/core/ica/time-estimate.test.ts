import { describe, expect, it } from 'vitest';
import { estimateFullSeconds, formatEstimate, timingSlice } from '../../../src/core/ica/time-estimate.ts';

describe('timingSlice', () => {
  it('copies the first seconds of every channel, channel-major, with the boundaries inside them', () => {
    const nSamples = 10;
    const data = Float32Array.from({ length: 2 * nSamples }, (_, i) => i);
    const s = timingSlice({ data, nChannels: 2, nSamples, sampleRate: 2, labels: ['a', 'b'], boundaries: [2, 8] }, 2);
    expect(s.nSamples).toBe(4);
    expect(Array.from(s.data)).toEqual([0, 1, 2, 3, 10, 11, 12, 13]);
    expect(s.boundaries).toEqual([2]);
  });
  it('keeps a recording shorter than the slice as it is', () => {
    const input = { data: new Float32Array(4), nChannels: 1, nSamples: 4, sampleRate: 1, labels: ['a'] };
    expect(timingSlice(input, 30)).toBe(input);
  });
});

describe('estimateFullSeconds', () => {
  it('scales linearly with the number of samples (every stage is linear in samples for fixed channels)', () => {
    expect(estimateFullSeconds(2, 7500, 75000, false)).toEqual({ seconds: 20, atLeast: false });
    expect(estimateFullSeconds(2, 7500, 7500, true)).toEqual({ seconds: 2, atLeast: true });
  });
});

describe('formatEstimate', () => {
  it('rounds to a figure to plan with', () => {
    expect(formatEstimate({ seconds: 0.4, atLeast: false })).toBe('under 1 s');
    expect(formatEstimate({ seconds: 7.4, atLeast: false })).toBe('about 7 s');
    expect(formatEstimate({ seconds: 41, atLeast: false })).toBe('about 40 s');
    expect(formatEstimate({ seconds: 170, atLeast: false })).toBe('about 3 min');
    expect(formatEstimate({ seconds: 720, atLeast: true })).toBe('at least 12 min');
    expect(formatEstimate({ seconds: 5400, atLeast: false })).toBe('about 1.5 h');
  });
});
