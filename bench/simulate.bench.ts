/**
 * `npm run bench -- simulate`: time of simulateSession for the demo size (32 ch × 3 min at 250 Hz) and the
 * size the issue asks to take seconds (64 ch × 10 min at 250 Hz), plus writing the EDF+C of the latter.
 * No reference implementation exists for our own scenario; the mixing step alone is compared with numpy's
 * matrix product when python3 is present (same shapes, float64).
 */
import { spawnSync } from 'node:child_process';
import { medianMs, type BenchRow } from './bench-types.ts';
import { simulateSession } from '../src/core/simulate/simulate.ts';
import { sessionEdf } from '../src/core/simulate/session-files.ts';
import { hz } from '../src/core/units.ts';

function numpyMixMs(m: number, k: number, n: number): number | null {
  const code = `
import numpy as np, time
A=np.random.default_rng(0).standard_normal((${m},${k})); S=np.random.default_rng(1).standard_normal((${k},${n})).astype(np.float32)
ts=[]
for _ in range(5):
    t=time.perf_counter(); X=(A@S.astype(np.float64)).astype(np.float32); ts.append(time.perf_counter()-t)
print(sorted(ts)[2]*1000)`;
  const r = spawnSync('python3', ['-c', code], { encoding: 'utf8' });
  const v = Number(r.stdout.trim());
  return r.status === 0 && Number.isFinite(v) ? v : null;
}

export async function bench(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  const demo = await medianMs(() => simulateSession({ seed: 1, channels: 32, minutes: 3, rate: hz(250) }), 3);
  rows.push({ area: 'simulate', case: 'simulateSession 32 ch × 3 min @ 250 Hz (demo)', oursMs: demo, referenceMs: null, reference: 'none (own scenario)' });
  let big = simulateSession({ seed: 1, channels: 64, minutes: 10, rate: hz(250) });
  const t = await medianMs(() => (big = simulateSession({ seed: 1, channels: 64, minutes: 10, rate: hz(250) })), 2);
  const mix = numpyMixMs(64, big.sources.length, big.nSamples);
  rows.push({
    area: 'simulate',
    case: `simulateSession 64 ch × 10 min @ 250 Hz (${big.sources.length} sources)`,
    oursMs: t,
    referenceMs: mix,
    reference: mix === null ? 'numpy unavailable' : 'numpy mixing product only (A·S, float64), python3',
    note: 'reference covers only the mixing step',
  });
  const edf = await medianMs(() => sessionEdf(big, 'data'), 2);
  rows.push({ area: 'simulate', case: 'EDF+C of 64 ch × 10 min', oursMs: edf, referenceMs: null, reference: 'none' });
  return rows;
}
