import { describe, expect, it } from 'vitest';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { computeEvidence, defaultEpochEvent, type EvidenceEvent } from '../../../src/core/evidence/compute-evidence.ts';
import { LOCKING_MAX_SHUFFLES, LOCKING_STOP_AFTER, mulberry32 } from '../../../src/core/evidence/time-locking.ts';

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

  it('returns measures only: no verdicts, and without events no event-locked evidence', () => {
    for (const c of r.components) expect(c).not.toHaveProperty('suggestions');
    expect(r.components[0].erp).toBeNull();
    expect(r.components[0].timeLocking).toEqual([]);
  });

  it('reports the quality of the 1/f fit', () => {
    for (const c of r.components) expect(typeof c.oneOverF.fitR2).toBe('number');
  });

  it('epochs the most frequent non-step event type (BIDS trial_type) by default', () => {
    const events: EvidenceEvent[] = [
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

describe('computeEvidence: time-locking tested for every event type (sequential permutation test)', () => {
  // Two channels, identity decomposition, 60 s at 256 Hz. Component 1: unit Gaussian noise plus a 0.3 s
  // half-sine of amplitude 3 after every "tone" with condition "rare" (nothing after "standard"); component 2:
  // noise only. A third event type, "button", falls at random times; "step" events are never tested.
  const fsL = 256;
  const nL = 60 * fsL;
  const rand = mulberry32(11);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  const events: EvidenceEvent[] = [];
  for (let k = 0; k < 56; k++) events.push({ onset: 1 + k, duration: 0, label: 'tone', columns: { condition: k % 2 === 0 ? 'rare' : 'standard' } });
  for (let k = 0; k < 20; k++) events.push({ onset: 1.5 + 2.8 * k + 0.3 * rand(), duration: 0, label: 'button' });
  for (let k = 0; k < 12; k++) events.push({ onset: 2.25 + 4 * k, duration: 0, label: 'step' });
  const a1 = Float64Array.from({ length: nL }, () => gauss());
  for (const e of events)
    if (e.columns?.condition === 'rare') {
      const at = Math.round(e.onset * fsL);
      for (let j = 0; j < 0.3 * fsL; j++) a1[at + j] += 3 * Math.sin((Math.PI * j) / (0.3 * fsL));
    }
  const data = new Float32Array(2 * nL);
  for (let t = 0; t < nL; t++) {
    data[t] = a1[t];
    data[nL + t] = gauss();
  }
  const identity = Float64Array.from([1, 0, 0, 1]);
  const decomposition: Decomposition = { channels: ['Cz', 'Pz'], nChannels: 2, nComponents: 2, mixing: identity, unmixing: identity, channelMeans: null, method: 'imported', rank: 2, iterations: 0, converged: true, preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] }, recordingSha256: '' };
  const r = computeEvidence({ data, nChannels: 2, nSamples: nL, sampleRate: fsL, labels: ['Cz', 'Pz'], decomposition, dipoleFit: null, events, lockColumn: 'condition' });
  const [locked, noise] = r.components;
  const find = (c: typeof locked, event: string, value?: string) => c.timeLocking!.find((t) => t.event === event && t.value === value)!;

  it('tests every non-step type, most frequent first, and each value of the chosen column within it', () => {
    expect(locked.timeLocking!.map((t) => [t.event, t.column ?? null, t.value ?? null])).toEqual([
      ['tone', null, null],
      ['tone', 'condition', 'rare'],
      ['tone', 'condition', 'standard'],
      ['button', null, null],
    ]);
    expect(find(locked, 'tone', 'rare').nEpochs).toBe(28);
  });

  it('finds the rare condition locked with p at the floor of 999 shuffles, 1 / (1 + 999) (Phipson & Smyth 2010)', () => {
    const rare = find(locked, 'tone', 'rare');
    expect(rare.shuffles).toBe(LOCKING_MAX_SHUFFLES);
    expect(rare.p).toBeCloseTo(1 / (1 + LOCKING_MAX_SHUFFLES), 12);
    expect(rare.strength).toBeGreaterThan(0.05);
    expect(find(locked, 'tone', 'rare').strength).toBeGreaterThan(find(locked, 'tone').strength);
  });

  it('stops early where nothing is locked (Besag & Clifford 1991): p = h / L after h exceedances', () => {
    for (const t of [find(locked, 'tone', 'standard'), find(locked, 'button'), ...noise.timeLocking!]) {
      expect(t.shuffles).toBeLessThan(LOCKING_MAX_SHUFFLES);
      expect(t.p).toBeCloseTo(LOCKING_STOP_AFTER / t.shuffles, 12);
      expect(t.p).toBeGreaterThan(0.01);
    }
  });

  it('keeps the ERP for the epoched type and carries its shuffle count', () => {
    expect(r.epochEvent).toBe('tone');
    expect(locked.erp!.event).toBe('tone');
    expect(locked.erp!.nEpochs).toBe(56);
    expect(locked.erp!.shuffles).toBe(find(locked, 'tone').shuffles);
    expect(locked.erp!.permutationP).toBe(find(locked, 'tone').p);
  });
});
