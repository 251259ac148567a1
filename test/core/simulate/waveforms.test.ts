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

/** OLS slope of y on x with its residual standard error (common practice). */
function ols(xs: number[], ys: number[]): { slope: number; se: number } {
  const k = xs.length;
  const xm = xs.reduce((a, b) => a + b) / k;
  const ym = ys.reduce((a, b) => a + b) / k;
  let sxx = 0, sxy = 0;
  for (let i = 0; i < k; i++) ((sxx += (xs[i] - xm) ** 2), (sxy += (xs[i] - xm) * (ys[i] - ym)));
  const slope = sxy / sxx;
  let rss = 0;
  for (let i = 0; i < k; i++) rss += (ys[i] - ym - slope * (xs[i] - xm)) ** 2;
  return { slope, se: Math.sqrt(rss / (k - 2) / sxx) };
}

/**
 * Adjacent Welch bins correlate: the squared periodic Hann window's transform weighs 3/8, 1/4, 1/16 at 0, 1, 2
 * bins, i.e. power correlations (2/3)² and (1/6)² (Harris 1978, Proc. IEEE 66:51–83), so the slope's standard
 * error grows by √(1 + 2 Σ ρ_k). The bound is 4 standard errors (common practice for seeded statistical tests).
 */
const BIN_CORRELATION_INFLATION = Math.sqrt(1 + 2 * ((2 / 3) ** 2 + (1 / 6) ** 2));
const SE_BOUND = 4;

describe('simulator waveforms', () => {
  it('shapes Gaussian noise to a power law: PSD slope as the closed form with its knee, unit variance', () => {
    // Closed form: |H(f)|² = (f² + fk²)^(−χ/2), log-log slope −χ f²/(f² + fk²) (→ −χ for f ≫ fk). The expected
    // OLS slope over the Welch bins of 5–60 Hz is that of the closed form at the same bins, computed here.
    const fs = 250;
    const n = 60 * fs;
    for (const chi of [1, 1.5, 2]) {
      const x = shapedNoise(streamRng(1, `pink-${chi}`), n, fs, powerLawGain(chi, 1));
      let ss = 0;
      for (const v of x) ss += v * v;
      expect(ss / n).toBeCloseTo(1, 9);
      const plan = createWelchPlan(512);
      const p = welchPsd(plan, x, fs);
      const f = welchFrequencies(plan, fs);
      const xs: number[] = [];
      const measured: number[] = [];
      const closed: number[] = [];
      for (let i = 1; i < p.length; i++)
        if (f[i] >= 5 && f[i] <= 60) (xs.push(Math.log10(f[i])), measured.push(Math.log10(p[i])), closed.push((-chi / 2) * Math.log10(f[i] ** 2 + 1)));
      const fit = ols(xs, measured);
      const expected = ols(xs, closed).slope;
      expect(Math.abs(fit.slope - expected)).toBeLessThan(SE_BOUND * fit.se * BIN_CORRELATION_INFLATION);
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
    // Standard errors for an AR(1) series of N samples (Bartlett 1946; common practice): sample variance
    // √(2 (1 + a²) / ((1 − a²) N)) σ², lag-1 autocorrelation √((1 − a²) / N).
    const a = Math.exp(-1 / (fs * tau));
    const N = x.length;
    expect(Math.abs(s0 / N - 1)).toBeLessThan(SE_BOUND * Math.sqrt((2 * (1 + a * a)) / ((1 - a * a) * N)));
    expect(Math.abs(s1 / s0 - a)).toBeLessThan(SE_BOUND * Math.sqrt((1 - a * a) / N));
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
