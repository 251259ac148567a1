import { describe, expect, it } from 'vitest';
import { cardiacBeats, cardiacPeriodicity } from '../../../src/core/evidence/cardiac.ts';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';

/** Seeded standard normal numbers (Box–Muller over mulberry32). */
function gaussian(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
}

/** Coefficient of variation, sd (n − 1) / mean: the handbook definition. */
function cv(v: number[]): number {
  const m = v.reduce((a, c) => a + c, 0) / v.length;
  return Math.sqrt(v.reduce((a, c) => a + (c - m) ** 2, 0) / (v.length - 1)) / m;
}

const fs = 250;

describe('cardiacBeats (docs/methods.md §14)', () => {
  it('recovers the beat-to-beat variability of a QRS-like spike train (a few percent at rest: common practice)', () => {
    const rand = mulberry32(11);
    const n = fs * 180;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.05 * gaussian(rand);
    const intervals: number[] = [];
    for (let t = 0.5; t < 179; ) {
      const c = Math.round(t * fs);
      for (let j = -4; j <= 4; j++) x[c + j] += Math.exp(-((j / (0.012 * fs)) ** 2) / 2); // R wave, σ 12 ms
      const rr = 0.85 * (1 + 0.04 * gaussian(rand)); // 71 bpm, 4 % interval variability
      intervals.push(rr);
      t += rr;
    }
    const p = cardiacPeriodicity(x, fs);
    expect(p.bpm!).toBeCloseTo(60 / 0.85, -1);
    const b = cardiacBeats(x, fs, p.bpm);
    expect(b.beats).toBeGreaterThan(200);
    // The marked beats fall on the 10 ms grid, which adds ≤ 0.003 / √6 of rounding to a 0.85 s interval.
    expect(b.intervalCv).toBeCloseTo(cv(intervals.slice(0, -1)), 2);
    // The beat stands far above the rest of the slope energy (> 10×).
    expect(b.sharpness).toBeGreaterThan(1);
  });

  it('reads the recurrence of an alpha rhythm\'s bursts as irregular, far above a heartbeat\'s few percent', () => {
    const rand = mulberry32(12);
    const n = fs * 180;
    // 10 Hz carrier under a slowly wandering positive envelope (Ornstein–Uhlenbeck, τ 0.5 s, log-normal).
    const x = new Float64Array(n);
    let u = 0;
    const a = Math.exp(-1 / (0.5 * fs));
    for (let i = 0; i < n; i++) {
      u = a * u + Math.sqrt(1 - a * a) * gaussian(rand);
      x[i] = Math.exp(0.75 * u) * Math.sin((2 * Math.PI * 10 * i) / fs) + 0.2 * gaussian(rand);
    }
    const b = cardiacBeats(x, fs, 70);
    expect(b.intervalCv).toBeGreaterThan(0.12);
  });

  it('gives NaN without a beat rate or with too few beats', () => {
    const x = new Float64Array(fs * 5);
    expect(Number.isNaN(cardiacBeats(x, fs, null).intervalCv)).toBe(true);
    expect(Number.isNaN(cardiacBeats(x, fs, 60).intervalCv)).toBe(true);
  });
});
