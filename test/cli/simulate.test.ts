import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { main } from '../../src/cli/winnow.ts';
import { bytesByteSource } from '../../src/core/formats/byte-source.ts';
import { readEdfInfo } from '../../src/core/formats/edf.ts';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'winnow-simulate-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('winnow simulate', () => {
  it('writes the recording, the neural-only recording, BIDS sidecars and the truth files', async () => {
    const out = join(dir, 'a');
    const io = memoryIo();
    const code = await main(['simulate', '--out', out, '--seed', '4', '--minutes', '0.2', '--line', '60'], io);
    expect(io.err).toBe('');
    expect(code).toBe(0);
    const summary = JSON.parse(io.out);
    expect(summary.channels).toBe(32);
    const files = (await readdir(out)).sort();
    expect(files).toEqual(
      ['activations.f32', 'channels.tsv', 'coordsystem.json', 'eeg.json', 'electrodes.tsv', 'events.json', 'events.tsv', 'neural.edf', 'recording.edf', 'sensor-noise.f32', 'truth.json'].sort(),
    );
    const truth = JSON.parse(await readFile(join(out, 'truth.json'), 'utf8'));
    expect(truth.lineHz).toBe(60);
    expect(truth.sources.length).toBe(summary.sources);
    const acts = await readFile(join(out, 'activations.f32'));
    expect(acts.length).toBe(truth.sources.length * truth.nSamples * 4);
    const edf = new Uint8Array(await readFile(join(out, 'recording.edf')));
    const info = await readEdfInfo(bytesByteSource(edf, 'recording.edf'));
    expect(info.ok).toBe(true);
    if (info.ok) expect(info.value.durationSeconds).toBeCloseTo(12, 9);
    expect(JSON.parse(await readFile(join(out, 'eeg.json'), 'utf8')).PowerLineFrequency).toBe(60);
  });

  it('writes identical files for the same seed', async () => {
    const a = join(dir, 'b1');
    const b = join(dir, 'b2');
    expect(await main(['simulate', '--out', a, '--seed', '9', '--minutes', '0.1'], memoryIo())).toBe(0);
    expect(await main(['simulate', '--out', b, '--seed', '9', '--minutes', '0.1'], memoryIo())).toBe(0);
    for (const f of ['recording.edf', 'truth.json', 'events.tsv']) expect((await readFile(join(a, f))).equals(await readFile(join(b, f)))).toBe(true);
  });

  it('rejects bad options with exit code 2 and a message naming the option', async () => {
    const cases: [string[], RegExp][] = [
      [['simulate'], /--out/],
      [['simulate', '--out', dir, '--channels', '48'], /--channels/],
      [['simulate', '--out', dir, '--rate', '100.5'], /--rate/],
      [['simulate', '--out', dir, '--line', '55'], /--line/],
      [['simulate', '--out', dir, '--minutes', '-1'], /--minutes/],
      [['simulate', '--out', dir, '--seed', 'x'], /--seed/],
      [['simulate', '--out', dir, '--bogus'], /bogus/],
    ];
    for (const [args, re] of cases) {
      const io = memoryIo();
      expect(await main(args, io)).toBe(2);
      expect(io.err).toMatch(re);
    }
  });
});
