/**
 * Welch power spectral density (Welch 1967, IEEE Trans. Audio Electroacoust. AU-15:70–73: averaged
 * modified periodograms), with the conventions of scipy.signal.welch's defaults (docs/methods.md §1):
 * periodic ("DFT-even") Hann taper, constant detrend per segment, one-sided density, mean over
 * segments, trailing samples that do not fill a segment dropped, FFT length = segment length.
 *
 * fft.js transforms power-of-two sizes only, so segment lengths are powers of two (512 samples ≈ 2 s at
 * 250 Hz; PERFORMANCE.md). A plan allocates the taper and FFT scratch once; `welchPsd` allocates nothing
 * when given `out`.
 */
import FFT from 'fft.js';
import { seconds, type Hz, type Lenient, type Seconds } from '../units.ts';

export interface WelchPlan {
  /** Segment (and FFT) length in samples, a power of two ≥ 2. */
  readonly nfft: number;
  /** Samples shared by consecutive segments (default nfft / 2, i.e. 50 %). */
  readonly overlap: number;
  /** Periodic Hann taper w[j] = 0.5 − 0.5 cos(2πj / nfft). */
  readonly hann: Float64Array;
  /** U = Σ w[j]² (density normalisation). */
  readonly taperEnergy: number;
  /** Number of one-sided bins, nfft / 2 + 1. */
  readonly nBins: number;
  readonly fft: FFT;
  /** Tapered, detrended segment (length nfft). */
  readonly segment: Float64Array;
  /** Interleaved complex FFT output (length 2 nfft). */
  readonly spectrum: Float64Array;
}

/** True for 1, 2, 4, 8, … */
export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}

/**
 * Allocates a Welch plan for `nfft`-sample segments. Throws RangeError when nfft is not a power of two
 * ≥ 2 or the overlap is not an integer in [0, nfft).
 */
export function createWelchPlan(nfft: number, overlap: number = nfft / 2): WelchPlan {
  if (!isPowerOfTwo(nfft) || nfft < 2) throw new RangeError(`createWelchPlan: nfft must be a power of two ≥ 2, got ${nfft}`);
  if (!Number.isInteger(overlap) || overlap < 0 || overlap >= nfft)
    throw new RangeError(`createWelchPlan: overlap must be an integer in [0, ${nfft}), got ${overlap}`);
  const hann = new Float64Array(nfft);
  let taperEnergy = 0;
  for (let j = 0; j < nfft; j++) {
    const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * j) / nfft);
    hann[j] = w;
    taperEnergy += w * w;
  }
  return {
    nfft,
    overlap,
    hann,
    taperEnergy,
    nBins: nfft / 2 + 1,
    fft: new FFT(nfft),
    segment: new Float64Array(nfft),
    spectrum: new Float64Array(2 * nfft),
  };
}

/** Number of whole segments Welch averages for `n` samples: floor((n − L) / (L − overlap)) + 1, or 0. */
export function welchSegmentCount(plan: WelchPlan, n: number): number {
  if (n < plan.nfft) return 0;
  return Math.floor((n - plan.nfft) / (plan.nfft - plan.overlap)) + 1;
}

/** Bin frequencies f_k = k fs / nfft, k = 0 … nfft/2, in Hz. */
export function welchFrequencies(plan: WelchPlan, fs: Lenient<Hz>): Float64Array {
  const f = new Float64Array(plan.nBins);
  for (let k = 0; k < plan.nBins; k++) f[k] = (k * fs) / plan.nfft;
  return f;
}

/**
 * One-sided power spectral density of `x` sampled at `fs` Hz, in (unit of x)²/Hz (µV²/Hz for µV input),
 * at the frequencies of `welchFrequencies`:
 *   P[k] = c_k / (fs U) · (1/S) Σ_s |Σ_j w[j] (x[sD+j] − mean_s) e^{−2πikj/L}|²,  c_k = 1 at k = 0 and
 * k = L/2, else 2 (docs/methods.md §1). Σ P[k] fs/L equals the mean over segments of the taper-weighted mean
 * square (Parseval). When `x` is shorter than one segment every bin is NaN (there is no estimate); a
 * segment containing NaN makes every bin NaN, as it would in scipy.
 */
export function welchPsd(
  plan: WelchPlan,
  x: Float32Array | Float64Array,
  fs: Lenient<Hz>,
  out: Float64Array = new Float64Array(plan.nBins),
): Float64Array {
  const { nfft, hann, segment, spectrum, nBins } = plan;
  const step = nfft - plan.overlap;
  const nSeg = welchSegmentCount(plan, x.length);
  out.fill(0, 0, nBins);
  if (nSeg === 0) {
    out.fill(NaN, 0, nBins);
    return out;
  }
  for (let s = 0; s < nSeg; s++) {
    const start = s * step;
    let mean = 0;
    for (let j = 0; j < nfft; j++) mean += x[start + j];
    mean /= nfft;
    for (let j = 0; j < nfft; j++) segment[j] = hann[j] * (x[start + j] - mean);
    plan.fft.realTransform(spectrum, segment);
    for (let k = 0; k < nBins; k++) {
      const re = spectrum[2 * k];
      const im = spectrum[2 * k + 1];
      out[k] += re * re + im * im;
    }
  }
  const scale = 1 / (fs * plan.taperEnergy * nSeg);
  for (let k = 0; k < nBins; k++) out[k] *= k === 0 || k === nBins - 1 ? scale : 2 * scale;
  return out;
}

/**
 * Band power Σ P[k] df over bins with lo ≤ f_k ≤ hi (inclusive edges, docs/methods.md §4), in (unit)².
 * `psd` holds bins k = 0… at spacing df Hz.
 */
export function bandPower(psd: Float64Array, df: Lenient<Hz>, lo: Lenient<Hz>, hi: Lenient<Hz>): number {
  const k0 = Math.max(0, Math.ceil(lo / df - 1e-9));
  const k1 = Math.min(psd.length - 1, Math.floor(hi / df + 1e-9));
  let sum = 0;
  for (let k = k0; k <= k1; k++) sum += psd[k];
  return sum * df;
}

/**
 * The power-of-two segment length nearest to `targetS` seconds at `fs` Hz (2 s by default, giving
 * ≈ 0.5 Hz resolution; common practice, docs/methods.md §1), but never longer than `nSamples` when that is
 * at least 2 samples.
 */
export function welchSegmentLength(fs: Lenient<Hz>, nSamples: number, targetS: Lenient<Seconds> = seconds(2)): number {
  let nfft = 2 ** Math.max(1, Math.round(Math.log2(Math.max(2, fs * targetS))));
  while (nfft > 2 && nfft > nSamples) nfft /= 2;
  return nfft;
}
