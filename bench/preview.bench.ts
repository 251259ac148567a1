/**
 * Live preview timings (issue 7: ≤ 16 ms from a verdict toggle to the repainted traces for 64 channels ×
 * 10 s). Measured here: the pure incremental update of the cleaned window (one toggle = ± a_i s_i over
 * 64 × 2500 samples at 250 Hz), the per-toggle figures (checksum, variance removed per channel), the window
 * activations computed once per window, and the non-incremental recomputation X − A[:,R] S[R,:] the toggle
 * replaces. The canvas repaint is measured in the browser (performance measure "winnow:toggle-to-repaint",
 * shown in the preview as "Last update"), not here: node has no canvas.
 * Reference: numpy on the same sizes (bench/preview_reference.py), run in this bench run.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { medianMs, type BenchRow } from './bench-types.ts';
import {
  applyRemovedSet,
  createPreviewWindow,
  recomputeCleaned,
  removedVarianceShare,
  setComponentRemoved,
  windowActivations,
  windowChecksum,
} from '../src/core/review/preview-projection.ts';
import { minMaxColumns } from '../src/ui/plots/trace-layout.ts';

const AREA = 'preview';
const N = 64;
const K = 64;
const FS = 250;
const L = 10 * FS;

function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32 - 0.5;
}

/** Mean time per call over `inner` calls, median over repeats (sub-millisecond work needs the inner loop). */
async function perCallMs(fn: () => void, inner: number, repeats = 7): Promise<number> {
  return (await medianMs(() => {
    for (let r = 0; r < inner; r++) fn();
  }, repeats)) / inner;
}

function numpyReference(): { numpy: string; activations: number; full: number; rank1: number } | null {
  const script = fileURLToPath(new URL('./preview_reference.py', import.meta.url));
  const out = spawnSync('python3', [script], { encoding: 'utf8', timeout: 60_000 });
  if (out.status !== 0) return null;
  try {
    return JSON.parse(out.stdout);
  } catch {
    return null;
  }
}

export async function bench(): Promise<BenchRow[]> {
  const r = lcg(20261202);
  const X = Float32Array.from({ length: N * L }, () => 40 * r());
  const W = Float64Array.from({ length: K * N }, () => r());
  const A = Float64Array.from({ length: N * K }, () => r());
  const m = Float64Array.from({ length: N }, () => r());
  const removed = new Set([0, 2, 4, 6, 8, 10, 12, 14, 16, 18]);

  const S = windowActivations({ unmixing: W, nComponents: K, nChannels: N, window: X, length: L, channelMeans: m });
  const win = createPreviewWindow({ original: X, nChannels: N, length: L, activations: S, nComponents: K });
  applyRemovedSet(win, A, removed);

  let flip = false;
  const toggleMs = await perCallMs(() => {
    flip = !flip;
    setComponentRemoved(win, A, 3, flip);
  }, 200);
  const checksumMs = await perCallMs(() => windowChecksum(win.cleaned), 20);
  const varianceMs = await perCallMs(() => removedVarianceShare(win), 20);
  // The arithmetic part of repainting the cleaned layer: 64 rows min/max-decimated to 1000 pixel columns.
  const mn = new Float64Array(1000);
  const mx = new Float64Array(1000);
  const decimateMs = await perCallMs(() => {
    for (let c = 0; c < N; c++) minMaxColumns(win.cleaned, c * L, (c + 1) * L, 1000, mn, mx);
  }, 20);
  const activationsMs = await medianMs(() => windowActivations({ unmixing: W, nComponents: K, nChannels: N, window: X, length: L, channelMeans: m }), 7);
  const fullMs = await medianMs(() => recomputeCleaned({ original: X, nChannels: N, length: L, mixing: A, activations: S, nComponents: K, removed }), 5);

  const py = numpyReference();
  const ref = (v: number | undefined) => (py && v !== undefined ? v : null);
  const refName = py ? `numpy ${py.numpy}, python3` : 'numpy unavailable (python3 failed)';
  const size = '64 ch × 10 s @ 250 Hz';
  return [
    {
      area: AREA, case: `one verdict toggle, incremental ± a·s (${size})`, oursMs: toggleMs, referenceMs: ref(py?.rank1),
      reference: `${refName}: in-place rank-one update`, note: 'target ≤ 16 ms toggle→repaint incl. canvas',
    },
    { area: AREA, case: `checksum of the cleaned window (${size})`, oursMs: checksumMs, referenceMs: null, reference: '—' },
    { area: AREA, case: `variance removed per channel (${size})`, oursMs: varianceMs, referenceMs: null, reference: '—' },
    {
      area: AREA, case: `min/max decimation of the cleaned layer, 64 rows → 1000 px`, oursMs: decimateMs, referenceMs: null,
      reference: '— (canvas stroking is measured in the browser)',
    },
    {
      area: AREA, case: `per-toggle total: update + checksum + variance map`, oursMs: toggleMs + checksumMs + varianceMs,
      referenceMs: null, reference: 'sum of the three rows above',
    },
    {
      area: AREA, case: `window activations S = W(X − m), once per window (${size}, 64 comps)`, oursMs: activationsMs,
      referenceMs: ref(py?.activations), reference: refName,
    },
    {
      area: AREA, case: `full recomputation X − A[:,R]S[R,:], |R| = 10 (what a toggle avoids)`, oursMs: fullMs,
      referenceMs: ref(py?.full), reference: refName, note: `ours is the plain reference loop (recomputeCleaned)`,
    },
  ];
}
