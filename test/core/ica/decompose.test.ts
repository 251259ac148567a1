import { describe, expect, it } from 'vitest';
import { decomposeRecording, type DecomposeProgress } from '../../../src/core/ica/decompose.ts';
import { amariIndexOf } from '../../../src/core/ica/amari.ts';
import { matrixMultiply } from '../../../src/core/linalg/dense.ts';
import { laplaceUniformSineMixture } from './mixtures.ts';

const fs = 250;

/** 8 EEG channels mixing 8 sources (µV scale, 10 µV offsets), plus an EOG and a bad channel. */
function recording(T = 12000) {
  const m = laplaceUniformSineMixture(8, T, 21);
  const nCh = 10;
  const data = new Float32Array(nCh * T);
  for (let c = 0; c < 8; c++) for (let t = 0; t < T; t++) data[c * T + t] = 10 * m.X[c * T + t] + 10 + c;
  for (let t = 0; t < T; t++) {
    data[8 * T + t] = 50 * Math.sin(t / 30); // EOG
    data[9 * T + t] = 1000 * ((t * 7919) % 13); // bad channel
  }
  const labels = ['Fp1', 'Fp2', 'F3', 'F4', 'C3', 'C4', 'O1', 'O2', 'HEOG', 'T7'];
  const types = ['EEG', 'EEG', 'EEG', 'EEG', 'EEG', 'EEG', 'EEG', 'EEG', 'EOG', 'EEG'];
  const status: ('good' | 'bad')[] = ['good', 'good', 'good', 'good', 'good', 'good', 'good', 'good', 'good', 'bad'];
  return { m, T, input: { data, nChannels: nCh, nSamples: T, sampleRate: fs, labels, types, status } };
}

describe('decomposeRecording', () => {
  for (const method of ['picard', 'infomax'] as const) {
    it(`recovers the sources with ${method} after leaving out the EOG and bad channels (Amari < 0.05)`, () => {
      const { m, input } = recording();
      const r = decomposeRecording(input, { method, seed: 3, highpassHz: null });
      const d = r.decomposition;
      expect(d.channels).toEqual(['Fp1', 'Fp2', 'F3', 'F4', 'C3', 'C4', 'O1', 'O2']);
      expect(d.preprocessing.excludedChannels).toEqual(['HEOG', 'T7']);
      expect(d.nComponents).toBe(8);
      expect(d.rank).toBe(8);
      // Unmixing of the 10·X data: W (10 A) should be a scaled permutation.
      const A10 = m.A.map((v) => 10 * v);
      expect(amariIndexOf(d.unmixing, A10, 8, 8).normalised).toBeLessThan(0.05);
      // W A = I in the component space (A = pinv(W) at full rank).
      const WA = matrixMultiply(d.unmixing, d.mixing, 8, 8, 8);
      for (let i = 0; i < 8; i++) for (let j = 0; j < 8; j++) expect(WA[i * 8 + j]).toBeCloseTo(i === j ? 1 : 0, 8);
      // channelMeans are the unfiltered means (10 + c plus the mixture's small mean).
      for (let c = 0; c < 8; c++) expect(d.channelMeans![c]).toBeCloseTo(10 + c, 0);
    });
  }
  it('orders components by variance accounted for and makes the largest map weight positive', () => {
    const { input } = recording(6000);
    const r = decomposeRecording(input, { method: 'picard', seed: 1, highpassHz: null, maxIter: 40 });
    const { mixing, nChannels: n, nComponents: k } = r.decomposition;
    for (let j = 1; j < k; j++) expect(r.varianceShare[j]).toBeLessThanOrEqual(r.varianceShare[j - 1]);
    for (let j = 0; j < k; j++) {
      let big = 0;
      for (let c = 0; c < n; c++) if (Math.abs(mixing[c * k + j]) > Math.abs(big)) big = mixing[c * k + j];
      expect(big).toBeGreaterThan(0);
    }
  });
  it('follows the rank of average-referenced data: 8 channels give 7 components, with the reason and reference stated', () => {
    const { input, T } = recording(6000);
    const data = input.data.slice();
    for (let t = 0; t < T; t++) {
      let s = 0;
      for (let c = 0; c < 8; c++) s += data[c * T + t];
      for (let c = 0; c < 8; c++) data[c * T + t] -= s / 8;
    }
    const r = decomposeRecording({ ...input, data }, { method: 'picard', seed: 1, maxIter: 30 });
    expect(r.decomposition.rank).toBe(7);
    expect(r.decomposition.nComponents).toBe(7);
    expect(r.rankReason).toMatch(/rank 7 of 8/);
    expect(r.decomposition.preprocessing.reference).toMatch(/^average/);
    expect(r.decomposition.preprocessing.filter).toMatch(/high-pass 1 Hz/);
  });
  it('gives bit-identical results for the same seed', () => {
    const { input } = recording(4000);
    const a = decomposeRecording(input, { method: 'infomax', seed: 9, maxIter: 10 });
    const b = decomposeRecording(input, { method: 'infomax', seed: 9, maxIter: 10 });
    expect(Array.from(a.decomposition.unmixing)).toEqual(Array.from(b.decomposition.unmixing));
    expect(Array.from(a.decomposition.mixing)).toEqual(Array.from(b.decomposition.mixing));
  });
  it('gives the same decomposition in place (consumeInput) as on a copy, with a left-out channel among the used ones', () => {
    const { input, T } = recording(4000);
    // HEOG (index 8) moved to index 3, so the in-place run has to close a gap between used channels.
    const order = [0, 1, 2, 8, 3, 4, 5, 6, 7, 9];
    const data = new Float32Array(10 * T);
    order.forEach((c, i) => data.set(input.data.subarray(c * T, (c + 1) * T), i * T));
    const moved = { ...input, data, labels: order.map((c) => input.labels[c]), types: order.map((c) => input.types[c]), status: order.map((c) => input.status[c]) };
    const before = data.slice();
    const copy = decomposeRecording(moved, { method: 'picard', seed: 2, maxIter: 20 });
    expect(Array.from(data)).toEqual(Array.from(before)); // without consumeInput the input is not modified
    const own = data.slice();
    const inPlace = decomposeRecording({ ...moved, data: own }, { method: 'picard', seed: 2, maxIter: 20, consumeInput: true });
    expect(inPlace.decomposition.channels).toEqual(copy.decomposition.channels);
    expect(Array.from(inPlace.decomposition.unmixing)).toEqual(Array.from(copy.decomposition.unmixing));
    expect(Array.from(inPlace.decomposition.mixing)).toEqual(Array.from(copy.decomposition.mixing));
    expect(Array.from(inPlace.decomposition.channelMeans!)).toEqual(Array.from(copy.decomposition.channelMeans!));
  });
  it('reports progress through the stages and stops with an AbortError when the signal is aborted', () => {
    const { input } = recording(4000);
    const seen: DecomposeProgress[] = [];
    decomposeRecording(input, { method: 'picard', maxIter: 5, onProgress: (p) => seen.push(p), progressIntervalMs: 0 });
    const stages = new Set(seen.map((p) => p.stage));
    for (const s of ['filter', 'whiten', 'ica', 'done']) expect(stages.has(s)).toBe(true);
    expect(seen.some((p) => p.stage === 'ica' && p.iteration > 0 && Number.isFinite(p.convergence))).toBe(true);
    const signal = { aborted: false };
    let calls = 0;
    expect(() =>
      decomposeRecording(input, {
        method: 'infomax',
        signal,
        progressIntervalMs: 0,
        onProgress: () => {
          if (++calls > 3) signal.aborted = true;
        },
      }),
    ).toThrowError(/cancelled/);
  });
  it('refuses a recording without good EEG channels with a RangeError', () => {
    const { input } = recording(2000);
    expect(() => decomposeRecording({ ...input, status: input.status.map(() => 'bad' as const) }, { method: 'picard' })).toThrowError(
      /no good EEG channels/,
    );
  });
});
