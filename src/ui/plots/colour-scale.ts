/**
 * Symmetric colour limits and ticks for diverging maps. A diverging palette centred on zero (negative blue →
 * white → positive red, common practice) only reads correctly when the limits are ±the same value.
 */
import { scaleLinear } from 'd3';

/**
 * Largest absolute finite value of `values`, used as ±limit of a diverging scale. NaN entries (outside the
 * head, unknown electrodes) are skipped rather than treated as 0 so they never shrink the scale. Returns 1
 * when nothing finite and non-zero is present, so a flat map still draws (white) instead of dividing by 0.
 */
export function symmetricLimit(values: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) {
    const v = Math.abs(values[i]);
    if (v > m && Number.isFinite(v)) m = v;
  }
  return m > 0 ? m : 1;
}

/** Linear limits [lo, hi] over finite values, or [0, 1] when none; widened by `pad` (fraction) each side. */
export function finiteExtent(values: ArrayLike<number>, pad = 0): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  const d = (hi - lo) * pad;
  return [lo - d, hi + d];
}

/** Tick values for a colour bar from −maxAbs to +maxAbs; always includes 0 when the scale spans it. */
export function colourTicks(maxAbs: number, count = 5): number[] {
  const ticks = scaleLinear().domain([-maxAbs, maxAbs]).ticks(count);
  if (!ticks.includes(0)) ticks.push(0);
  return ticks.sort((a, b) => a - b);
}

/**
 * Tick values for a sequential colour bar from 0 to `max` (a share, a variance): 0 and `max` always in.
 */
export function sequentialTicks(max: number, count = 4): number[] {
  const ticks = scaleLinear().domain([0, max]).ticks(count);
  if (!ticks.includes(0)) ticks.unshift(0);
  return ticks;
}

/** Largest finite value of `values` (at least 0), for the top of a sequential scale; 1 when none is positive. */
export function sequentialLimit(values: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i]) && values[i] > m) m = values[i];
  return m > 0 ? m : 1;
}

/** An RGB palette: value in [−maxAbs, maxAbs] → [r, g, b] bytes (0–255). */
export type DivergingPalette = (value: number, maxAbs: number) => readonly [number, number, number];

/**
 * Paints a map grid (row-major, `NaN` = outside the head) into RGBA bytes with `palette`. NaN pixels get
 * alpha 0 so the page shows through; every other pixel is opaque, or takes `alpha` (0…1 per pixel, e.g. a
 * scalp map's smooth edge) when given. Writes into `out` when given.
 */
export function gridToRgba(
  grid: ArrayLike<number>,
  maxAbs: number,
  palette: DivergingPalette,
  out = new Uint8ClampedArray(grid.length * 4),
  alpha?: ArrayLike<number>,
): Uint8ClampedArray {
  for (let i = 0; i < grid.length; i++) {
    const v = grid[i];
    const o = i * 4;
    if (Number.isNaN(v)) {
      out[o] = out[o + 1] = out[o + 2] = out[o + 3] = 0;
      continue;
    }
    const [r, g, b] = palette(v, maxAbs);
    out[o] = r;
    out[o + 1] = g;
    out[o + 2] = b;
    out[o + 3] = alpha ? Math.round(255 * Math.max(0, Math.min(1, alpha[i]))) : 255;
  }
  return out;
}
