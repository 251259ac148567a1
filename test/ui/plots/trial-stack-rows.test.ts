import { describe, expect, it } from 'vitest';
import { trialStackRows, robustLimit, rowWindowMeans } from '../../../src/ui/plots/trial-stack-rows.ts';
import { syntheticEvidence } from './synthetic-evidence.ts';

const img = syntheticEvidence().trialStack!;
// Row r (event order) is (r + 1) · (j − 2) for column j, times −0.2 … 0.5 s in 0.1 s steps.

describe('trialStackRows', () => {
  it('keeps event order when asked', () => {
    const r = trialStackRows(img, 'order', 1);
    expect(r.order).toEqual([0, 1, 2, 3]);
    expect(r.rows[8 + 7]).toBe(2 * 5);
  });
  it('sorts by response time ascending with trials lacking one last (common practice for trial stacks)', () => {
    const r = trialStackRows(img, 'response-time', 1);
    expect(r.order).toEqual([1, 3, 0, 2]);
    expect(Array.from(r.keys.slice(0, 3))).toEqual([0.2, 0.3, 0.5]);
    expect(r.sortApplied).toBe('response-time');
  });
  it('falls back to event order when there are no response times', () => {
    const r = trialStackRows({ ...img, responseTimes: null }, 'response-time', 1);
    expect(r.sortApplied).toBe('order');
    expect(r.order).toEqual([0, 1, 2, 3]);
  });
  it('sorts by mean amplitude in a window, hand-computed', () => {
    // window 0.1–0.3 s = columns 3, 4, 5 → mean (r+1)·2 for row r; make row 2 negative to change the order
    const data = img.data.slice();
    for (let j = 0; j < 8; j++) data[16 + j] = -data[16 + j];
    const r = trialStackRows({ ...img, data }, 'amplitude', 1, [0.1, 0.3]);
    expect(r.order).toEqual([2, 0, 1, 3]);
    expect(r.keys[0]).toBeCloseTo(-6, 12);
  });
  it('smooths over neighbouring displayed rows with a centred moving average (docs/methods.md §5)', () => {
    const r = trialStackRows(img, 'order', 3);
    // row 1 = mean of rows 0, 1, 2 → (1 + 2 + 3)/3 · (j − 2) = 2 (j − 2)
    expect(r.rows[8 + 7]).toBeCloseTo(10, 12);
    // edge row 0 averages rows 0 and 1 only → 1.5 (j − 2)
    expect(r.rows[7]).toBeCloseTo(7.5, 12);
  });
});

describe('rowWindowMeans', () => {
  it('is NaN for a window without columns', () => {
    expect(Number.isNaN(rowWindowMeans(img, 5, 6)[0])).toBe(true);
  });
});

describe('robustLimit', () => {
  it('takes the 98th percentile of |value| with linear interpolation (numpy default method)', () => {
    const v = Float64Array.from({ length: 101 }, (_, i) => (i % 2 ? -i : i));
    expect(robustLimit(v)).toBeCloseTo(98, 12);
  });
  it('never returns zero', () => {
    expect(robustLimit([0, 0, 0])).toBe(1);
    expect(robustLimit([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 5], 0.5)).toBe(5);
  });
});
