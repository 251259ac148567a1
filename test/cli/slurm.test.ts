/**
 * The SLURM array-job recipe (scripts/winnow-batch.sbatch, docs/batch.md) run for real: the test starts a
 * single-node SLURM (munge, slurmctld, slurmd from Debian's slurm-wlm and munge packages, private
 * configuration, state and sockets in a temp folder, free ports), submits the script as an array over two
 * participants with `sbatch --wait`, and checks every output. Needs root to run the daemons as SlurmUser;
 * .ci/run installs the packages.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { chmod, mkdir, mkdtemp, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { hostname, tmpdir, userInfo } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';

const root = join(import.meta.dirname, '..', '..');
let dir = '';
const pidFiles: string[] = [];
const exists = (p: string) => stat(p).then(() => true, () => false);

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      s.close(() => resolve(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): { status: number | null; out: string } {
  const r = spawnSync(cmd, args, { env, encoding: 'utf8', timeout: 240_000 });
  return { status: r.status, out: `${r.stdout ?? ''}${r.stderr ?? ''}${r.error ? String(r.error) : ''}` };
}

let env: NodeJS.ProcessEnv = {};

beforeAll(async () => {
  for (const tool of ['munged', 'slurmctld', 'slurmd', 'sbatch']) {
    const which = spawnSync('sh', ['-c', `command -v ${tool}`], { encoding: 'utf8' });
    expect(which.status, `${tool} is not installed (.ci/run installs Debian's slurm-wlm and munge)`).toBe(0);
  }
  expect(userInfo().uid, 'the single-node SLURM test runs its daemons as root').toBe(0);
  dir = await mkdtemp(join(tmpdir(), 'winnow-slurm-'));
  const m = join(dir, 'munge');
  await mkdir(m, { mode: 0o700 });
  for (const d of ['state', 'spool', 'log']) await mkdir(join(dir, d));
  await writeFile(join(m, 'munge.key'), randomBytes(1024));
  await chmod(join(m, 'munge.key'), 0o400);
  const socket = join(m, 'munge.socket');
  const munge = run('munged', [`--key-file=${join(m, 'munge.key')}`, `--socket=${socket}`, `--pid-file=${join(m, 'munged.pid')}`, `--log-file=${join(m, 'munged.log')}`, `--seed-file=${join(m, 'seed')}`, '-f'], process.env);
  expect(munge.status, munge.out).toBe(0);
  pidFiles.push(join(m, 'munged.pid'));
  const [ctldPort, dPort] = [await freePort(), await freePort()];
  const host = hostname();
  const conf = [
    'ClusterName=winnowtest',
    `SlurmctldHost=${host}`,
    'SlurmUser=root',
    'SlurmdUser=root',
    'AuthType=auth/munge',
    `AuthInfo=socket=${socket}`,
    'CredType=cred/munge',
    `StateSaveLocation=${join(dir, 'state')}`,
    `SlurmdSpoolDir=${join(dir, 'spool')}`,
    `SlurmctldPidFile=${join(dir, 'slurmctld.pid')}`,
    `SlurmdPidFile=${join(dir, 'slurmd.pid')}`,
    `SlurmctldLogFile=${join(dir, 'log', 'slurmctld.log')}`,
    `SlurmdLogFile=${join(dir, 'log', 'slurmd.log')}`,
    `SlurmctldPort=${ctldPort}`,
    `SlurmdPort=${dPort}`,
    'ProctrackType=proctrack/linuxproc',
    'TaskPlugin=task/none',
    'SchedulerType=sched/backfill',
    'SelectType=select/cons_tres',
    'SelectTypeParameters=CR_Core',
    'ReturnToService=2',
    'MpiDefault=none',
    'JobAcctGatherType=jobacct_gather/none',
    `NodeName=${host} CPUs=2 RealMemory=4000 State=UNKNOWN`,
    'PartitionName=test Nodes=ALL Default=YES MaxTime=INFINITE State=UP',
  ].join('\n');
  await writeFile(join(dir, 'slurm.conf'), conf + '\n');
  env = { ...process.env, SLURM_CONF: join(dir, 'slurm.conf') };
  const ctld = run('slurmctld', ['-c'], env);
  expect(ctld.status, ctld.out).toBe(0);
  pidFiles.push(join(dir, 'slurmctld.pid'));
  const d = run('slurmd', [], env);
  expect(d.status, d.out).toBe(0);
  pidFiles.push(join(dir, 'slurmd.pid'));
  // wait for the node to register as idle
  for (let i = 0; i < 60; i++) {
    const s = run('sinfo', ['-h', '-o', '%t'], env);
    if (/idle/.test(s.out)) break;
    await new Promise((r) => setTimeout(r, 500));
  }
  const io = memoryIo();
  expect(await main(['simulate-study', '--out', join(dir, 'ds'), '--participants', '2', '--minutes', '0.5', '--seed', '21'], io)).toBe(0);
}, 180_000);

afterAll(async () => {
  if (env.SLURM_CONF) run('scontrol', ['shutdown'], env);
  const alive = (pid: number) => {
    try {
      process.kill(pid, 0);
      return true;
    } catch {
      return false;
    }
  };
  const pids: number[] = [];
  for (const p of pidFiles.reverse()) {
    const pid = Number((await readFile(p, 'utf8').catch(() => '')).trim());
    if (pid > 0) pids.push(pid);
  }
  for (const [signal, waitMs] of [['SIGTERM', 5000], ['SIGKILL', 2000]] as const) {
    for (const pid of pids.filter(alive)) {
      try {
        process.kill(pid, signal);
      } catch {
        // already gone
      }
    }
    for (let t = 0; t < waitMs && pids.some(alive); t += 100) await new Promise((r) => setTimeout(r, 100));
  }
  if (dir) await rm(dir, { recursive: true, force: true, maxRetries: 10, retryDelay: 200 });
});

describe('SLURM array job (scripts/winnow-batch.sbatch)', () => {
  it('runs one participant per array task and writes every output', async () => {
    await writeFile(join(dir, 'participants.txt'), '01\n02\n');
    const out = join(dir, 'out');
    const r = run(
      'sbatch',
      ['--wait', '--array=1-2', '--mem=1G', '--cpus-per-task=1', `--chdir=${dir}`, '--export=ALL', join(root, 'scripts', 'winnow-batch.sbatch'), join(dir, 'ds'), out, join(dir, 'participants.txt')],
      { ...env, WINNOW: `${process.execPath} ${join(root, 'bin', 'winnow.mjs')}` },
    );
    const job = /Submitted batch job (\d+)/.exec(r.out)?.[1] ?? '?';
    const logs = await Promise.all(['1', '2'].map((k) => readFile(join(dir, `winnow-${job}_${k}.log`), 'utf8').catch(() => '(no log)')));
    expect(r.status, `${r.out}\n${logs.join('\n')}`).toBe(0);
    for (const l of ['01', '02'])
      for (const kind of ['decomposition', 'evidence'])
        expect(await exists(join(out, `sub-${l}`, 'eeg', `sub-${l}_task-walkoddball_desc-winnow_${kind}.json`))).toBe(true);
  }, 300_000);
});
