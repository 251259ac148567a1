import { describe, expect, it } from 'vitest';
import { placeLegend, pointsInside } from '../../../src/ui/plots/legend-placement.ts';

describe('placeLegend', () => {
  const topRight = { x: 80, y: 0, width: 20, height: 10 };
  const bottomLeft = { x: 0, y: 90, width: 20, height: 10 };
  it('keeps the preferred corner when it is free', () => {
    expect(placeLegend([[10, 10], [50, 50]], [topRight, bottomLeft])).toBe(topRight);
  });
  it('moves off a peak that rises into it (a 50 Hz mains line at the right edge)', () => {
    const peak: [number, number][] = [[90, 80], [90, 40], [90, 5], [91, 60]];
    expect(pointsInside(peak, topRight)).toBe(1);
    expect(placeLegend(peak, [topRight, bottomLeft])).toBe(bottomLeft);
  });
});
