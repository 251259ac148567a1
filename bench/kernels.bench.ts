/**
 * Kernel bench (issue 12): the unmixing / back-projection product W·X (64 × 64 · 64 × 150 000) and one Picard
 * data pass (Y = W Z, tanh, ln cosh, E[tanh(Y) Yᵀ]) over 64 × 150 000 whitened samples, with the WebAssembly
 * SIMD kernels (asm/kernels.ts, float32 lanes) and the plain-JS kernels (float64), one thread each, side by side
 * with numpy's W @ X (bench/matmul_reference.py, float32 and float64) in the same run. Medians of 5 after a
 * warm-up; GFLOP/s counts 2·k·n·T for the product.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { medianMs, type BenchRow } from './bench-types.ts';
import { createJsKernels, installKernelModule, useJsKernels, type Kernels } from '../src/core/kernels/kernels.ts';
import { createPassSums } from '../src/core/ica/picard-pass.ts';
import { loadKernelModule } from '../src/cli/wasm-kernels.ts';
import { createPrng } from '../src/core/ica/prng.ts';

const K = 64;
const T = 150_000;

function numpyMatmul(): { numpy: string; f32: number; f64: number } | null {
  const script = fileURLToPath(new URL('./matmul_reference.py', import.meta.url));
  const r = spawnSync('python3', [script, String(K), String(K), String(T)], { encoding: 'utf8', timeout: 120_000 });
  if (r.status !== 0) return null;
  try {
    return JSON.parse(r.stdout.trim().split('\n').pop()!);
  } catch {
    return null;
  }
}

export async function bench(): Promise<BenchRow[]> {
  const rng = createPrng(12);
  const X = Float32Array.from({ length: K * T }, () => rng.normal());
  const W = Float64Array.from({ length: K * K }, () => rng.normal() / 8);
  // An orthogonal-ish unmixing for the pass: a rotation keeps Y at unit scale.
  const R = new Float64Array(K * K);
  for (let i = 0; i < K; i++) R[i * K + i] = Math.cos(0.1);
  for (let i = 0; i + 1 < K; i += 2) {
    R[i * K + i + 1] = Math.sin(0.1);
    R[(i + 1) * K + i] = -Math.sin(0.1);
  }
  const out = new Float32Array(K * T);
  const js = createJsKernels();
  const wasmInstall = installKernelModule(loadKernelModule());
  useJsKernels();
  const candidates: Kernels[] = [wasmInstall.kernels.name === 'wasm-simd' ? wasmInstall.kernels : null, js].filter((k): k is Kernels => k !== null);
  const ref = numpyMatmul();
  const flops = 2 * K * K * T;
  const rows: BenchRow[] = [];
  const times: Record<string, number> = {};
  for (const kern of candidates) {
    const ms = await medianMs(() => kern.multiply(W, K, K, X, T, out), 5);
    times[`mm-${kern.name}`] = ms;
    process.stderr.write(`bench kernels: W·X ${kern.name} ${ms.toFixed(1)} ms, ${(flops / ms / 1e6).toFixed(1)} GFLOP/s\n`);
    rows.push({
      area: 'kernels',
      case: `W·X ${K}×${K} · ${K}×${T}, ${kern.name}, 1 thread`,
      oursMs: ms,
      referenceMs: ref?.f32 ?? null,
      reference: ref ? `numpy ${ref.numpy} float32 matmul (f64 ${ref.f64.toFixed(1)} ms)` : 'numpy unavailable',
      note: `${(flops / ms / 1e6).toFixed(1)} GFLOP/s${ref ? `; numpy f32 ${(flops / ref.f32 / 1e6).toFixed(0)} GFLOP/s` : ''}`,
    });
  }
  const sums = createPassSums(K);
  for (const kern of candidates) {
    const ms = await medianMs(() => {
      sums.logcosh.fill(0);
      sums.sech2.fill(0);
      sums.gTanh.fill(0);
      kern.passSums(X, K, T, R, 0, T, sums);
    }, 5);
    times[`pass-${kern.name}`] = ms;
    process.stderr.write(`bench kernels: Picard pass ${kern.name} ${ms.toFixed(1)} ms\n`);
    rows.push({
      area: 'kernels',
      case: `Picard pass ${K} × ${T}, ${kern.name}, 1 thread`,
      oursMs: ms,
      referenceMs: null,
      reference: 'ours (no outside reference for the fused pass)',
      note: kern.name === 'js' && times['pass-wasm-simd'] !== undefined ? `wasm-simd is ${(ms / times['pass-wasm-simd']).toFixed(1)}× faster` : '',
    });
  }
  if (times['mm-js'] !== undefined && times['mm-wasm-simd'] !== undefined)
    rows.push({ area: 'kernels', case: 'W·X wasm-simd vs js', oursMs: times['mm-wasm-simd'], referenceMs: times['mm-js'], reference: 'plain-JS kernel, same run' });
  return rows;
}
