import { describe, expect, expectTypeOf, it } from 'vitest';
import fixture from '../../fixtures/preview/preview_projection.json' with { type: 'json' };
import {
  applyRemovedSet,
  createPreviewWindow,
  extractWindow,
  recomputeCleaned,
  regionErpAfter,
  regionErpPlan,
  regionMean,
  regionMixing,
  removedVarianceShare,
  setComponentRemoved,
  windowActivations,
  windowChecksum,
  type WindowActivationsInput,
} from '../../../src/core/review/preview-projection.ts';
import { epochMean, extractEpochs } from '../../../src/core/signal/epochs.ts';

/** Seeded LCG (Numerical Recipes constants) so every run sees the same data. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  };
}

function randomProblem(n: number, k: number, L: number, seed: number) {
  const r = lcg(seed);
  const X = Float32Array.from({ length: n * L }, () => 40 * r());
  const W = Float64Array.from({ length: k * n }, () => r());
  const A = Float64Array.from({ length: n * k }, () => r());
  const m = Float64Array.from({ length: n }, () => 5 * r());
  return { X, W, A, m };
}

describe('windowActivations and the cleaned window', () => {
  const { n, k, L } = fixture;
  const X = Float32Array.from(fixture.X);
  const W = Float64Array.from(fixture.W);
  const A = Float64Array.from(fixture.A);
  const m = Float64Array.from(fixture.m);

  it('computes S = W (X − m) as numpy does (fixtures/preview, numpy 2.4.6, 1e-9)', () => {
    const S = windowActivations(W, k, n, X, L, m);
    fixture.S.forEach((v, j) => expect(S[j]).toBeCloseTo(v, 9));
  });

  it('matches numpy X − A[:,R] W (X − m) after removing components 1 and 3 incrementally (docs/methods.md §7.6)', () => {
    const S = windowActivations(W, k, n, X, L, m);
    const win = createPreviewWindow(X, n, L, S, k);
    applyRemovedSet(win, A, new Set(fixture.removed));
    fixture.clean.forEach((v, j) => expect(win.cleaned[j]).toBeCloseTo(v, 9));
  });
});

describe('incremental toggles', () => {
  const n = 16, k = 12, L = 300;
  const { X, W, A, m } = randomProblem(n, k, L, 7);
  const S = windowActivations(W, k, n, X, L, m);

  it('equal full recomputation after any sequence of toggles', () => {
    const win = createPreviewWindow(X, n, L, S, k);
    const r = lcg(99);
    const removed = new Set<number>();
    for (let step = 0; step < 200; step++) {
      const i = Math.floor((r() + 0.5) * k);
      const remove = !removed.has(i);
      setComponentRemoved(win, A, i, remove);
      if (remove) removed.add(i);
      else removed.delete(i);
    }
    const ref = recomputeCleaned(X, n, L, A, S, k, removed);
    let maxErr = 0;
    for (let j = 0; j < ref.length; j++) maxErr = Math.max(maxErr, Math.abs(ref[j] - win.cleaned[j]));
    expect(maxErr).toBeLessThan(1e-9);
  });

  it('returns to the original bit for bit when everything is kept again', () => {
    const win = createPreviewWindow(X, n, L, S, k);
    applyRemovedSet(win, A, new Set([0, 3, 5]));
    applyRemovedSet(win, A, new Set());
    expect(Array.from(win.cleaned)).toEqual(Array.from(X));
  });

  it('changes nothing for a repeated verdict or an index out of range', () => {
    const win = createPreviewWindow(X, n, L, S, k);
    expect(setComponentRemoved(win, A, 2, true)).toBe(true);
    expect(setComponentRemoved(win, A, 2, true)).toBe(false);
    expect(setComponentRemoved(win, A, k, true)).toBe(false);
    expect(setComponentRemoved(win, A, -1, true)).toBe(false);
  });

  it('toggles only the components whose state differs', () => {
    const win = createPreviewWindow(X, n, L, S, k);
    expect(applyRemovedSet(win, A, new Set([1, 2]))).toBe(2);
    expect(applyRemovedSet(win, A, new Set([2, 4]))).toBe(2);
  });
});

describe('windowChecksum', () => {
  it('changes when a verdict changes and comes back when it is undone', () => {
    const n = 4, k = 3, L = 50;
    const { X, W, A, m } = randomProblem(n, k, L, 3);
    const S = windowActivations(W, k, n, X, L, m);
    const win = createPreviewWindow(X, n, L, S, k);
    const before = windowChecksum(win.cleaned);
    setComponentRemoved(win, A, 1, true);
    const after = windowChecksum(win.cleaned);
    setComponentRemoved(win, A, 2, true);
    setComponentRemoved(win, A, 2, false);
    expect(after).not.toBe(before);
    expect(windowChecksum(win.cleaned)).toBe(after);
    expect(before).toMatch(/^[0-9a-f]{8}$/);
  });
});

describe('extractWindow', () => {
  it('copies the decomposition channels in their order from a channel-major recording', () => {
    // recording: 3 channels × 5 samples, values 100·c + j
    const data = Float32Array.from({ length: 15 }, (_, i) => 100 * Math.floor(i / 5) + (i % 5));
    const w = extractWindow(data, 5, [2, 0], 1, 4);
    expect(Array.from(w)).toEqual([201, 202, 203, 1, 2, 3]);
  });
  it('fills samples outside the recording with zeros', () => {
    const data = Float32Array.from([1, 2, 3]);
    expect(Array.from(extractWindow(data, 3, [0], 2, 5))).toEqual([3, 0, 0]);
  });
});

describe('regionErpAfter', () => {
  it('equals the ERP of the fully cleaned data averaged over the region (linearity of §5 and §7.6)', () => {
    const n = 6, k = 4, T = 2000, fs = 100;
    const { X, W, A, m } = randomProblem(n, k, T, 11);
    const S = windowActivations(W, k, n, X, T, m);
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
    const direct = erpOf(roiMean(recomputeCleaned(X, n, T, A, S, k, removed)));
    for (let t = 0; t < after.length; t++) expect(after[t]).toBeCloseTo(direct[t], 8);
  });
  it('gives NaN region weights for an empty region', () => {
    expect(Number.isNaN(regionMixing(new Float64Array(4), 2, 2, [])[0])).toBe(true);
  });
});

describe('removedVarianceShare', () => {
  it('is 1 on a channel that only carries the removed component and 0 where it has no weight', () => {
    // Two channels, one component: channel 0 = s, channel 1 = independent ramp; A = [1; 0], W = [1, 0].
    const L = 64;
    const X = new Float32Array(2 * L);
    for (let t = 0; t < L; t++) {
      X[t] = Math.sin(t / 3);
      X[L + t] = t;
    }
    const W = Float64Array.from([1, 0]);
    const A = Float64Array.from([1, 0]);
    const S = windowActivations(W, 1, 2, X, L, null);
    const win = createPreviewWindow(X, 2, L, S, 1);
    setComponentRemoved(win, A, 0, true);
    const share = removedVarianceShare(win);
    expect(share[0]).toBeCloseTo(1, 12);
    expect(share[1]).toBe(0);
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
    const plan = regionErpPlan(data, T, fs, perm, roi, W, A, k, onsets)!;
    expect(plan.nEpochs).toBe(5);
    const S = windowActivations(W, k, n, X, T, m);
    const removed = new Set([1]);
    const after = regionErpAfter(plan.before, plan.componentErps, plan.regionWeights, removed);
    const cleanRoi = regionMean(recomputeCleaned(X, n, T, A, S, k, removed), T, roi);
    const ep = extractEpochs(cleanRoi, fs, onsets, -0.2, 0.8);
    const direct = epochMean(ep.epochs, ep.nEpochs, ep.length);
    for (let t = 0; t < direct.length; t++) expect(after[t]).toBeCloseTo(direct[t], 8);
  });
  it('returns null when no epoch fits in the recording', () => {
    const X = new Float32Array(20);
    expect(regionErpPlan(X, 10, 100, [0, 1], [0], new Float64Array(2), new Float64Array(2), 1, [5])).toBeNull();
  });
});

describe('WindowActivationsInput', () => {
  it('is windowActivations\' six inputs without the out buffer (what the projection worker takes)', () => {
    // Checked by the type checker (tsc --noEmit covers test/).
    expectTypeOf<WindowActivationsInput>().toEqualTypeOf<
      [unmixing: Float64Array, k: number, n: number, window: Float32Array, length: number, channelMeans: Float64Array | null]
    >();
  });
});
