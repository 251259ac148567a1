import { describe, expect, it } from 'vitest';
import { colourTicks, finiteExtent, gridToRgba, symmetricLimit } from '../../../src/ui/plots/colour-scale.ts';

describe('symmetricLimit', () => {
  it('takes the largest absolute value so the diverging scale is centred on zero', () => {
    // A diverging palette symmetric about zero is common practice for scalp maps (docs/methods.md §9, issue 3).
    expect(symmetricLimit(new Float32Array([0.2, -3, 1.5]))).toBe(3);
  });
  it('skips NaN (outside the head) instead of counting it as zero', () => {
    expect(symmetricLimit(new Float32Array([NaN, -0.5, NaN, 0.25]))).toBe(0.5);
  });
  it('returns 1 for a flat or empty picture so the palette never divides by zero', () => {
    expect(symmetricLimit(new Float32Array([0, 0]))).toBe(1);
    expect(symmetricLimit(new Float32Array([NaN]))).toBe(1);
    expect(symmetricLimit([])).toBe(1);
  });
});

describe('finiteExtent', () => {
  it('spans the finite values and pads each side by the given fraction', () => {
    expect(finiteExtent([2, NaN, 6, Infinity], 0.25)).toEqual([1, 7]);
  });
  it('widens a constant series to a unit range around it', () => {
    expect(finiteExtent([3, 3])).toEqual([2, 4]);
  });
});

describe('colourTicks', () => {
  it('is symmetric about zero and includes zero', () => {
    const t = colourTicks(2, 4);
    expect(t).toContain(0);
    expect(t[0]).toBe(-t[t.length - 1]);
  });
});

describe('gridToRgba', () => {
  const grey = (v: number, m: number) => {
    const g = Math.round(((v / m + 1) / 2) * 255);
    return [g, g, g] as const;
  };
  it('makes NaN pixels transparent and all others opaque', () => {
    const out = gridToRgba(new Float32Array([NaN, -1, 1]), 1, grey);
    expect(Array.from(out)).toEqual([0, 0, 0, 0, 0, 0, 0, 255, 255, 255, 255, 255]);
  });
  it('writes into the given buffer', () => {
    const buf = new Uint8ClampedArray(4);
    expect(gridToRgba([0], 1, grey, buf)).toBe(buf);
    expect(buf[3]).toBe(255);
  });
});

describe('sequential scale for shares (0 … max)', () => {
  it('ticks from 0 to the top and takes the largest finite value as the top', async () => {
    const { sequentialTicks, sequentialLimit } = await import('../../../src/ui/plots/colour-scale.ts');
    expect(sequentialTicks(1, 4)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(sequentialLimit([0.1, NaN, 0.4, -2])).toBe(0.4);
    expect(sequentialLimit([NaN])).toBe(1);
  });
  it('darkens monotonically from 0 to max, so the order reads in greyscale (CIELAB L*, CIE 15:2004)', async () => {
    const { sequentialLab, sequentialColor } = await import('../../../src/ui/plots/palette.ts');
    let last = Infinity;
    for (let i = 0; i <= 10; i++) {
      const [l] = sequentialLab(i / 10);
      expect(l).toBeLessThan(last);
      last = l;
    }
    // Rec. 709 luma of the sRGB bytes falls too (ITU-R BT.709).
    const luma = (v: number) => {
      const [r, g, b] = sequentialColor(v, 1);
      return 0.2126 * r + 0.7152 * g + 0.0722 * b;
    };
    expect(luma(0)).toBeGreaterThan(luma(0.5));
    expect(luma(0.5)).toBeGreaterThan(luma(1));
    expect(sequentialColor(NaN, 1)).toEqual([150, 150, 150]);
  });
  it('paints per-pixel opacity when given (the scalp map edge)', () => {
    const rgba = gridToRgba([0, 0, NaN], 1, () => [10, 20, 30], undefined, [1, 0.5, 1]);
    expect(Array.from(rgba)).toEqual([10, 20, 30, 255, 10, 20, 30, 128, 0, 0, 0, 0]);
  });
});
