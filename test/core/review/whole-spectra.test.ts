import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';
import { bandPower } from '../../../src/core/signal/welch.ts';
import { removedRegionWeights, wholeRegionSpectra } from '../../../src/core/review/whole-spectra.ts';

/**
 * Two channels mixing two sources: s1 a 10 Hz sine of amplitude 4, s2 white noise. A = [[1, 0.5], [0.5, 1]],
 * W = A⁻¹. The region is channel 0.
 */
function scene() {
  const fs = 200;
  const N = fs * 60;
  const rand = mulberry32(7);
  const s1 = Float64Array.from({ length: N }, (_, t) => 4 * Math.sin((2 * Math.PI * 10 * t) / fs));
  const s2 = Float64Array.from({ length: N }, () => rand() * 2 - 1);
  const mixing = Float64Array.from([1, 0.5, 0.5, 1]);
  const det = 1 - 0.25;
  const unmixing = Float64Array.from([1 / det, -0.5 / det, -0.5 / det, 1 / det]);
  const data = new Float32Array(2 * N);
  for (let t = 0; t < N; t++) {
    data[t] = s1[t] + 0.5 * s2[t];
    data[N + t] = 0.5 * s1[t] + s2[t];
  }
  return { fs, N, data, mixing, unmixing };
}

describe('wholeRegionSpectra', () => {
  it('with nothing removed, before and after are the same spectrum', () => {
    const { fs, N, data, mixing, unmixing } = scene();
    const v = removedRegionWeights(unmixing, mixing, 2, 2, [0], []);
    const s = wholeRegionSpectra({ data, nSamples: N, sampleRate: fs, rows: [0, 1], roi: [0], removedWeights: v, channelMeans: null });
    expect(Array.from(s.after)).toEqual(Array.from(s.before));
    expect(s.durationS).toBe(60);
  });

  it('removing the sine component takes its power out of the region: a sine of amplitude a carries a²/2 (Parseval)', () => {
    const { fs, N, data, mixing, unmixing } = scene();
    const v = removedRegionWeights(unmixing, mixing, 2, 2, [0], [0]);
    const s = wholeRegionSpectra({ data, nSamples: N, sampleRate: fs, rows: [0, 1], roi: [0], removedWeights: v, channelMeans: null });
    // Before: the sine at channel 0 has amplitude 4, so 8 µV² near 10 Hz (plus a little noise power).
    expect(bandPower(s.before, s.df, 9, 11)).toBeGreaterThan(7.6);
    expect(bandPower(s.before, s.df, 9, 11)).toBeLessThan(8.4);
    // After: only the noise (0.5 · uniform(−1, 1), variance 0.25/3 spread over 100 Hz) remains in 9–11 Hz.
    expect(bandPower(s.after, s.df, 9, 11)).toBeLessThan(0.01);
    // The noise part elsewhere is untouched: 20–80 Hz holds 60/100 of 0.25/3 µV² (white noise).
    expect(bandPower(s.after, s.df, 20, 80)).toBeCloseTo((0.6 * 0.25) / 3, 2);
  });

  it('weights an empty region as NaN rather than inventing a signal', () => {
    const { fs, N, data, mixing, unmixing } = scene();
    const v = removedRegionWeights(unmixing, mixing, 2, 2, [], [0]);
    expect(Array.from(v)).toEqual([0, 0]);
    const s = wholeRegionSpectra({ data, nSamples: N, sampleRate: fs, rows: [0, 1], roi: [], removedWeights: v, channelMeans: null });
    expect(Number.isNaN(s.before[5])).toBe(true);
  });
});
