import { describe, expect, expectTypeOf, it } from 'vitest';
import fixture from '../../fixtures/preview/preview_projection.json' with { type: 'json' };
import {
  applyRemovedSet,
  createPreviewWindow,
  extractWindow,
  recomputeCleaned,
  removedVarianceShare,
  setComponentRemoved,
  windowActivations,
  windowChecksum,
  type WindowActivationsInput,
} from '../../../src/core/review/preview-projection.ts';
import { lcg, randomProblem } from './random-problem.ts';

describe('windowActivations and the cleaned window', () => {
  const { n, k, L } = fixture;
  const X = Float32Array.from(fixture.X);
  const W = Float64Array.from(fixture.W);
  const A = Float64Array.from(fixture.A);
  const m = Float64Array.from(fixture.m);

  it('computes S = W (X − m) as numpy does (fixtures/preview, numpy 2.4.6, 1e-9)', () => {
    const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: L, channelMeans: m });
    fixture.S.forEach((v, j) => expect(S[j]).toBeCloseTo(v, 9));
  });

  it('matches numpy X − A[:,R] W (X − m) after removing components 1 and 3 incrementally (docs/methods.md §7.6)', () => {
    const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: L, channelMeans: m });
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
    applyRemovedSet(win, A, new Set(fixture.removed));
    fixture.clean.forEach((v, j) => expect(win.cleaned[j]).toBeCloseTo(v, 9));
  });
});

describe('incremental toggles', () => {
  const n = 16, k = 12, L = 300;
  const { X, W, A, m } = randomProblem(n, k, L, 7);
  const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: L, channelMeans: m });

  it('equal full recomputation after any sequence of toggles', () => {
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
    const r = lcg(99);
    const removed = new Set<number>();
    for (let step = 0; step < 200; step++) {
      const i = Math.floor((r() + 0.5) * k);
      const remove = !removed.has(i);
      setComponentRemoved(win, A, i, remove);
      if (remove) removed.add(i);
      else removed.delete(i);
    }
    const ref = recomputeCleaned({ original: X, nChannels: n, length: L, mixing: A, activations: S, nComponents: k, removed });
    let maxErr = 0;
    for (let j = 0; j < ref.length; j++) maxErr = Math.max(maxErr, Math.abs(ref[j] - win.cleaned[j]));
    expect(maxErr).toBeLessThan(1e-9);
  });

  it('returns to the original bit for bit when everything is kept again', () => {
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
    applyRemovedSet(win, A, new Set([0, 3, 5]));
    applyRemovedSet(win, A, new Set());
    expect(Array.from(win.cleaned)).toEqual(Array.from(X));
  });

  it('changes nothing for a repeated verdict or an index out of range', () => {
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
    expect(setComponentRemoved(win, A, 2, true)).toBe(true);
    expect(setComponentRemoved(win, A, 2, true)).toBe(false);
    expect(setComponentRemoved(win, A, k, true)).toBe(false);
    expect(setComponentRemoved(win, A, -1, true)).toBe(false);
  });

  it('toggles only the components whose state differs', () => {
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
    expect(applyRemovedSet(win, A, new Set([1, 2]))).toBe(2);
    expect(applyRemovedSet(win, A, new Set([2, 4]))).toBe(2);
  });
});

describe('windowChecksum', () => {
  it('changes when a verdict changes and comes back when it is undone', () => {
    const n = 4, k = 3, L = 50;
    const { X, W, A, m } = randomProblem(n, k, L, 3);
    const S = windowActivations({ unmixing: W, nComponents: k, nChannels: n, window: X, length: L, channelMeans: m });
    const win = createPreviewWindow({ original: X, nChannels: n, length: L, activations: S, nComponents: k });
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
    const S = windowActivations({ unmixing: W, nComponents: 1, nChannels: 2, window: X, length: L, channelMeans: null });
    const win = createPreviewWindow({ original: X, nChannels: 2, length: L, activations: S, nComponents: 1 });
    setComponentRemoved(win, A, 0, true);
    const share = removedVarianceShare(win);
    expect(share[0]).toBeCloseTo(1, 12);
    expect(share[1]).toBe(0);
  });
});

describe('WindowActivationsInput', () => {
  it('is one options object of six named inputs (what the projection worker takes)', () => {
    // Checked by the type checker (tsc --noEmit covers test/).
    expectTypeOf<WindowActivationsInput>().toEqualTypeOf<{
      readonly unmixing: Float64Array;
      readonly nComponents: number;
      readonly nChannels: number;
      readonly window: Float32Array;
      readonly length: number;
      readonly channelMeans: Float64Array | null;
    }>();
  });

  it('writes into a given output and matches W (X − m) worked by hand', () => {
    const W = Float64Array.from([0.5, -1, 2, 0.25, 1, -0.5]);
    const X = Float32Array.from([1, 2, 3, 4, -1, 0, 2, 5]);
    const m = Float64Array.from([0.5, -0.25]);
    const byObject = windowActivations({ unmixing: W, nComponents: 3, nChannels: 2, window: X, length: 4, channelMeans: m });
    // row 0 of W (X − m) at t = 0: 0.5·(1 − 0.5) − 1·(−1 + 0.25) = 1 (matrix product, by hand)
    expect(byObject[0]).toBeCloseTo(1, 12);
    const out = new Float64Array(12);
    expect(windowActivations({ unmixing: W, nComponents: 3, nChannels: 2, window: X, length: 4, channelMeans: m }, out)).toBe(out);
    expect(out).toEqual(byObject);
  });
});
