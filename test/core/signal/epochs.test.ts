import { describe, expect, it } from 'vitest';
import {
  epochMean,
  epochSem,
  epochWindowMeans,
  extractEpochs,
  latencyToNextEvent,
  reorderEpochRows,
  roundHalfAway,
  smoothEpochRows,
  sortOrderByKey,
} from '../../../src/core/signal/epochs.ts';
// Hand-checkable example computed two ways (numpy indexing and loops) by test/fixtures/evidence/epochs.py.
import fixture from '../../fixtures/evidence/epochs.json';
import { seconds } from '../../../src/core/units.ts';

function fixtureSignal(): Float64Array {
  const x = new Float64Array(1000);
  for (let n = 0; n < 1000; n++) x[n] = Math.sin((2 * Math.PI * 2 * n) / 100) + 0.01 * n;
  return x;
}

describe('extractEpochs', () => {
  const ep = extractEpochs(fixtureSignal(), 100, [1.5, 4.03, 6.57, 9.8], -0.2, 0.5);

  it('keeps the events whose window fits and drops the one running past the end (epochs.json)', () => {
    expect(ep.eventSamples).toEqual(fixture.kept_event_samples);
    expect(ep.kept).toEqual([0, 1, 2]);
    expect(ep.length).toBe(fixture.n_samples_per_epoch);
    expect(ep.times[0]).toBeCloseTo(fixture.times_s_first_last[0], 12);
    expect(ep.times[ep.length - 1]).toBeCloseTo(fixture.times_s_first_last[1], 12);
  });

  it('subtracts the −0.2…0 s baseline of each epoch (epochs.json baseline values)', () => {
    const x = fixtureSignal();
    fixture.kept_event_samples.forEach((e, r) => {
      expect(x[e - 20] - ep.epochs[r * ep.length]).toBeCloseTo(fixture.baseline_values[r], 12);
    });
  });

  it('averages and gives the SEM of the hand-computed example (epochs.json)', () => {
    const mean = epochMean(ep.epochs, ep.nEpochs, ep.length);
    const sem = epochSem(ep.epochs, ep.nEpochs, ep.length);
    for (let j = 0; j < ep.length; j++) {
      expect(mean[j]).toBeCloseTo(fixture.average[j], 12);
      expect(sem[j]).toBeCloseTo(fixture.sem[j], 12);
    }
    expect(mean[20]).toBeCloseTo(fixture.average_at_t0, 12);
    expect(mean[45]).toBeCloseTo(fixture['average_at_t0.25'], 12);
  });

  it('smooths the trial stack over 3 trials, averaging only available rows at the edges (epochs.json)', () => {
    const img = smoothEpochRows(ep.epochs, ep.nEpochs, ep.length, 3);
    fixture.trial_stack_smoothed_w3_row0_first5.forEach((v, j) => expect(img[j]).toBeCloseTo(v, 12));
    // middle row is the mean of all three rows
    const mean = epochMean(ep.epochs, ep.nEpochs, ep.length);
    expect(img[ep.length + 7]).toBeCloseTo(mean[7], 12);
  });

  it('rounds half away from zero with a 1e-9 guard (docs/methods.md §5)', () => {
    expect(roundHalfAway(2.5)).toBe(3);
    expect(roundHalfAway(-2.5)).toBe(-3);
    expect(roundHalfAway(0.285 * 100)).toBe(29); // 28.499999999999996 in binary
    expect(roundHalfAway(-0.2 * 100)).toBe(-20);
  });

  it('leaves the epochs as cut when the baseline is null', () => {
    const raw = extractEpochs(fixtureSignal(), 100, [1.5], -0.2, 0.5, null);
    expect(raw.epochs[0]).toBeCloseTo(fixtureSignal()[130], 15);
  });

  it('returns no epochs, and NaN averages, when no event fits', () => {
    const none = extractEpochs(new Float64Array(10), 100, [0.05], -0.2, 0.5);
    expect(none.nEpochs).toBe(0);
    expect(Number.isNaN(epochMean(none.epochs, 0, none.length)[0])).toBe(true);
  });
});

describe('trial stack sorting', () => {
  it('orders by a key ascending with NaN last and ties in event order', () => {
    expect(sortOrderByKey([3, NaN, 1, 3, 0])).toEqual([4, 2, 0, 3, 1]);
  });

  it('measures the latency to the next response, NaN when none follows within the limit', () => {
    const lat = latencyToNextEvent([1, 5, 9], [0, 1, 2], [1.4, 5.9, 20], 2);
    expect(lat[0]).toBeCloseTo(0.4, 12);
    expect(lat[1]).toBeCloseTo(0.9, 12);
    expect(Number.isNaN(lat[2])).toBe(true);
  });

  it('sorts rows by mean amplitude in a window', () => {
    const x = new Float64Array(400);
    x.fill(5, 100, 110); // event at 100: big
    x.fill(1, 300, 310); // event at 300: small
    const ep = extractEpochs(x, 100, [1, 3], 0, 0.05, null);
    const keys = epochWindowMeans(ep, seconds(0), seconds(0.05));
    expect(Array.from(keys)).toEqual([5, 1]);
    const sorted = reorderEpochRows(ep.epochs, ep.length, sortOrderByKey(keys));
    expect(sorted[0]).toBe(1);
  });
});
