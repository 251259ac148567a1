import { describe, expect, it } from 'vitest';
import { fastLogCosh, fastTanh } from '../../../src/core/ica/fast-tanh.ts';

describe('fastTanh', () => {
  it('stays within 3e-8 of Math.tanh on a 1e-4 grid over [-20, 20] (the documented accuracy)', () => {
    let worst = 0;
    for (let x = -20; x <= 20; x += 1e-4) worst = Math.max(worst, Math.abs(fastTanh(x) - Math.tanh(x)));
    expect(worst).toBeLessThan(3e-8);
  });
  it('is odd and saturates at ±1 for huge arguments', () => {
    expect(fastTanh(0)).toBe(0);
    expect(fastTanh(-0.7)).toBe(-fastTanh(0.7));
    expect(Math.abs(fastTanh(1e6) - 1)).toBeLessThan(3e-8);
    expect(Number.isNaN(fastTanh(NaN))).toBe(true);
  });
});

describe('fastLogCosh', () => {
  it('matches ln(cosh x) computed as |x| - ln 2 + log1p(exp(-2|x|)) within 1e-9', () => {
    let worst = 0;
    for (let x = -25; x <= 25; x += 1.37e-3) {
      const a = Math.abs(x);
      worst = Math.max(worst, Math.abs(fastLogCosh(x) - (a - Math.LN2 + Math.log1p(Math.exp(-2 * a)))));
    }
    expect(worst).toBeLessThan(1e-9);
    expect(fastLogCosh(0)).toBeCloseTo(0, 12);
  });
});
