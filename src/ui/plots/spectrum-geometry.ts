/**
 * Geometry of a power-spectrum plot: log10 power against frequency, with the 1/f fit
 * `log10 P = offset − exponent · log10 f` (docs/methods.md §2) and the alpha peak marked. Pure: d3 computes the
 * scales and path strings, React renders them.
 */
import { line, scaleLinear, type ScaleLinear } from 'd3';

export interface SpectrumSeries {
  /** Bin frequencies in Hz, ascending. */
  readonly frequencies: ArrayLike<number>;
  /** Power spectral density in µV²/Hz (or a.u.²/Hz), same length. */
  readonly power: ArrayLike<number>;
}

export interface OneOverFLine {
  /** χ in log10 P = b − χ log10 f (dimensionless, positive for falling spectra). */
  readonly exponent: number;
  /** b in log10(µV²/Hz). */
  readonly offset: number;
}

export interface SpectrumFrame {
  readonly width: number;
  readonly height: number;
  /** Frequency range drawn (Hz); default [1, min(45, highest bin)]. */
  readonly rangeHz?: readonly [number, number];
  readonly margin?: { top: number; right: number; bottom: number; left: number };
}

export interface SpectrumGeometry {
  readonly x: ScaleLinear<number, number>;
  readonly y: ScaleLinear<number, number>;
  /** One path per series, in the order given (NaN / non-positive bins break the line). */
  readonly lines: string[];
  /** The 1/f fit over the drawn range, or null. */
  readonly fit: string | null;
  /** x pixel of the alpha peak, or null when there is none or it is out of range. */
  readonly alphaX: number | null;
  /** log10 power at the alpha peak (interpolated from the first series), or null. */
  readonly alphaLogPower: number | null;
}

/** log10 of a PSD value; non-positive or non-finite power has no logarithm and becomes NaN (a gap). */
export function logPower(p: number): number {
  return p > 0 && Number.isFinite(p) ? Math.log10(p) : NaN;
}

/** Linear interpolation of `ys` at `x` over ascending `xs`; NaN outside. */
export function interpolateAt(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number): number {
  const n = xs.length;
  if (n === 0 || !(x >= xs[0] && x <= xs[n - 1])) return NaN;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  if (xs[hi] === xs[lo]) return ys[lo];
  const t = (x - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + t * (ys[hi] - ys[lo]);
}

/**
 * Scales and paths for one or more spectra sharing axes (e.g. before/after). The y range covers the log
 * power of every series inside the drawn frequency range, plus 5 % padding.
 */
export function spectrumGeometry(
  series: readonly SpectrumSeries[],
  frame: SpectrumFrame,
  oneOverF: OneOverFLine | null = null,
  alphaPeakHz: number | null = null,
): SpectrumGeometry {
  const m = frame.margin ?? { top: 2, right: 2, bottom: 2, left: 2 };
  const first = series[0];
  const nyquistish = first && first.frequencies.length ? first.frequencies[first.frequencies.length - 1] : 45;
  const [f0, f1] = frame.rangeHz ?? [1, Math.min(45, nyquistish)];
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    for (let i = 0; i < s.frequencies.length; i++) {
      const f = s.frequencies[i];
      if (f < f0 || f > f1) continue;
      const v = logPower(s.power[i]);
      if (Number.isNaN(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  if (lo > hi) [lo, hi] = [0, 1];
  else if (lo === hi) [lo, hi] = [lo - 0.5, hi + 0.5];
  const pad = (hi - lo) * 0.05;
  const x = scaleLinear().domain([f0, f1]).range([m.left, frame.width - m.right]);
  const y = scaleLinear().domain([lo - pad, hi + pad]).range([frame.height - m.bottom, m.top]);

  const lines = series.map((s) => {
    const idx: number[] = [];
    for (let i = 0; i < s.frequencies.length; i++) {
      const f = s.frequencies[i];
      if (f >= f0 && f <= f1) idx.push(i);
    }
    const gen = line<number>()
      .defined((i) => !Number.isNaN(logPower(s.power[i])))
      .x((i) => x(s.frequencies[i]))
      .y((i) => y(logPower(s.power[i])));
    return gen(idx) ?? '';
  });

  let fit: string | null = null;
  if (oneOverF && Number.isFinite(oneOverF.exponent) && Number.isFinite(oneOverF.offset)) {
    const steps = 40;
    const pts: [number, number][] = [];
    for (let k = 0; k <= steps; k++) {
      const f = f0 + ((f1 - f0) * k) / steps;
      if (f <= 0) continue;
      pts.push([x(f), y(oneOverF.offset - oneOverF.exponent * Math.log10(f))]);
    }
    fit = line()(pts);
  }

  let alphaX: number | null = null;
  let alphaLogPower: number | null = null;
  if (alphaPeakHz !== null && Number.isFinite(alphaPeakHz) && alphaPeakHz >= f0 && alphaPeakHz <= f1) {
    alphaX = x(alphaPeakHz);
    if (first) {
      const lp = interpolateAt(first.frequencies, Array.from(first.power, logPower), alphaPeakHz);
      alphaLogPower = Number.isNaN(lp) ? null : lp;
    }
  }
  return { x, y, lines, fit, alphaX, alphaLogPower };
}
