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
