import { describe, expect, it } from 'vitest';
import { createWelchPlan, welchFrequencies, welchPsd } from '../../../src/core/signal/welch.ts';
import { streamRng } from '../../../src/core/simulate/rng.ts';
import {
  bandGain,
  blinkKernel,
  burstyOscillation,
  heartbeatKernel,
  nextPowerOfTwo,
  ornsteinUhlenbeck,
  powerLawGain,
  rampStep,
  shapedNoise,
} from '../../../src/core/simulate/waveforms.ts';

function slope(p: Float64Array, f: Float64Array, lo: number, hi: number): number {
  let sx = 0, sy = 0, sxx = 0, sxy = 0, k = 0;
  for (let i = 1; i < p.length; i++) {
    if (f[i] < lo || f[i] > hi) continue;
    const x = Math.log10(f[i]);
    const y = Math.log10(p[i]);
    sx += x; sy += y; sxx += x * x; sxy += x * y; k++;
  }
  return (k * sxy - sx * sy) / (k * sxx - sx * sx);
}

describe('simulator waveforms', () => {
  it('shapes Gaussian noise to a power law: PSD slope −χ above the knee, unit variance', () => {
    // Closed form: |H(f)|² = (f² + fk²)^(−χ/2) → log-log slope −χ for f ≫ fk.
    const fs = 250;
    const n = 60 * fs;
    for (const chi of [1, 1.5, 2]) {
      const x = shapedNoise(streamRng(1, `pink-${chi}`), n, fs, powerLawGain(chi, 1));
      let ss = 0;
      for (const v of x) ss += v * v;
      expect(ss / n).toBeCloseTo(1, 9);
      const plan = createWelchPlan(512);
      const p = welchPsd(plan, x, fs);
      expect(Math.abs(-slope(p, welchFrequencies(plan, fs), 5, 60) - chi)).toBeLessThan(0.15);
    }
  });

  it('has a band gain of 1 inside the band, 1/2 halfway down each skirt and 0 beyond', () => {
    const g = bandGain(15, 100, 8, 15);
    expect(g(15)).toBe(1);
    expect(g(60)).toBe(1);
    expect(g(11)).toBeCloseTo(0.5, 12);
    expect(g(107.5)).toBeCloseTo(0.5, 12);
    expect(g(6)).toBe(0);
    expect(g(120)).toBe(0);
  });

  it('makes an Ornstein–Uhlenbeck process with lag-1 autocorrelation exp(−1/(fs·τ)) and unit variance', () => {
    // Exact AR(1) discretisation of the OU process (common practice).
    const fs = 100;
    const tau = 0.2;
    const x = ornsteinUhlenbeck(streamRng(2, 'ou'), 200_000, fs, tau);
    let s0 = 0, s1 = 0;
    for (let i = 0; i < x.length; i++) {
      s0 += x[i] * x[i];
      if (i > 0) s1 += x[i] * x[i - 1];
    }
    expect(s0 / x.length).toBeCloseTo(1, 1);
    expect(s1 / s0).toBeCloseTo(Math.exp(-1 / (fs * tau)), 2);
  });

  it('makes a bursty rhythm whose spectrum peaks at the set frequency', () => {
    const fs = 250;
    const x = burstyOscillation(streamRng(3, 'osc'), 120 * fs, fs, {
      freqHz: 12, freqJitterHz: 0.1, envelopeTauS: 0.5, envelopeLogSd: 0.7, harmonicRatio: 0, harmonicPhaseRad: 0,
    });
    const plan = createWelchPlan(1024);
    const p = welchPsd(plan, x, fs);
    const f = welchFrequencies(plan, fs);
    let k = 1;
    for (let i = 1; i < p.length; i++) if (p[i] > p[k]) k = i;
    expect(Math.abs(f[k] - 12)).toBeLessThanOrEqual(f[1]);
  });

  it('shapes blinks, heartbeats and saccade steps as documented', () => {
    expect(blinkKernel(0.1, 0.1, 0.2)).toBe(1);
    expect(blinkKernel(-0.01, 0.1, 0.2)).toBe(0);
    expect(blinkKernel(0.3, 0.1, 0.2)).toBe(0);
    expect(blinkKernel(0.2, 0.1, 0.2)).toBeCloseTo(0.5, 12);
    let best = -Infinity;
    let at = 0;
    for (let t = -0.4; t <= 0.6; t += 0.001) if (heartbeatKernel(t) > best) ((best = heartbeatKernel(t)), (at = t));
    expect(Math.abs(at)).toBeLessThan(0.0015); // the R peak
    expect(best).toBeGreaterThan(0.95);
    expect(rampStep(0, 0.04)).toBe(0);
    expect(rampStep(0.02, 0.04)).toBeCloseTo(0.5, 12);
    expect(rampStep(0.05, 0.04)).toBe(1);
    expect(nextPowerOfTwo(150_000)).toBe(262_144);
  });
});
