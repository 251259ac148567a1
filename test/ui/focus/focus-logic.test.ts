import { describe, expect, it } from 'vitest';
import { backProjectedActivation, mixingColumn, neighbourIndex, strongestChannels } from '../../../src/ui/focus/focus-logic.ts';

describe('neighbourIndex', () => {
  it('steps within 1…n and stops at the ends', () => {
    expect(neighbourIndex(3, 5, 1)).toBe(4);
    expect(neighbourIndex(5, 5, 1)).toBe(5);
    expect(neighbourIndex(1, 5, -1)).toBe(1);
    expect(neighbourIndex(null, 5, 1)).toBe(2);
    expect(neighbourIndex(2, 0, 1)).toBeNull();
  });
});

// 3 channels × 2 components, row-major: A = [[1, 0.5], [-3, 0], [2, 1]]
const A = Float64Array.from([1, 0.5, -3, 0, 2, 1]);

describe('strongestChannels', () => {
  it('orders channels by the magnitude of the map weight', () => {
    expect(strongestChannels(A, 3, 2, 0, 2)).toEqual([1, 2]);
    expect(strongestChannels(A, 3, 2, 1, 3)).toEqual([2, 0, 1]);
  });
  it('skips channels the recording lacks', () => {
    expect(strongestChannels(A, 3, 2, 0, 2, [0, -1, 2])).toEqual([2, 0]);
  });
});

describe('backProjectedActivation', () => {
  it('is A[c,i] · W[i,:] (x − m), worked by hand', () => {
    const W = Float64Array.from([1, 1, 0, 0, 0, 1]); // component 0 = ch0 + ch1
    const X = Float32Array.from([1, 2, 10, 20, 0, 0]); // 3 channels × 2 samples
    const m = Float64Array.from([1, 10, 0]);
    const s = backProjectedActivation(W, A, 3, 2, 0, 1, X, 2, m);
    // s_0 = (1 − 1) + (10 − 10) = 0, then (2 − 1) + (20 − 10) = 11; times A[1,0] = −3
    expect(Array.from(s)).toEqual([-0, -33]);
  });
});

describe('mixingColumn', () => {
  it('reads column i of the row-major mixing matrix', () => {
    expect(Array.from(mixingColumn(A, 3, 2, 1))).toEqual([0.5, 0, 1]);
  });
});
