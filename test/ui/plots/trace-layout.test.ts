import { describe, expect, it } from 'vitest';
import {
  clampWindowStart,
  eventsInWindow,
  formatScale,
  minMaxColumns,
  niceScaleAbove,
  niceScaleBelow,
  niceScaleNearest,
  peakRowSpan,
  robustRowSpan,
  rowCentres,
  stepScale,
} from '../../../src/ui/plots/trace-layout.ts';
import { scaleBarRows } from '../../../src/ui/plots/trace-draw.ts';
import { mulberry32 } from '../../../src/core/evidence/time-locking.ts';

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

/** Standard normal samples by Box–Muller from a seeded uniform generator. */
function gaussian(n: number, seed: number, sd = 1): Float64Array {
  const rand = mulberry32(seed);
  return Float64Array.from({ length: n }, () => sd * Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand()));
}

describe('peakRowSpan', () => {
  it('on Gaussian noise is 2.4 × the 99.5th percentile of |x|: 2.4 × 2.807 σ (standard normal table)', () => {
    const x = gaussian(200_000, 3, 10);
    expect(peakRowSpan(x, x.length) / 10).toBeCloseTo(2.4 * 2.807, 1);
  });
  it('lets a blink fit its row where ±3 robust SD would let it overshoot (blink 3 % of a 10 s window)', () => {
    const fs = 250;
    const x = gaussian(10 * fs, 5, 5);
    // a 0.3 s raised-cosine deflection of 150 µV at 4 s
    for (let t = 0; t < 0.3 * fs; t++) x[4 * fs + t] += 150 * 0.5 * (1 - Math.cos((2 * Math.PI * t) / (0.3 * fs)));
    const robust = robustRowSpan(x, 1, x.length);
    const peak = peakRowSpan(x, x.length);
    expect(150 / robust).toBeGreaterThan(3); // at the robust scale the blink would cross three rows or more
    expect(peak / 2).toBeGreaterThan(0.9 * 150); // at the peak scale the blink reaches (about) the row edge
    expect(peak / 2).toBeLessThan(1.3 * 155);
  });
  it('returns 1 for empty or flat data', () => {
    expect(peakRowSpan(new Float64Array(0), 0)).toBe(1);
    expect(peakRowSpan(new Float64Array(10).fill(3), 10)).toBe(1);
  });
});

describe('1-2-5 scale values (the usual oscilloscope and chart-recorder sequence, common practice)', () => {
  it('rounds up and down onto the sequence', () => {
    expect([0.3, 1, 1.1, 2.5, 7, 37, 120].map(niceScaleAbove)).toEqual([0.5, 1, 2, 5, 10, 50, 200]);
    expect([0.3, 1, 1.1, 2.5, 7, 37, 120].map(niceScaleBelow)).toEqual([0.2, 1, 1, 2, 5, 20, 100]);
  });
  it('steps along the sequence', () => {
    expect(stepScale(10, 1)).toBe(20);
    expect(stepScale(20, 1)).toBe(50);
    expect(stepScale(50, 1)).toBe(100);
    expect(stepScale(100, -1)).toBe(50);
    expect(stepScale(1, -1)).toBe(0.5);
    expect(stepScale(0.5, -1)).toBe(0.2);
  });
  it('writes the value with its unit, never breaking between them', () => {
    expect(formatScale(50)).toBe('50\u00a0µV');
    expect(formatScale(0.2, 'a.u.')).toBe('0.2\u00a0a.u.');
  });
});

describe('scaleBarRows', () => {
  it('puts the shared bar on the last row and one on each row with its own span', () => {
    expect(scaleBarRows({ rowLabels: ['IC', 'a', 'b'], rowSpan: 40, rowSpans: [300, 40, 40] })).toEqual([[0, 300], [2, 40]]);
    expect(scaleBarRows({ rowLabels: ['a', 'b'], rowSpan: 40 })).toEqual([[1, 40]]);
    expect(scaleBarRows({ rowLabels: [], rowSpan: 40 })).toEqual([]);
  });
});

describe('niceScaleNearest', () => {
  it('takes the nearer 1-2-5 value on a log scale', () => {
    expect([110, 160, 140, 3.3, 0.7].map(niceScaleNearest)).toEqual([100, 200, 100, 5, 0.5]); // 3.3: ln(3.3/2) = 0.50 > ln(5/3.3) = 0.42;
  });
});
