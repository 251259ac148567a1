/**
 * Hour-long recording bench (issue 12): `winnow decompose` (Picard, default options) on a simulated
 * 64-channel, 60-minute, 500 Hz recording (460.8 MB as float32), run as a child process so its peak resident
 * memory is its own. Reports wall time, iterations and peak RSS against the targets: ≤ 180 s and peak RSS
 * ≤ 2× the float32 data. Peak RSS comes from /usr/bin/time -v ("Maximum resident set size") when present,
 * else from sampling VmHWM in /proc/<pid>/status; the same is measured for `node -e 0` (Node's own baseline)
 * and for `winnow decompose --help` (the CLI's baseline: Node plus the TypeScript loader and our modules), so
 * the note gives the ratio raw and above each baseline. Timed once; heavy (minutes, ~1 GB): run it alone,
 * `npm run bench long-recording`.
 * Environment: WINNOW_BENCH_LONG_FILE=path.edf (decompose that recording instead), WINNOW_BENCH_LONG_MINUTES
 * (default 60; the simulated recording is kept in the system temp folder and reused), WINNOW_BENCH_LONG_CHANNELS
 * (32|64, default 64), WINNOW_BENCH_LONG_RATE (Hz, default 500), WINNOW_BENCH_LONG_THREADS (1|2, default 2).
 * Memory and time are measured here only, never asserted in tests.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readSync, closeSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchRow } from './bench-types.ts';

const WINNOW = fileURLToPath(new URL('../bin/winnow.mjs', import.meta.url));
const TIME = '/usr/bin/time';

interface ChildRun {
  readonly ms: number;
  readonly peakKb: number;
  readonly stdout: string;
  readonly code: number | null;
}

/** Runs `args` (after node) in a child process; wall time and peak RSS (kB). */
function runMeasured(args: string[]): Promise<ChildRun> {
  const useTime = existsSync(TIME);
  const cmd = useTime ? TIME : process.execPath;
  const argv = useTime ? ['-v', process.execPath, ...args] : args;
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const p = spawn(cmd, argv, { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    let hwm = 0;
    p.stdout.on('data', (d) => (stdout += d));
    p.stderr.on('data', (d) => {
      stderr += d;
      if (stderr.length > 1 << 20) stderr = stderr.slice(-(1 << 16)); // progress lines: keep the tail
    });
    // Without /usr/bin/time: the child's VmHWM (peak RSS), sampled until it exits.
    const timer = useTime
      ? null
      : setInterval(() => {
          try {
            const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${p.pid}/status`, 'utf8'));
            if (m) hwm = Math.max(hwm, Number(m[1]));
          } catch {
            // exited
          }
        }, 100);
    p.on('error', reject);
    p.on('close', (code) => {
      if (timer) clearInterval(timer);
      const ms = performance.now() - t0;
      const m = /Maximum resident set size \(kbytes\):\s*(\d+)/.exec(stderr);
      const peakKb = useTime && m ? Number(m[1]) : hwm;
      if (code !== 0) process.stderr.write(stderr.slice(-2000));
      resolve({ ms, peakKb, stdout, code });
    });
  });
}

/** Bytes of the recording's signal samples as float32 (EDF/BDF header: records × Σ samples per record). */
function float32Bytes(path: string): number {
  const fd = openSync(path, 'r');
  try {
    const head = Buffer.alloc(256);
    readSync(fd, head, 0, 256, 0);
    const records = Number(head.toString('latin1', 236, 244).trim());
    const ns = Number(head.toString('latin1', 252, 256).trim());
    const sig = Buffer.alloc(ns * 256);
    readSync(fd, sig, 0, ns * 256, 256);
    let spr = 0;
    for (let i = 0; i < ns; i++) {
      const label = sig.toString('latin1', 16 * i, 16 * i + 16).trim();
      if (/annotations/i.test(label)) continue;
      spr += Number(sig.toString('latin1', 216 * ns + 8 * i, 216 * ns + 8 * i + 8).trim());
    }
    return records * spr * 4;
  } finally {
    closeSync(fd);
  }
}

async function recordingPath(channels: number, minutes: number, rate: number): Promise<string> {
  const given = process.env.WINNOW_BENCH_LONG_FILE;
  if (given) return given;
  const dir = join(tmpdir(), `winnow-bench-long-${channels}ch-${minutes}min-${rate}Hz`);
  const path = join(dir, 'recording.edf');
  if (existsSync(path) && existsSync(join(dir, 'truth.json'))) return path;
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  process.stderr.write(`long-recording: simulating ${channels} ch × ${minutes} min × ${rate} Hz into ${dir} …\n`);
  const sim = await runMeasured([WINNOW, 'simulate', '--out', dir, '--channels', String(channels), '--minutes', String(minutes), '--rate', String(rate)]);
  if (sim.code !== 0) throw new Error(`winnow simulate exited ${sim.code}`);
  return path;
}

export async function bench(): Promise<BenchRow[]> {
  const channels = Number(process.env.WINNOW_BENCH_LONG_CHANNELS ?? 64);
  const minutes = Number(process.env.WINNOW_BENCH_LONG_MINUTES ?? 60);
  const rate = Number(process.env.WINNOW_BENCH_LONG_RATE ?? 500);
  const threads = process.env.WINNOW_BENCH_LONG_THREADS ?? '2';
  const path = await recordingPath(channels, minutes, rate);
  const dataMb = float32Bytes(path) / 1e6;
  const nodeBase = await runMeasured(['-e', '0']);
  const cliBase = await runMeasured([WINNOW, 'decompose', '--help']);
  const out = join(tmpdir(), `winnow-bench-long-${process.pid}.json`);
  process.stderr.write(`long-recording: winnow decompose ${path} (${dataMb.toFixed(1)} MB as float32) …\n`);
  const run = await runMeasured([WINNOW, 'decompose', path, '--out', out, '--threads', threads]);
  rmSync(out, { force: true });
  if (run.code !== 0) throw new Error(`winnow decompose exited ${run.code}`);
  const peakMb = run.peakKb / 1000;
  const nodeMb = nodeBase.peakKb / 1000;
  const cliMb = cliBase.peakKb / 1000;
  const it = /(\d+) iterations, (converged|NOT converged)/.exec(run.stdout);
  const label = process.env.WINNOW_BENCH_LONG_FILE ? path.split('/').pop() : `${channels} ch × ${minutes} min × ${rate} Hz`;
  return [
    {
      area: 'decompose (CLI)',
      case: `${label}, picard, ${threads} thread${threads === '1' ? '' : 's'}`,
      oursMs: run.ms,
      referenceMs: null,
      reference: `targets ≤ 180 s (60 min), peak RSS ≤ 2× float32 data (${(2 * dataMb).toFixed(0)} MB)`,
      note:
        `peak RSS ${peakMb.toFixed(0)} MB = ${(peakMb / dataMb).toFixed(2)}× data; above node -e 0 (${nodeMb.toFixed(0)} MB) ` +
        `${((peakMb - nodeMb) / dataMb).toFixed(2)}×, above decompose --help (${cliMb.toFixed(0)} MB) ${((peakMb - cliMb) / dataMb).toFixed(2)}×; ` +
        (it ? `${it[1]} iterations, ${it[2]}` : 'iterations not reported'),
    },
  ];
}
