/**
 * What the decomposition missed (review/residual.ts), on simulated recordings where the "cleaned" data are
 * built by hand: the true brain background alone (a perfect cleaning), or with an artefact deliberately
 * left in — a 50 Hz sine, blink-like frontal pulses, heartbeat spikes.
 */
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';
import { matchMontage } from '../../../src/core/headmodel/montage-1020.ts';
import { RESIDUAL_LIMITS, residualArtefacts, type ResidualInput } from '../../../src/core/review/residual.ts';
import { hz } from '../../../src/core/units.ts';

const fs = 250;
const n = 60 * fs;
const eeg = ['Fp1', 'Fp2', 'F3', 'F4', 'C3', 'C4', 'O1', 'O2'];
const labels = [...eeg, 'VEOG'];
const types = [...eeg.map(() => 'EEG'), 'VEOG'];
const { positions } = matchMontage(labels);
const rand = mulberry32(3);
const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());

// Brain background: independent AR(1) noise per channel (a falling, 1/f-like spectrum), ≈ 10 µV rms.
const background = eeg.map(() => {
  const x = new Float64Array(n);
  for (let t = 1; t < n; t++) x[t] = 0.95 * x[t - 1] + 3.2 * gauss();
  return x;
});
// Blinks: 0.3 s half-sine pulses of 100 µV at irregular times (3–5 s apart); weight 1 at Fp, 0.4 at F, 0.1 elsewhere.
const blink = new Float64Array(n);
for (let t0 = 1; t0 < 58; t0 += 3 + 2 * rand()) {
  const at = Math.round(t0 * fs);
  for (let j = 0; j < 0.3 * fs; j++) blink[at + j] += 100 * Math.sin((Math.PI * j) / (0.3 * fs));
}
const blinkWeight = [1, 1, 0.4, 0.4, 0.1, 0.1, 0.1, 0.1];

function pack(channel: (c: number, t: number) => number, veog: (t: number) => number): Float32Array {
  const out = new Float32Array(labels.length * n);
  for (let c = 0; c < eeg.length; c++) for (let t = 0; t < n; t++) out[c * n + t] = channel(c, t);
  for (let t = 0; t < n; t++) out[eeg.length * n + t] = veog(t);
  return out;
}
const veog = (t: number) => 2 * blink[t] + 2 * gauss();
const original = pack((c, t) => background[c][t] + blinkWeight[c] * blink[t], veog);
const input = (cleaned: Float32Array, lineHz: 50 | 60 = 50): ResidualInput => ({
  original, cleaned, nChannels: labels.length, nSamples: n, sampleRate: hz(fs), labels, types, positionsUnit: positions, lineHz,
});
const perfect = pack((c, t) => background[c][t], veog);

describe('residualArtefacts', () => {
  it('gives no warning when the cleaned channels hold only the brain background', () => {
    const r = residualArtefacts(input(perfect));
    expect(r.warnings).toEqual([]);
    expect(r.measures.ocular!.reference).toBe('EOG channels');
    expect(r.measures.ocular!.remaining).toBeLessThan(0.1);
    expect(r.measures.mains!.worstShare).toBeLessThan(0.01);
  });

  it('warns that eye artefact remains when the blinks were left in, with the share that remains', () => {
    const all = residualArtefacts(input(original));
    expect(all.measures.ocular!.remaining).toBeGreaterThan(0.95); // nothing removed: β(cleaned) = β(original)
    expect(all.warnings.map((w) => w.kind)).toEqual(['ocular']);
    expect(all.warnings[0].text).toMatch(/^Fp[12] keeps (9\d|100) % of its slow activity that follows the vertical eye reference \(VEOG/);
    // half of each blink left: β is linear in the channel, so about half remains
    const half = residualArtefacts(input(pack((c, t) => background[c][t] + 0.5 * blinkWeight[c] * blink[t], veog)));
    expect(half.measures.ocular!.remaining).toBeGreaterThan(0.4);
    expect(half.measures.ocular!.remaining).toBeLessThan(0.6);
    expect(half.warnings[0].kind).toBe('ocular');
  });

  it('warns that mains remains when a 50 Hz sine is added to the cleaned channels, and not when 60 Hz is the line', () => {
    // 10 µV amplitude: 50 µV² of line power against ≈ 100 µV² of background
    const mainsLeft = pack((c, t) => background[c][t] + 10 * Math.sin((2 * Math.PI * 50 * t) / fs), veog);
    const r = residualArtefacts(input(mainsLeft));
    expect(r.warnings.map((w) => w.kind)).toEqual(['mains']);
    expect(r.measures.mains!.channelsAbove).toHaveLength(8);
    expect(r.measures.mains!.medianShare).toBeGreaterThan(RESIDUAL_LIMITS.mainsShare);
    expect(r.warnings[0].text).toMatch(/^8 of 8 cleaned channels keep ≥ 5 % of their power at 50 Hz/);
    expect(residualArtefacts(input(mainsLeft, 60)).warnings).toEqual([]);
  });

  it('warns that a heartbeat remains when QRS-like spikes at 72 per minute are left on the channels', () => {
    // 72 beats per minute (0.833 s apart; common practice: a resting heart beats 60–100 times a minute),
    // each a 40 ms triangular spike of 30 µV on C3, C4, O1 and O2
    const beat = new Float64Array(n);
    for (let t0 = 0.5; t0 < 59.5; t0 += 60 / 72) {
      const at = Math.round(t0 * fs);
      for (let j = -5; j <= 5; j++) beat[at + j] += 30 * (1 - Math.abs(j) / 5);
    }
    const r = residualArtefacts(input(pack((c, t) => background[c][t] + (c >= 4 ? beat[t] : 0), veog)));
    expect(r.warnings.map((w) => w.kind)).toEqual(['cardiac']);
    expect(r.measures.cardiac!.bpm).toBeGreaterThan(70);
    expect(r.measures.cardiac!.bpm).toBeLessThan(74);
    expect([...r.measures.cardiac!.channelsAbove].sort()).toEqual(['C3', 'C4', 'O1', 'O2']);
  });

  it('uses the frontal bipolar proxy from the recording before cleaning when there is no EOG channel', () => {
    const noEog = { ...input(original), types: labels.map(() => 'EEG'), labels: [...eeg, 'X1'] };
    const r = residualArtefacts(noEog);
    expect(r.measures.ocular!.reference).toBe('frontal bipolar');
    expect(r.warnings[0].kind).toBe('ocular');
    expect(residualArtefacts({ ...noEog, cleaned: perfect }).warnings).toEqual([]);
  });
});
