/**
 * The ICA progress model (src/core/ica/progress-model.ts, issue 12): the fraction never runs backwards and the
 * time estimate does not swing when the convergence measure jumps (checked on synthetic traces: the facts
 * checked are monotonicity and bounds, ours).
 */
import { describe, expect, it } from 'vitest';
import { createIcaProgressModel } from '../../../src/core/ica/progress-model.ts';

describe('createIcaProgressModel', () => {
  it('fraction is monotone in [0, 1] although the measure rises and falls', () => {
    const m = createIcaProgressModel(200);
    let last = 0;
    for (let it = 1; it <= 60; it++) {
      const conv = 1e-2 * 10 ** (-it / 12) * (it % 7 === 0 ? 30 : 1); // geometric with spikes
      m.update(it, conv, 1e-6, it * 0.1);
      expect(m.fraction).toBeGreaterThanOrEqual(last);
      expect(m.fraction).toBeLessThanOrEqual(1);
      last = m.fraction;
    }
    expect(last).toBeGreaterThan(0.5);
  });
  it('time estimate tracks a steady geometric decline and does not jump when the measure spikes', () => {
    const m = createIcaProgressModel(500);
    // 0.1 s per iteration, one decade per 10 iterations from 1e-2 to 1e-6: 40 iterations in all.
    for (let it = 1; it <= 20; it++) m.update(it, 1e-2 * 10 ** (-it / 10), 1e-6, it * 0.1);
    const before = m.etaSeconds!;
    expect(before).toBeGreaterThan(1.5); // 20 iterations left ≈ 2 s
    expect(before).toBeLessThan(2.5);
    m.update(21, 1e-2, 1e-6, 2.1); // the measure jumps back up
    const after = m.etaSeconds!;
    expect(Math.abs(after - before)).toBeLessThan(0.3); // the smallest measure so far did not change
    expect(after).toBeGreaterThanOrEqual(0);
  });
  it('no estimate before two iterations; the budget caps the estimate', () => {
    const m = createIcaProgressModel(10);
    m.update(1, 1e-2, 1e-6, 1);
    expect(m.etaSeconds).toBeNull();
    for (let it = 2; it <= 5; it++) m.update(it, 1e-2, 1e-6, it); // no progress at all
    expect(m.etaSeconds!).toBeLessThanOrEqual(5 * 1 + 1e-9 + 5);
    expect(m.fraction).toBeCloseTo(0.5, 10); // budget floor: 5 of 10 iterations
  });
});
