import { describe, expect, it } from 'vitest';
import { amariIndex, amariIndexOf } from '../../../src/core/ica/amari.ts';
import fixture from '../../fixtures/ica/amari.json' with { type: 'json' };

// Reference: amari.json from the project's reference checks (loops vs numpy, Amari, Cichocki & Yang 1996).
describe('amariIndex', () => {
  for (const [name, c] of Object.entries(fixture.cases)) {
    it(`reproduces the reference values for ${name}`, () => {
      const n = c.P.length;
      const P = Float64Array.from(c.P.flat());
      const r = amariIndex(P, n);
      expect(r.raw).toBeCloseTo(c.E_raw, 12);
      expect(r.normalised).toBeCloseTo(c['E_normalised_2n(n-1)'], 12);
      expect(amariIndex(P, n, { squared: true }).raw).toBeCloseTo(c.E_raw_squared_variant, 12);
    });
  }
  it('is zero for W = inverse of A (P = I) via amariIndexOf', () => {
    const A = Float64Array.from([1, 2, 3, 4]);
    const W = Float64Array.from([-2, 1, 1.5, -0.5]);
    expect(amariIndexOf(W, A, 2, 2).raw).toBeCloseTo(0, 14);
  });
});
