import { describe, expect, it } from 'vitest';
import { clampWindowStart, eventsInWindow, minMaxColumns, robustRowSpan, rowCentres } from '../../../src/ui/plots/trace-layout.ts';

describe('rowCentres', () => {
  it('spreads rows evenly between top and bottom', () => {
    expect(Array.from(rowCentres(4, 0, 100))).toEqual([12.5, 37.5, 62.5, 87.5]);
  });
});

describe('minMaxColumns', () => {
  it('keeps every peak when decimating', () => {
    const x = Float64Array.from([0, 5, 0, 0, -7, 0, 1, 2]);
    const { min, max } = minMaxColumns(x, 0, 8, 2);
    expect(Array.from(max)).toEqual([5, 2]);
    expect(Array.from(min)).toEqual([0, -7]);
  });
  it('reads a window inside a longer channel-major buffer', () => {
    const x = Float64Array.from([9, 9, 1, 3, 2, 4, 9, 9]);
    const { min, max } = minMaxColumns(x, 2, 6, 2);
    expect(Array.from(min)).toEqual([1, 2]);
    expect(Array.from(max)).toEqual([3, 4]);
  });
});

describe('robustRowSpan', () => {
  it('is six normal-consistent MADs (1.4826 · MAD, common practice) of the rows', () => {
    // one row: values −1, 0, 1 → median 0, MAD 1 → span 6 · 1.4826
    expect(robustRowSpan([-1, 0, 1], 1, 3)).toBeCloseTo(6 * 1.4826, 12);
  });
  it('ignores one wild spike', () => {
    expect(robustRowSpan([-1, 0, 1, 0, 1000], 1, 5)).toBeLessThan(10);
  });
  it('returns 1 for flat data', () => {
    expect(robustRowSpan([2, 2, 2], 1, 3)).toBe(1);
  });
});

describe('eventsInWindow and clampWindowStart', () => {
  it('keeps the events inside [t0, t1) in time order', () => {
    const ev = [{ onset: 5, label: 'b' }, { onset: 1, label: 'a' }, { onset: 10, label: 'c' }];
    expect(eventsInWindow(ev, 1, 10).map((e) => e.label)).toEqual(['a', 'b']);
  });
  it('keeps the window inside the recording', () => {
    expect(clampWindowStart(95, 10, 100)).toBe(90);
    expect(clampWindowStart(-3, 10, 100)).toBe(0);
    expect(clampWindowStart(4, 10, 6)).toBe(0);
  });
});

describe('event markers (chosen by BIDS events.tsv columns)', () => {
  const ev = [
    { onset: 1, label: 'tone', source: 'events-tsv', columns: { condition: 'rare' } },
    { onset: 2, label: 'step', source: 'events-tsv', columns: { condition: 'n/a' } },
    { onset: 3, label: 'tone', source: 'events-tsv', columns: { condition: 'standard' } },
    { onset: 4, label: 'boundary', source: 'boundary' },
    { onset: 5, label: 'tone/rare', source: 'annotation' },
  ];
  it('keeps all events, none, or those of the chosen types and column values; a "/" label is its own type', async () => {
    const { markerEvents } = await import('../../../src/ui/plots/trace-layout.ts');
    const { selectionKey } = await import('../../../src/core/evidence/event-selection.ts');
    expect(markerEvents(ev, null).map((e) => e.onset)).toEqual([1, 2, 3, 5]);
    expect(markerEvents(ev, new Set())).toEqual([]);
    expect(markerEvents(ev, new Set(['tone'])).map((e) => e.onset)).toEqual([1, 3]);
    expect(markerEvents(ev, new Set([selectionKey({ type: 'tone', where: { condition: 'rare' } })])).map((e) => e.onset)).toEqual([1]);
  });
});
