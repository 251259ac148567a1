import { describe, expect, it } from 'vitest';
import { positionsForRows, rowsForLabels } from '../../../src/ui/plots/montage-positions.ts';

describe('rowsForLabels', () => {
  it('finds each decomposition channel in the recording regardless of case and padding, −1 when absent', () => {
    expect(Array.from(rowsForLabels(['Cz', 'fp1', 'Oz'], ['FP1 ', 'EOG', 'cz']))).toEqual([2, 0, -1]);
  });
});

describe('positionsForRows', () => {
  it('copies the rows in the new order and writes NaN for missing channels', () => {
    const pos = Float64Array.from([1, 0, 0, 0, 1, 0]);
    const out = positionsForRows(Int32Array.from([1, -1, 0]), pos);
    expect(Array.from(out.slice(0, 3))).toEqual([0, 1, 0]);
    expect(out[3]).toBeNaN();
    expect(Array.from(out.slice(6))).toEqual([1, 0, 0]);
  });
  it('gives all NaN when the recording has no positions', () => {
    expect(positionsForRows(Int32Array.from([0]), undefined)[0]).toBeNaN();
  });
});
