import { describe, expect, it } from 'vitest';
import { estimateSecondsLeft, progressAt } from '../../src/state/task-progress.ts';

describe('estimateSecondsLeft', () => {
  it('extrapolates linearly: a quarter done after 10 s leaves 30 s', () => {
    expect(estimateSecondsLeft(0.25, 10)).toBeCloseTo(30, 12);
  });

  it('gives no estimate before 3 % or when done', () => {
    expect(estimateSecondsLeft(0.01, 5)).toBeNull();
    expect(estimateSecondsLeft(1, 5)).toBeNull();
    expect(estimateSecondsLeft(NaN, 5)).toBeNull();
  });
});

describe('progressAt', () => {
  it('clamps the fraction and prefers the engine’s own estimate of time left', () => {
    expect(progressAt('t', 1.5, 0, 1000).fraction).toBe(1);
    expect(progressAt('t', 0.5, 0, 4000).etaSeconds).toBeCloseTo(4, 12);
    expect(progressAt('t', 0.5, 0, 4000, undefined, 12).etaSeconds).toBe(12);
  });
});
