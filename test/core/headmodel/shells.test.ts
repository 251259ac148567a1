import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  equivalentDipolesLeadField,
  fitEquivalentDipoles,
  seriesTermsNeeded,
  shellSeriesCoefficients,
  shellSeriesLeadField,
} from '../../../src/core/headmodel/shells.ts';

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/sphere_forward.json', import.meta.url), 'utf8'));
const names = Object.keys(fixture.electrodes);
const electrodes = Float64Array.from(names.flatMap((n) => fixture.electrodes[n]));
const radii = fixture.three_shell_unit.radii_over_R as number[];
const sigmas = fixture.three_shell_unit.conductivity_over_sigma_brain as number[];

function potentials(f: Float64Array, q: ArrayLike<number>): number[] {
  const out: number[] = [];
  for (let e = 0; e < f.length / 3; e++) out.push((f[3 * e] * q[0] + f[3 * e + 1] * q[1] + f[3 * e + 2] * q[2]) / (4 * Math.PI));
  return out;
}

describe('shellSeriesCoefficients', () => {
  it('reproduces the Rush & Driscoll g_1…g_6 of sphere_forward.json (float64 vs 50-digit mpmath reference) to 1e-13', () => {
    const g = shellSeriesCoefficients(radii, sigmas, 6);
    for (let n = 1; n <= 6; n++) {
      const ref = fixture.three_shell_unit.g_n_first_6[String(n)];
      expect(Math.abs(g[n - 1] - ref) / ref).toBeLessThan(1e-13);
    }
  });

  it('returns the homogeneous (2n+1)/n when all conductivities are equal (invariant, docs/methods.md §8.3)', () => {
    const g = shellSeriesCoefficients(radii, [1, 1, 1], 500);
    for (let n = 1; n <= 500; n++) expect(Math.abs(g[n - 1] - (2 * n + 1) / n) / ((2 * n + 1) / n)).toBeLessThan(1e-13);
  });

  it('stays finite and tends to ≈ 0.0977 at high degree (skull suppresses high spatial frequencies, docs/methods.md §8.3)', () => {
    const g = shellSeriesCoefficients(radii, sigmas, 2000);
    for (const v of g) expect(Number.isFinite(v)).toBe(true);
    expect(g[1999]).toBeGreaterThan(0.09);
    expect(g[1999]).toBeLessThan(0.105);
  });
});

describe('shellSeriesLeadField (three shells)', () => {
  const g = shellSeriesCoefficients(radii, sigmas, 2000);

  it('matches the three-shell reference values of sphere_forward.json (mpmath full system) to < 1e-6 relative', () => {
    for (const [key, dip] of Object.entries<{ r0: number[]; q: number[] }>(fixture.dipoles)) {
      const v = potentials(shellSeriesLeadField(g, electrodes, 1, dip.r0), dip.q);
      names.forEach((n, e) => {
        const ref = fixture.three_shell_unit.values[key][n].series_mpmath_fullsystem;
        // reference zeros (symmetry) are checked absolutely
        if (Math.abs(ref) < 1e-12) expect(Math.abs(v[e])).toBeLessThan(1e-12);
        else expect(Math.abs(v[e] - ref) / Math.abs(ref)).toBeLessThan(1e-6);
      });
    }
  });

  it('matches the physical three-shell values (R = 0.09 m, σ = 0.33 S/m, 10 nA·m) of sphere_forward.json', () => {
    const phys = fixture.three_shell_physical;
    for (const dip of Object.values<{ q_Am: number[]; r0_m: number[]; V: Record<string, number> }>(phys.values_V)) {
      const f = shellSeriesLeadField(g, electrodes, phys.R_m, dip.r0_m);
      const v = potentials(f, dip.q_Am).map((x) => x / phys.sigma_brain_S_per_m);
      names.forEach((n, e) => expect(Math.abs(v[e] - dip.V[n])).toBeLessThan(1e-6 * Math.abs(dip.V[n]) + 1e-18));
    }
  });

  it('uses more terms for more eccentric sources and one term at the centre (convergence criterion)', () => {
    expect(seriesTermsNeeded(g, 0)).toBe(1);
    const counts = [0.2, 0.5, 0.8, 0.86].map((b) => seriesTermsNeeded(g, b));
    for (let i = 1; i < counts.length; i++) expect(counts[i]).toBeGreaterThan(counts[i - 1]);
    expect(counts[3]).toBeLessThan(2000);
  });

  it('returns NaN for a source outside the sphere', () => {
    const f = shellSeriesLeadField(g, electrodes, 1, [0, 0, 1.2]);
    expect(f.every((v) => Number.isNaN(v))).toBe(true);
  });
});

describe('fitEquivalentDipoles (Berg & Scherg 1994 approximation)', () => {
  const g = shellSeriesCoefficients(radii, sigmas, 2000);
  const eq = fitEquivalentDipoles(g);
  const el = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8'));
  const grid = Object.entries<number[]>(el.positions_unit_sphere).filter(([n]) => !['Nz', 'Iz', 'LPA', 'RPA'].includes(n));
  const cap = Float64Array.from(grid.flatMap(([, p]) => p));

  it('finds three eccentricities in (0, 1) with positive magnitudes that reproduce g_1…g_10 within 0.5 %', () => {
    expect(eq.eccentricity.length).toBe(3);
    for (const mu of eq.eccentricity) expect(mu > 0 && mu < 1).toBe(true);
    for (const l of eq.magnitude) expect(l).toBeGreaterThan(0);
    expect(eq.maxRelativeErrorLowOrders).toBeLessThan(0.005);
  });

  it('stays within 1 % of the exact series over the brain region (|r0| < 0.87 R; error relative to the map maximum, average reference)', () => {
    let seed = 11;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
    let worst = 0;
    for (let k = 0; k < 120; k++) {
      const dir = [rnd(), rnd(), rnd()];
      const len = Math.hypot(dir[0], dir[1], dir[2]);
      const b = 0.869 * Math.cbrt((k + 0.5) / 120);
      const r0 = dir.map((v) => (b * v) / len);
      const q = [rnd(), rnd(), rnd()];
      const exact = potentials(shellSeriesLeadField(g, cap, 1, r0), q);
      const approx = potentials(equivalentDipolesLeadField(eq, cap, 1, r0), q);
      const me = exact.reduce((s, v) => s + v, 0) / exact.length;
      const ma = approx.reduce((s, v) => s + v, 0) / approx.length;
      let peak = 0;
      let err = 0;
      for (let e = 0; e < exact.length; e++) {
        peak = Math.max(peak, Math.abs(exact[e] - me));
        err = Math.max(err, Math.abs(exact[e] - me - (approx[e] - ma)));
      }
      worst = Math.max(worst, err / peak);
    }
    expect(worst).toBeLessThan(0.01);
  });
});
