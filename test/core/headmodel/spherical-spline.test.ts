import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createSplineInterpolator, sphericalSplineG } from '../../../src/core/headmodel/spherical-spline.ts';

const ref = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/spherical_spline.json', import.meta.url), 'utf8'));
const positions = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8'))
  .positions_unit_sphere as Record<string, number[]>;
const names = ref.electrodes as string[];
const electrodes = Float64Array.from(names.flatMap((n) => positions[n]));
const values = Float64Array.from(names.map((n) => ref.electrode_values[n] as number));

describe('sphericalSplineG (Perrin et al. 1989, m = 4)', () => {
  it('matches the g table of spherical_spline.json (scipy Legendre, N = 50 and N = 7) to 1e-13', () => {
    for (const [x, row] of Object.entries<{ N7: number; N50: number }>(ref.g_table_m4)) {
      expect(Math.abs(sphericalSplineG(Number(x)) - row.N50)).toBeLessThan(1e-13 * Math.abs(row.N50) + 1e-17);
      expect(Math.abs(sphericalSplineG(Number(x), 4, 7) - row.N7)).toBeLessThan(1e-13 * Math.abs(row.N7) + 1e-17);
    }
  });

  it('clamps x outside [−1, 1] (rounding of dot products of unit vectors)', () => {
    expect(sphericalSplineG(1 + 1e-15)).toBe(sphericalSplineG(1));
  });
});

describe('createSplineInterpolator', () => {
  it('reproduces the values at the electrodes (λ = 0) to 1e-12', () => {
    const interp = createSplineInterpolator(electrodes, electrodes);
    const out = interp.interpolate(values);
    for (let i = 0; i < names.length; i++) expect(Math.abs(out[i] - values[i])).toBeLessThan(1e-12);
  });

  it('matches the off-electrode values of spherical_spline.json for λ = 0 and λ = 1e-5 to 1e-9', () => {
    for (const lambda of ['0', '1e-05']) {
      const cases = Object.values<{ point: number[]; spline_A: number }>(ref.interpolation[`lambda=${lambda}`].values);
      const targets = Float64Array.from(cases.flatMap((c) => c.point));
      const out = createSplineInterpolator(electrodes, targets, Number(lambda)).interpolate(values);
      cases.forEach((c, i) => expect(Math.abs(out[i] - c.spline_A)).toBeLessThan(1e-9));
    }
  });

  it('reuses one matrix: interpolation is linear in the values', () => {
    const targets = Float64Array.of(0.2, -0.5, 0.8, 0, 0, 1);
    const interp = createSplineInterpolator(electrodes, targets);
    const a = interp.interpolate(values);
    const b = interp.interpolate(values.map((v) => 2 * v + 1));
    for (let i = 0; i < 2; i++) expect(b[i]).toBeCloseTo(2 * a[i] + 1, 10);
  });

  it('gives the same values with the tabulated target kernel (cubic Hermite) to 1e-11', () => {
    const targets = new Float64Array(3 * 200);
    for (let i = 0; i < 200; i++) {
      const th = (i * 0.7) % Math.PI;
      const ph = i * 2.39996;
      targets.set([Math.sin(th) * Math.cos(ph), Math.sin(th) * Math.sin(ph), Math.cos(th)], 3 * i);
    }
    const a = createSplineInterpolator(electrodes, targets).interpolate(values);
    const b = createSplineInterpolator(electrodes, targets, 0, { targetKernel: 'table' }).interpolate(values);
    for (let i = 0; i < 200; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-11);
  });

  it('gives NaN for a singular montage (a repeated electrode with λ = 0)', () => {
    const twice = Float64Array.from([...electrodes, ...electrodes.subarray(0, 3)]);
    const out = createSplineInterpolator(twice, Float64Array.of(0, 0, 1)).interpolate(new Float64Array(names.length + 1));
    expect(Number.isNaN(out[0])).toBe(true);
  });
});
