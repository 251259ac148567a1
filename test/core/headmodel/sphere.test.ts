import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { homogeneousSeriesCoefficients, sphereLeadField } from '../../../src/core/headmodel/sphere.ts';
import { shellSeriesLeadField } from '../../../src/core/headmodel/shells.ts';

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/sphere_forward.json', import.meta.url), 'utf8'));
const names = Object.keys(fixture.electrodes);
const electrodes = Float64Array.from(names.flatMap((n) => fixture.electrodes[n]));

/** V = q · F / (4πσ) for σ = 1 (the fixture's unit model). */
function potentials(f: Float64Array, q: number[]): number[] {
  const out: number[] = [];
  for (let e = 0; e < f.length / 3; e++) out.push((f[3 * e] * q[0] + f[3 * e + 1] * q[1] + f[3 * e + 2] * q[2]) / (4 * Math.PI));
  return out;
}

describe('sphereLeadField (homogeneous sphere, closed form)', () => {
  it('gives V = 3 q cosθ / (4πσR²) for a radial dipole at the centre (closed form, docs/methods.md §8.2)', () => {
    const radius = 0.09;
    const sigma = 0.33;
    const q = 1e-8;
    const f = sphereLeadField(electrodes, radius, [0, 0, 0]);
    names.forEach((n, e) => {
      const cosTheta = fixture.electrodes[n][2];
      const v = (f[3 * e + 2] * q) / (4 * Math.PI * sigma);
      const expected = (3 * q * cosTheta) / (4 * Math.PI * sigma * radius * radius);
      expect(Math.abs(v - expected)).toBeLessThan(1e-12 * expected);
      // and the fixture's physical values (sphere_forward.py, numpy 2, closed form): 8.931253821e-7 V at Cz
      const ref = fixture.homogeneous_centred_radial_physical.values[n].V_closed_form;
      expect(Math.abs(v - ref)).toBeLessThan(1e-12 * Math.abs(ref));
    });
  });

  it('matches the reference closed-form values of sphere_forward.json to 1e-12 relative', () => {
    for (const [key, dip] of Object.entries<{ r0: number[]; q: number[] }>(fixture.dipoles)) {
      const v = potentials(sphereLeadField(electrodes, 1, dip.r0), dip.q);
      names.forEach((n, e) => {
        const ref = fixture.homogeneous_unit.values[key][n].closed_form;
        expect(Math.abs(v[e] - ref)).toBeLessThanOrEqual(1e-12 * Math.max(Math.abs(ref), 1e-3));
      });
    }
  });

  it('agrees with the Legendre series (g_n = (2n+1)/n) to 1e-9 relative for off-centre dipoles (docs/methods.md §8.3)', () => {
    const g = homogeneousSeriesCoefficients(2000);
    // deterministic off-centre positions up to 0.85 R, arbitrary moments
    let seed = 7;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
    for (let k = 0; k < 40; k++) {
      const dir = [rnd(), rnd(), rnd()];
      const len = Math.hypot(dir[0], dir[1], dir[2]);
      const b = 0.05 + 0.8 * ((k + 0.5) / 40);
      const r0 = dir.map((v) => (b * v) / len);
      const closed = sphereLeadField(electrodes, 1, r0);
      const series = shellSeriesLeadField(g, electrodes, 1, r0);
      let scale = 0;
      for (const v of closed) scale = Math.max(scale, Math.abs(v));
      for (let i = 0; i < closed.length; i++) expect(Math.abs(closed[i] - series[i])).toBeLessThan(1e-9 * scale);
    }
  });

  it('projects electrodes that are not on the sphere radially onto it', () => {
    // electrode e scaled by 1 + 0.1 e: same directions, different distances from the centre
    const scaled = electrodes.map((v, i) => v * (1 + Math.floor(i / 3) * 0.1));
    const a = sphereLeadField(electrodes, 1, [0.1, 0.2, 0.3]);
    const b = sphereLeadField(scaled, 1, [0.1, 0.2, 0.3]);
    for (let i = 0; i < a.length; i++) expect(b[i]).toBeCloseTo(a[i], 12);
  });
});
