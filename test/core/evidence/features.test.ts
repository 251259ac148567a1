import { describe, expect, it } from 'vitest';
import { channelMoments, computeActivations, pearson, signalMoments } from '../../../src/core/evidence/activations.ts';
import { cardiacPeriodicity } from '../../../src/core/evidence/cardiac.ts';
import { mapFocality } from '../../../src/core/evidence/focality.ts';
import { stepLocking } from '../../../src/core/evidence/motion.ts';
import { mapGeometry, mirrorPairs, stepLikeness } from '../../../src/core/evidence/ocular.ts';
import { dominantFrequency, interTrialCoherence, lockedShare, lockingPermutationTest, mulberry32 } from '../../../src/core/evidence/time-locking.ts';
import { extractEpochs } from '../../../src/core/signal/epochs.ts';
import type { Decomposition } from '../../../src/core/decomposition.ts';

/** Seeded standard normal numbers (Box–Muller over mulberry32). */
function gaussian(seed: number, n: number): Float64Array {
  const rand = mulberry32(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  return out;
}

describe('activations', () => {
  it('computes W (X − μ) block by block, matching a hand-multiplied 2 × 3 example', () => {
    // X: 3 channels × 4 samples; W: 2 × 3; μ: channel means
    const X = Float32Array.from([1, 2, 3, 4, 0, 0, 1, 1, 2, 2, 2, 6]);
    const W = Float64Array.from([1, 0, -1, 0.5, 2, 0]);
    const mu = Float64Array.from([2.5, 0.5, 3]);
    const dec = { nChannels: 3, nComponents: 2, unmixing: W, channelMeans: mu } as unknown as Decomposition;
    const s = computeActivations(dec, X, 4, 0, 2);
    // row 0 = (x0 − 2.5) − (x2 − 3); row 1 = 0.5 (x0 − 2.5) + 2 (x1 − 0.5)
    expect(Array.from(s)).toEqual([-0.5, 0.5, 1.5, -1.5, -1.75, -1.25, 1.25, 1.75]);
    const second = computeActivations(dec, X, 4, 1, 2);
    expect(Array.from(second)).toEqual([-1.75, -1.25, 1.25, 1.75]);
  });

  it('gives excess kurtosis −2 for a ±1 square wave and about 0 for Gaussian noise (definition, docs/methods.md §14)', () => {
    expect(signalMoments([1, -1, 1, -1]).kurtosis).toBeCloseTo(-2, 12);
    expect(Math.abs(signalMoments(gaussian(3, 200_000)).kurtosis)).toBeLessThan(0.05);
  });

  it('computes population channel variances and Pearson r of ±1 for proportional signals', () => {
    const { means, variances } = channelMoments(Float32Array.from([1, 3, 2, 2]), 2, 2);
    expect(Array.from(means)).toEqual([2, 2]);
    expect(Array.from(variances)).toEqual([1, 0]);
    expect(pearson([1, 2, 3], [-2, -4, -6])).toBeCloseTo(-1, 12);
  });
});

describe('map evidence', () => {
  // four electrodes: a left/right frontal pair and a left/right posterior pair, plus Fpz and Pz
  const positions = Float64Array.from([-0.6, 0.6, 0.5, 0.6, 0.6, 0.5, -0.6, -0.6, 0.5, 0.6, -0.6, 0.5, 0, 0.95, 0.3, 0, -0.7, 0.7]);

  it('finds the mirror pairs of a montage', () => {
    expect(mirrorPairs(positions, 6)).toEqual([
      [0, 1],
      [2, 3],
    ]);
  });

  it('scores an antisymmetric map +1 and a symmetric map −1 (docs/methods.md §14 definition, pooled over pairs)', () => {
    const pairs = mirrorPairs(positions, 6);
    expect(mapGeometry([1, -1, 0.5, -0.5, 0, 0], positions, pairs).lateralAntisymmetry).toBeCloseTo(1, 12);
    expect(mapGeometry([1, 1, 0.5, 0.5, 0, 0], positions, pairs).lateralAntisymmetry).toBeCloseTo(-1, 12);
  });

  it('measures frontal-pole share and gradient of a map strongest at Fpz', () => {
    const g = mapGeometry([0.2, 0.2, 0.1, 0.1, 1, 0.1], positions, mirrorPairs(positions, 6));
    expect(g.frontalShare).toBeCloseTo(1 / (1 + 0.04 + 0.04 + 0.01 + 0.01 + 0.01), 12);
    expect(g.frontalGradient).toBeCloseTo(1 / ((0.2 + 0.2 + 0.1 + 0.1 + 0.1) / 5), 12);
    expect(g.anteriorCorrelation).toBeGreaterThan(0.5);
  });

  it('gives focality 16/25 for the map (3, 0, 0, 4) and names its electrode', () => {
    expect(mapFocality([3, 0, 0, -4])).toEqual({ share: 16 / 25, channelIndex: 3 });
  });
});

describe('time course evidence', () => {
  const fs = 250;

  it('calls persistent level shifts step-like (≈ 1) and returning bumps not step-like (≈ 0)', () => {
    const n = fs * 60;
    const steps = gaussian(5, n).map((v) => 0.02 * v);
    const bumps = Float64Array.from(steps);
    // a staircase: the level alternates between 0 and 5 every 1.5 s
    for (let i = 0; i < n; i++) steps[i] += (Math.floor(i / (1.5 * fs)) % 2) * 5;
    for (let k = 1; k < 40; k++) {
      const at = Math.round(k * 1.5 * fs);
      for (let j = 0; j < 0.25 * fs; j++) bumps[at + j] += 5 * Math.sin((Math.PI * j) / (0.25 * fs));
    }
    expect(stepLikeness(steps, fs)).toBeGreaterThan(0.9);
    expect(stepLikeness(bumps, fs)).toBeLessThan(0.2);
  });

  it('finds 60 beats per minute in a 1 Hz spike train with noise, and no beat in noise alone', () => {
    const n = fs * 60;
    const x = gaussian(7, n).map((v) => 0.05 * v);
    for (let t = 100; t < n - 10; t += fs) for (let j = -3; j <= 3; j++) x[t + j] += Math.exp(-(j * j) / 2);
    const beat = cardiacPeriodicity(x, fs);
    expect(beat.bpm).not.toBeNull();
    expect(beat.bpm!).toBeCloseTo(60, 0);
    expect(beat.peak).toBeGreaterThan(0.8);
    expect(cardiacPeriodicity(gaussian(8, n), fs).peak).toBeLessThan(0.15);
  });

  it('gives a locked share of 1 for identical trials and about 0 for noise; the permutation test separates them', () => {
    const n = fs * 120;
    const noise = gaussian(9, n);
    const onsets: number[] = [];
    for (let t = 1; t < 118; t += 1.1) onsets.push(t);
    const evoked = new Float64Array(n);
    for (const o of onsets) for (let j = 0; j < 50; j++) evoked[Math.round(o * fs) + j] = Math.sin((2 * Math.PI * j) / 50);
    const ep = extractEpochs(evoked, fs, onsets, -0.2, 0.8, null);
    expect(lockedShare(evoked, ep.eventSamples, ep.firstOffset, ep.length)).toBeCloseTo(1, 10);
    expect(Math.abs(lockedShare(noise, ep.eventSamples, ep.firstOffset, ep.length))).toBeLessThan(0.02);
    const mixed = noise.map((v, i) => v + evoked[i]);
    const test = lockingPermutationTest(mixed, ep.eventSamples, ep.firstOffset, ep.length, 49, 1);
    expect(test.p).toBeCloseTo(0.02, 10); // no shuffle reaches it: (1 + 0) / (1 + 49)
    // evoked power 0.5 · 50/251 of the epoch against unit noise: ≈ 0.09 of the variance is locked
    expect(test.observed - test.chance).toBeGreaterThan(0.05);
    expect(lockingPermutationTest(noise, ep.eventSamples, ep.firstOffset, ep.length, 49, 1).p).toBeGreaterThan(0.05);
  });

  it('gives inter-trial coherence 1 at the dominant frequency of identical trials', () => {
    const n = fs * 30;
    const x = new Float64Array(n);
    const onsets = [2, 5, 8, 11, 14, 17];
    for (const o of onsets) for (let j = 0; j < 250; j++) x[Math.round(o * fs) + j] = Math.sin((2 * Math.PI * 5 * j) / fs);
    const ep = extractEpochs(x, fs, onsets, 0, 0.996, null);
    const f = dominantFrequency(x.subarray(2 * fs, 3 * fs), fs);
    expect(f).toBeCloseTo(5, 10);
    expect(interTrialCoherence(ep, fs, f)).toBeCloseTo(1, 10);
  });

  it('finds step locking per foot even when left and right steps swing the opposite way', () => {
    const n = fs * 120;
    const x = gaussian(11, n).map((v) => 0.2 * v);
    const steps: { onset: number; label: string }[] = [];
    for (let k = 0; k < 200; k++) {
      const onset = 1 + k * 0.55;
      const sign = k % 2 === 0 ? 1 : -1;
      steps.push({ onset, label: sign > 0 ? 'step/left' : 'step/right' });
      for (let j = 0; j < 100; j++) x[Math.round(onset * fs) + j] += sign * Math.exp(-j / 50) * Math.sin((2 * Math.PI * 2.5 * j) / fs);
    }
    const r = stepLocking(x, fs, steps);
    expect(r).not.toBeNull();
    expect(r!.share).toBeGreaterThan(0.5);
    expect(stepLocking(gaussian(12, n), fs, steps)!.share).toBeLessThan(0.05);
  });
});

describe('lockedShare on a coarser grid', () => {
  it('gives 1 for identical trials and ≈ the full-rate value for a mixture when every 2nd sample is used', () => {
    const fs = 250;
    const n = fs * 60;
    const x = gaussian(13, n);
    const onsets: number[] = [];
    for (let t = 1; t < 58; t += 1.1) onsets.push(t);
    const evoked = new Float64Array(n);
    for (const o of onsets) for (let j = 0; j < 100; j++) evoked[Math.round(o * fs) + j] = 2 * Math.sin((2 * Math.PI * j) / 100);
    const ep = extractEpochs(evoked, fs, onsets, -0.2, 0.8, null);
    expect(lockedShare(evoked, ep.eventSamples, ep.firstOffset, ep.length, undefined, 2)).toBeCloseTo(1, 10);
    const mixed = x.map((v, i) => v + evoked[i]);
    const full = lockedShare(mixed, ep.eventSamples, ep.firstOffset, ep.length);
    expect(lockedShare(mixed, ep.eventSamples, ep.firstOffset, ep.length, undefined, 2)).toBeCloseTo(full, 1);
  });
});
