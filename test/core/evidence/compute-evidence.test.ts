import { describe, expect, it } from 'vitest';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { computeEvidence, defaultEpochEvent } from '../../../src/core/evidence/compute-evidence.ts';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';

const fs = 256;
const n = fs * 20;

/** 3 EEG channels plus a VEOG channel the decomposition does not use, 2 components with known maps. */
function setup() {
  const rand = mulberry32(5);
  // component 1: 16 Hz sine of amplitude 1 (a bin centre for 512-point segments at 256 Hz), map (2, 1, 0)
  // component 2: small uniform noise, map (0, 1, 1)
  const s1 = Float64Array.from({ length: n }, (_, t) => Math.sin((2 * Math.PI * 16 * t) / fs));
  const s2 = Float64Array.from({ length: n }, () => 0.1 * (rand() - 0.5));
  const A = [
    [2, 0],
    [1, 1],
    [0, 1],
  ];
  const data = new Float32Array(4 * n);
  for (let c = 0; c < 3; c++) for (let t = 0; t < n; t++) data[c * n + t] = A[c][0] * s1[t] + A[c][1] * s2[t];
  for (let t = 0; t < n; t++) data[3 * n + t] = rand() - 0.5; // VEOG
  const mixing = Float64Array.from(A.flat());
  // left inverse of A (rows chosen by hand): W A = I
  const unmixing = Float64Array.from([0.5, 0, 0, 0, 0, 1]);
  const decomposition: Decomposition = { channels: ['Cz', 'Pz', 'Oz'], nChannels: 3, nComponents: 2, mixing, unmixing, channelMeans: null, method: 'imported', rank: 2, iterations: 0, converged: true, preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: ['VEOG'] }, recordingSha256: '' };
  return { data, decomposition, labels: ['Cz', 'Pz', 'Oz', 'VEOG'], types: ['EEG', 'EEG', 'EEG', 'VEOG'], s2 };
}

describe('computeEvidence', () => {
  const { data, decomposition, labels, types, s2 } = setup();
  const r = computeEvidence({ data, nChannels: 4, nSamples: n, sampleRate: fs, labels, types, decomposition, dipoleFit: null });

  it('gives the back-projected sinusoid A²/2 µV² at its strongest channel (Welch closed form, docs/methods.md §1)', () => {
    const c = r.components[0];
    expect(c.strongestChannel).toEqual({ index: 0, label: 'Cz', weight: 2 });
    const { frequencies, power, df } = c.spectrum;
    const k = frequencies.findIndex((f) => f === 16);
    expect((power[k - 1] + power[k] + power[k + 1]) * df).toBeCloseTo(2, 6); // (2 · 1)² / 2
    expect(frequencies[0]).toBe(1);
    expect(frequencies[frequencies.length - 1]).toBe(100);
  });

  it('computes variance shares from the map and the activation variance', () => {
    const v1 = 0.5; // var of a unit sine over whole cycles
    let v2 = 0;
    const m2 = s2.reduce((s, v) => s + v, 0) / n;
    for (const v of s2) v2 += (v - m2) ** 2;
    v2 /= n;
    let total = 0;
    for (let c = 0; c < 3; c++) {
      const row = data.subarray(c * n, (c + 1) * n);
      const m = row.reduce((s, v) => s + v, 0) / n;
      total += row.reduce((s, v) => s + (v - m) ** 2, 0) / n;
    }
    expect(r.components[0].varianceShare).toBeCloseTo((5 * v1) / total, 4);
    expect(r.components[1].varianceShare).toBeCloseTo((2 * v2) / total, 4);
    expect(r.components[0].variancePerChannel[2]).toBe(0);
  });

  it('uses the EOG channel outside the decomposition as the vertical eye reference', () => {
    expect(r.components[0].eogCorrelation.source).toBe('EOG channels');
    expect(r.components[0].eogCorrelation.vertical!).toBeLessThan(0.1);
  });

  it('gives every component a suggestion for every aim and reports stage timings', () => {
    for (const c of r.components) expect(Object.keys(c.suggestions).sort()).toEqual(['conservative', 'erp', 'oscillations']);
    for (const stage of ['activations', 'spectra', 'epochs', 'dipoles', 'total']) expect(r.timings[stage]).toBeGreaterThanOrEqual(0);
    expect(r.components[0].erp).toBeNull();
  });

  it('epochs the most frequent non-step event type (BIDS trial_type) by default', () => {
    const events = [
      { onset: 1, duration: 0, label: 'tone', columns: { condition: 'standard' } },
      { onset: 2, duration: 0, label: 'tone', columns: { condition: 'rare' } },
      { onset: 3, duration: 0, label: 'step', columns: { foot: 'left' } },
      { onset: 4, duration: 0, label: 'step', columns: { foot: 'left' } },
      { onset: 5, duration: 0, label: 'step', columns: { foot: 'left' } },
      { onset: 6, duration: 0, label: 'button' },
    ];
    expect(defaultEpochEvent(events)).toBe('tone');
    const withEvents = computeEvidence({ data, nChannels: 4, nSamples: n, sampleRate: fs, labels, types, decomposition, dipoleFit: null, events, permutations: 5 });
    expect(withEvents.epochEvent).toBe('tone');
    expect(withEvents.components[0].erp?.nEpochs).toBe(2);
    expect(withEvents.components[0].trialStack?.data.length).toBe(2 * withEvents.components[0].trialStack!.length);
  });
});
