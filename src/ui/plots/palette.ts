/**
 * Diverging colour scale for scalp maps: negative blue → white → positive red (common practice), built by
 * us in CIELAB so that it is symmetric about zero in lightness and chroma:
 *
 *     t = clamp(value / maxAbs, −1, 1)
 *     L*(t) = 97 − 60 |t|                      (same lightness for +t and −t; monotone in |t|)
 *     C*(t) = 48 · min(1, |t| / 0.55)          (chroma saturates at mid-scale)
 *     hue   = 282° for t < 0 (blue), 38° for t > 0 (red)
 *
 * Blue against red differs along the blue–yellow axis that dichromats keep, and the lightness ramp alone
 * orders the magnitudes, so the scale survives red–green colour blindness and greyscale printing [b].
 * Conversion CIELAB → sRGB with the D65 white and the sRGB transfer curve (IEC 61966-2-1); the chosen
 * lightness/chroma stay inside the sRGB gamut, so no channel is clipped (checked in palette.test.ts).
 */

export type Rgb = [number, number, number];

const HUE_NEGATIVE = (282 * Math.PI) / 180;
const HUE_POSITIVE = (38 * Math.PI) / 180;
/** Shown for NaN values (no data): a neutral mid grey. */
const NO_DATA: Rgb = [150, 150, 150];

function labToRgb(l: number, a: number, b: number): Rgb {
  const fy = (l + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const d = 6 / 29;
  const inv = (f: number) => (f > d ? f * f * f : 3 * d * d * (f - 4 / 29));
  const x = 0.95047 * inv(fx);
  const y = inv(fy);
  const z = 1.08883 * inv(fz);
  const lin = [
    3.2404542 * x - 1.5371385 * y - 0.4985314 * z,
    -0.969266 * x + 1.8760108 * y + 0.041556 * z,
    0.0556434 * x - 0.2040259 * y + 1.0572252 * z,
  ];
  return lin.map((c) => {
    const v = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.pow(c, 1 / 2.4) - 0.055;
    return Math.round(255 * Math.min(1, Math.max(0, v)));
  }) as Rgb;
}

/** CIELAB coordinates (L*, a*, b*) of the scale at t ∈ [−1, 1]. */
export function divergingLab(t: number): [number, number, number] {
  const u = Math.min(1, Math.abs(t));
  const l = 97 - 60 * u;
  const c = 48 * Math.min(1, u / 0.55);
  const h = t < 0 ? HUE_NEGATIVE : HUE_POSITIVE;
  return [l, c * Math.cos(h), c * Math.sin(h)];
}

/**
 * sRGB colour (0–255 per channel) of `value` on a scale running from −maxAbs (deep blue) through 0 (near
 * white) to +maxAbs (deep red); values beyond ±maxAbs take the end colours. NaN gives a neutral grey; a
 * maxAbs of 0 (a flat map) gives the centre colour.
 */
export function divergingColor(value: number, maxAbs: number): Rgb {
  if (Number.isNaN(value)) return [...NO_DATA] as Rgb;
  const t = maxAbs > 0 ? Math.max(-1, Math.min(1, value / maxAbs)) : 0;
  const [l, a, b] = divergingLab(t);
  return labToRgb(l, a, b);
}

/**
 * Sequential scale for quantities that run from 0 up (a share of variance, 0…1), ours, in CIELAB like the
 * diverging one: t = clamp(value / max, 0, 1), L*(t) = 97 − 62 t (lightness alone orders the values, so it
 * reads in greyscale), C*(t) = 14 + 36 t, hue 88° (pale yellow) → 300° (deep violet) through red, so it never
 * shares the diverging scale's blue-for-negative. NaN gives the neutral grey.
 */
export function sequentialLab(t: number): [number, number, number] {
  const u = Math.max(0, Math.min(1, t));
  const l = 97 - 62 * u;
  const c = 14 + 36 * u;
  const h = ((88 - 148 * u + 360) % 360) * (Math.PI / 180);
  return [l, c * Math.cos(h), c * Math.sin(h)];
}

/** sRGB colour (0–255) of `value` on the sequential scale from 0 (near white) to `max` (deep violet). */
export function sequentialColor(value: number, max: number): Rgb {
  if (Number.isNaN(value)) return [...NO_DATA] as Rgb;
  const [l, a, b] = sequentialLab(max > 0 ? value / max : 0);
  return labToRgb(l, a, b);
}

/** CSS `rgb(r, g, b)` string of `divergingColor(value, maxAbs)`. */
export function paletteCss(value: number, maxAbs: number): string {
  const [r, g, b] = divergingColor(value, maxAbs);
  return `rgb(${r}, ${g}, ${b})`;
}

export interface ScaleStop {
  /** Position on the scale in [−1, 1] (multiply by maxAbs for the value). */
  readonly t: number;
  /** Fraction along a legend, 0 at the negative end, 1 at the positive end. */
  readonly offset: number;
  readonly rgb: Rgb;
  readonly css: string;
}

/** `n` (≥ 2) evenly spaced stops from −1 to +1, for gradient legends. */
export function divergingScaleStops(n: number): ScaleStop[] {
  const count = Math.max(2, Math.floor(n));
  const stops: ScaleStop[] = [];
  for (let i = 0; i < count; i++) {
    const t = -1 + (2 * i) / (count - 1);
    const rgb = divergingColor(t, 1);
    stops.push({ t, offset: i / (count - 1), rgb, css: `rgb(${rgb[0]}, ${rgb[1]}, ${rgb[2]})` });
  }
  return stops;
}

/**
 * RGBA lookup table (`steps` × 4 bytes, alpha 255) from −1 to +1, for painting many pixels: index
 * round((t + 1) / 2 × (steps − 1)).
 */
export function divergingColorTable(steps = 256): Uint8ClampedArray {
  const n = Math.max(2, Math.floor(steps));
  const lut = new Uint8ClampedArray(4 * n);
  for (let i = 0; i < n; i++) {
    const [r, g, b] = divergingColor(-1 + (2 * i) / (n - 1), 1);
    lut[4 * i] = r;
    lut[4 * i + 1] = g;
    lut[4 * i + 2] = b;
    lut[4 * i + 3] = 255;
  }
  return lut;
}
