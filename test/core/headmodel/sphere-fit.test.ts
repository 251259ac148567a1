import { describe, expect, it } from 'vitest';
import { fitSphere } from '../../../src/core/headmodel/sphere-fit.ts';

describe('fitSphere', () => {
  it('recovers the centre and radius of points on the upper half of a shifted sphere (exact data)', () => {
    const pts: number[] = [];
    for (let i = 0; i < 40; i++) {
      const theta = (Math.PI / 2) * ((i % 8) / 8);
      const phi = (2 * Math.PI * i) / 40 + i;
      pts.push(3 + 85 * Math.sin(theta) * Math.cos(phi), -7 + 85 * Math.sin(theta) * Math.sin(phi), 12 + 85 * Math.cos(theta));
    }
    const fit = fitSphere(Float64Array.from(pts));
    expect(fit.radiusMm).toBeCloseTo(85, 9);
    expect(fit.centre[0]).toBeCloseTo(3, 9);
    expect(fit.centre[1]).toBeCloseTo(-7, 9);
    expect(fit.centre[2]).toBeCloseTo(12, 9);
  });

  it('falls back to the origin and the mean distance for fewer than four points, and NaN for none', () => {
    const fit = fitSphere(Float64Array.of(0, 0, 10, 0, 20, 0));
    expect(fit.centre).toEqual([0, 0, 0]);
    expect(fit.radiusMm).toBe(15);
    expect(Number.isNaN(fitSphere(new Float64Array(0)).radiusMm)).toBe(true);
  });

  it('falls back for points in one plane, which do not fix a sphere', () => {
    const pts: number[] = [];
    for (let i = 0; i < 12; i++) pts.push(50 * Math.cos(i), 50 * Math.sin(i), 30);
    const fit = fitSphere(Float64Array.from(pts));
    expect(fit.centre).toEqual([0, 0, 0]);
    expect(fit.radiusMm).toBeCloseTo(Math.hypot(50, 30), 9);
  });
});
