import { afterAll, describe, expect, it } from 'vitest';
import { rmSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { writeCliRecordings } from '../core/formats/cli-recordings.ts';

const files = writeCliRecordings();
afterAll(() => rmSync(files.dir, { recursive: true, force: true }));
const repo = fileURLToPath(new URL('../..', import.meta.url));

async function read(...args: string[]) {
  const io = memoryIo();
  const code = await main(['read', ...args], io);
  return { code, out: io.out, err: io.err, rows: io.out.trimEnd().split('\n').map((l) => l.split('\t')) };
}

describe('winnow read (issue 2 contract)', () => {
  it('prints time then the labels, one row per sample, physical values, for channels of one rate', async () => {
    const r = await read(files.multiRate, '--channels', 'EEG Fz,EEG Cz');
    expect(r.code).toBe(0);
    expect(r.rows).toEqual([
      ['time', 'EEG Fz', 'EEG Cz'],
      ['0', '0', '0'], ['0.25', '1', '0'], ['0.5', '2', '0'], ['0.75', '3', '0'],
      ['1', '10', '-1'], ['1.25', '11', '-1'], ['1.5', '12', '-1'], ['1.75', '13', '-1'],
    ]);
  });

  it('selects a time window with --start and --duration (t ≥ start, t < start + duration)', async () => {
    const r = await read(files.multiRate, '--channels', 'Resp', '--start', '0.5', '--duration', '1');
    // Resp: 2 Hz, mV header, 1 digital step = 0.001 mV = 1 µV → values 1000 / −1000 µV
    expect(r.rows.map((row) => [row[0], Number(row[1]).toFixed(6)])).toEqual([['time', 'NaN'], ['0.5', '-1000.000000'], ['1', '1000.000000']]);
    expect(r.rows[0]).toEqual(['time', 'Resp']);
  });

  it('exits 2 listing the rates when channels of different rates are asked for (or none are named)', async () => {
    const r = await read(files.multiRate, '--channels', 'EEG Fz,Resp');
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe(`error: ${files.multiRate}: the channels have different sampling rates (4 Hz: EEG Fz; 2 Hz: Resp); read channels of one rate at a time\n`);
    const all = await read(files.multiRate);
    expect(all.code).toBe(2);
    expect(all.err).toContain('4 Hz: EEG Fz, EEG Cz; 2 Hz: Resp');
  });

  it('prints the true sample times of an EDF+D file, so the gap shows', async () => {
    const r = await read(files.discontinuous);
    expect(r.code).toBe(0);
    expect(r.rows.map((row) => row[0])).toEqual(['time', '0', '0.25', '0.5', '0.75', '3', '3.25']);
    expect(r.rows.slice(1).map((row) => row[1])).toEqual(['0', '1', '2', '3', '4', '5']);
  });

  it('prints BDF samples with the BioSemi scaling of checks/edf_layout.json', async () => {
    const r = await read(files.bdf, '--duration', '0.25');
    expect(r.rows).toEqual([['time', 'A1'], ['0', '-0.4843750288709998'], ['0.125', '-0.45312508661299944']]);
  });

  it('exits 2 for an unknown channel, a bad option value and a truncated file, without a stack trace', async () => {
    const u = await read(files.multiRate, '--channels', 'Oz');
    expect(u.code).toBe(2);
    expect(u.err).toBe(`error: ${files.multiRate}: no channel "Oz"; the file has EEG Fz, EEG Cz, Resp\n`);
    const s = await read(files.multiRate, '--start', 'soon');
    expect(s.code).toBe(2);
    expect(s.err).toBe('error: winnow read: --start must be a number, got "soon"\n');
    const t = await read(files.truncated, '--channels', 'Resp');
    expect(t.code).toBe(2);
    expect(t.err).toMatch(/^error: .*recording\.edf: header says 2 data records of 60 bytes but the file holds 1 and 30 bytes\n$/);
    expect(t.err).not.toMatch(/\n\s+at /);
  });

  it('works through the real command: node bin/winnow.mjs read / inspect', () => {
    const ok = spawnSync(process.execPath, ['bin/winnow.mjs', 'read', files.discontinuous, '--start', '3'], { cwd: repo, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    expect(ok.stdout).toBe('time\tOz\n3\t4\n3.25\t5\n');
    const bad = spawnSync(process.execPath, ['bin/winnow.mjs', 'inspect', files.truncated], { cwd: repo, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toBe(`error: ${files.truncated}: header says 2 data records of 60 bytes but the file holds 1 and 30 bytes\n`);
  });
});

describe('file access under winnow read (node-byte-source, atomic-write)', () => {
  it('reads a file in positioned slices, short at the end', async () => {
    const { openFileByteSource } = await import('../../src/cli/node-byte-source.ts');
    const src = await openFileByteSource(files.bdf);
    try {
      expect(src.size).toBe(536); // checks/edf_layout.json: bdf size_bytes
      expect(Array.from(await src.read(0, 8))).toEqual([0xff, 0x42, 0x49, 0x4f, 0x53, 0x45, 0x4d, 0x49]);
      expect((await src.read(530, 100)).length).toBe(6);
    } finally {
      await src.close();
    }
  });

  it('writes atomically: the target gets the whole content and no temporary file is left behind', async () => {
    const { writeFileAtomic, writeFileAtomicChunks } = await import('../../src/cli/atomic-write.ts');
    const { readdirSync, readFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const target = join(files.dir, 'out.tsv');
    await writeFileAtomic(target, 'a\tb\n');
    await writeFileAtomic(target, 'c\td\n'); // replaces
    expect(readFileSync(target, 'utf8')).toBe('c\td\n');
    await writeFileAtomicChunks(join(files.dir, 'out.bin'), [new Uint8Array([1, 2]), new Uint8Array([3])]);
    expect(Array.from(readFileSync(join(files.dir, 'out.bin')))).toEqual([1, 2, 3]);
    expect(readdirSync(files.dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    await expect(writeFileAtomic(join(files.dir, 'no-such-dir', 'x'), 'x')).rejects.toThrow();
  });
});
