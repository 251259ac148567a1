import { describe, expect, it } from 'vitest';
import { interpolateAt, logPower, spectrumGeometry } from '../../../src/ui/plots/spectrum-geometry.ts';

// A pure power law P = 10^1.5 · f^-1.8 is the no-peak case of docs/methods.md §2 (checks/one_over_f_alpha.json):
// its 1/f fit is exactly exponent 1.8, offset 1.5, so the drawn fit must lie on the data.
const freqs = Float64Array.from({ length: 89 }, (_, i) => 1 + i * 0.5);
const power = Float64Array.from(freqs, (f) => 10 ** 1.5 * f ** -1.8);

describe('spectrumGeometry', () => {
  const g = spectrumGeometry([{ frequencies: freqs, power }], { width: 200, height: 100 }, { exponent: 1.8, offset: 1.5 }, 10);

  it('draws the 1/f fit on top of a pure power-law spectrum', () => {
    for (const f of [2, 10, 30]) {
      const py = g.y(logPower(10 ** 1.5 * f ** -1.8));
      const fy = g.y(1.5 - 1.8 * Math.log10(f));
      expect(py).toBeCloseTo(fy, 9);
    }
    expect(g.fit).not.toBeNull();
  });
  it('defaults to 1–45 Hz and places the alpha marker at its frequency', () => {
    expect(g.x.domain()).toEqual([1, 45]);
    expect(g.alphaX).toBeCloseTo(g.x(10), 9);
  });
  it('puts the highest power at the top of the frame (log scale, SVG y down)', () => {
    expect(g.y(logPower(power[0]))).toBeLessThan(g.y(logPower(power[88])));
  });
  it('has no alpha marker when there is no peak', () => {
    const none = spectrumGeometry([{ frequencies: freqs, power }], { width: 200, height: 100 }, null, null);
    expect(none.alphaX).toBeNull();
    expect(none.fit).toBeNull();
  });
  it('breaks the line at non-positive power instead of drawing to minus infinity', () => {
    const p2 = power.slice();
    p2[10] = 0;
    const gg = spectrumGeometry([{ frequencies: freqs, power: p2 }], { width: 200, height: 100 });
    expect(gg.lines[0].match(/M/g)?.length).toBe(2);
  });
});

describe('interpolateAt', () => {
  it('interpolates linearly between bins and returns NaN outside', () => {
    expect(interpolateAt([0, 1, 2], [0, 10, 30], 1.5)).toBe(20);
    expect(interpolateAt([0, 1, 2], [0, 10, 30], 3)).toBeNaN();
  });
});
