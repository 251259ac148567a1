/**
 * Geometry of an event-locked average plot: one or more averages on shared axes, an optional confidence
 * band (e.g. mean ± 1.96 SEM, the 95 % normal interval, common practice), the event at t = 0 and an
 * optional measurement window. Also the peak measure the preview prints before/after.
 */
import { area, line, scaleLinear, type ScaleLinear } from 'd3';
import { finiteExtent } from './colour-scale.ts';

export interface ErpSeries {
  /** µV (or a.u.) per time point. */
  readonly values: ArrayLike<number>;
  readonly label: string;
}

export interface ErpFrame {
  readonly width: number;
  readonly height: number;
  readonly margin: { top: number; right: number; bottom: number; left: number };
}

export interface ErpGeometry {
  readonly x: ScaleLinear<number, number>;
  readonly y: ScaleLinear<number, number>;
  readonly lines: string[];
  /** Path of the band between lower and upper, or null. */
  readonly band: string | null;
}

/**
 * Scales and paths over `times` (s). The y range spans every series and the band, padded 8 %, and always
 * includes 0 so the baseline is visible.
 */
export function erpGeometry(
  times: ArrayLike<number>,
  series: readonly ErpSeries[],
  frame: ErpFrame,
  band: { lower: ArrayLike<number>; upper: ArrayLike<number> } | null = null,
): ErpGeometry {
  const m = frame.margin;
  const all: number[] = [0];
  for (const s of series) for (let i = 0; i < s.values.length; i++) all.push(s.values[i]);
  if (band) for (let i = 0; i < band.lower.length; i++) all.push(band.lower[i], band.upper[i]);
  const [lo, hi] = finiteExtent(all, 0.08);
  const t0 = times.length ? times[0] : 0;
  const t1 = times.length ? times[times.length - 1] : 1;
  const x = scaleLinear().domain([t0, t1 > t0 ? t1 : t0 + 1]).range([m.left, frame.width - m.right]);
  const y = scaleLinear().domain([lo, hi]).range([frame.height - m.bottom, m.top]);
  const idx = Array.from({ length: times.length }, (_, i) => i);
  const lines = series.map(
    (s) =>
      line<number>()
        .defined((i) => Number.isFinite(s.values[i]))
        .x((i) => x(times[i]))
        .y((i) => y(s.values[i]))(idx) ?? '',
  );
  const bandPath = band
    ? area<number>()
        .defined((i) => Number.isFinite(band.lower[i]) && Number.isFinite(band.upper[i]))
        .x((i) => x(times[i]))
        .y0((i) => y(band.lower[i]))
        .y1((i) => y(band.upper[i]))(idx)
    : null;
  return { x, y, lines, band: bandPath };
}

/**
 * The signed value of largest magnitude of `values` at times within [t0, t1] s (the peak of an average in
 * a measurement window), and its time. NaN values are skipped; NaN when no sample falls in the window.
 */
export function peakInWindow(
  times: ArrayLike<number>,
  values: ArrayLike<number>,
  t0: number,
  t1: number,
): { value: number; timeS: number } {
  let best = NaN;
  let at = NaN;
  for (let i = 0; i < times.length; i++) {
    const t = times[i];
    if (t < t0 - 1e-12 || t > t1 + 1e-12) continue;
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (Number.isNaN(best) || Math.abs(v) > Math.abs(best)) {
      best = v;
      at = t;
    }
  }
  return { value: best, timeS: at };
}
