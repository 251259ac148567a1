import { describe, expect, it } from 'vitest';
import { divergingColor, divergingColorTable, divergingScaleStops, paletteCss } from '../../../src/ui/plots/palette.ts';

/** CIE L* of an sRGB colour (IEC 61966-2-1 transfer curve, D65) — an independent check of lightness. */
function lightness([r, g, b]: number[]): number {
  const lin = (c: number) => {
    const v = c / 255;
    return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4);
  };
  const y = 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
  return y > 216 / 24389 ? 116 * Math.cbrt(y) - 16 : (24389 / 27) * y;
}

describe('divergingColor', () => {
  it('runs from blue (negative) through near-white (zero) to red (positive) — common practice for scalp maps', () => {
    const neg = divergingColor(-1, 1);
    const pos = divergingColor(1, 1);
    const mid = divergingColor(0, 1);
    expect(neg[2]).toBeGreaterThan(neg[0]);
    expect(pos[0]).toBeGreaterThan(pos[2]);
    expect(Math.min(...mid)).toBeGreaterThan(235);
  });

  it('is symmetric about zero in lightness (within 1.5 L*) and darkens monotonically with |value|', () => {
    let prev = Infinity;
    for (let i = 0; i <= 20; i++) {
      const t = i / 20;
      const lp = lightness(divergingColor(t, 1));
      const ln = lightness(divergingColor(-t, 1));
      expect(Math.abs(lp - ln)).toBeLessThan(1.5);
      expect(lp).toBeLessThanOrEqual(prev + 0.5);
      prev = lp;
    }
  });

  it('clamps beyond ±maxAbs, greys out NaN and shows a flat map (maxAbs 0) as the centre colour', () => {
    expect(divergingColor(5, 1)).toEqual(divergingColor(1, 1));
    expect(divergingColor(Number.NaN, 1)).toEqual([150, 150, 150]);
    expect(divergingColor(3, 0)).toEqual(divergingColor(0, 1));
  });
});

describe('legend helpers', () => {
  it('gives n evenly spaced stops from −1 to 1 with CSS strings', () => {
    const stops = divergingScaleStops(5);
    expect(stops.map((s) => s.t)).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(stops[4].css).toBe(paletteCss(1, 1));
    expect(paletteCss(0, 1)).toMatch(/^rgb\(\d+, \d+, \d+\)$/);
  });

  it('builds an RGBA table whose ends match divergingColor', () => {
    const lut = divergingColorTable(9);
    expect(Array.from(lut.subarray(0, 3))).toEqual(divergingColor(-1, 1));
    expect(Array.from(lut.subarray(32, 35))).toEqual(divergingColor(1, 1));
    expect(lut[3]).toBe(255);
  });
});
