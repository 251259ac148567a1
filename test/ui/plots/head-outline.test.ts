import { describe, expect, it } from 'vitest';
import { diskToPixel, headOutlinePaths } from '../../../src/ui/plots/head-outline.ts';

const frame = { cx: 50, cy: 50, radius: 40 };

function numbers(d: string): number[] {
  return (d.match(/-?\d+(\.\d+)?(e-?\d+)?/g) ?? []).map(Number);
}

describe('diskToPixel', () => {
  it('puts the nasion (+y) at the top and the right ear (+x) on the right, nose up as is common practice', () => {
    expect(diskToPixel(frame, 0, 1)).toEqual([50, 10]);
    expect(diskToPixel(frame, 1, 0)).toEqual([90, 50]);
  });
});

describe('headOutlinePaths', () => {
  const p = headOutlinePaths(frame);
  it('draws the nose above the head circle', () => {
    const ys = numbers(p.nose).filter((_, i) => i % 2 === 1);
    expect(Math.min(...ys)).toBeLessThan(10);
  });
  it('draws the ears outside the circle on both sides', () => {
    const xs = numbers(p.ears).filter((_, i) => i % 2 === 0);
    expect(Math.min(...xs)).toBeLessThan(10);
    expect(Math.max(...xs)).toBeGreaterThan(90);
  });
  it('draws the head as a circle of the frame radius', () => {
    expect(p.head).toContain('A40,40');
  });
});
