/**
 * `winnow simulate-study` and `winnow batch` (issue 11): the BIDS Apps call convention (Gorgolewski et al.
 * 2017, PLoS Comput. Biol. 13:e1005209: <bids_dir> <output_dir> participant|group, --participant-label),
 * BIDS derivative naming (specification v1.10, "Derivatives"), resumable runs, failures that spare the
 * others, and GNU parallel spreading participants over processes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { cp, mkdtemp, readFile, rm, stat, truncate } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';

const root = join(import.meta.dirname, '..', '..');
let dir = '';
let ds = '';
const exists = (p: string) => stat(p).then(() => true, () => false);

async function winnow(...args: string[]) {
  const io = memoryIo();
  const code = await main(args, io);
  return { code, out: io.out, err: io.err };
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'winnow-batch-'));
  ds = join(dir, 'ds');
  const r = await winnow('simulate-study', '--out', ds, '--participants', '4', '--minutes', '0.5', '--seed', '11');
  expect(r.code).toBe(0);
}, 120_000);
afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('winnow simulate-study', () => {
  it('writes a BIDS dataset: description, participants and per-participant recordings with sidecars', async () => {
    const desc = JSON.parse(await readFile(join(ds, 'dataset_description.json'), 'utf8'));
    expect(desc.BIDSVersion).toMatch(/^1\./);
    expect(desc.Name).toBeTruthy();
    const participants = (await readFile(join(ds, 'participants.tsv'), 'utf8')).trim().split('\n');
    expect(participants[0].split('\t')[0]).toBe('participant_id');
    expect(participants.slice(1).map((l) => l.split('\t')[0])).toEqual(['sub-01', 'sub-02', 'sub-03', 'sub-04']);
    for (const f of ['eeg.edf', 'channels.tsv', 'events.tsv', 'eeg.json']) expect(await exists(join(ds, 'sub-03', 'eeg', `sub-03_task-walkoddball_${f}`))).toBe(true);
    expect(await exists(join(ds, 'sub-03', 'eeg', 'sub-03_electrodes.tsv'))).toBe(true);
    // the last participant is the noisy one
    expect(participants[4].split('\t')[2]).not.toBe(participants[1].split('\t')[2]);
  });
});

describe('winnow batch', () => {
  const out = () => join(dir, 'out');
  it('participant level writes decomposition and evidence per recording, then a second run skips everything', async () => {
    const first = await winnow('batch', ds, out(), 'participant');
    expect(first.code, first.err).toBe(0);
    const summary = JSON.parse(first.out);
    expect(summary.done).toHaveLength(4);
    for (const l of ['01', '02', '03', '04']) {
      for (const kind of ['decomposition', 'evidence'])
        expect(await exists(join(out(), `sub-${l}`, 'eeg', `sub-${l}_task-walkoddball_desc-winnow_${kind}.json`))).toBe(true);
    }
    const desc = JSON.parse(await readFile(join(out(), 'dataset_description.json'), 'utf8'));
    expect(desc.DatasetType).toBe('derivative');
    expect(desc.GeneratedBy[0].Name).toBe('winnow');
    expect(first.err.split('\n').filter((l) => / done$/.test(l))).toHaveLength(4);

    const second = await winnow('batch', ds, out(), 'participant');
    expect(second.code).toBe(0);
    expect(JSON.parse(second.out)).toMatchObject({ done: [], failed: [] });
    expect(JSON.parse(second.out).skipped).toHaveLength(4);
  }, 300_000);

  it('group level tabulates each recording from its evidence file, with the study flags', async () => {
    const r = await winnow('batch', ds, out(), 'group');
    expect(r.code, r.err).toBe(0);
    const lines = (await readFile(join(out(), 'winnow_study.tsv'), 'utf8')).trim().split('\n').map((l) => l.split('\t'));
    const head = lines[0];
    expect(head.slice(0, 5)).toEqual(['participant_id', 'session', 'task', 'run', 'components']);
    expect(lines).toHaveLength(5);
    // recount from the evidence files themselves
    for (const row of lines.slice(1)) {
      const sub = row[0];
      const ev = JSON.parse(await readFile(join(out(), sub, 'eeg', `${sub}_task-walkoddball_desc-winnow_evidence.json`), 'utf8'));
      const removed = ev.components.filter((c: { suggestions: Record<string, { verdict: string }> }) => c.suggestions.oscillations.verdict === 'remove');
      expect(Number(row[head.indexOf('removals_oscillations')])).toBe(removed.length);
      expect(Number(row[head.indexOf('components')])).toBe(ev.components.length);
      const share = removed.reduce((s: number, c: { varianceShare: number }) => s + c.varianceShare, 0);
      expect(Number(row[head.indexOf('removed_variance_oscillations')])).toBeCloseTo(share, 3);
    }
    const json = JSON.parse(await readFile(join(out(), 'winnow_study.json'), 'utf8'));
    expect(json.recordings).toHaveLength(4);
  });

  it('a recording that fails is listed, the others are still written, exit 1', async () => {
    const broken = join(dir, 'broken');
    await cp(ds, broken, { recursive: true });
    await truncate(join(broken, 'sub-02', 'eeg', 'sub-02_task-walkoddball_eeg.edf'), 300);
    const r = await winnow('batch', broken, join(dir, 'broken-out'), 'participant', '--participant-label', '01', '--participant-label', 'sub-02');
    expect(r.code).toBe(1);
    const s = JSON.parse(r.out);
    expect(s.done).toEqual(['sub-01/eeg/sub-01_task-walkoddball_eeg.edf']);
    expect(s.failed.map((f: { recording: string }) => f.recording)).toEqual(['sub-02/eeg/sub-02_task-walkoddball_eeg.edf']);
    expect(r.err).toMatch(/^error: 1 of 2 recordings failed/m);
  }, 120_000);

  it('a bad command line or dataset exits 2 with an error line naming it', async () => {
    const notBids = await winnow('batch', join(dir, 'nowhere'), join(dir, 'x'), 'participant');
    expect(notBids.code).toBe(2);
    expect(notBids.err).toMatch(/^error: .*nowhere: not a BIDS dataset/);
    const level = await winnow('batch', ds, join(dir, 'x'), 'subject');
    expect(level.code).toBe(2);
    expect(level.err).toMatch(/^error: .*analysis level/);
    const who = await winnow('batch', ds, join(dir, 'x'), 'participant', '--participant-label', '99');
    expect(who.code).toBe(2);
    expect(who.err).toMatch(/sub-99/);
  });

  it('GNU parallel runs one participant per process (the recipe in docs/batch.md)', async () => {
    const has = spawnSync('parallel', ['--version'], { encoding: 'utf8' });
    expect(has.status, 'GNU parallel is not installed (.ci/run installs the Debian package "parallel")').toBe(0);
    const pout = join(dir, 'parallel-out');
    execFileSync(
      'parallel',
      ['--will-cite', '-j', '2', '--halt', 'now,fail=1', 'node', join(root, 'bin', 'winnow.mjs'), 'batch', ds, pout, 'participant', '--participant-label', '{}', ':::', '01', '02', '03', '04'],
      { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] },
    );
    for (const l of ['01', '02', '03', '04']) expect(await exists(join(pout, `sub-${l}`, 'eeg', `sub-${l}_task-walkoddball_desc-winnow_evidence.json`))).toBe(true);
  }, 300_000);
});
