/**
 * Decomposition-engine bench (issue 5): our whitening + ICA time for 32 and 64 channels × 150 000 samples
 * (10 min at 250 Hz) of mixed Laplace/uniform sources, per algorithm, with the Amari index reached, side by side
 * with a numpy FastICA reference (bench/fastica_reference.py) on the same data in the same run. ICA runs take
 * seconds to minutes, so each case is timed once (no warm-up, no median); trust ratios over absolute times on
 * this shared machine. Environment: WINNOW_BENCH_ICA_CHANNELS="32,64", WINNOW_BENCH_ICA_METHODS="picard,infomax",
 * WINNOW_BENCH_INFOMAX_MAXITER (default 200 passes), WINNOW_BENCH_ICA_THREADS=1 (no helper thread for Picard),
 * WINNOW_BENCH_KERNELS=js (plain-JS kernels instead of WebAssembly SIMD, src/core/kernels).
 * Our time covers what the reference's covers: covariance, eigen-whitening, ICA (plus our ordering and sign).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchRow } from './bench-types.ts';
import { createPrng } from '../src/core/ica/prng.ts';
import { decomposeRecording } from '../src/core/ica/decompose.ts';
import { amariIndexOf } from '../src/core/ica/amari.ts';
import { createNodeIcaThreads } from '../src/cli/decompose.ts';
import { installNodeKernels } from '../src/cli/wasm-kernels.ts';
import { useJsKernels } from '../src/core/kernels/kernels.ts';

const T = 150_000;

function mixture(n: number, seed: number) {
  const rng = createPrng(seed);
  const S = new Float64Array(n * T);
  for (let i = 0; i < n; i++)
    for (let t = 0; t < T; t++) {
      const u = rng.next() - 0.5;
      S[i * T + t] = i % 2 === 0 ? (-Math.sign(u) * Math.log(1 - 2 * Math.abs(u))) / Math.SQRT2 : u * Math.sqrt(12);
    }
  const A = Float64Array.from({ length: n * n }, () => rng.normal());
  const X = new Float32Array(n * T);
  const acc = new Float64Array(T);
  for (let c = 0; c < n; c++) {
    acc.fill(0);
    for (let j = 0; j < n; j++) {
      const a = 10 * A[c * n + j]; // µV scale
      const o = j * T;
      for (let t = 0; t < T; t++) acc[t] += a * S[o + t];
    }
    X.set(acc, c * T);
  }
  return { X, A: A.map((v) => 10 * v) };
}

function reference(dir: string, X: Float32Array, A: Float64Array, n: number): { ms: number | null; note: string; what: string } {
  const dataPath = join(dir, `x${n}.f32`);
  const mixPath = join(dir, `a${n}.f64`);
  writeFileSync(dataPath, new Uint8Array(X.buffer, X.byteOffset, X.byteLength));
  writeFileSync(mixPath, new Uint8Array(A.buffer, A.byteOffset, A.byteLength));
  const script = fileURLToPath(new URL('./fastica_reference.py', import.meta.url));
  const r = spawnSync('python3', [script, dataPath, mixPath, String(n), String(T)], { encoding: 'utf8' });
  if (r.error || r.status !== 0) return { ms: null, note: '', what: 'reference unavailable' };
  try {
    const o = JSON.parse(r.stdout.trim().split('\n').pop()!);
    return { ms: o.seconds * 1000, note: `ref Amari ${o.amari.toFixed(4)}, ${o.iterations} it`, what: `numpy ${o.numpy} FastICA (python3)` };
  } catch {
    return { ms: null, note: '', what: 'reference unavailable' };
  }
}

export async function bench(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  const channels = (process.env.WINNOW_BENCH_ICA_CHANNELS ?? '32,64').split(',').map(Number);
  const methods = (process.env.WINNOW_BENCH_ICA_METHODS ?? 'picard,infomax').split(',') as ('picard' | 'infomax')[];
  const infomaxMax = Number(process.env.WINNOW_BENCH_INFOMAX_MAXITER ?? 200);
  const kernels = process.env.WINNOW_BENCH_KERNELS === 'js' ? useJsKernels() : installNodeKernels().kernels;
  const dir = mkdtempSync(join(tmpdir(), 'winnow-ica-bench-'));
  const helper = process.env.WINNOW_BENCH_ICA_THREADS === '1' ? null : await createNodeIcaThreads();
  try {
    for (const n of channels) {
      const { X, A } = mixture(n, 1000 + n);
      const ref = reference(dir, X, A, n);
      for (const method of methods) {
        const t0 = performance.now();
        const r = decomposeRecording(
          { data: X, nChannels: n, nSamples: T, sampleRate: 250, labels: Array.from({ length: n }, (_, i) => `E${i + 1}`) },
          { method, seed: 1, highpassHz: null, maxIter: method === 'infomax' ? infomaxMax : undefined, threads: helper?.threads },
        );
        const ms = performance.now() - t0;
        const d = r.decomposition;
        const amari = amariIndexOf(d.unmixing, A, n, n).normalised;
        process.stderr.write(`bench ica: ${n} ch ${method}: ${(ms / 1000).toFixed(1)} s, Amari ${amari.toFixed(4)}, ${d.iterations} it\n`);
        rows.push({
          area: 'ica',
          case: `${method} ${n} ch × ${T}${method === 'picard' && helper ? ' (2 threads)' : ''}, ${kernels.name}`,
          oursMs: ms,
          referenceMs: ref.ms,
          reference: ref.what,
          note: `Amari ${amari.toFixed(4)}, ${d.iterations} it${r.finalGradientNorm !== null ? `, gradient ${r.finalGradientNorm.toExponential(1)}` : ''}${d.converged ? '' : ' (not converged)'}${ref.note ? `; ${ref.note}` : ''}`,
        });
      }
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
    await helper?.close();
  }
  return rows;
}
