import { describe, expect, it } from 'vitest';
import { extractEpochs } from '../../../src/core/signal/epochs.ts';
import { LOCKING_MAX_SHUFFLES, LOCKING_STOP_AFTER, lockingPermutationTest, mulberry32 } from '../../../src/core/evidence/time-locking.ts';

const fs = 100;

function gaussian(seed: number, n: number): Float64Array {
  const rand = mulberry32(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  return out;
}

/** 60 s of unit noise with 40 events at seeded times (at least 1 s apart), epochs −0.2 … 0.8 s. */
function session(seed: number, evokedAmplitude: number) {
  const n = fs * 60;
  const x = gaussian(1000 + seed, n);
  const rand = mulberry32(seed);
  const onsets: number[] = [];
  for (let k = 0; k < 40; k++) onsets.push(1 + 1.4 * k + 0.3 * rand());
  for (const o of onsets) for (let j = 0; j < 30; j++) x[Math.round(o * fs) + j] += evokedAmplitude * Math.sin((2 * Math.PI * j) / 30);
  const ep = extractEpochs(x, fs, onsets, -0.2, 0.8, null);
  return { x, ep };
}

describe('sequential permutation test of the locked share (Besag & Clifford 1991; Phipson & Smyth 2010)', () => {
  it('defaults to at most 999 shuffles, stopping after 10 exceedances', () => {
    expect(LOCKING_MAX_SHUFFLES).toBe(999);
    expect(LOCKING_STOP_AFTER).toBe(10);
  });

  it('gives a strongly locked signal p = 1 / (1 + 999) after all 999 shuffles, deterministically', () => {
    const { x, ep } = session(1, 2);
    const t = lockingPermutationTest(x, ep.eventSamples, ep.firstOffset, ep.length);
    // (1 + 0) / (1 + 999): no shuffle reaches the observed share (Phipson & Smyth 2010, eq. for p_u)
    expect(t.p).toBeCloseTo(1 / 1000, 12);
    expect(t.p).toBeLessThanOrEqual(0.001);
    expect(t.permutations).toBe(999);
    expect(t.exceedances).toBe(0);
    expect(t.stoppedEarly).toBe(false);
    expect(lockingPermutationTest(x, ep.eventSamples, ep.firstOffset, ep.length)).toEqual(t); // seeded
  });

  it('gives pure noise a roughly uniform p and stops early after few shuffles', () => {
    const ps: number[] = [];
    const used: number[] = [];
    for (let seed = 1; seed <= 50; seed++) {
      const { x, ep } = session(seed, 0);
      const t = lockingPermutationTest(x, ep.eventSamples, ep.firstOffset, ep.length, 999, seed);
      expect(t.p).toBeGreaterThan(0);
      expect(t.p).toBeLessThanOrEqual(1);
      if (t.stoppedEarly) {
        expect(t.exceedances).toBe(10);
        expect(t.p).toBeCloseTo(10 / t.permutations, 12); // h / L
      }
      ps.push(t.p);
      used.push(t.permutations);
    }
    // Binomial(50, 0.05): P(X ≥ 9) ≈ 0.002, so at most 8 of 50 below 0.05 for a valid test.
    expect(ps.filter((p) => p < 0.05).length).toBeLessThanOrEqual(8);
    // Binomial(50, 0.5): P(X ≤ 14) = P(X ≥ 36) ≈ 0.001, so 15…35 of 50 below 0.5 for a uniform p.
    const belowHalf = ps.filter((p) => p < 0.5).length;
    expect(belowHalf).toBeGreaterThanOrEqual(15);
    expect(belowHalf).toBeLessThanOrEqual(35);
    // Under the null L ≈ 10 / p: the median run stops after a few tens of shuffles, far below 999.
    const sorted = [...used].sort((a, b) => a - b);
    expect(sorted[25]).toBeLessThan(100);
    expect(used.filter((u) => u < 999).length).toBeGreaterThanOrEqual(45);
  });
});
