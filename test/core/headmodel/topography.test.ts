import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createTopographyPlan, projectAzimuthalEquidistant } from '../../../src/core/headmodel/topography.ts';
import { createSplineInterpolator } from '../../../src/core/headmodel/spherical-spline.ts';

const positions = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8'));
const names = positions.ten_twenty_order as string[];
const electrodes = Float64Array.from(names.flatMap((n) => positions.positions_unit_sphere[n] as number[]));

describe('projectAzimuthalEquidistant', () => {
  it('puts Cz at the centre and Fpz, T8, Oz at ρ = 0.8 on their axes (docs/methods.md §9)', () => {
    const pick = (n: string) => Float64Array.from(positions.positions_unit_sphere[n] as number[]);
    const close = (a: Float64Array, b: number[]) => b.forEach((v, i) => expect(a[i]).toBeCloseTo(v, 12));
    close(projectAzimuthalEquidistant(pick('Cz')), [0, 0]);
    close(projectAzimuthalEquidistant(pick('Fpz')), [0, 0.8]);
    close(projectAzimuthalEquidistant(pick('T8')), [0.8, 0]);
    close(projectAzimuthalEquidistant(pick('Oz')), [0, -0.8]);
  });
});

describe('createTopographyPlan', () => {
  const plan = createTopographyPlan(electrodes, { size: 32 });

  it('has a round mask of the requested size and the nose at the top of the image', () => {
    expect(plan.size).toBe(32);
    expect(plan.mask.length).toBe(32 * 32);
    expect(plan.mask[0]).toBe(0); // corner outside the disc
    expect(plan.mask[16 * 32 + 16]).toBe(1);
    const fpz = names.indexOf('Fpz');
    expect(plan.electrodeXY[2 * fpz]).toBeCloseTo(0, 12);
    expect(plan.electrodeXY[2 * fpz + 1]).toBeCloseTo(-0.8 / 1.1, 12);
    const t8 = names.indexOf('T8');
    expect(plan.electrodeXY[2 * t8]).toBeCloseTo(0.8 / 1.1, 12);
  });

  it('renders NaN outside the head and a constant map as that constant inside', () => {
    const img = plan.render(new Float64Array(names.length).fill(2.5));
    for (let i = 0; i < img.length; i++) {
      if (plan.mask[i]) expect(img[i]).toBeCloseTo(2.5, 5);
      else expect(Number.isNaN(img[i])).toBe(true);
    }
  });

  it('agrees with the spline interpolator at a pixel centre (the plan reuses the same interpolation)', () => {
    const v = Float64Array.from(names.map((_, i) => Math.sin(i)));
    const img = plan.render(v);
    const r = 10;
    const c = 20;
    const px = (-1 + (2 * c + 1) / 32) * 1.1;
    const py = -(-1 + (2 * r + 1) / 32) * 1.1;
    const rho = Math.hypot(px, py);
    const s = Math.sin((rho * Math.PI) / 2);
    const target = Float64Array.of((s * px) / rho, (s * py) / rho, Math.cos((rho * Math.PI) / 2));
    const expected = createSplineInterpolator(electrodes, target).interpolate(v)[0];
    expect(img[r * 32 + c]).toBeCloseTo(expected, 5);
  });
});

describe('clipping to the electrodes (convex hull plus a margin)', () => {
  it('finds the convex hull of a square with an inside point (monotone chain, Andrew 1979)', async () => {
    const { convexHull } = await import('../../../src/core/headmodel/topography.ts');
    const hull = convexHull([0, 0, 1, 0, 1, 1, 0, 1, 0.5, 0.5, 0.5, 0]);
    expect(hull).toEqual([[0, 0], [1, 0], [1, 1], [0, 1]]);
  });

  it('measures signed distance to the hull: minus the edge distance inside, the boundary distance outside (plane geometry)', async () => {
    const { convexHull, signedHullDistance } = await import('../../../src/core/headmodel/topography.ts');
    const hull = convexHull([0, 0, 1, 0, 1, 1, 0, 1]);
    expect(signedHullDistance(hull, 0.5, 0.5)).toBeCloseTo(-0.5, 12);
    expect(signedHullDistance(hull, 1.3, 0.5)).toBeCloseTo(0.3, 12);
    expect(signedHullDistance(hull, 1.3, 1.4)).toBeCloseTo(0.5, 12); // 3-4-5 triangle to the corner
  });

  it('paints only within the margin of the outermost electrodes and fades the last part of it smoothly', async () => {
    const { convexHull, signedHullDistance } = await import('../../../src/core/headmodel/topography.ts');
    const size = 64;
    const extent = 1.15;
    const clip = { marginRho: 0.1, featherRho: 0.05 };
    const p = createTopographyPlan(electrodes, { size, extent, clip });
    const hull = convexHull(projectAzimuthalEquidistant(electrodes));
    let faded = 0;
    for (let r = 0; r < size; r++)
      for (let c = 0; c < size; c++) {
        const i = r * size + c;
        const px = (-1 + (2 * c + 1) / size) * extent;
        const py = -(-1 + (2 * r + 1) / size) * extent;
        const d = signedHullDistance(hull, px, py);
        if (d > clip.marginRho) expect(p.mask[i]).toBe(0);
        if (d <= clip.marginRho - clip.featherRho && Math.hypot(px, py) <= extent) expect(p.alpha[i]).toBe(1);
        if (p.alpha[i] > 0 && p.alpha[i] < 1) faded++;
        if (!p.mask[i]) expect(p.alpha[i]).toBe(0);
      }
    expect(faded).toBeGreaterThan(0);
    // Every electrode's own pixel is fully painted.
    for (let e = 0; e < names.length; e++) {
      const c = Math.floor(((p.electrodeXY[2 * e] + 1) / 2) * size);
      const r = Math.floor(((p.electrodeXY[2 * e + 1] + 1) / 2) * size);
      expect(p.alpha[r * size + c]).toBe(1);
    }
    // The rendered picture is NaN exactly where nothing is painted.
    const img = p.render(new Float64Array(names.length).fill(1));
    for (let i = 0; i < img.length; i++) expect(Number.isNaN(img[i])).toBe(!p.mask[i]);
  });

  it('keeps the whole disc without a clip (alpha = mask)', () => {
    const plan = createTopographyPlan(electrodes, { size: 32 });
    for (let i = 0; i < plan.mask.length; i++) expect(plan.alpha[i]).toBe(plan.mask[i]);
  });
});
