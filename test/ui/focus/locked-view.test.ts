/**
 * The focus view's event-locked answer for any BIDS event selection. Checks are worked by hand from the
 * epoch rule of docs/methods.md §5 (event sample round(onset · fs), window inclusive, baseline = mean before
 * the event) and the locked-share property stated in time-locking.ts (identical trials give 1).
 */
import { describe, expect, it } from 'vitest';
import { groupedStackRows, lockedView, type LockableEvent } from '../../../src/ui/focus/locked-view.ts';

const fs = 10;
// A trace that is 0 except a bump of height h at 0.1–0.2 s after each tone; rare tones bump 3, standard 1.
const trace = new Float64Array(200);
const tone = (onset: number, condition: string, rt?: number): LockableEvent => ({
  onset, label: 'tone', source: 'events-tsv', columns: { condition }, ...(rt !== undefined ? { responseTime: rt } : {}),
});
const events: LockableEvent[] = [tone(2, 'standard'), tone(5, 'rare', 0.4), tone(8, 'standard'), tone(11, 'rare', 0.3), tone(14, 'standard'), { onset: 16, label: 'step', columns: { foot: 'left' } }];
for (const e of events) {
  if (e.label !== 'tone') continue;
  const h = e.columns!.condition === 'rare' ? 3 : 1;
  const s = Math.round(e.onset * fs);
  trace[s + 1] = h;
  trace[s + 2] = h;
}
const WIN = [-0.2, 0.5] as const;

describe('lockedView', () => {
  it('averages the chosen type: (3·1 + 2·3) / 5 = 1.8 at 0.1 and 0.2 s, 0 elsewhere', () => {
    const v = lockedView(trace, fs, events, { type: 'tone' }, null, WIN)!;
    expect(v.nEpochs).toBe(5);
    expect(v.length).toBe(8);
    expect(Array.from(v.times, (t) => +t.toFixed(3))).toEqual([-0.2, -0.1, 0, 0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(Array.from(v.groups[0].mean, (m) => +m.toFixed(9))).toEqual([0, 0, 0, 1.8, 1.8, 0, 0, 0]);
  });

  it('narrows by a column value and splits by a column, one group per value', () => {
    const rare = lockedView(trace, fs, events, { type: 'tone', where: { condition: 'rare' } }, null, WIN)!;
    expect(rare.nEpochs).toBe(2);
    expect(rare.groups[0].mean[3]).toBeCloseTo(3, 12);
    // Identical trials: all variance is locked (share 1, time-locking.ts).
    expect(rare.groups[0].lockedShare).toBeCloseTo(1, 12);
    const split = lockedView(trace, fs, events, { type: 'tone' }, 'condition', WIN)!;
    expect(split.groups.map((g) => [g.value, g.nEpochs, g.rowStart, +g.mean[3].toFixed(9)])).toEqual([
      ['standard', 3, 0, 1],
      ['rare', 2, 3, 3],
    ]);
    // No spread between identical trials: the 95 % band collapses onto the mean.
    expect(split.groups[1].upper[3]).toBeCloseTo(3, 12);
    expect(split.groups[1].input.responseTimes).toEqual(Float64Array.from([0.4, 0.3]));
    expect(split.groups[0].input.responseTimes).toBeNull();
  });

  it('returns null when fewer than 2 epochs fit', () => {
    expect(lockedView(trace, fs, events, { type: 'step' }, null, WIN)).toBeNull();
    expect(lockedView(trace, fs, events, { type: 'nothing' }, null, WIN)).toBeNull();
  });
});

describe('groupedStackRows', () => {
  it('orders trials within each group and keeps the groups one below the other', () => {
    const split = lockedView(trace, fs, events, { type: 'tone' }, 'condition', WIN)!;
    const r = groupedStackRows(split, 'response-time', 1, [0, 0.5]);
    // standard tones have no response times, so that group stays in event order and the sort falls back there
    expect(r.order).toEqual([0, 1, 2, 4, 3]);
    expect(r.sortApplied).toBe('order');
    expect(r.rows.length).toBe(5 * 8);
    expect(r.rows[3 * 8 + 3]).toBe(3); // first row of the rare group
  });
});
