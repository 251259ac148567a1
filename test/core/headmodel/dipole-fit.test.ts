import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { millimetres } from '../../../src/core/units.ts';
import { createHeadModel, dipolePotentials } from '../../../src/core/headmodel/forward.ts';
import { createDipoleFitter, fitDipole } from '../../../src/core/headmodel/dipole-fit.ts';

const reference = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/dipole_fit.json', import.meta.url), 'utf8'));
const positions = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8'))
  .positions_unit_sphere as Record<string, number[]>;
/** The 69 idealised 10-10 electrodes of dipole_fit.json, as unit vectors. */
const unit69 = Float64Array.from((reference.electrodes as string[]).flatMap((n) => positions[n]));
/** The first 64 of them on a 90 mm head. */
const cap64 = Float64Array.from((reference.electrodes as string[]).slice(0, 64).flatMap((n) => positions[n].map((v) => v * 90)));

const model = createHeadModel();
const fitter = createDipoleFitter(model, cap64);

/** 32-bit LCG (Numerical Recipes constants), uniform in [−1, 1): seeded noise for the tests. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}
const distance = (a: ArrayLike<number>, b: ArrayLike<number>) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('createDipoleFitter on a 64-electrode, 90 mm three-shell head', () => {
  const sources: [number[], number[]][] = [
    [[20, 10, 40], [5, -3, 8]],
    [[-45, 20, 30], [0, 10, 2]],
    [[0, -60, 20], [3, 3, 3]],
    [[-10, 5, 70], [8, 0, 0]],
    [[35, -30, -5], [-2, 6, 1]],
  ];

  it('recovers the position of noise-free simulated maps within 1 mm with RV < 1e-4 (issue 3 check)', () => {
    for (const [p, q] of sources) {
      const map = dipolePotentials(model, cap64, p, q);
      const fit = fitter.fit(map);
      expect(distance(fit.position, p)).toBeLessThan(1);
      expect(fit.residualVariance).toBeLessThan(1e-4);
      expect(distance(fit.moment, q)).toBeLessThan(0.01 * Math.hypot(q[0], q[1], q[2]));
      expect(fit.atBoundary).toBe(false);
    }
  });

  it('ignores the map reference: a constant offset changes nothing (average reference on model and data)', () => {
    const map = dipolePotentials(model, cap64, [20, 10, 40], [5, -3, 8]);
    const a = fitter.fit(map);
    const b = fitter.fit(map.map((v) => v + 7.5));
    expect(distance(a.position, b.position)).toBeLessThan(1e-6);
  });

  it('recovers the position within 10 mm with 5 % noise (seeded; issue 3 check)', () => {
    const rnd = lcg(4242);
    for (const [p, q] of sources) {
      const map = dipolePotentials(model, cap64, p, q);
      const peak = map.reduce((s, v) => Math.max(s, Math.abs(v)), 0);
      const noisy = map.map((v) => v + 0.05 * peak * rnd());
      const fit = fitter.fit(noisy);
      expect(distance(fit.position, p)).toBeLessThan(10);
      expect(fit.residualVariance).toBeGreaterThan(0);
      expect(fit.residualVariance).toBeLessThan(0.1);
    }
  });

  it('leaves a high residual variance (> 15 %, the "not dipolar" level of docs/methods.md §15 [c]) for a map made by two distant dipoles', () => {
    // left frontal and right parieto-occipital radial sources ~120 mm apart (our fit gives RV ≈ 0.23)
    const a = dipolePotentials(model, cap64, [-50, 30, 30], [0, 0, 10]);
    const b = dipolePotentials(model, cap64, [40, -45, 25], [0, 0, 10]);
    const fit = fitter.fit(a.map((v, i) => v + b[i]));
    expect(fit.residualVariance).toBeGreaterThan(0.15);
  });

  it('explains a mirror-symmetric pair with the symmetric fit, which a single dipole cannot', () => {
    const a = dipolePotentials(model, cap64, [-40, -10, 35], [-3, 2, 8]);
    const b = dipolePotentials(model, cap64, [40, -10, 35], [4, 1, 6]);
    const map = a.map((v, i) => v + b[i]);
    const pair = fitter.fitSymmetric(map);
    expect(pair.residualVariance).toBeLessThan(1e-4);
    expect(distance(pair.right.position, [40, -10, 35])).toBeLessThan(1);
    expect(distance(pair.left.position, [-40, -10, 35])).toBeLessThan(1);
    expect(distance(pair.left.moment, [-3, 2, 8])).toBeLessThan(0.1);
    expect(distance(pair.right.moment, [4, 1, 6])).toBeLessThan(0.1);
    expect(fitter.fit(map).residualVariance).toBeGreaterThan(10 * pair.residualVariance);
  });

  it('returns NaN (not a made-up dipole) for a flat map or a map holding NaN', () => {
    expect(Number.isNaN(fitter.fit(new Float64Array(64).fill(3)).residualVariance)).toBe(true);
    const bad = dipolePotentials(model, cap64, [20, 10, 40], [5, -3, 8]);
    bad[5] = NaN;
    const fit = fitter.fit(bad);
    expect(Number.isNaN(fit.position[0])).toBe(true);
  });

  it('flags a fit that ends on the edge of the allowed region', () => {
    // a source just under the scalp of a homogeneous sphere, fitted with the region limited to 40 mm
    const sphere = createHeadModel({ kind: 'sphere' });
    const map = dipolePotentials(sphere, cap64, [0, 0, 75], [0, 0, 10]);
    const fit = fitDipole(sphere, cap64, map, { limitRadiusMm: millimetres(40) });
    expect(fit.atBoundary).toBe(true);
    expect(Math.hypot(...fit.position)).toBeLessThanOrEqual(40 + 1e-9);
  });
});

describe('fitDipole against dipole_fit.json (own LM vs scipy.optimize.least_squares, unit three-shell model, 69 electrodes)', () => {
  // unit model: R = 1 "mm", σ = 1, so our µV are 1e3 × the fixture's unit potentials; positions compare directly
  const unitShell = createHeadModel({ radiusMm: 1, conductivity: 1 });
  const clean = Float64Array.from(reference.data_noise_free_avgref as number[]);
  const noisy = clean.map((v, i) => v + reference.noise_added[i]);

  it('recovers the true dipole from the noise-free map', () => {
    const fit = fitDipole(unitShell, unit69, clean);
    const ref = reference.cases.noise_free_3shell.scipy_lm;
    expect(distance(fit.position, ref.p)).toBeLessThan(1e-6);
    expect(distance(fit.moment.map((v) => v * 1e3), ref.q)).toBeLessThan(1e-6);
    expect(fit.residualVariance).toBeLessThan(1e-20);
  });

  it('matches the noisy-map fit (±5 % LCG noise) to 1e-6 R in position and 1e-9 in RV', () => {
    const fit = fitDipole(unitShell, unit69, noisy);
    const ref = reference.cases.noisy_3shell.scipy_lm;
    expect(distance(fit.position, ref.p)).toBeLessThan(1e-6);
    expect(Math.abs(fit.residualVariance - ref.RV)).toBeLessThan(1e-9);
  });

  it('matches the homogeneous-model fit to three-shell data, which lands too deep (docs/methods.md §15 case 3)', () => {
    const fit = fitDipole(createHeadModel({ kind: 'sphere', radiusMm: 1, conductivity: 1 }), unit69, clean);
    const ref = reference.cases['3shell_data_homogeneous_model'].scipy_lm;
    expect(distance(fit.position, ref.p)).toBeLessThan(1e-6);
    expect(Math.abs(fit.residualVariance - ref.RV)).toBeLessThan(1e-9);
    expect(Math.hypot(...fit.position)).toBeLessThan(Math.hypot(...(reference.p_true as number[])));
  });
});
