import { describe, expect, it } from 'vitest';
import { knownPositionIndices, MAP_EXTENT, topographyPlanFor } from '../../../src/ui/plots/topography-plans.ts';

// Idealised 10-20 positions from docs/methods.md §10 (checks/electrodes_1020.json): Fpz, Oz, T7, T8, Cz, C3, C4,
// plus one channel without a position.
const positions = Float64Array.from([
  0, 0.951057, 0.309017,
  0, -0.951057, 0.309017,
  -0.951057, 0, 0.309017,
  0.951057, 0, 0.309017,
  0, 0, 1,
  -0.587785, 0, 0.809017,
  0.587785, 0, 0.809017,
  NaN, NaN, NaN,
]);

describe('topographyPlanFor', () => {
  const plan = topographyPlanFor(positions, 40);

  it('is computed once per montage and size', () => {
    expect(topographyPlanFor(positions, 40)).toBe(plan);
    expect(topographyPlanFor(positions, 41)).not.toBe(plan);
  });
  it('puts Cz at the centre and Fpz above it at ρ = 0.8 (azimuthal equidistant projection, docs/methods.md §9)', () => {
    expect(plan.electrodePx[8]).toBeCloseTo(20, 6);
    expect(plan.electrodePx[9]).toBeCloseTo(20, 6);
    expect(plan.electrodePx[0]).toBeCloseTo(20, 6);
    expect(plan.electrodePx[1]).toBeCloseTo(20 - (0.8 / MAP_EXTENT) * 20, 4);
  });
  it('leaves the channel without a position out and draws no dot for it', () => {
    expect(knownPositionIndices(positions)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(plan.electrodePx[14]).toBeNaN();
  });
  it('reproduces a constant map inside the head (splines with a constant term interpolate constants exactly, Perrin et al. 1989)', () => {
    const img = plan.render(Float64Array.from([2, 2, 2, 2, 2, 2, 2, NaN]));
    const inside = Array.from(img).filter((v) => !Number.isNaN(v));
    expect(inside.length).toBeGreaterThan(0);
    for (const v of inside) expect(v).toBeCloseTo(2, 6);
    expect(img[0]).toBeNaN(); // the corner is outside the head
  });
});

describe('the painted area (electrode hull plus MAP_CLIP margin)', () => {
  it('leaves unpainted a point of the head between Fpz and T8, well outside the hull of the electrodes', async () => {
    const { MAP_CLIP } = await import('../../../src/ui/plots/topography-plans.ts');
    const plan = topographyPlanFor(positions, 64);
    // ρ = 0.8 at 45°: 0.23 ρ outside the Fpz–T8 edge (x + y = 0.8), beyond the 0.1 ρ margin (plane geometry).
    const x = 0.8 * Math.SQRT1_2;
    const c = Math.floor(((x / MAP_EXTENT + 1) / 2) * 64);
    const r = Math.floor(((-x / MAP_EXTENT + 1) / 2) * 64);
    expect(plan.alpha[r * 64 + c]).toBe(0);
    expect(plan.render(Float64Array.from([1, 1, 1, 1, 1, 1, 1, NaN]))[r * 64 + c]).toBeNaN();
    // Cz, at the centre, is fully painted; some pixels fade (the smooth edge).
    expect(plan.alpha[32 * 64 + 32]).toBe(1);
    expect(Array.from(plan.alpha).some((a) => a > 0 && a < 1)).toBe(true);
    expect(MAP_CLIP.marginRho).toBeGreaterThan(MAP_CLIP.featherRho);
  });
});
