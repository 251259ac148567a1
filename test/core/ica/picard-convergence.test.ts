/**
 * Picard-O convergence (issue 12; docs/methods.md §7.7): separation quality on known mixings with both kernel
 * paths (the Amari index, Amari, Cichocki & Yang 1996, whose implementation test/core/ica/amari.test.ts checks
 * against test/fixtures/ica/amari.json), and a bounded iteration count on the simulator's realistic recording
 * (ceilings, never times: speed is measured in `npm run bench`).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { picardOrthogonal, picardTolerance } from '../../../src/core/ica/picard.ts';
import { amariIndex, amariIndexOf } from '../../../src/core/ica/amari.ts';
import { decomposeRecording } from '../../../src/core/ica/decompose.ts';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import { applyWhitening, covariance, pcaWhitening } from '../../../src/core/linalg/whitening.ts';
import { matrixMultiply, matrixTranspose } from '../../../src/core/linalg/dense.ts';
import { installKernelModule, useJsKernels } from '../../../src/core/kernels/kernels.ts';
import { loadKernelModule } from '../../../src/cli/wasm-kernels.ts';
import { laplaceUniformSineMixture } from './mixtures.ts';

const mod = loadKernelModule();
const useKernels = (name: 'js' | 'wasm-simd') => (name === 'js' ? useJsKernels() : installKernelModule(mod).kernels);

afterAll(() => {
  useJsKernels();
});

describe('Picard-O on a known mixing of 12 Laplace/uniform/sinusoid sources × 40 000 samples', () => {
  const k = 12;
  const T = 40000;
  const m = laplaceUniformSineMixture(k, T, 21);
  const cv = covariance(m.X, k, T);
  const pw = pcaWhitening(cv.covariance, k);
  const Z = applyWhitening(pw.whitening, pw.k, k, cv.means, m.X, T);
  const results: Record<string, Float64Array> = {};
  for (const name of ['js', 'wasm-simd'] as const) {
    it(`${name} kernels: converges below the tolerance with a normalised Amari index ≤ 0.01`, () => {
      expect(useKernels(name).name).toBe(name);
      const r = picardOrthogonal(Z, k, T, { seed: 4 });
      expect(r.converged).toBe(true);
      expect(r.convergence).toBeLessThan(picardTolerance(T));
      expect(r.iterations).toBeLessThanOrEqual(60); // ours: 20–30 measured
      results[name] = r.W;
      const W = matrixMultiply(r.W, pw.whitening, k, k, k);
      expect(amariIndexOf(W, m.A, k, k).normalised).toBeLessThanOrEqual(0.01);
    });
  }
  it('both kernel paths reach the same unmixing (W_wasm W_jsᵀ a signed permutation to Amari 1e-3)', () => {
    const P = matrixMultiply(results['wasm-simd'], matrixTranspose(results.js, k, k), k, k, k);
    expect(amariIndex(P, k).normalised).toBeLessThan(1e-3);
  });
});

describe('Picard iterations on the simulated 32-channel walking session (3 minutes at 250 Hz)', () => {
  const s = simulateSession({ seed: 3, channels: 32, minutes: 3 });
  // One kernel path here (the JS path takes ~7× longer; both paths are compared on the known mixing above).
  for (const name of ['wasm-simd'] as const) {
    it(`${name} kernels: converges within an iteration ceiling and reports the final gradient norm`, () => {
      useKernels(name);
      const r = decomposeRecording({ data: s.data, nChannels: s.labels.length, nSamples: s.nSamples, sampleRate: s.sampleRate, labels: s.labels }, { method: 'picard', seed: 1 });
      expect(r.kernels).toBe(name);
      expect(r.decomposition.converged).toBe(true);
      expect(r.finalGradientNorm).not.toBeNull();
      expect(r.finalGradientNorm!).toBeLessThan(picardTolerance(s.nSamples));
      // Ceiling ≈ 2× the 41 iterations measured (ours; 76 with the fixed tolerance 1e-6; the 10-minute recording
      // took 160 before the corrected Newton step).
      expect(r.iterations).toBeLessThanOrEqual(90);
    }, 120_000);
  }
});
