import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { millimetres } from '../../../src/core/units.ts';
import {
  createHeadModel,
  dipolePotentials,
  leadField,
  leadFieldFast,
  projectToSphere,
} from '../../../src/core/headmodel/forward.ts';

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/headmodel/sphere_forward.json', import.meta.url), 'utf8'));
const names = Object.keys(fixture.electrodes);
/** Fixture electrode directions scaled to a 90 mm head. */
const electrodes90 = Float64Array.from(names.flatMap((n) => fixture.electrodes[n].map((v: number) => v * 90)));

describe('createHeadModel', () => {
  it('defaults to three shells of 90 mm, σ = 0.33 S/m, radii 0.87/0.92/1 and skull 1/80 (Rush & Driscoll 1969)', () => {
    const m = createHeadModel();
    expect(m.kind).toBe('three-shell');
    expect(m.radiusMm).toBe(90);
    expect(m.conductivity).toBe(0.33);
    expect(Array.from(m.shellRadii)).toEqual([0.87, 0.92, 1]);
    expect(m.shellConductivities[1]).toBeCloseTo(0.33 / 80, 15);
    expect(m.innerRadiusMm).toBeCloseTo(78.3, 10);
    expect(m.fast).toBe(false);
  });

  it('rejects a non-positive radius with a RangeError naming the option', () => {
    expect(() => createHeadModel({ radiusMm: 0 })).toThrow(/radiusMm/);
  });
});

describe('dipolePotentials (mm, nA·m → µV)', () => {
  it('gives 0.8931 µV at Cz for a centred radial 10 nA·m dipole in a 90 mm, 0.33 S/m sphere (3q/(4πσR²), docs/methods.md §8.4)', () => {
    const m = createHeadModel({ kind: 'sphere' });
    const v = dipolePotentials(m, electrodes90, [0, 0, 0], [0, 0, 10]);
    const ref = fixture.homogeneous_centred_radial_physical.values.Cz.V_3qcos_over_4pisigmaR2 * 1e6;
    expect(Math.abs(v[names.indexOf('Cz')] - ref)).toBeLessThan(1e-12 * ref);
  });

  it('reproduces the physical three-shell example of sphere_forward.json in µV to 1e-6 relative', () => {
    const m = createHeadModel();
    for (const dip of Object.values<{ q_Am: number[]; r0_m: number[]; V: Record<string, number> }>(fixture.three_shell_physical.values_V)) {
      const v = dipolePotentials(
        m,
        electrodes90,
        dip.r0_m.map((x) => x * 1e3),
        dip.q_Am.map((x) => x * 1e9),
      );
      names.forEach((n, e) => expect(Math.abs(v[e] - dip.V[n] * 1e6)).toBeLessThan(1e-6 * Math.abs(dip.V[n] * 1e6) + 1e-12));
    }
  });

  it('is linear in the moment: dipolePotentials equals the lead field times the moment', () => {
    const m = createHeadModel();
    const lf = leadField(m, electrodes90, [10, -20, 30]);
    const v = dipolePotentials(m, electrodes90, [10, -20, 30], [1, 2, -3]);
    for (let e = 0; e < names.length; e++) expect(v[e]).toBeCloseTo(lf[3 * e] + 2 * lf[3 * e + 1] - 3 * lf[3 * e + 2], 12);
  });

  it('returns NaN for a dipole outside the brain shell of the three-shell model', () => {
    const v = dipolePotentials(createHeadModel(), electrodes90, [0, 0, 80], [0, 0, 1]);
    expect(v.every((x) => Number.isNaN(x))).toBe(true);
  });
});

describe('leadField invariants', () => {
  it('matches the homogeneous sphere when the skull conducts like brain and scalp (STYLE.md invariant; docs/methods.md §8.3)', () => {
    const shells = createHeadModel({ skullRatio: 1 });
    const sphere = createHeadModel({ kind: 'sphere' });
    for (const p of [[0, 0, 0], [10, -20, 30], [-40, 35, 45], [0, 0, 75]]) {
      const a = leadField(shells, electrodes90, p);
      const b = leadField(sphere, electrodes90, p);
      const scale = b.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-10 * scale);
    }
  });

  it('is unchanged when electrodes, dipole position and moment are rotated together (spherical symmetry)', () => {
    const m = createHeadModel();
    // rotation by 40° about z then 25° about x
    const cz = Math.cos(0.698), sz = Math.sin(0.698), cx = Math.cos(0.436), sx = Math.sin(0.436);
    const rot = (v: ArrayLike<number>, o = 0): number[] => {
      const x1 = cz * v[o] - sz * v[o + 1];
      const y1 = sz * v[o] + cz * v[o + 1];
      const z1 = v[o + 2];
      return [x1, cx * y1 - sx * z1, sx * y1 + cx * z1];
    };
    const rotated = new Float64Array(electrodes90.length);
    for (let e = 0; e < names.length; e++) rotated.set(rot(electrodes90, 3 * e), 3 * e);
    const p = [12, -25, 40];
    const q = [3, 1, -2];
    const a = dipolePotentials(m, electrodes90, p, q);
    const b = dipolePotentials(m, rotated, rot(p), rot(q));
    for (let e = 0; e < names.length; e++) expect(b[e]).toBeCloseTo(a[e], 10);
  });
});

describe('leadFieldFast', () => {
  it('is used by leadField when the model is created with fast: true', () => {
    const fast = createHeadModel({ fast: true });
    const a = leadField(fast, electrodes90, [5, 10, 40]);
    const b = leadFieldFast(createHeadModel(), electrodes90, [5, 10, 40]);
    expect(Array.from(a)).toEqual(Array.from(b));
  });

  it('equals the exact closed form for the homogeneous sphere', () => {
    const m = createHeadModel({ kind: 'sphere' });
    const a = leadField(m, electrodes90, [5, 10, 40]);
    const b = leadFieldFast(m, electrodes90, [5, 10, 40]);
    expect(Array.from(a)).toEqual(Array.from(b));
  });
});

describe('projectToSphere', () => {
  it('moves each position along its ray to the given radius and gives NaN for the origin', () => {
    const p = projectToSphere(Float64Array.of(3, 4, 0, 0, 0, 0, 0, 0, 2), millimetres(10));
    expect(Array.from(p.subarray(0, 3))).toEqual([6, 8, 0]);
    expect(p.subarray(3, 6).every((v) => Number.isNaN(v))).toBe(true);
    expect(Array.from(p.subarray(6, 9))).toEqual([0, 0, 10]);
  });
});
