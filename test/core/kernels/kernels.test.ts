/**
 * The WebAssembly SIMD kernels (asm/kernels.ts, float32 lanes) against the plain-JS kernels (float64) on the
 * same inputs: both must agree to float32 tolerance. The JS twins are themselves checked against handbook
 * identities elsewhere (test/core/ica/fast-tanh.test.ts against Math.tanh/Math.log1p, linalg tests against
 * naive loops); here the wasm kernels are also checked directly against Math.tanh / ln cosh sums.
 * Needs build/wasm/kernels.wasm (built by npm install / npm run build:wasm).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { createJsKernels, installKernelModule, simdSupported, useJsKernels, type Kernels } from '../../../src/core/kernels/kernels.ts';
import { createPassSums } from '../../../src/core/ica/picard-pass.ts';
import { loadKernelModule } from '../../../src/cli/wasm-kernels.ts';
import { createPrng } from '../../../src/core/ica/prng.ts';
import { createBlockScratch, naturalGradientBlockStep } from '../../../src/core/ica/infomax.ts';

const mod = loadKernelModule();

function wasmKernels(): Kernels {
  const r = installKernelModule(mod);
  useJsKernels();
  return r.kernels;
}

function data(rows: number, T: number, seed: number, scale = 1) {
  const rng = createPrng(seed);
  return Float32Array.from({ length: rows * T }, () => scale * rng.normal());
}
function weights(k: number, n: number, seed: number) {
  const rng = createPrng(seed);
  return Float64Array.from({ length: k * n }, () => rng.normal() / Math.sqrt(n));
}
function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>) {
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs(a[i] - b[i]));
  return e;
}

afterAll(() => {
  useJsKernels();
});

describe('kernel selection', () => {
  it('node ≥ 20 runs WebAssembly SIMD (WebAssembly.validate of a v128 module) and the built module installs', () => {
    expect(simdSupported()).toBe(true);
    expect(mod).not.toBeNull();
    expect(wasmKernels().name).toBe('wasm-simd');
  });
  it('falls back to the JS kernels where WebAssembly SIMD is missing (validate of the probe module fails)', () => {
    const api = WebAssembly as unknown as { validate: (b: Uint8Array) => boolean };
    const original = api.validate;
    api.validate = () => false;
    try {
      expect(simdSupported()).toBe(false);
      const r = installKernelModule(mod);
      expect(r.kernels.name).toBe('js');
      expect(r.reason).toMatch(/SIMD is not available/);
    } finally {
      api.validate = original;
      useJsKernels();
    }
  });
  it('falls back to the JS kernels without a module', () => {
    const r = installKernelModule(null);
    expect(r.kernels.name).toBe('js');
    expect(r.reason).toMatch(/no kernel module/);
  });
  it('falls back to the JS kernels when the bytes are not a kernel module', () => {
    const r = installKernelModule(new Uint8Array([0, 97, 115, 109, 1, 0, 0, 0]));
    expect(r.kernels.name).toBe('js');
    expect(r.reason).toMatch(/could not be instantiated/);
    useJsKernels();
  });
});

describe('wasm and JS kernels agree to float32 tolerance', () => {
  const js = createJsKernels();
  const wasm = wasmKernels();
  // Shapes that exercise the row remainder (k mod 4), the sample remainder (T mod 8) and more than one tile.
  for (const [k, n, T, start, end] of [
    [64, 64, 3000, 0, 3000],
    [7, 5, 1031, 3, 1029],
    [1, 3, 17, 0, 17],
    [13, 13, 5000, 1200, 4321],
  ] as const) {
    it(`multiply ${k}×${n} · ${n}×[${start}, ${end}) of ${T}`, () => {
      const X = data(n, T, k + n);
      const W = weights(k, n, T);
      const a = new Float64Array(k * (end - start));
      const b = new Float32Array(k * (end - start));
      js.multiply(W, k, n, X, T, a, start, end);
      wasm.multiply(W, k, n, X, T, b, start, end);
      // float32 products of unit-scale data summed over n terms: relative error ~ n·2⁻²⁴.
      expect(maxAbsDiff(a, b)).toBeLessThan(2e-6 * Math.sqrt(n) * 4);
    });
  }
  for (const [k, T, t0, t1, scale] of [
    [32, 4000, 0, 4000, 1],
    [9, 2051, 5, 2049, 3],
    [3, 600, 0, 600, 0.1],
  ] as const) {
    it(`Picard pass sums k = ${k}, samples [${t0}, ${t1}), scale ${scale}`, () => {
      const Z = data(k, T, 7 * k, scale);
      const W = weights(k, k, 3 * k);
      const a = createPassSums(k);
      const b = createPassSums(k);
      expect(js.passSums(Z, k, T, W, t0, t1, a)).toBe(true);
      expect(wasm.passSums(Z, k, T, W, t0, t1, b)).toBe(true);
      const m = t1 - t0;
      // Per-sample float32 error ≤ ~1e-6 (|y| up to ~5 for scale 3), so the normalised sums agree to 2e-6.
      expect(maxAbsDiff(a.logcosh, b.logcosh) / m).toBeLessThan(2e-6);
      expect(maxAbsDiff(a.sech2, b.sech2) / m).toBeLessThan(2e-6);
      expect(maxAbsDiff(a.gTanh, b.gTanh) / m).toBeLessThan(2e-6 * scale);
    });
  }
  it('pass sums of the wasm kernels match Math.tanh and ln cosh by the exp/log1p identity (handbook formulas)', () => {
    const k = 2;
    const T = 1000;
    const Z = new Float32Array(k * T);
    for (let t = 0; t < T; t++) {
      Z[t] = -12 + (24 * t) / T; // covers the clamp region of exp and both signs
      Z[T + t] = 0.5 * Math.sin(t);
    }
    const W = Float64Array.from([1, 0, 0, 1]);
    const s = createPassSums(k);
    wasm.passSums(Z, k, T, W, 0, T, s);
    for (let i = 0; i < k; i++) {
      let lc = 0;
      let s2 = 0;
      for (let t = 0; t < T; t++) {
        const y = Z[i * T + t];
        const a = Math.abs(y);
        lc += a - Math.LN2 + Math.log1p(Math.exp(-2 * a));
        s2 += 1 - Math.tanh(y) ** 2;
      }
      expect(Math.abs(s.logcosh[i] - lc) / T).toBeLessThan(1e-6);
      expect(Math.abs(s.sech2[i] - s2) / T).toBeLessThan(1e-6);
    }
  });
  it('Gram matrix (covariance kernel) 6 channels', () => {
    const n = 6;
    const T = 2001;
    const X = data(n, T, 5);
    const a = new Float64Array(n * n);
    const b = new Float64Array(n * n);
    js.accumulateGram(X, n, T, 0, T, a);
    wasm.accumulateGram(X, n, T, 0, T, b);
    expect(maxAbsDiff(a, b) / T).toBeLessThan(1e-6);
  });
  it('one extended-Infomax block update (k = 17, 301 samples) gives the same W and statistics on both paths', () => {
    const k = 17;
    const T = 1000;
    const Z = data(k, T, 9);
    const K = Float64Array.from({ length: k }, (_, i) => (i % 3 === 0 ? -1 : 1));
    const run = (kern: 'js' | 'wasm') => {
      if (kern === 'wasm') installKernelModule(mod);
      else useJsKernels();
      const W = weights(k, k, 4);
      const stats = { sech2: new Float64Array(k), u2: new Float64Array(k), tanhU: new Float64Array(k) };
      naturalGradientBlockStep(W, k, Z, T, 17, 301, K, 0.04, createBlockScratch(k, 301), stats);
      useJsKernels();
      return { W, stats };
    };
    const a = run('js');
    const b = run('wasm');
    expect(maxAbsDiff(a.W, b.W)).toBeLessThan(1e-6);
    expect(maxAbsDiff(a.stats.sech2, b.stats.sech2) / 301).toBeLessThan(2e-6);
    expect(maxAbsDiff(a.stats.u2, b.stats.u2) / 301).toBeLessThan(2e-6);
    expect(maxAbsDiff(a.stats.tanhU, b.stats.tanhU) / 301).toBeLessThan(2e-6);
  });
  it('a poll that says stop ends the wasm pass early with false', () => {
    const k = 4;
    const T = 600 * 512;
    const Z = data(k, T, 1);
    const s = createPassSums(k);
    expect(wasm.passSums(Z, k, T, weights(k, k, 2), 0, T, s, () => true)).toBe(false);
  });
});
