import { beforeAll, describe, expect, it } from 'vitest';
import { createHeadModel, dipolePotentials } from '../../../src/core/headmodel/forward.ts';
import { bandPower, createWelchPlan, welchFrequencies, welchPsd } from '../../../src/core/signal/welch.ts';
import { LABELS_32, LABELS_64, simulateSession } from '../../../src/core/simulate/simulate.ts';
import type { SimulatedSession, TrueSource } from '../../../src/core/simulate/truth.ts';
import { hz } from '../../../src/core/units.ts';

// One small session for the whole file (32 channels × 1 minute at 250 Hz; common practice for tests here).
let s: SimulatedSession;
beforeAll(() => {
  s = simulateSession({ seed: 11, channels: 32, minutes: 1, rate: hz(250), lineHz: 50 });
});

const source = (id: string): TrueSource => {
  const found = s.sources.find((x) => x.id === id);
  if (!found) throw new Error(`no source ${id}`);
  return found;
};
const ch = (label: string) => s.labels.indexOf(label);

/** Welch PSD (project's welchPsd; 512-sample periodic-Hann segments, 50 % overlap = 0.49 Hz bins). */
function psd(x: Float32Array | Float64Array, fs: number) {
  const plan = createWelchPlan(512);
  return { p: welchPsd(plan, x, fs), f: welchFrequencies(plan, fs), df: fs / 512 };
}

/**
 * Half a Welch bin (fs / 1024 at 512-sample segments): the largest bin of a symmetric peak lies within half a
 * bin of the peak, and the parabolic refinement moves towards it (docs/methods.md §3). The simulator's
 * oscillations are centred on their stated frequency (waveforms.ts burstyOscillation: OU frequency wander of mean 0).
 */
const HALF_BIN_HZ = 250 / 1024;

/** Parabolic interpolation of a peak in log power (docs/methods.md §3). */
function peakHz(p: Float64Array, f: Float64Array, lo: number, hi: number): number {
  let k = -1;
  for (let i = 1; i < p.length - 1; i++) if (f[i] >= lo && f[i] <= hi && (k < 0 || p[i] > p[k])) k = i;
  const y0 = Math.log10(p[k - 1]);
  const y1 = Math.log10(p[k]);
  const y2 = Math.log10(p[k + 1]);
  const delta = (0.5 * (y0 - y2)) / (y0 - 2 * y1 + y2);
  return f[k] + delta * (f[1] - f[0]);
}

/**
 * Ordinary least squares y = a + b x with the usual standard error of b from the residuals (common practice).
 * Adjacent Welch bins are not independent: the squared periodic Hann window's transform has weights 3/8, 1/4,
 * 1/16 at 0, 1, 2 bins, so the power of neighbouring bins correlates by (2/3)² and (1/6)² (Harris 1978,
 * Proc. IEEE 66:51–83; Welch 1967). A smooth regressor's slope variance grows by 1 + 2 Σ ρ_k, the factor in `se`.
 */
const BIN_CORRELATION_INFLATION = Math.sqrt(1 + 2 * ((2 / 3) ** 2 + (1 / 6) ** 2));
function olsFit(xs: number[], ys: number[]): { slope: number; se: number } {
  const xm = xs.reduce((a, b) => a + b) / xs.length;
  const ym = ys.reduce((a, b) => a + b) / ys.length;
  let sxy = 0;
  let sxx = 0;
  xs.forEach((x, i) => ((sxy += (x - xm) * (ys[i] - ym)), (sxx += (x - xm) ** 2)));
  const slope = sxy / sxx;
  let rss = 0;
  xs.forEach((x, i) => (rss += (ys[i] - ym - slope * (x - xm)) ** 2));
  return { slope, se: Math.sqrt(rss / (xs.length - 2) / sxx) * BIN_CORRELATION_INFLATION };
}

/** Fit of log10 P over [lo, hi] Hz on x(f) (log10 f for the log-log slope of docs/methods.md §2). */
function spectrumFit(p: Float64Array, f: Float64Array, lo: number, hi: number, x: (fHz: number) => number) {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 1; i < p.length; i++) if (f[i] >= lo && f[i] <= hi) (xs.push(x(f[i])), ys.push(Math.log10(p[i])));
  return olsFit(xs, ys);
}

/**
 * Tolerance of a randomised estimate: 4 standard errors (a correct simulator fails with probability below
 * 1e-4 per check for a normal estimate; common practice for seeded statistical tests).
 */
const SE_BOUND = 4;

describe('simulateSession', () => {
  it('returns sensor data equal to mixing × activations + sensor noise, recomputed exactly', () => {
    const { nSamples: n, sources } = s;
    const k = sources.length;
    let mismatches = 0;
    for (let c = 0; c < s.labels.length; c++) {
      for (let t = 0; t < n; t++) {
        let acc = 0;
        for (let j = 0; j < k; j++) acc += s.mixing[c * k + j] * sources[j].activation[t];
        if (Math.fround(acc + s.sensorNoise[c * n + t]) !== s.data[c * n + t]) mismatches++;
      }
    }
    expect(mismatches).toBe(0);
  });

  it('returns neuralOnly equal to the back-projection of the neural sources alone', () => {
    const n = s.nSamples;
    const neural = s.sources.filter((x) => x.class === 'neural');
    expect(neural.length).toBeGreaterThanOrEqual(6);
    // Neural sources come first, so their partial sum is the same float64 sum the simulator rounds.
    expect(s.sources.slice(0, neural.length).every((x) => x.class === 'neural')).toBe(true);
    let worst = 0;
    for (let c = 0; c < s.labels.length; c++) {
      for (let t = 0; t < n; t++) {
        let acc = 0;
        for (const src of neural) acc += src.map[c] * src.activation[t];
        worst = Math.max(worst, Math.abs(Math.fround(acc) - s.neuralOnly[c * n + t]));
      }
    }
    expect(worst).toBe(0);
  });

  it('has fewer sources with fixed maps than the 31 dimensions left by average referencing 32 channels', () => {
    expect(s.sources.length).toBeLessThanOrEqual(31);
    const classes = new Set(s.sources.map((x) => x.class));
    for (const c of ['neural', 'blink', 'gaze', 'muscle', 'cardiac', 'mains', 'contact', 'movement']) expect(classes.has(c as never)).toBe(true);
  });

  it('gives every map zero mean over channels (average reference) and the mixing matrix its columns', () => {
    const k = s.sources.length;
    s.sources.forEach((src, j) => {
      const sum = src.map.reduce((a, b) => a + b, 0);
      const peak = src.map.reduce((a, b) => Math.max(a, Math.abs(b)), 0);
      expect(Math.abs(sum)).toBeLessThan(1e-9 * peak * src.map.length);
      for (let c = 0; c < s.labels.length; c++) expect(s.mixing[c * k + j]).toBe(src.map[c]);
    });
  });

  it('reproduces each dipolar map from its true dipole through the head model and the average reference', () => {
    // Closed-form sphere / shell series are checked in test/core/headmodel; here: our bookkeeping of scale.
    const brain = createHeadModel({ kind: 'three-shell', radiusMm: s.headRadiusMm });
    const sphere = createHeadModel({ kind: 'sphere', radiusMm: s.headRadiusMm });
    for (const src of s.sources) {
      const dipoles = src.dipoles ?? (src.dipole ? [src.dipole] : []);
      if (dipoles.length === 0) continue;
      const model = src.class === 'neural' ? brain : sphere;
      const v = new Float64Array(s.labels.length);
      for (const d of dipoles) dipolePotentials(model, s.electrodesMm, d.positionMm, d.momentNAm).forEach((x, c) => (v[c] += x));
      const mean = v.reduce((a, b) => a + b) / v.length;
      src.map.forEach((m, c) => expect(v[c] - mean).toBeCloseTo(m, 9));
    }
  });

  it('is deterministic per seed and differs between seeds', () => {
    const a = simulateSession({ seed: 5, minutes: 0.1 });
    const b = simulateSession({ seed: 5, minutes: 0.1 });
    const c = simulateSession({ seed: 6, minutes: 0.1 });
    expect(Buffer.from(a.data.buffer).equals(Buffer.from(b.data.buffer))).toBe(true);
    expect(a.events).toEqual(b.events);
    expect(Buffer.from(a.data.buffer).equals(Buffer.from(c.data.buffer))).toBe(false);
  });

  it('uses the 32- and 64-channel label sets, mirror-symmetric about the midline', () => {
    expect(LABELS_32).toHaveLength(32);
    expect(LABELS_64).toHaveLength(64);
    expect(new Set(LABELS_64).size).toBe(64);
    const g = simulateSession({ seed: 1, channels: 64, minutes: 0.05 });
    expect(g.labels).toEqual([...LABELS_64]);
    for (const labels of [LABELS_32, LABELS_64]) {
      const sim = labels === LABELS_32 ? s : g;
      for (let c = 0; c < labels.length; c++) {
        const x = sim.electrodesMm[3 * c];
        const y = sim.electrodesMm[3 * c + 1];
        const z = sim.electrodesMm[3 * c + 2];
        expect(Math.hypot(x, y, z)).toBeCloseTo(90, 9);
        const mirror = labels.findIndex((_, d) => Math.abs(sim.electrodesMm[3 * d] + x) < 1e-9 && Math.abs(sim.electrodesMm[3 * d + 1] - y) < 1e-9 && Math.abs(sim.electrodesMm[3 * d + 2] - z) < 1e-9);
        expect(mirror).toBeGreaterThanOrEqual(0);
      }
    }
  });

  it('puts the posterior alpha peak at its set frequency of 9.5 Hz with a harmonic near 19 Hz', () => {
    const { p, f } = psd(source('alpha-posterior').activation, s.sampleRate);
    expect(Math.abs(peakHz(p, f, 7, 14) - 9.5)).toBeLessThan(HALF_BIN_HZ);
    expect(Math.abs(peakHz(p, f, 16, 22) - 19)).toBeLessThan(HALF_BIN_HZ);
    // The alpha source is strongest over posterior sites (common practice).
    const m = source('alpha-posterior').map;
    const best = s.labels[m.reduce((bi, v, i) => (Math.abs(v) > Math.abs(m[bi]) ? i : bi), 0)];
    expect(['O1', 'Oz', 'O2', 'PO3', 'PO4', 'Pz']).toContain(best);
  });

  it('puts the mu peaks near 10.5/11 Hz and the frontal theta peak near 6 Hz', () => {
    expect(Math.abs(peakHz(psd(source('mu-left').activation, 250).p, psd(source('mu-left').activation, 250).f, 8, 14) - 10.5)).toBeLessThan(HALF_BIN_HZ);
    expect(Math.abs(peakHz(psd(source('mu-right').activation, 250).p, psd(source('mu-right').activation, 250).f, 8, 14) - 11)).toBeLessThan(HALF_BIN_HZ);
    const th = psd(source('theta-frontal').activation, 250);
    expect(Math.abs(peakHz(th.p, th.f, 4, 8) - 6)).toBeLessThan(HALF_BIN_HZ);
  });

  it('makes muscle activity flat above 20 Hz (log-log slope over 20–95 Hz is 0 within 4 SE) and mostly high-frequency', () => {
    // The simulator's stated carrier is flat from 15 to 100 Hz (muscleActivation: bandGain(15, 100, …)), so the
    // expected log-log slope over 20–95 Hz is 0; muscle components are flat or rising above ~20 Hz (docs/methods.md
    // §2/§14, common practice). One minute holds only a few bursts, so the bound is the fit's own standard error.
    for (const id of ['muscle-temporal-left', 'muscle-temporal-right', 'muscle-neck']) {
      const { p, f, df } = psd(source(id).activation, s.sampleRate);
      const fit = spectrumFit(p, f, 20, 95, Math.log10);
      expect(Math.abs(fit.slope), `${id}: slope ${fit.slope.toFixed(3)} ± ${fit.se.toFixed(3)}`).toBeLessThan(SE_BOUND * fit.se);
      // High-frequency share BP(20, 45) / BP(1, 45) (docs/methods.md §4); a flat 15–100 Hz carrier puts
      // (45 − 20) / (45 − 15) = 0.83 of the 1–45 Hz power above 20 Hz, the burst envelope smears a little down.
      expect(bandPower(p, df, 20, 45) / bandPower(p, df, 1, 45)).toBeGreaterThan(0.7);
    }
  });

  it('gives the 1/f background sources the exponents the simulator sets (1.4–1.9), fitted on its stated law', () => {
    // The simulator's stated parameters (src/core/simulate/sources.ts, background table) and its stated law:
    // PSD ∝ (f² + 1)^(−χ/2), a 1/f^χ spectrum with a 1 Hz knee (waveforms.ts powerLawGain). χ is estimated here
    // independently by least squares of log10 P on log10(f² + 1) over 3–40 Hz (slope −χ/2). Scalp 1/f
    // exponents lie between 1 and 2 (common practice).
    const stated: Record<string, number> = {
      'bg-frontal-left': 1.6,
      'bg-frontal-right': 1.8,
      'bg-temporal-left': 1.5,
      'bg-temporal-right': 1.7,
      'bg-parietal-left': 1.9,
      'bg-parietal-right': 1.4,
    };
    const bg = s.sources.filter((x) => x.id.startsWith('bg-'));
    expect(bg.map((x) => x.id).sort()).toEqual(Object.keys(stated).sort());
    for (const src of bg) {
      const { p, f } = psd(src.activation, s.sampleRate);
      const fit = spectrumFit(p, f, 3, 40, (x) => Math.log10(x * x + 1));
      const chi = -2 * fit.slope;
      expect(chi).toBeGreaterThan(1);
      expect(chi).toBeLessThan(2);
      expect(Math.abs(chi - stated[src.id]), `${src.id}: χ ${chi.toFixed(3)} ± ${(2 * fit.se).toFixed(3)}`).toBeLessThan(SE_BOUND * 2 * fit.se);
    }
  });

  it('puts the mains peak at 50 Hz (or 60 Hz when asked) with most power within ±1 Hz', () => {
    const { p, f, df } = psd(source('mains').activation, s.sampleRate);
    expect(Math.abs(peakHz(p, f, 30, 70) - 50)).toBeLessThan(0.1);
    // Line share (docs/methods.md §4) on the line channel's own activation.
    expect(bandPower(p, df, 49, 51) / bandPower(p, df, 1, 120)).toBeGreaterThan(0.9);
    const us = simulateSession({ seed: 11, minutes: 0.25, lineHz: 60 });
    const line60 = us.sources.find((x) => x.class === 'mains')!;
    const q = psd(line60.activation, us.sampleRate);
    expect(Math.abs(peakHz(q.p, q.f, 30, 70) - 60)).toBeLessThan(0.1);
  });

  it('beats the heart at 60–90 per minute with an autocorrelation peak at the RR interval', () => {
    const x = source('cardiac').activation;
    const fs = s.sampleRate;
    let best = 0;
    let bestLag = 0;
    for (let lag = Math.round(0.5 * fs); lag <= Math.round(1.3 * fs); lag++) {
      let acc = 0;
      for (let t = 0; t + lag < x.length; t++) acc += x[t] * x[t + lag];
      if (acc > best) ((best = acc), (bestLag = lag));
    }
    const bpm = 60 / (bestLag / fs);
    expect(bpm).toBeGreaterThanOrEqual(60);
    expect(bpm).toBeLessThanOrEqual(90);
  });

  it('makes the blink map strongest at the most frontal sites, same sign, falling off posteriorly', () => {
    // docs/methods.md §14 (common practice): frontal dominance = mean |a| over Fp/AF ÷ mean |a| elsewhere.
    const m = source('blink').map;
    const frontal = s.labels.map((l, i) => [l, i] as const).filter(([l]) => /^(Fp|AF)/.test(l));
    const rest = s.labels.map((l, i) => [l, i] as const).filter(([l]) => !/^(Fp|AF)/.test(l));
    const mean = (xs: readonly (readonly [string, number])[]) => xs.reduce((a, [, i]) => a + Math.abs(m[i]), 0) / xs.length;
    expect(mean(frontal) / mean(rest)).toBeGreaterThan(2);
    expect(Math.sign(m[ch('Fp1')])).toBe(Math.sign(m[ch('Fp2')]));
    expect(Math.abs(m[ch('Fp1')])).toBeGreaterThan(Math.abs(m[ch('Fz')]));
    expect(Math.abs(m[ch('Fz')])).toBeGreaterThan(Math.abs(m[ch('Cz')]));
    // ~100 µV at Fp1/Fp2 for a typical blink (the realistic range).
    expect(Math.max(Math.abs(m[ch('Fp1')]), Math.abs(m[ch('Fp2')]))).toBeCloseTo(100, 6);
  });

  it('makes the horizontal eye-movement map left–right antisymmetric with opposite signs at F7 and F8', () => {
    // docs/methods.md §14 (common practice): lateral antisymmetry (a_L − a_R)/(|a_L| + |a_R|) = ±1 for mirror pairs.
    const m = source('eye-horizontal').map;
    const pairs: [string, string][] = [['Fp1', 'Fp2'], ['F7', 'F8'], ['AF3', 'AF4'], ['T7', 'T8'], ['F3', 'F4'], ['O1', 'O2']];
    for (const [l, r] of pairs) expect(Math.abs((m[ch(l)] - m[ch(r)]) / (Math.abs(m[ch(l)]) + Math.abs(m[ch(r)])))).toBeCloseTo(1, 9);
    for (const mid of ['Fz', 'Cz', 'Pz', 'Oz']) expect(Math.abs(m[ch(mid)])).toBeLessThan(1e-9);
    expect(Math.sign(m[ch('F7')])).toBe(-Math.sign(m[ch('F8')]));
    // Gaze to the right makes the right frontal sites positive (cornea positive; common practice).
    expect(m[ch('F8')]).toBeGreaterThan(0);
  });

  it('concentrates the loose electrode on one channel (max a² / Σ a² > 0.8)', () => {
    const m = source('electrode-P7').map;
    const ss = m.reduce((a, b) => a + b * b, 0);
    expect(m[ch('P7')] ** 2 / ss).toBeGreaterThan(0.8);
  });

  it('keeps amplitudes in realistic µV ranges (alpha bursts 10–30 µV at Oz, blinks ~100 µV at Fp1)', () => {
    const n = s.nSamples;
    const alpha = source('alpha-posterior');
    const oz = alpha.map[ch('Oz')];
    const abs = Float64Array.from(alpha.activation, (v) => Math.abs(v * oz)).sort();
    const p99 = abs[Math.floor(0.99 * n)];
    expect(p99).toBeGreaterThan(10);
    expect(p99).toBeLessThan(30);
    const blink = source('blink');
    const peakBlink = blink.activation.reduce((a, v) => Math.max(a, v), 0) * Math.abs(blink.map[ch('Fp1')]);
    expect(peakBlink).toBeGreaterThan(60);
    expect(peakBlink).toBeLessThan(160);
    const noise = s.sensorNoise;
    let ss = 0;
    for (const v of noise) ss += v * v;
    // The stated sensor noise SD is 0.7 µV (simulateSession's default); the sample SD of N normals has standard
    // error σ/√(2N) (common practice), so the bound is SE_BOUND of those.
    expect(Math.abs(Math.sqrt(ss / noise.length) - 0.7)).toBeLessThan((SE_BOUND * 0.7) / Math.sqrt(2 * noise.length));
  });

  it('makes the parietal response positive 300–400 ms after rare tones and the auditory response negative at Cz ~100 ms', () => {
    const fs = s.sampleRate;
    const average = (src: TrueSource, channel: number, condition: string, fromS: number, toS: number) => {
      const len = Math.round((toS - fromS) * fs);
      const acc = new Float64Array(len);
      let count = 0;
      for (const e of s.events.filter((x) => x.label === 'tone' && x.columns.condition === condition)) {
        const i0 = Math.round((e.onset + fromS) * fs);
        if (i0 < 0 || i0 + len > s.nSamples) continue;
        for (let i = 0; i < len; i++) acc[i] += src.map[channel] * src.activation[i0 + i];
        count++;
      }
      return acc.map((v) => v / count);
    };
    const p3 = average(source('p3-parietal'), ch('Pz'), 'rare', 0, 0.8);
    const kMax = p3.reduce((bi, v, i) => (v > p3[bi] ? i : bi), 0);
    // Stated: each rare tone's P3 peaks 300–400 ms after it (latency clipped to that span; equal-width Gaussian
    // bumps), so their average peaks inside the span too (outside it every bump falls the same way).
    expect(kMax / fs).toBeGreaterThanOrEqual(0.3);
    expect(kMax / fs).toBeLessThanOrEqual(0.4);
    expect(p3[kMax]).toBeGreaterThan(4);
    const aud = average(source('auditory'), ch('Cz'), 'standard', 0, 0.3);
    const kMin = aud.reduce((bi, v, i) => (v < aud[bi] ? i : bi), 0);
    // Stated kernel −g(t − 0.1, 18 ms) + 0.55 g(t − 0.19, 30 ms), scaled per tone, tones on the sample grid: the
    // minimum is 0.2 ms before 100 ms (−f′/f″ of the kernel), so the averaged minimum is the sample nearest 100 ms.
    expect(Math.abs(kMin / fs - 0.1)).toBeLessThan(0.5 / fs);
    expect(aud[kMin]).toBeLessThan(-2);
  });

  it('places every event on the sample grid, sorted, with tone and step types only and their BIDS columns', () => {
    const labels = new Set(s.events.map((e) => `${e.label} ${e.columns.condition} ${e.columns.foot}`));
    expect([...labels].sort()).toEqual(['step n/a left', 'step n/a right', 'tone rare n/a', 'tone standard n/a']);
    for (let i = 0; i < s.events.length; i++) {
      const e = s.events[i];
      expect(Math.abs(e.onset * s.sampleRate - Math.round(e.onset * s.sampleRate))).toBeLessThan(1e-6);
      if (i > 0) expect(e.onset).toBeGreaterThanOrEqual(s.events[i - 1].onset);
    }
  });

  it('rejects options outside its contract with a RangeError naming the option', () => {
    expect(() => simulateSession({ channels: 16 as never })).toThrow(/channels/);
    expect(() => simulateSession({ minutes: 0 })).toThrow(/minutes/);
    expect(() => simulateSession({ rate: hz(100) })).toThrow(/rate/);
  });
});
