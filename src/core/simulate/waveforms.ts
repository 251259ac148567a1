/**
 * Activation time courses of the simulated sources: coloured noise, bursty oscillations, event-locked
 * kernels. Every generator takes its own Rng stream, writes into a Float64Array of `n` samples at `fs` Hz
 * and allocates only that output (plus FFT scratch for spectrally shaped noise).
 */
import FFT from 'fft.js';
import type { Rng } from './rng.ts';

/** Smallest power of two ≥ n (n ≥ 1). */
export function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/** FFT objects and complex scratch per transform size, kept for the module's life (one per power of two). */
const fftPlans = new Map<number, { fft: FFT; spec: Float64Array; time: Float64Array }>();
function fftPlan(size: number): { fft: FFT; spec: Float64Array; time: Float64Array } {
  let p = fftPlans.get(size);
  if (!p) {
    p = { fft: new FFT(size), spec: new Float64Array(2 * size), time: new Float64Array(2 * size) };
    fftPlans.set(size, p);
  }
  return p;
}

/**
 * Gaussian noise with amplitude spectrum |H(f)| = `gain(f)` (f in Hz), made by drawing independent complex
 * Gaussian Fourier coefficients for a record of N = nextPowerOfTwo(n) samples, weighting them by the gain
 * and inverse-transforming (fft.js); the first n samples are kept, so the result is not periodic within
 * the kept part unless n is a power of two. Power spectral density ∝ gain(f)². The output is scaled to
 * unit sample variance over the n kept samples (mean removed), so callers set amplitudes explicitly.
 */
export function shapedNoise(rng: Rng, n: number, fs: number, gain: (fHz: number) => number): Float64Array {
  const out = new Float64Array(n);
  if (n < 2) return out;
  const size = Math.max(4, nextPowerOfTwo(n));
  const { fft, spec, time } = fftPlan(size);
  spec.fill(0);
  const df = fs / size;
  for (let k = 1; k < size / 2; k++) {
    const g = gain(k * df);
    const re = g * rng.normal();
    const im = g * rng.normal();
    spec[2 * k] = re;
    spec[2 * k + 1] = im;
    spec[2 * (size - k)] = re; // Hermitian symmetry → real time series
    spec[2 * (size - k) + 1] = -im;
  }
  spec[size] = gain(fs / 2) * rng.normal(); // Nyquist bin, real
  fft.inverseTransform(time, spec);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += time[2 * i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const v = time[2 * i] - mean;
    out[i] = v;
    ss += v * v;
  }
  const sd = Math.sqrt(ss / n);
  if (sd > 0) for (let i = 0; i < n; i++) out[i] /= sd;
  return out;
}

/**
 * Amplitude gain of "1/f^χ" background noise with a knee: |H(f)| = (f² + fKnee²)^(−χ/4), so the PSD
 * falls as f^−χ above the knee and is flat below it (a real amplifier's high-pass keeps the spectrum from
 * diverging at 0 Hz). Scalp EEG 1/f exponents are typically 1–2 [docs/methods.md §2, from memory there].
 */
export function powerLawGain(chi: number, fKneeHz: number): (fHz: number) => number {
  const k2 = fKneeHz * fKneeHz;
  return (f) => Math.pow(f * f + k2, -chi / 4);
}

/**
 * Flat amplitude gain between `loHz` and `hiHz` with raised-cosine skirts of width `lowSkirtHz` below and
 * `highSkirtHz` above the band; 0 beyond the skirts. Used for the broadband muscle sources.
 */
export function bandGain(loHz: number, hiHz: number, lowSkirtHz: number, highSkirtHz = lowSkirtHz): (fHz: number) => number {
  return (f) => {
    if (f >= loHz && f <= hiHz) return 1;
    const below = f < loHz;
    const d = below ? loHz - f : f - hiHz;
    const w = below ? lowSkirtHz : highSkirtHz;
    if (d >= w) return 0;
    return 0.5 + 0.5 * Math.cos((Math.PI * d) / w);
  };
}

/**
 * Unit-variance Ornstein–Uhlenbeck process (exact AR(1) discretisation: x[i+1] = a·x[i] + √(1−a²)·ξ,
 * a = exp(−1/(fs·τ))), started from its stationary distribution. Lorentzian spectrum with corner
 * 1/(2πτ) Hz. Used for slow envelopes and frequency jitter.
 */
export function ornsteinUhlenbeck(rng: Rng, n: number, fs: number, tauS: number): Float64Array {
  const out = new Float64Array(n);
  if (n === 0) return out;
  const a = Math.exp(-1 / (fs * Math.max(tauS, 1e-9)));
  const b = Math.sqrt(1 - a * a);
  let x = rng.normal();
  for (let i = 0; i < n; i++) {
    out[i] = x;
    x = a * x + b * rng.normal();
  }
  return out;
}

export interface BurstyOscillationOptions {
  /** Centre frequency of the rhythm, Hz. */
  readonly freqHz: number;
  /** Standard deviation of the slow frequency wander, Hz (an OU process with τ = 2 s). */
  readonly freqJitterHz: number;
  /** Time constant of the log-amplitude envelope, s (bursts last roughly 2–4 τ). */
  readonly envelopeTauS: number;
  /** Standard deviation of the log-amplitude (natural log); larger = burstier, more super-Gaussian. */
  readonly envelopeLogSd: number;
  /** Amplitude of the second harmonic relative to the fundamental (0 = pure rhythm). */
  readonly harmonicRatio: number;
  /** Phase of the harmonic relative to twice the fundamental's phase, rad. */
  readonly harmonicPhaseRad: number;
}

/**
 * A waxing and waning rhythm: e(t)·[cos φ(t) + h·cos(2φ(t) + ψ)], with φ' = 2π(f0 + δf(t)), δf an OU
 * wander, and a log-normal envelope e(t) = exp(σ·z(t) − σ²/2) (z a unit OU process), so E[e] = 1 and the
 * amplitude distribution is heavy-tailed. The PSD peaks at f0 (and 2·f0 when h > 0), broadened by about
 * 1/(π τ) Hz. Common practice for simulating spontaneous alpha/mu/theta as amplitude-modulated narrow-band
 * activity; the log-normal envelope is our choice.
 */
export function burstyOscillation(rng: Rng, n: number, fs: number, o: BurstyOscillationOptions): Float64Array {
  const env = ornsteinUhlenbeck(rng, n, fs, o.envelopeTauS);
  const wander = ornsteinUhlenbeck(rng, n, fs, 2);
  const out = new Float64Array(n);
  let phase = rng.between(0, 2 * Math.PI);
  const s = o.envelopeLogSd;
  for (let i = 0; i < n; i++) {
    const e = Math.exp(s * env[i] - (s * s) / 2);
    out[i] = e * (Math.cos(phase) + o.harmonicRatio * Math.cos(2 * phase + o.harmonicPhaseRad));
    phase += (2 * Math.PI * (o.freqHz + o.freqJitterHz * wander[i])) / fs;
    if (phase > 2 * Math.PI) phase -= 2 * Math.PI;
  }
  return out;
}

/** One event waveform for `addKernel`: where it sits and how it is shaped. */
export interface KernelPlacement {
  /** Sample rate of `out`, Hz. */
  readonly fs: number;
  /** Event time, s from the first sample. */
  readonly onsetS: number;
  readonly amplitude: number;
  /** Kernel time span [startS, endS) relative to the onset, s. */
  readonly startS: number;
  readonly endS: number;
  /** The waveform, of time in seconds relative to the onset. */
  readonly kernel: (tS: number) => number;
}

/**
 * Adds `amplitude · kernel((i/fs) − onsetS)` to `out` for every sample with kernel time in
 * [startS, endS). The kernel is in seconds relative to the onset.
 */
export function addKernel(out: Float64Array, p: KernelPlacement): void {
  const { fs, onsetS, amplitude, startS, endS, kernel } = p;
  const i0 = Math.max(0, Math.ceil((onsetS + startS) * fs));
  const i1 = Math.min(out.length, Math.ceil((onsetS + endS) * fs));
  for (let i = i0; i < i1; i++) out[i] += amplitude * kernel(i / fs - onsetS);
}

/** exp(−t²/(2σ²)). */
export function gaussianBump(tS: number, sigmaS: number): number {
  return Math.exp((-0.5 * tS * tS) / (sigmaS * sigmaS));
}

/**
 * Blink waveform, peak 1 at `riseS`: a half raised-cosine rise over `riseS` and a raised-cosine fall
 * over `fallS` (total ≈ 0.2–0.4 s; blink duration ~300 ms is common practice, docs/methods.md §14; the
 * asymmetric rise/fall is our approximation of the lid closing faster than it reopens).
 */
export function blinkKernel(tS: number, riseS: number, fallS: number): number {
  if (tS < 0 || tS >= riseS + fallS) return 0;
  if (tS < riseS) return 0.5 - 0.5 * Math.cos((Math.PI * tS) / riseS);
  return 0.5 + 0.5 * Math.cos((Math.PI * (tS - riseS)) / fallS);
}

/**
 * QRS-like heartbeat: a sum of Gaussian waves P, Q, R, S, T around the R peak at t = 0 (the sum-of-
 * Gaussians shape is the idea of McSharry et al. 2003, IEEE TBME 50:289–294; the wave heights, times and
 * widths below are our round numbers, from memory of a lead-II trace). R peak ≈ 1.
 */
export function heartbeatKernel(tS: number): number {
  return (
    0.12 * gaussianBump(tS + 0.2, 0.025) - // P
    0.15 * gaussianBump(tS + 0.03, 0.01) + // Q
    1.0 * gaussianBump(tS, 0.012) - // R
    0.25 * gaussianBump(tS - 0.03, 0.01) + // S
    0.3 * gaussianBump(tS - 0.26, 0.05) // T
  );
}

/**
 * Smooth step from 0 to 1 over `durS` starting at t = 0 (raised-cosine ramp); used for saccades, whose
 * duration grows with amplitude (~20–60 ms for 5–20°, the "main sequence" of Bahill, Clark & Stark 1975,
 * Math. Biosci. 24:191–204; numbers from memory).
 */
export function rampStep(tS: number, durS: number): number {
  if (tS <= 0) return 0;
  if (tS >= durS) return 1;
  return 0.5 - 0.5 * Math.cos((Math.PI * tS) / durS);
}
