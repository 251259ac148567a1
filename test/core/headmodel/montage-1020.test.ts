import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { electrodeNameFromLabel, matchMontage, standardPositions } from '../../../src/core/headmodel/montage-1020.ts';

// test/fixtures/headmodel/electrodes_1020.json, written by electrodes_1020.py beside it (numpy 2.4.6, scipy 1.17.1;
// docs/methods.md §10; two constructions there: closed-form trig and equal-chord root finding)
const ref = JSON.parse(readFileSync(fileURLToPath(new URL('../../fixtures/headmodel/electrodes_1020.json', import.meta.url)), 'utf8'));
const P = standardPositions();
const deg = (a: number[], b: number[]) => (Math.acos(Math.min(1, a[0] * b[0] + a[1] * b[1] + a[2] * b[2])) * 180) / Math.PI;

describe('standardPositions (idealised 10-20/10-10 on the unit sphere, RAS)', () => {
  it('matches every position of electrodes_1020.json to 1e-12', () => {
    const names = Object.keys(ref.positions_unit_sphere);
    expect(names.length).toBe(73);
    for (const name of names) {
      const want = ref.positions_unit_sphere[name] as number[];
      const got = P.get(name);
      expect(got, name).toBeDefined();
      for (let k = 0; k < 3; k++) expect(Math.abs(got![k] - want[k]), `${name}[${k}]`).toBeLessThan(1e-12);
    }
    expect(P.size).toBe(names.length);
  });

  it('puts Cz at the vertex and Fpz/Oz 10 % (18°) above the nasion–inion plane (Jasper 1958 percentage rules)', () => {
    expect(P.get('Cz')![2]).toBeCloseTo(1, 15);
    expect(P.get('Fpz')).toEqual([0, expect.closeTo(Math.cos(0.1 * Math.PI), 15), expect.closeTo(Math.sin(0.1 * Math.PI), 15)]);
    expect(P.get('Oz')![2]).toBeCloseTo(Math.sin((18 * Math.PI) / 180), 15);
    expect(deg(P.get('Nz')!, P.get('Fpz')!)).toBeCloseTo(18, 10);
    expect(deg(P.get('Iz')!, P.get('Oz')!)).toBeCloseTo(18, 10);
  });

  it('keeps the 20 % steps of the midline and coronal arcs (36° each) and the docs/methods.md §10 angle table', () => {
    for (const [a, b] of [['Fpz', 'Fz'], ['Fz', 'Cz'], ['Cz', 'Pz'], ['Pz', 'Oz'], ['T7', 'C3'], ['C3', 'Cz'], ['Cz', 'C4'], ['C4', 'T8']])
      expect(deg(P.get(a)!, P.get(b)!)).toBeCloseTo(36, 10);
    for (const [pair, angle] of Object.entries(ref.angles_between_deg as Record<string, number>)) {
      const [a, b] = pair.split('-');
      expect(deg(P.get(a)!, P.get(b)!), pair).toBeCloseTo(angle, 9);
    }
  });

  it('gives unit vectors and mirrors odd (left) and even (right) electrodes in x', () => {
    for (const [name, v] of P) {
      expect(Math.hypot(...v), name).toBeCloseTo(1, 14);
      const m = /^([A-Z]+)(\d)$/.exec(name);
      if (m && +m[2] % 2 === 1) {
        const mirror = P.get(`${m[1]}${+m[2] + 1}`)!;
        expect(mirror[0]).toBeCloseTo(-v[0], 14);
        expect(mirror[1]).toBeCloseTo(v[1], 14);
      }
    }
  });
});

describe('matchMontage', () => {
  it('matches case-insensitively with the old/new aliases T3/T7, T4/T8, T5/P7, T6/P8 (ACNS Guideline 2)', () => {
    const m = matchMontage(['FP1', 'cz', 'T3', 'T4', 'T5', 'T6', 'EEG Oz', 'Pz-REF']);
    expect(m.unmatched).toEqual([]);
    const row = (i: number) => Array.from(m.positions.subarray(3 * i, 3 * i + 3));
    expect(row(0)).toEqual(P.get('Fp1'));
    expect(row(2)).toEqual(P.get('T7'));
    expect(row(3)).toEqual(P.get('T8'));
    expect(row(4)).toEqual(P.get('P7'));
    expect(row(5)).toEqual(P.get('P8'));
    expect(row(6)).toEqual(P.get('Oz'));
    expect(row(7)).toEqual(P.get('Pz'));
  });

  it('reports unknown labels with NaN rows instead of guessing', () => {
    const m = matchMontage(['VEOG', 'Fp1-F3', 'Cz', 'EKG']);
    expect(m.matched).toEqual(['Cz']);
    expect(m.unmatched).toEqual(['VEOG', 'Fp1-F3', 'EKG']);
    expect(Array.from(m.positions.subarray(0, 3)).every(Number.isNaN)).toBe(true);
    expect(electrodeNameFromLabel(' EEG Fz ')).toBe('Fz');
  });
});
