import { describe, expect, it } from 'vitest';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { computeEvidence } from '../../../src/core/evidence/compute-evidence.ts';
import type { ComponentEvidence } from '../../../src/core/evidence/types.ts';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';
import { computeImpact, orderByImpact } from '../../../src/core/review/impact.ts';
import { epochMean, extractEpochs } from '../../../src/core/signal/epochs.ts';

/** Just the fields impact reads, on a hand-made component. */
function component(index: number, weight: number, erpMean: number[] | null, power: number[]): ComponentEvidence {
  const frequencies = Float64Array.from([8, 9, 10, 11]);
  return {
    index,
    strongestChannel: { index: 0, label: 'Pz', weight },
    erp: erpMean ? { times: Float64Array.from([0.1, 0.2]), mean: Float64Array.from(erpMean) } : null,
    spectrum: { frequencies, power: Float64Array.from(power), powerDb: new Float64Array(4), nfft: 256, df: 1 },
  } as unknown as ComponentEvidence;
}

describe('computeImpact', () => {
  // 2 channels × 3 components; ROI = channel 0 whose mixing row is (1, 1, 0.5)
  const mixing = Float64Array.from([1, 1, 0.5, 0, 0, 1]);
  const comps = [component(1, 2, [2, 4], [1, 1, 1, 1]), component(2, 1, [1, 0], [4, 4, 4, 4]), component(3, 1, null, [0, 0, 0, 0])];

  it('splits a hand-computed ROI ERP into projection shares and measures what removals change', () => {
    // c1 = 1·[2,4]/2 = [1,2], c2 = 1·[1,0]/1 = [1,0]; total [2,2]; shares (2+4)/8 and 2/8
    const r = computeImpact({ components: comps, mixing, nChannels: 2, nComponents: 3, roi: [0], target: { kind: 'erp', windowS: [0.1, 0.2] }, removed: [2] });
    expect(r.perComponent[0].share).toBeCloseTo(0.75, 12);
    expect(r.perComponent[1].share).toBeCloseTo(0.25, 12);
    expect(Number.isNaN(r.perComponent[2].share)).toBe(true);
    expect(r.before).toBeCloseTo(2, 12);
    expect(r.after).toBeCloseTo(1.5, 12);
    expect(r.relativeChange).toBeCloseTo(-0.25, 12);
    expect(r.removedRms).toBeCloseTo(Math.SQRT1_2, 12);
    expect(r.order).toEqual([1, 2, 3]);
  });

  it('splits ROI band power into shares under independence and measures what removals change', () => {
    // w_i² · P_i / weight_i² · bins · df: comp 1: 1² · 1 / 2² · 3 · 1 = 0.75; comp 2: 1² · 4 / 1² · 3 · 1 = 12
    const r = computeImpact({ components: comps, mixing, nChannels: 2, nComponents: 3, roi: [0], target: { kind: 'oscillations', bandHz: [8, 10] }, removed: new Set([2]) });
    expect(r.perComponent[0].contribution).toBeCloseTo(0.75, 12);
    expect(r.perComponent[1].contribution).toBeCloseTo(12, 12);
    expect(r.before).toBeCloseTo(12.75, 12);
    expect(r.after).toBeCloseTo(0.75, 12);
    expect(r.order).toEqual([2, 1, 3]);
  });

  it('orders components by |share|, NaN last', () => {
    expect(
      orderByImpact([
        { index: 1, share: 0.1, contribution: 0, removed: false },
        { index: 2, share: NaN, contribution: 0, removed: false },
        { index: 3, share: -0.5, contribution: 0, removed: false },
      ]),
    ).toEqual([3, 1, 2]);
  });

  it('adds up to the ERP of the channels themselves when the decomposition is square (linearity of averaging)', () => {
    const fs = 100;
    const n = fs * 60;
    const rand = mulberry32(4);
    const k = 3;
    const A = Float64Array.from([1, 0.4, -0.2, 0.3, 1, 0.5, -0.1, 0.2, 1]);
    // inverse of A by cofactors (3 × 3)
    const [a, b, c, d, e, f, g, h, i] = A;
    const det = a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
    const W = Float64Array.from([e * i - f * h, c * h - b * i, b * f - c * e, f * g - d * i, a * i - c * g, c * d - a * f, d * h - e * g, b * g - a * h, a * e - b * d].map((v) => v / det));
    const S = new Float64Array(k * n).map(() => rand() - 0.5);
    const onsets: number[] = [];
    for (let t = 1; t < 58; t += 0.9) onsets.push(t);
    for (const o of onsets) for (let j = 0; j < 30; j++) S[Math.round(o * fs) + j] += Math.sin((Math.PI * j) / 30);
    const X = new Float32Array(k * n);
    for (let ch = 0; ch < k; ch++) for (let t = 0; t < n; t++) X[ch * n + t] = A[ch * k] * S[t] + A[ch * k + 1] * S[n + t] + A[ch * k + 2] * S[2 * n + t];
    const labels = ['C3', 'Cz', 'C4'];
    const dec: Decomposition = { channels: labels, nChannels: k, nComponents: k, mixing: A, unmixing: W, channelMeans: null, method: 'imported', rank: k, iterations: 0, converged: true, preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] }, recordingSha256: '' };
    const ev = computeEvidence({ data: X, nChannels: k, nSamples: n, sampleRate: fs, labels, decomposition: dec, events: onsets.map((onset) => ({ onset, duration: 0, label: 'cue' })), dipoleFit: null, permutations: 5 });
    const r = computeImpact({ components: ev.components, mixing: A, nChannels: k, nComponents: k, roi: [0, 1], target: { kind: 'erp', windowS: [0.1, 0.3] }, removed: [] });
    // the same number from the channels: ROI-average the data, epoch, baseline, average, mean over the window
    const roiSignal = new Float64Array(n).map((_, t) => (X[t] + X[n + t]) / 2);
    const ep = extractEpochs(roiSignal, fs, onsets, -0.2, 0.8);
    const avg = epochMean(ep.epochs, ep.nEpochs, ep.length);
    let sum = 0;
    let count = 0;
    ep.times.forEach((t, j) => {
      if (t >= 0.1 - 1e-9 && t <= 0.3 + 1e-9) {
        sum += avg[j];
        count++;
      }
    });
    expect(r.before).toBeCloseTo(sum / count, 5);
    expect(r.perComponent.reduce((s, p) => s + p.share, 0)).toBeCloseTo(1, 10);
  });
});
