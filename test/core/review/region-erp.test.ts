import { describe, expect, it } from 'vitest';
import { recomputeCleaned, windowActivations } from '../../../src/core/review/preview-projection.ts';
import { regionErpAfter, regionErpPlan, regionMean, regionMixing } from '../../../src/core/review/region-erp.ts';
import { epochMean, extractEpochs } from '../../../src/core/signal/epochs.ts';
import { randomProblem } from './random-problem.ts';

describe('regionErpAfter', () => {
  it('equals the ERP of the fully cleaned data averaged over the region (linearity of §5 and §7.6)', () => {
    const n = 6, k = 4, T = 2000, fs = 100;
    const { X, W, A, m } = randomProblem(n, k, T, 11);
    const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: T, channelMeans: m });
    const onsets = [2, 4.5, 7.01, 9.5, 12, 15.3];
    const roi = [1, 4];
    const removed = new Set([0, 2]);
    const erpOf = (x: Float32Array | Float64Array) => {
      const ep = extractEpochs(x, fs, onsets, -0.2, 0.5);
      return epochMean(ep.epochs, ep.nEpochs, ep.length);
    };
    const roiMean = (M: ArrayLike<number>) => {
      const out = new Float64Array(T);
      for (const c of roi) for (let t = 0; t < T; t++) out[t] += M[c * T + t] / roi.length;
      return out;
    };
    const before = erpOf(roiMean(X));
    const compErps = new Float64Array(k * before.length);
    for (let i = 0; i < k; i++) compErps.set(erpOf(S.subarray(i * T, (i + 1) * T)), i * before.length);
    const after = regionErpAfter(before, compErps, regionMixing(A, n, k, roi), removed);
    const direct = erpOf(roiMean(recomputeCleaned({ original: X, nChannels: n, length: T, mixing: A, activations: S, nComponents: k, removed })));
    for (let t = 0; t < after.length; t++) expect(after[t]).toBeCloseTo(direct[t], 8);
  });
  it('gives NaN region weights for an empty region', () => {
    expect(Number.isNaN(regionMixing(new Float64Array(4), 2, 2, [])[0])).toBe(true);
  });
});

describe('regionErpPlan', () => {
  it('gives region and component ERPs whose combination equals the ERP of the cleaned data', () => {
    const n = 5, k = 3, T = 1500, fs = 100;
    const { X, W, A, m } = randomProblem(n, k, T, 21);
    // recording rows in a different order from the decomposition channels: decomposition c ↔ row perm[c]
    const perm = [3, 0, 4, 1, 2];
    const data = new Float32Array(n * T);
    for (let c = 0; c < n; c++) data.set(X.subarray(c * T, (c + 1) * T), perm[c] * T);
    const onsets = [1, 3.3, 5.5, 8.02, 11];
    const roi = [0, 2];
    const plan = regionErpPlan({ data, nSamples: T, sampleRate: fs, rows: perm, roi, unmixing: W, mixing: A, nComponents: k, onsetsS: onsets })!;
    expect(plan.nEpochs).toBe(5);
    const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: T, channelMeans: m });
    const removed = new Set([1]);
    const after = regionErpAfter(plan.before, plan.componentErps, plan.regionWeights, removed);
    const cleanRoi = regionMean(recomputeCleaned({ original: X, nChannels: n, length: T, mixing: A, activations: S, nComponents: k, removed }), T, roi);
    const ep = extractEpochs(cleanRoi, fs, onsets, -0.2, 0.8);
    const direct = epochMean(ep.epochs, ep.nEpochs, ep.length);
    for (let t = 0; t < direct.length; t++) expect(after[t]).toBeCloseTo(direct[t], 8);
  });
  it('returns null when no epoch fits in the recording', () => {
    const X = new Float32Array(20);
    expect(regionErpPlan({ data: X, nSamples: 10, sampleRate: 100, rows: [0, 1], roi: [0], unmixing: new Float64Array(2), mixing: new Float64Array(2), nComponents: 1, onsetsS: [5] })).toBeNull();
  });
});
