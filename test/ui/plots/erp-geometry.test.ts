import { describe, expect, it } from 'vitest';
import { erpGeometry, peakInWindow } from '../../../src/ui/plots/erp-geometry.ts';

describe('peakInWindow', () => {
  it('returns the signed value of largest magnitude inside the window and its time', () => {
    const t = [0, 0.1, 0.2, 0.3, 0.4];
    const v = [9, 2, -5, 4, 100];
    expect(peakInWindow(t, v, 0.1, 0.3)).toEqual({ value: -5, timeS: 0.2 });
  });
  it('is NaN when no sample falls in the window', () => {
    expect(peakInWindow([0, 1], [1, 2], 2, 3).value).toBeNaN();
  });
});

describe('erpGeometry', () => {
  it('always shows the zero line and spans the band', () => {
    const g = erpGeometry([0, 1], [{ values: [5, 6], label: 'a' }], { width: 100, height: 100, margin: { top: 0, right: 0, bottom: 0, left: 0 } }, { lower: [4, 5], upper: [7, 8] });
    const [lo, hi] = g.y.domain();
    expect(lo).toBeLessThanOrEqual(0);
    expect(hi).toBeGreaterThanOrEqual(8);
    expect(g.band).not.toBeNull();
  });
});
