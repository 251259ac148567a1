import { describe, expect, it } from 'vitest';
import { electrodeDirections, fitSphere } from '../../../src/core/headmodel/sphere-fit.ts';

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

describe('fitSphere: hand-worked examples (algebraic fit |p|² = 2c·p + d, centred on the mean; common practice)', () => {
  it('puts the sphere through four points exactly: (6,2,3), (−4,2,3), (1,7,3), (1,2,8) lie on centre (1,2,3), radius 5', () => {
    // By hand: |p − c|² = r² for the first two gives cx = (6 + (−4)) / 2 = 1; likewise cy = 2 (third point,
    // with the first) and cz = 3; r = |(6,2,3) − (1,2,3)| = 5.
    const fit = fitSphere(Float64Array.of(6, 2, 3, -4, 2, 3, 1, 7, 3, 1, 2, 8));
    expect(fit.centre[0]).toBeCloseTo(1, 10);
    expect(fit.centre[1]).toBeCloseTo(2, 10);
    expect(fit.centre[2]).toBeCloseTo(3, 10);
    expect(fit.radiusMm).toBeCloseTo(5, 10);
  });

  it('gives the root-mean-square distance for points in pairs about their mean: ±5 on x and y, ±4 on z about (1,2,3) → r = √22', () => {
    // By hand, centred coordinates (±5,0,0), (0,±5,0), (0,0,±4): the normal equations decouple; every sum that
    // multiplies a coordinate by 1 or by |p|² cancels in the pairs, so c = 0, and 6d = Σ|p|² = 4·25 + 2·16 = 132,
    // d = 22, r = √(d + |c|²) = √22 ≈ 4.690 (the algebraic fit's radius, between 4 and 5).
    const pts = Float64Array.of(6, 2, 3, -4, 2, 3, 1, 7, 3, 1, -3, 3, 1, 2, 7, 1, 2, -1);
    const fit = fitSphere(pts);
    expect(fit.centre[0]).toBeCloseTo(1, 10);
    expect(fit.centre[1]).toBeCloseTo(2, 10);
    expect(fit.centre[2]).toBeCloseTo(3, 10);
    expect(fit.radiusMm).toBeCloseTo(Math.sqrt(22), 10);
  });
});

describe('electrodeDirections', () => {
  it('projects electrodes onto the fitted sphere as unit vectors from its centre, matching labels by name', () => {
    // The four points above (centre (1,2,3)): "EEG Fp1" finds Fp1 by the name inside the label, "cz" by case.
    const names = ['Fp1', 'T7', 'Cz', 'Oz'];
    const mm = Float64Array.of(6, 2, 3, -4, 2, 3, 1, 7, 3, 1, 2, 8);
    const { positions, missing } = electrodeDirections(['EEG Fp1', 'cz', 'Oz', 'X9'], names, mm);
    expect(Array.from(positions.subarray(0, 3)).map((v) => Number(v.toFixed(12)))).toEqual([1, 0, 0]);
    expect(Array.from(positions.subarray(3, 6)).map((v) => Number(v.toFixed(12)))).toEqual([0, 1, 0]);
    expect(Array.from(positions.subarray(6, 9)).map((v) => Number(v.toFixed(12)))).toEqual([0, 0, 1]);
    expect(Array.from(positions.subarray(9, 12)).every(Number.isNaN)).toBe(true);
    expect(missing).toEqual(['X9']);
  });
});
