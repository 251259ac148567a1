import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/clean.ts';
import { memoryIo, CliError } from '../../src/cli/cli-support.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';
import { readEdfInfo, readEdfSignals } from '../../src/core/formats/edf.ts';
import { bytesByteSource } from '../../src/core/formats/byte-source.ts';
import { serializeDecomposition } from '../../src/core/formats/decomposition-file.ts';
import { buildDecisionsFile, formatDecisionsJson } from '../../src/core/review/decisions-file.ts';
import { cleanSignals, createCleaningPlan } from '../../src/core/review/clean.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';

const fs = 100;
const T = 200; // 2 records of 1 s
const labels = ['Fz', 'Cz', 'Pz'];
// A full-rank 3 × 3 mixing matrix and its inverse (computed by hand: A is upper triangular with unit diagonal).
// A = [[1, 0.5, 0.2], [0, 1, 0.4], [0, 0, 1]];  A⁻¹ = [[1, −0.5, 0], [0, 1, −0.4], [0, 0, 1]]
const A = [1, 0.5, 0.2, 0, 1, 0.4, 0, 0, 1];
const W = [1, -0.5, 0, 0, 1, -0.4, 0, 0, 1];
const decomposition: Decomposition = {
  channels: labels, nChannels: 3, nComponents: 3,
  mixing: Float64Array.from(A), unmixing: Float64Array.from(W), channelMeans: Float64Array.from([1, -2, 0.5]),
  method: 'imported', rank: 3, iterations: 0, converged: true,
  preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] },
  recordingSha256: '',
};

const eeg = new Float32Array(3 * T);
for (let c = 0; c < 3; c++) for (let t = 0; t < T; t++) eeg[c * T + t] = 40 * Math.sin(2 * Math.PI * (c + 2) * t / fs) + 10 * Math.cos(2 * Math.PI * 7 * t / fs + c);
const resp = Float32Array.from({ length: 2 * 25 }, (_, t) => 300 * Math.sin(2 * Math.PI * 0.3 * t / 25));

let dir = '';
const sha = (b: Uint8Array | string) => createHash('sha256').update(b).digest('hex');

async function setup(removed: number[], tamper = false) {
  const recordingBytes = writeEdf({
    format: 'EDF+C', patientId: 'MCH-0234567 F 02-MAY-1951 Haagse_Harry', recordingId: 'Startdate 02-MAR-2026 EMG561 BK/JOP Sony', keepIdentity: true,
    start: '2026-03-02T10:00:00', recordDurationSeconds: 1,
    channels: [
      ...labels.map((label, c) => ({ label, unit: 'uV', sampleRate: fs, physicalMin: -200, physicalMax: 200, data: eeg.subarray(c * T, (c + 1) * T) })),
      { label: 'Resp', unit: 'uV', sampleRate: 25, physicalMin: -500, physicalMax: 500, data: resp },
    ],
    annotations: [{ onset: 0.5, duration: 0, label: 'stim' }, { onset: 1.25, duration: 0.1, label: 'response' }],
  });
  const decompositionText = serializeDecomposition(decomposition);
  const decisions = buildDecisionsFile({
    aim: 'erp', reviewer: 't', createdAt: '2026-12-02T00:00:00Z', software: 'winnow test',
    recordingSha256: tamper ? '0'.repeat(64) : sha(recordingBytes), decompositionSha256: sha(decompositionText), nComponents: 3,
    decisions: Object.fromEntries(removed.map((i) => [i, { verdict: 'remove' as const, reason: 'blink' as const, note: '' }])),
  });
  await writeFile(join(dir, 'rec.edf'), recordingBytes);
  await writeFile(join(dir, 'dec.json'), decompositionText);
  await writeFile(join(dir, 'decisions.json'), formatDecisionsJson(decisions));
}

async function readBack(path: string) {
  const source = bytesByteSource(new Uint8Array(await readFile(path)), 'out.edf');
  const info = await readEdfInfo(source);
  if (!info.ok) throw new Error(info.error.message);
  const main = await readEdfSignals(source, info.value, { channels: labels });
  const other = await readEdfSignals(source, info.value, { channels: ['Resp'] });
  if (!main.ok || !other.ok) throw new Error('read failed');
  return { info: info.value, main: main.value, other: other.value };
}

beforeAll(async () => { dir = await mkdtemp(join(tmpdir(), 'winnow-clean-')); });
afterAll(async () => { await rm(dir, { recursive: true, force: true }); });

describe('winnow clean', () => {
  it('subtracts the removed components and keeps channels, rates, annotations; identity blanked', async () => {
    await setup([1, 3]);
    const io = memoryIo();
    const code = await run([join(dir, 'rec.edf'), join(dir, 'dec.json'), join(dir, 'decisions.json'), '--out', join(dir, 'clean.edf')], io);
    expect(code).toBe(0);
    expect(io.out).toMatch(/2 of 3 components removed \(1, 3\)/);
    const back = await readBack(join(dir, 'clean.edf'));
    expect(back.info.channels.map((c) => [c.label, c.sampleRate])).toEqual([['Fz', 100], ['Cz', 100], ['Pz', 100], ['Resp', 25]]);
    expect(back.info.events.filter((e) => e.source === 'annotation').map((e) => [e.onset, e.duration, e.label])).toEqual([[0.5, 0, 'stim'], [1.25, 0.1, 'response']]);
    // EDF+ anonymous patient field is "X X X X" (Kemp & Olivan 2003, EDF+ spec §2.1.3.3).
    expect(back.info.header.patientId).toBe('X X X X');
    const made = createCleaningPlan(decomposition, labels, [1, 3]);
    if (!made.ok) throw new Error(made.message);
    // The input file was quantised to 400 µV / 65535 steps; compare with the cleaning of what the file holds.
    const source = await readBack(join(dir, 'rec.edf'));
    const expected = cleanSignals(made.plan, source.main.data, T);
    let maxErr = 0;
    for (let i = 0; i < expected.length; i++) maxErr = Math.max(maxErr, Math.abs(back.main.data[i] - expected[i]));
    expect(maxErr).toBeLessThan(0.02); // a few 16-bit steps of the output's own range
    // The 25 Hz channel is not in the decomposition: same samples exactly (same scaling kept).
    expect(Array.from(back.other.data)).toEqual(Array.from(source.other.data));
  });

  it('writes the recording back unchanged when nothing is removed', async () => {
    await setup([]);
    const code = await run([join(dir, 'rec.edf'), join(dir, 'dec.json'), join(dir, 'decisions.json'), '--out', join(dir, 'same.edf'), '--keep-identity'], memoryIo());
    expect(code).toBe(0);
    const back = await readBack(join(dir, 'same.edf'));
    const source = await readBack(join(dir, 'rec.edf'));
    expect(Array.from(back.main.data)).toEqual(Array.from(source.main.data));
    expect(back.info.header.patientId).toBe(source.info.header.patientId);
  });

  it('refuses a decisions file made for another recording, naming both hashes (exit 2)', async () => {
    await setup([1], true);
    await expect(run([join(dir, 'rec.edf'), join(dir, 'dec.json'), join(dir, 'decisions.json'), '--out', join(dir, 'x.edf')], memoryIo()))
      .rejects.toSatisfy((e: unknown) => e instanceof CliError && e.exitCode === 2 && /made for a recording with SHA-256 0{64}/.test(e.message));
  });

  it('requires --out and names a missing input file', async () => {
    await expect(run(['a.edf', 'b.json', 'c.json'], memoryIo())).rejects.toThrow(/--out is required/);
    await expect(run([join(dir, 'nope.edf'), join(dir, 'dec.json'), join(dir, 'decisions.json'), '--out', join(dir, 'y.edf')], memoryIo()))
      .rejects.toThrow(/nope\.edf: no such file/);
  });
});
