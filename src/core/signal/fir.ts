/**
 * Linear-phase FIR filters for the decomposition's copy of the data (the review shows the original data).
 *
 * Design: windowed sinc with a Hamming window, the textbook window method (Oppenheim & Schafer, Discrete-Time
 * Signal Processing, 3rd ed., §7.5; Hamming peak approximation error ≈ −53 dB). Transition width of the
 * Hamming design Δf ≈ 3.3·fs/N (Ifeachor & Jervis 2002, Digital Signal Processing, 2nd ed., Table 7.2; the
 * same as Δω ≈ 6.6π/N) — the basis of the order rule below. Coefficients match scipy.signal.firwin(numtaps, cutoff, window='hamming',
 * fs=fs) including its scaling (unit gain at DC for low-pass, at Nyquist for high-pass); the fixture in
 * test/fixtures/signal/ checks that. The cutoff is the −6 dB point (gain 0.5) of the design.
 *
 * Order rule (ours, stated): order M = ceil(3.3·fs/Δf) rounded up to even, numtaps = M + 1 (odd, so the delay
 * M/2 is a whole number of samples). Default transition width Δf: high-pass min(max(cutoff, 0.1 Hz), 2 Hz)
 * (1 Hz high-pass: stopband below 0.5 Hz, passband above 1.5 Hz); low-pass min(max(0.25·cutoff, 1 Hz), 10 Hz),
 * never wider than twice the distance to Nyquist.
 *
 * Application: `applyZeroPhase` convolves once and removes the M/2-sample delay (a symmetric FIR has exactly
 * linear phase, so the result has zero phase and magnitude |H(f)|); `filtfiltFir` runs the filter forward and
 * backward (magnitude |H(f)|², corner at −12 dB). Both filter each segment separately (EDF+D gaps and boundary
 * events are never bridged), with odd extension of M/2 samples at each segment edge (as scipy.signal.filtfilt's
 * default padtype='odd'), by FFT overlap-add (fft.js), two channels per complex transform.
 */
import FFT from 'fft.js';
import type { Hz, Lenient } from '../units.ts';

export interface FirDesign {
  /** Symmetric taps, length numTaps (odd). */
  readonly taps: Float64Array;
  readonly numTaps: number;
  /** Description for provenance, e.g. "high-pass 1 Hz (−6 dB), transition 1 Hz, 825 taps, windowed-sinc FIR (Hamming)". */
  readonly description: string;
}

export interface FirDesignOptions {
  /** Transition width in Hz (default: see the order rule in the module comment). */
  transitionHz?: Lenient<Hz>;
  /** Force an odd number of taps (overrides transitionHz). */
  numTaps?: number;
}

const sinc = (x: number) => (x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x));

function tapsFor(transitionHz: number, sampleRate: number, forced?: number): number {
  if (forced !== undefined) {
    const n = Math.max(1, Math.round(forced));
    if (n % 2 === 0) throw new RangeError(`numTaps must be odd, got ${forced}`);
    return n;
  }
  let order = Math.ceil((3.3 * sampleRate) / transitionHz);
  if (order % 2 === 1) order++;
  return order + 1;
}

/** Hamming window w(n) = 0.54 − 0.46 cos(2πn/(N−1)) (symmetric, as scipy.signal.get_window('hamming', N, fftbins=False)). */
function hamming(N: number, n: number): number {
  return N === 1 ? 1 : 0.54 - 0.46 * Math.cos((2 * Math.PI * n) / (N - 1));
}

/** firwin-style design for one band [lo, hi] in units of Nyquist, scaled to unit gain at `scaleAt` (units of Nyquist). */
function windowedSinc(N: number, bands: [number, number], scaleAt: number): Float64Array {
  const alpha = 0.5 * (N - 1);
  const h = new Float64Array(N);
  const [lo, hi] = bands;
  for (let n = 0; n < N; n++) {
    const m = n - alpha;
    h[n] = (hi * sinc(hi * m) - lo * sinc(lo * m)) * hamming(N, n);
  }
  let s = 0;
  for (let n = 0; n < N; n++) s += h[n] * Math.cos(Math.PI * (n - alpha) * scaleAt);
  for (let n = 0; n < N; n++) h[n] /= s;
  return h;
}

function checkCutoff(name: string, cutoffHz: number, sampleRate: number) {
  if (!(sampleRate > 0)) throw new RangeError(`sampleRate must be positive, got ${sampleRate}`);
  if (!(cutoffHz > 0 && cutoffHz < sampleRate / 2))
    throw new RangeError(`${name} cutoff must lie in (0, ${sampleRate / 2}) Hz, got ${cutoffHz}`);
}

/** High-pass windowed-sinc FIR (Hamming); cutoff at −6 dB; see the module comment for the order rule. */
export function designHighpassFir(cutoffHz: Lenient<Hz>, sampleRate: Lenient<Hz>, opts: FirDesignOptions = {}): FirDesign {
  checkCutoff('high-pass', cutoffHz, sampleRate);
  const tw = opts.transitionHz ?? Math.min(Math.max(cutoffHz, 0.1), 2);
  const N = tapsFor(tw, sampleRate, opts.numTaps);
  const nyq = sampleRate / 2;
  const taps = windowedSinc(N, [cutoffHz / nyq, 1], 1);
  return {
    taps,
    numTaps: N,
    description: `high-pass ${cutoffHz} Hz (−6 dB), transition ${+tw.toFixed(3)} Hz, ${N} taps, windowed-sinc FIR (Hamming), zero phase`,
  };
}

/** Low-pass windowed-sinc FIR (Hamming); cutoff at −6 dB; see the module comment for the order rule. */
export function designLowpassFir(cutoffHz: Lenient<Hz>, sampleRate: Lenient<Hz>, opts: FirDesignOptions = {}): FirDesign {
  checkCutoff('low-pass', cutoffHz, sampleRate);
  const nyqGap = 2 * (sampleRate / 2 - cutoffHz);
  const tw = opts.transitionHz ?? Math.min(Math.min(Math.max(0.25 * cutoffHz, 1), 10), nyqGap);
  const N = tapsFor(tw, sampleRate, opts.numTaps);
  const nyq = sampleRate / 2;
  const taps = windowedSinc(N, [0, cutoffHz / nyq], 0);
  return {
    taps,
    numTaps: N,
    description: `low-pass ${cutoffHz} Hz (−6 dB), transition ${+tw.toFixed(3)} Hz, ${N} taps, windowed-sinc FIR (Hamming), zero phase`,
  };
}

/** Cascade of two designs as one FIR (taps convolved): band-pass from a high-pass and a low-pass. */
export function cascadeFir(a: FirDesign, b: FirDesign): FirDesign {
  const N = a.numTaps + b.numTaps - 1;
  const taps = new Float64Array(N);
  for (let i = 0; i < a.numTaps; i++) for (let j = 0; j < b.numTaps; j++) taps[i + j] += a.taps[i] * b.taps[j];
  return { taps, numTaps: N, description: `${a.description}; ${b.description}` };
}

/** |H(f)| of a design at frequencies in Hz (direct DTFT, like scipy.signal.freqz(taps, worN=f, fs=fs)). */
export function firMagnitude(design: FirDesign, sampleRate: Hz, freqsHz: ArrayLike<number>): Float64Array {
  const out = new Float64Array(freqsHz.length);
  for (let q = 0; q < freqsHz.length; q++) {
    const w = (2 * Math.PI * freqsHz[q]) / sampleRate;
    let re = 0;
    let im = 0;
    for (let n = 0; n < design.numTaps; n++) {
      re += design.taps[n] * Math.cos(w * n);
      im -= design.taps[n] * Math.sin(w * n);
    }
    out[q] = Math.hypot(re, im);
  }
  return out;
}

/** Segment ranges [start, end) from segment start indices (e.g. EDF+D record discontinuities or boundary events). */
export function segmentRanges(nSamples: number, boundaries?: readonly number[]): [number, number][] {
  const starts = [0, ...(boundaries ?? [])]
    .map((b) => Math.round(b))
    .filter((b) => b >= 0 && b < nSamples)
    .sort((a, b) => a - b);
  const uniq = starts.filter((b, i) => i === 0 || b !== starts[i - 1]);
  return uniq.map((s, i) => [s, i + 1 < uniq.length ? uniq[i + 1] : nSamples] as [number, number]);
}

function nextPow2(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/**
 * Zero-phase filtering in place of channel-major `data` (nChannels × nSamples) with a symmetric FIR: one
 * convolution with the delay of (numTaps − 1)/2 samples removed. Each segment between `boundaries` (sample
 * indices where segments start) is filtered on its own, with odd extension at its edges. NaN samples
 * propagate to the outputs they touch. `onChannel` is called after each pair of channels (progress).
 */
export function applyZeroPhase(
  data: Float32Array,
  nChannels: number,
  nSamples: number,
  design: FirDesign,
  boundaries?: readonly number[],
  onChannel?: (done: number, total: number) => void,
): void {
  const N = design.numTaps;
  if (N % 2 === 0) throw new RangeError(`zero-phase application needs an odd number of taps, got ${N}`);
  if (N === 1) {
    const g = design.taps[0];
    for (let i = 0; i < nChannels * nSamples; i++) data[i] *= g;
    return;
  }
  const half = (N - 1) / 2;
  const nfft = Math.max(1024, nextPow2(4 * N));
  const block = nfft - N + 1;
  const fft = new FFT(nfft);
  // Filter spectrum, complex interleaved.
  const hPad = new Float64Array(nfft);
  hPad.set(design.taps);
  const H = fft.createComplexArray() as number[];
  fft.realTransform(H, hPad);
  fft.completeSpectrum(H);
  const buf = fft.createComplexArray() as number[];
  const spec = fft.createComplexArray() as number[];
  const res = fft.createComplexArray() as number[];
  const segs = segmentRanges(nSamples, boundaries);
  // Overlap-save in place, block by block (issue 12: no scratch of the segment's length). Output y[t] needs the
  // extended input e(t − half … t + half); window w[m] = e(t0 − half + m), m < nfft, gives y[t0 + b] at circular
  // convolution index b + N − 1 for b < block. Each next window starts `block` samples on, so its first N − 1
  // values are the last N − 1 of the current one (kept, as the samples there are overwritten by then), and its
  // new values lie at x ≥ t0 + block + half, not yet written. The odd extensions at the segment's ends are
  // taken before any sample is overwritten.
  const winA = new Float64Array(nfft);
  const winB = new Float64Array(nfft);
  const headA = new Float64Array(half);
  const tailA = new Float64Array(half);
  const headB = new Float64Array(half);
  const tailB = new Float64Array(half);

  const extensions = (row: Float32Array, len: number, head: Float64Array, tail: Float64Array) => {
    const x0 = row[0];
    const xe = row[len - 1];
    for (let i = 0; i < half; i++) {
      const j = Math.min(i + 1, len - 1);
      head[i] = 2 * x0 - row[j]; // e(−1 − i)
      tail[i] = 2 * xe - row[len - 1 - j]; // e(len + i)
    }
  };
  /** Fills win[m0, nfft) with e(i0 + m) of the row (0 beyond the extended segment). */
  const fill = (win: Float64Array, m0: number, i0: number, row: Float32Array, len: number, head: Float64Array, tail: Float64Array) => {
    for (let m = m0; m < nfft; m++) {
      const i = i0 + m;
      win[m] = i < 0 ? head[-1 - i] : i < len ? row[i] : i < len + half ? tail[i - len] : 0;
    }
  };

  for (let c = 0; c < nChannels; c += 2) {
    const pair = c + 1 < nChannels;
    for (const [s0, s1] of segs) {
      const len = s1 - s0;
      if (len <= 0) continue;
      const rowA = data.subarray(c * nSamples + s0, c * nSamples + s1);
      const rowB = pair ? data.subarray((c + 1) * nSamples + s0, (c + 1) * nSamples + s1) : null;
      extensions(rowA, len, headA, tailA);
      if (rowB) extensions(rowB, len, headB, tailB);
      for (let t0 = 0; t0 < len; t0 += block) {
        const m0 = t0 === 0 ? 0 : N - 1;
        if (t0 > 0) {
          winA.copyWithin(0, block);
          if (rowB) winB.copyWithin(0, block);
        }
        fill(winA, m0, t0 - half, rowA, len, headA, tailA);
        if (rowB) fill(winB, m0, t0 - half, rowB, len, headB, tailB);
        for (let i = 0; i < nfft; i++) {
          buf[2 * i] = winA[i];
          buf[2 * i + 1] = rowB ? winB[i] : 0;
        }
        fft.transform(spec, buf);
        for (let i = 0; i < nfft; i++) {
          const xr = spec[2 * i], xi = spec[2 * i + 1];
          const hr = H[2 * i], hi = H[2 * i + 1];
          spec[2 * i] = xr * hr - xi * hi;
          spec[2 * i + 1] = xr * hi + xi * hr;
        }
        fft.inverseTransform(res, spec);
        const nOut = Math.min(block, len - t0);
        for (let b = 0; b < nOut; b++) rowA[t0 + b] = res[2 * (b + N - 1)];
        if (rowB) for (let b = 0; b < nOut; b++) rowB[t0 + b] = res[2 * (b + N - 1) + 1];
      }
    }
    onChannel?.(Math.min(c + 2, nChannels), nChannels);
  }
}

/** Forward–backward filtering (magnitude |H|², zero phase): the same as applyZeroPhase with the taps' autocorrelation. */
export function filtfiltFir(
  data: Float32Array,
  nChannels: number,
  nSamples: number,
  design: FirDesign,
  boundaries?: readonly number[],
): void {
  applyZeroPhase(data, nChannels, nSamples, cascadeFir(design, design), boundaries);
}
