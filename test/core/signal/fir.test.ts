import { describe, expect, it } from 'vitest';
import {
  applyZeroPhase,
  designHighpassFir,
  designLowpassFir,
  filtfiltFir,
  firMagnitude,
  segmentRanges,
} from '../../../src/core/signal/fir.ts';
import fixture from '../../fixtures/signal/fir_reference.json' with { type: 'json' };
import { hz } from '../../../src/core/units.ts';

// Reference: test/fixtures/signal/fir_reference.py (scipy 1.17.1, numpy 2.4.6). Each case is a spec (cutoff,
// rate, transition width); the script derives everything else outside this project: the tap count from the
// published Hamming window table (Ifeachor & Jervis 2002, Table 7.2: transition 3.3/M of fs, 53 dB), Kaiser's
// order estimate (Kaiser 1974; Oppenheim & Schafer 3rd ed. eq. 7.63, scipy.signal.kaiserord), the taps by
// scipy.signal.firwin(..., window='hamming'), |H(f)| by scipy.signal.freqz, and the worst stopband gain and
// passband deviation beyond fc ∓ Δf/2 on a dense freqz grid.
const design = (c: (typeof fixture.cases)[keyof typeof fixture.cases], opts: { transitionHz?: number } = {}) =>
  c.kind === 'highpass' ? designHighpassFir(c.cutoff_hz, c.fs, opts) : designLowpassFir(c.cutoff_hz, c.fs, opts);

/**
 * Bound on both ripples: 50 dB, i.e. δ = 10^(−50/20). The table's 53 dB is the nominal figure of the Hamming
 * window; a window-method design has about the same peak error δ in passband and stopband (Oppenheim & Schafer
 * 3rd ed. §7.5.1) and is specified with a margin below the window's nominal attenuation (common practice).
 */
const DELTA_50DB = 10 ** (-50 / 20);

describe('designHighpassFir / designLowpassFir against the window-method table and scipy.signal.firwin + freqz', () => {
  for (const [name, c] of Object.entries(fixture.cases)) {
    it(`${name}: the default transition is the spec's ${c.transition_hz} Hz and the tap count is the table's ${c.numtaps}`, () => {
      const d = design(c);
      expect(d.numTaps).toBe(c.numtaps); // smallest even order M ≥ 3.3 fs/Δf, counted in fir_reference.py from the table
      expect(design(c, { transitionHz: c.transition_hz }).numTaps).toBe(c.numtaps);
      expect(d.description).toContain(`transition ${c.transition_hz} Hz, ${c.numtaps} taps`);
    });
    it(`${name}: no shorter than Kaiser's estimate for the same 53 dB and within the table-to-Kaiser width ratio`, () => {
      const d = design(c);
      // A Kaiser window reaches a given attenuation with the shortest window design; Hamming's 3.3/M width
      // against Kaiser's (53 − 7.95)/(2.285·2π) = 3.137/M is a ratio of 1.052, plus up to 2 taps for rounding up to
      // an even order.
      expect(d.numTaps).toBeGreaterThanOrEqual(c.kaiser_numtaps);
      expect(d.numTaps - 1).toBeLessThanOrEqual((3.3 / 3.137) * c.kaiser_order_exact + 2);
    });
    it(`${name}: matches scipy in every tap (${c.numtaps}) and in magnitude at the stated frequencies`, () => {
      const d = design(c);
      expect(c.taps).toHaveLength(c.numtaps);
      let worst = 0;
      for (let i = 0; i < c.numtaps; i++) worst = Math.max(worst, Math.abs(d.taps[i] - c.taps[i]));
      expect(worst).toBeLessThan(1e-12);
      const mag = firMagnitude(d, hz(c.fs), c.freqs_hz);
      for (let i = 0; i < mag.length; i++) expect(Math.abs(mag[i] - c.magnitude[i])).toBeLessThan(1e-9);
    });
    it(`${name}: at that length the design keeps both ripples under 50 dB beyond fc ∓ Δf/2`, () => {
      const p = c.performance;
      expect(p.stopband_max_gain).toBeLessThan(DELTA_50DB);
      expect(p.passband_max_deviation).toBeLessThan(DELTA_50DB);
      // ours at the worst frequencies scipy found, same values
      const d = design(c);
      const [gs, gp] = firMagnitude(d, hz(c.fs), [p.stopband_max_gain_hz, p.passband_max_deviation_hz]);
      expect(Math.abs(gs - p.stopband_max_gain)).toBeLessThan(1e-9);
      expect(Math.abs(Math.abs(gp - 1) - p.passband_max_deviation)).toBeLessThan(1e-9);
    });
  }
  it('puts the cutoff at −6 dB (gain 0.5 within 0.001) as windowed-sinc designs do', () => {
    const d = designHighpassFir(1, 250);
    expect(firMagnitude(d, hz(250), [1])[0]).toBeCloseTo(0.5, 3);
  });
  it('refuses cutoffs outside (0, Nyquist) with a RangeError naming the value', () => {
    expect(() => designHighpassFir(200, 250)).toThrowError(/200/);
    expect(() => designLowpassFir(0, 250)).toThrowError(RangeError);
  });
});

function sine(fs: number, f: number, T: number, phase = 0, amp = 1) {
  return Float32Array.from({ length: T }, (_, t) => amp * Math.sin((2 * Math.PI * f * t) / fs + phase));
}

/** Amplitude and phase of the f-Hz component of x over [a, b) by least squares on sin/cos. */
function sinusoidFit(x: Float32Array, fs: number, f: number, a: number, b: number) {
  let ss = 0, sc = 0;
  for (let t = a; t < b; t++) {
    ss += x[t] * Math.sin((2 * Math.PI * f * t) / fs);
    sc += x[t] * Math.cos((2 * Math.PI * f * t) / fs);
  }
  const n = b - a;
  return { sinCoef: (2 * ss) / n, cosCoef: (2 * sc) / n };
}

describe('applyZeroPhase', () => {
  const fs = 250;
  const T = 10000; // 40 s, whole cycles of 10 Hz and 1.25 Hz
  it('passes a 10 Hz sine with gain |H(10)| and no phase shift (zero phase)', () => {
    const d = designHighpassFir(1, fs);
    const x = sine(fs, 10, T);
    applyZeroPhase(x, 1, T, d);
    const fit = sinusoidFit(x, fs, 10, 1000, 9000);
    expect(fit.sinCoef).toBeCloseTo(firMagnitude(d, hz(fs), [10])[0], 4);
    expect(Math.abs(fit.cosCoef)).toBeLessThan(1e-5);
  });
  it('scales a 1.25 Hz sine (in the transition band) by |H(1.25)| with zero phase', () => {
    const d = designHighpassFir(1, fs);
    const x = sine(fs, 1.25, T);
    applyZeroPhase(x, 1, T, d);
    const fit = sinusoidFit(x, fs, 1.25, 1000, 9000);
    expect(fit.sinCoef).toBeCloseTo(firMagnitude(d, hz(fs), [1.25])[0], 3);
    expect(Math.abs(fit.cosCoef)).toBeLessThan(1e-3);
  });
  it('has a symmetric impulse response centred on the impulse (zero phase by definition)', () => {
    const d = designLowpassFir(40, fs);
    const x = new Float32Array(401);
    x[200] = 1;
    applyZeroPhase(x, 1, 401, d);
    for (let i = 1; i < 100; i++) expect(x[200 - i]).toBeCloseTo(x[200 + i], 6);
    expect(x[200]).toBeCloseTo(d.taps[(d.numTaps - 1) / 2], 6);
  });
  it('filters each segment on its own: the result equals filtering the pieces separately', () => {
    const d = designHighpassFir(1, fs);
    const a = sine(fs, 7, 3000, 0.3, 5);
    const b = sine(fs, 3, 2000, 1.1, 50).map((v) => v + 100); // a 100 µV step at the boundary
    const both = new Float32Array(5000);
    both.set(a, 0);
    both.set(b, 3000);
    applyZeroPhase(both, 1, 5000, d, [3000]);
    const a1 = a.slice();
    const b1 = b.slice();
    applyZeroPhase(a1, 1, 3000, d);
    applyZeroPhase(b1, 1, 2000, d);
    for (let t = 0; t < 3000; t++) expect(both[t]).toBeCloseTo(a1[t], 4);
    for (let t = 0; t < 2000; t++) expect(both[3000 + t]).toBeCloseTo(b1[t], 4);
  });
  it('filters channel pairs and an odd last channel identically to one channel at a time', () => {
    const d = designHighpassFir(1, fs);
    const x = new Float32Array(3 * 2000);
    x.set(sine(fs, 5, 2000), 0);
    x.set(sine(fs, 0.3, 2000, 0, 20), 2000);
    x.set(sine(fs, 12, 2000, 1), 4000);
    const single = x.slice(4000);
    applyZeroPhase(x, 3, 2000, d);
    applyZeroPhase(single, 1, 2000, d);
    for (let t = 0; t < 2000; t++) expect(x[4000 + t]).toBeCloseTo(single[t], 5);
  });
});

describe('filtfiltFir', () => {
  it('squares the magnitude: a 1 Hz sine at the −6 dB cutoff comes out at gain 0.25', () => {
    const fs = 250;
    const d = designHighpassFir(1, fs);
    const x = sine(fs, 1, 20000);
    filtfiltFir(x, 1, 20000, d);
    const fit = sinusoidFit(x, fs, 1, 5000, 15000);
    expect(fit.sinCoef).toBeCloseTo(firMagnitude(d, hz(fs), [1])[0] ** 2, 3);
    expect(Math.abs(fit.cosCoef)).toBeLessThan(1e-3);
  });
});

describe('segmentRanges', () => {
  it('turns boundary sample indices into sorted, de-duplicated [start, end) ranges', () => {
    expect(segmentRanges(100, [50, 20, 50, 0, 120])).toEqual([
      [0, 20],
      [20, 50],
      [50, 100],
    ]);
  });
});
