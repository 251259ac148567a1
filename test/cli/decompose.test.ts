import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';
import { parseDecompositionJson } from '../../src/core/formats/decomposition-file.ts';
import { laplaceUniformSineMixture } from '../core/ica/mixtures.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-decompose-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// 6 EEG channels mixing 6 known sources (µV), an EOG channel and a channel marked bad in channels.tsv; 250 Hz, 40 s.
const fs = 250;
const T = 40 * fs;
const mix = laplaceUniformSineMixture(6, T, 5);
const labels = ['Fz', 'Cz', 'Pz', 'C3', 'C4', 'Oz', 'VEOG', 'T8'];
const channels = labels.map((label, c) => ({
  label,
  unit: 'uV',
  sampleRate: fs,
  data: Float32Array.from({ length: T }, (_, t) => (c < 6 ? 20 * mix.X[c * T + t] : c === 6 ? 80 * Math.sin(t / 40) : 500 * Math.sin(t))),
}));
const recording = join(dir, 'sub-01_eeg.edf');
writeFileSync(recording, writeEdf({ format: 'EDF+C', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, channels, annotations: [] }));
const channelsTsv = join(dir, 'sub-01_channels.tsv');
writeFileSync(
  channelsTsv,
  'name\ttype\tunits\tstatus\n' + labels.map((l, i) => `${l}\t${i === 6 ? 'VEOG' : 'EEG'}\tuV\t${i === 7 ? 'bad' : 'good'}`).join('\n') + '\n',
);

async function decompose(...args: string[]) {
  const io = memoryIo();
  const code = await main(['decompose', ...args], io);
  return { code, out: io.out, err: io.err };
}

describe('winnow decompose (issue 5 contract)', () => {
  it('writes the decomposition JSON with the contract fields, leaving out the EOG and bad channels, progress on stderr', async () => {
    const out = join(dir, 'ica.json');
    const r = await decompose(recording, '--out', out, '--method', 'picard', '--seed', '3', '--channels-tsv', channelsTsv);
    expect(r.err).not.toMatch(/error/);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/decompose: ica iteration \d+, convergence/);
    expect(r.out).toMatch(/6 components from 6 channels/);
    const text = readFileSync(out, 'utf8');
    const o = JSON.parse(text);
    expect(o.channels).toEqual(['Fz', 'Cz', 'Pz', 'C3', 'C4', 'Oz']);
    expect(o.method).toBe('picard');
    expect(o.rank).toBe(6);
    expect(o.converged).toBe(true);
    expect(o.mixing).toHaveLength(6);
    expect(o.unmixing).toHaveLength(6);
    expect(o.preprocessing.excludedChannels).toEqual(['VEOG', 'T8']);
    expect(o.preprocessing.highpassHz).toBe(1);
    expect(o.preprocessing.filter).toMatch(/windowed-sinc FIR \(Hamming\)/);
    expect(o.recordingSha256).toBe(createHash('sha256').update(readFileSync(recording)).digest('hex'));
    expect(parseDecompositionJson(text, out).ok).toBe(true);
  });
  it('gives byte-identical files for the same seed', async () => {
    const a = join(dir, 'a.json');
    const b = join(dir, 'b.json');
    await decompose(recording, '--out', a, '--method', 'infomax', '--seed', '7', '--max-iter', '5', '--highpass', '0');
    await decompose(recording, '--out', b, '--method', 'infomax', '--seed', '7', '--max-iter', '5', '--highpass', '0');
    expect(readFileSync(a, 'utf8')).toBe(readFileSync(b, 'utf8'));
    expect(JSON.parse(readFileSync(a, 'utf8')).preprocessing.filter).toBe('none');
  });
  it('gives the same unmixing within 1e-9 with one thread and with a helper thread (--threads 1 | 2)', async () => {
    const one = join(dir, 'one.json');
    const two = join(dir, 'two.json');
    expect((await decompose(recording, '--out', one, '--threads', '1', '--seed', '2')).code).toBe(0);
    expect((await decompose(recording, '--out', two, '--threads', '2', '--seed', '2')).code).toBe(0);
    const a = JSON.parse(readFileSync(one, 'utf8')).unmixing.flat() as number[];
    const b = JSON.parse(readFileSync(two, 'utf8')).unmixing.flat() as number[];
    const scale = Math.max(...a.map(Math.abs));
    let worst = 0;
    for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
    expect(worst / scale).toBeLessThan(1e-9);
  });
  it('exits 2 with a message for a missing --out, an unknown method, a bad number and a missing recording', async () => {
    const noOut = await decompose(recording);
    expect(noOut.code).toBe(2);
    expect(noOut.err).toMatch(/--out FILE.json is required/);
    const m = await decompose(recording, '--out', join(dir, 'x.json'), '--method', 'fastica');
    expect(m.code).toBe(2);
    expect(m.err).toMatch(/--method must be infomax or picard, got "fastica"/);
    const n = await decompose(recording, '--out', join(dir, 'x.json'), '--max-iter', 'ten');
    expect(n.code).toBe(2);
    const f = await decompose(join(dir, 'nope.edf'), '--out', join(dir, 'x.json'));
    expect(f.code).toBe(2);
    expect(f.err).toMatch(/nope\.edf: no such file/);
    const h = await decompose(recording, '--out', join(dir, 'x.json'), '--highpass', '200');
    expect(h.code).toBe(2);
    expect(h.err).toMatch(/Nyquist/);
  });
});
