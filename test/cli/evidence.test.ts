import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';
import { mulberry32 } from '../../src/core/evidence/time-locking.ts';
import { serializeDecomposition } from '../../src/core/formats/decomposition-file.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-evidence-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// 8 EEG channels at 10-20 sites plus a VEOG channel, 250 Hz, 60 s. Three sources with known maps:
// a posterior 10 Hz rhythm, blinks (frontal map, also on VEOG) and a loose O2 electrode (slow drift and a
// jump: a 1/f² spectrum); 5 weak noise sources.
const fs = 250;
const T = 60 * fs;
const eeg = ['Fp1', 'Fp2', 'F7', 'F8', 'C3', 'C4', 'O1', 'O2'];
const rand = mulberry32(21);
const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
const k = 8;
const maps: number[][] = [
  [0.05, 0.05, 0.1, 0.1, 0.4, 0.4, 1, 1], // alpha, posterior
  [1, 1, 0.5, 0.5, 0.2, 0.2, 0.05, 0.05], // blink, frontal
  [0, 0, 0, 0, 0, 0, 0, 1], // O2 electrode
];
for (let i = 3; i < k; i++) maps.push(Array.from({ length: 8 }, () => gauss()));
const S = Array.from({ length: k }, () => new Float64Array(T));
const blinkOnsets: number[] = [];
for (let t = 0; t < T; t++) {
  S[0][t] = 10 * Math.sin((2 * Math.PI * 10 * t) / fs) * (1 + 0.5 * Math.sin((2 * Math.PI * 0.2 * t) / fs)) + 2 * gauss();
  S[2][t] = (t > 0 ? 0.999 * S[2][t - 1] : 0) + gauss() + (t === T / 2 ? 50 : 0); // drifting, with a pop
  for (let i = 3; i < k; i++) S[i][t] = gauss();
}
for (let b = 1.3; b < 59; b += 2.7) {
  blinkOnsets.push(b);
  const at = Math.round(b * fs);
  for (let j = 0; j < 75; j++) S[1][at + j] += 100 * Math.sin((Math.PI * j) / 75);
}
const mixing = new Float64Array(8 * k);
for (let c = 0; c < 8; c++) for (let i = 0; i < k; i++) mixing[c * k + i] = maps[i][c];
// unmixing = inverse of the mixing (Gauss–Jordan, test set-up only)
function inverse(A: Float64Array, n: number): Float64Array {
  const M = Float64Array.from(A);
  const I = new Float64Array(n * n);
  for (let i = 0; i < n; i++) I[i * n + i] = 1;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r * n + c]) > Math.abs(M[p * n + c])) p = r;
    for (let j = 0; j < n; j++) {
      [M[c * n + j], M[p * n + j]] = [M[p * n + j], M[c * n + j]];
      [I[c * n + j], I[p * n + j]] = [I[p * n + j], I[c * n + j]];
    }
    const d = M[c * n + c];
    for (let j = 0; j < n; j++) {
      M[c * n + j] /= d;
      I[c * n + j] /= d;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = M[r * n + c];
      for (let j = 0; j < n; j++) {
        M[r * n + j] -= f * M[c * n + j];
        I[r * n + j] -= f * I[c * n + j];
      }
    }
  }
  return I;
}
const channels = [
  ...eeg.map((label, c) => ({
    label,
    unit: 'uV',
    sampleRate: fs,
    data: Float32Array.from({ length: T }, (_, t) => S.reduce((s, src, i) => s + mixing[c * k + i] * src[t], 0)),
  })),
  { label: 'VEOG', unit: 'uV', sampleRate: fs, data: Float32Array.from({ length: T }, (_, t) => 2 * S[1][t] + 3 * gauss()) },
];
const recording = join(dir, 'sub-01_eeg.edf');
writeFileSync(recording, writeEdf({ format: 'EDF+C', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, channels, annotations: blinkOnsets.map((onset) => ({ onset, duration: 0, label: 'cue' })) }));
const dec: Decomposition = {
  channels: eeg,
  nChannels: 8,
  nComponents: k,
  mixing,
  unmixing: inverse(mixing, k),
  channelMeans: null,
  method: 'imported',
  rank: k,
  iterations: 0,
  converged: true,
  preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: ['VEOG'] },
  recordingSha256: '',
};
const decFile = join(dir, 'dec.json');
writeFileSync(decFile, serializeDecomposition(dec));

async function evidence(...args: string[]) {
  const io = memoryIo();
  const code = await main(['evidence', ...args], io);
  return { code, out: io.out, err: io.err };
}

describe('winnow evidence (issue 6 contract)', () => {
  it('writes the contract fields for every component, with suggestions for the chosen aim', async () => {
    const out = join(dir, 'evidence.json');
    const r = await evidence(recording, decFile, '--aim', 'oscillations', '--out', out);
    expect(r.err).not.toMatch(/error/);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/evidence for 8 components \(aim oscillations:/);
    const o = JSON.parse(readFileSync(out, 'utf8'));
    expect(o.format).toBe('winnow-evidence/1');
    expect(o.components).toHaveLength(8);
    // the input files' hashes, as Node's crypto computes SHA-256 of their bytes (FIPS 180-4), for the workbench's reuse check
    expect(o.recordingSha256).toBe(createHash('sha256').update(readFileSync(recording)).digest('hex'));
    expect(o.decompositionSha256).toBe(createHash('sha256').update(readFileSync(decFile)).digest('hex'));
    expect(o.components[0].variancePerChannel).toHaveLength(o.components[0].map.length);
    for (const c of o.components) {
      for (const key of ['index', 'varianceShare', 'spectrum', 'oneOverFExponent', 'alphaPeakHz', 'highFrequencyShare', 'mainsShare', 'dipole', 'suggestion'])
        expect(c).toHaveProperty(key);
      expect(c.spectrum.frequencies.length).toBe(c.spectrum.power.length);
      expect(c.spectrum.frequencies[0]).toBeGreaterThanOrEqual(1);
      expect(['keep', 'remove', 'undecided']).toContain(c.suggestion.verdict);
      expect(c.suggestion).toEqual(c.suggestions.oscillations);
    }
    expect(o.components.map((c: { index: number }) => c.index)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    const [alpha, blink, electrode] = o.components;
    expect(alpha.alphaPeakHz).toBeCloseTo(10, 0);
    expect(blink.eogCorrelation.source).toBe('EOG channels');
    expect(blink.eogCorrelation.vertical).toBeGreaterThan(0.9);
    expect(blink.suggestion).toMatchObject({ verdict: 'remove', reason: 'blink' });
    expect(electrode.focality).toEqual({ share: 1, channel: 'O2' });
    expect(electrode.suggestion).toMatchObject({ verdict: 'remove', reason: 'contact' });
    expect(alpha.dipole).toHaveProperty('residualVariance');
    expect(alpha.dipole.position).toHaveLength(3);
    expect(o.epochEvent).toBe('cue');
    expect(blink.erp.nEpochs).toBeGreaterThan(15);
    // suggestions per aim carry the rules that fired, computed at output time with the recorded thresholds
    expect(blink.suggestion.rules).toContainEqual(expect.objectContaining({ measure: 'eogCorrelation.vertical', direction: '≥', threshold: o.thresholds.eogCorrelation }));
    expect(electrode.suggestion.rules).toContainEqual(expect.objectContaining({ measure: 'focality.share', value: 1, threshold: o.thresholds.electrodeFocality }));
    for (const c of o.components) for (const r of c.suggestion.rules) expect(['common practice', 'ours']).toContain(r.source);
    // the permutations record: shuffles run per component (sequential, at most 999) and the 1/f fit quality
    expect(o.permutations.maxShuffles).toBe(999);
    expect(o.permutations.components).toHaveLength(8);
    for (const p of o.permutations.components) {
      expect(p.shuffles).toBeGreaterThanOrEqual(10);
      expect(p.shuffles).toBeLessThanOrEqual(999);
      expect(p.shuffles).toBe(o.components[p.index - 1].erp.shuffles);
    }
    expect(o.components[0].oneOverFFitR2).toBe(o.permutations.components[0].fitR2);
    expect(blink.timeLocking).toEqual([expect.objectContaining({ event: 'cue', nEpochs: blink.erp.nEpochs, shuffles: blink.erp.shuffles, p: blink.erp.permutationP })]);
    // the blinks are the cue's response: locked, p at the floor 1 / (1 + 999)
    expect(blink.erp.permutationP).toBeCloseTo(1 / 1000, 12);
  });

  it('reads events from events.tsv (merged with the annotations, as the workbench loads them) and writes to stdout without --out', async () => {
    const events = join(dir, 'events.tsv');
    writeFileSync(events, 'onset\tduration\ttrial_type\n' + blinkOnsets.map((o) => `${o}\t0\tflash`).join('\n') + '\n');
    // "flash" is only in events.tsv: epoching on it proves the file was read.
    const r = await evidence(recording, decFile, '--events', events, '--epoch-event', 'flash');
    expect(r.code).toBe(0);
    const o = JSON.parse(r.out);
    expect(o.aim).toBe('erp');
    expect(o.epochEvent).toBe('flash');
    expect(o.components[1].erp.nEpochs).toBeGreaterThan(15);
    expect((await evidence(recording, decFile, '--epoch-event', 'flash')).err).toMatch(/--epoch-event "flash" matches no event/);
  });

  it('tests time-locking for every event type and, with --lock-column, each value of that column', async () => {
    const events = join(dir, 'events-cond.tsv');
    // "flash" after every blink, alternately condition a / b; "press" at times unrelated to the blinks
    const rows = blinkOnsets.map((o, k) => `${o}\t0\tflash\t${k % 2 ? 'b' : 'a'}`);
    for (let k = 0; k < 20; k++) rows.push(`${(2 + 2.9 * k).toFixed(3)}\t0\tpress\tn/a`);
    writeFileSync(events, 'onset\tduration\ttrial_type\tcondition\n' + rows.join('\n') + '\n');
    const r = await evidence(recording, decFile, '--events', events, '--epoch-event', 'flash', '--lock-column', 'condition');
    expect(r.code).toBe(0);
    const blink = JSON.parse(r.out).components[1];
    const tests = blink.timeLocking.filter((t: { event: string }) => t.event !== 'cue');
    expect(tests.map((t: { event: string; value?: string }) => [t.event, t.value ?? null])).toEqual([['flash', null], ['flash', 'a'], ['flash', 'b'], ['press', null]]);
    for (const t of tests.slice(0, 3)) expect(t.p).toBeCloseTo(1 / 1000, 12); // locked: every shuffle below the observed share
    expect(tests[3].p).toBeGreaterThan(0.01);
    expect(tests[3].shuffles).toBeLessThan(999); // stopped early (Besag & Clifford 1991)
    expect((await evidence(recording, decFile, '--events', events, '--lock-column', 'colour')).err).toMatch(/--lock-column "colour" is not a column of the events/);
  });

  it('fails with exit 2 and the file name for bad input', async () => {
    expect(await evidence(recording, decFile, '--aim', 'fast')).toMatchObject({ code: 2, err: expect.stringMatching(/--aim must be erp, oscillations or conservative, got "fast"/) });
    expect(await evidence(join(dir, 'none.edf'), decFile)).toMatchObject({ code: 2, err: expect.stringMatching(/none\.edf: no such file/) });
    writeFileSync(join(dir, 'bad.json'), '{');
    expect((await evidence(recording, join(dir, 'bad.json'))).code).toBe(2);
    expect((await evidence(recording)).code).toBe(2);
  });
});

describe('winnow evidence: mains frequency (BIDS PowerLineFrequency, --line-frequency)', () => {
  // A simulated 60 Hz session (mains on T8, FC6 and C4; src/core/simulate), read through an identity
  // decomposition of four channels so each component is one channel.
  const simDir = join(dir, 'sim60');
  const picked = ['T8', 'FC6', 'C4', 'Cz'];
  const identity = new Float64Array(16);
  for (let i = 0; i < 4; i++) identity[i * 4 + i] = 1;
  const simDec = join(dir, 'sim-dec.json');
  writeFileSync(simDec, serializeDecomposition({ ...dec, channels: picked, nChannels: 4, nComponents: 4, mixing: identity, unmixing: identity, rank: 4, preprocessing: { ...dec.preprocessing, excludedChannels: [] } }));

  it('uses 60 Hz from the simulator\'s eeg.json, lets --line-frequency override it, and warns when it assumes 50 Hz', async () => {
    const sim = memoryIo();
    expect(await main(['simulate', '--out', simDir, '--seed', '2', '--minutes', '0.5', '--line', '60'], sim)).toBe(0);
    expect(JSON.parse(readFileSync(join(simDir, 'eeg.json'), 'utf8')).PowerLineFrequency).toBe(60);
    const rec = join(simDir, 'recording.edf');

    const fromSidecar = await evidence(rec, simDec);
    expect(fromSidecar.code).toBe(0);
    expect(fromSidecar.err).not.toMatch(/assumed/);
    const o60 = JSON.parse(fromSidecar.out);
    expect(o60.lineHz).toBe(60);
    expect(o60.lineHzSource).toBe('sidecar');

    const forced = await evidence(rec, simDec, '--line-frequency', '50');
    const o50 = JSON.parse(forced.out);
    expect(o50.lineHz).toBe(50);
    expect(o50.lineHzSource).toBe('option');
    // T8 carries the 60 Hz mains: its mains share is large at 60 Hz and small when 50 Hz is looked at
    const t8 = (o: { components: { strongestChannel: { label: string }; mainsShare: number }[] }) => o.components.find((c) => c.strongestChannel.label === 'T8')!.mainsShare;
    expect(t8(o60)).toBeGreaterThan(5 * t8(o50));

    rmSync(join(simDir, 'eeg.json'));
    const assumed = await evidence(rec, simDec);
    expect(JSON.parse(assumed.out)).toMatchObject({ lineHz: 50, lineHzSource: 'assumed' });
    expect(assumed.err).toMatch(/warning: recording\.edf: no PowerLineFrequency .*mains assumed to be 50 Hz/);

    expect(await evidence(rec, simDec, '--line-frequency', '55')).toMatchObject({ code: 2, err: expect.stringMatching(/--line-frequency must be 50 or 60 \(Hz\), got "55"/) });
  });
});
