import { describe, expect, it } from 'vitest';
import type { RecordingEvent } from '../../../src/core/recording.ts';
import {
  defaultTraceChannels,
  eventOnsets,
  formatValue,
  defaultEventLabel,
  regionBandPower,
  regionChannels,
  regionSpectra,
  removedSetFromDecisions,
} from '../../../src/ui/preview/preview-logic.ts';

const ev = (onset: number, label: string, source: RecordingEvent['source'] = 'events-tsv'): RecordingEvent => ({ onset, duration: 0, label, source });

describe('removedSetFromDecisions', () => {
  it('turns 1-based remove verdicts into 0-based indices and ignores the rest', () => {
    const d = {
      1: { verdict: 'remove' as const, reason: 'blink' as const, note: '' },
      2: { verdict: 'keep' as const, reason: null, note: '' },
      5: { verdict: 'remove' as const, reason: null, note: '' },
      9: { verdict: 'remove' as const, reason: null, note: '' },
    };
    expect([...removedSetFromDecisions(d, 8)].sort()).toEqual([0, 4]);
  });
});

describe('regionChannels', () => {
  const labels = ['Fp1', 'Cz', 'Pz', 'Oz', 'O1'];
  it('uses the chosen labels when they exist', () => {
    expect(regionChannels('erp', ['oz', 'nope'], labels)).toEqual([3]);
  });
  it('falls back to centro-parietal sites for ERPs and posterior sites for oscillations', () => {
    expect(regionChannels('erp', [], labels)).toEqual([2, 1]);
    expect(regionChannels('oscillations', [], labels)).toEqual([3, 4, 2]);
  });
  it('takes the first present channel when no default exists', () => {
    expect(regionChannels('erp', [], ['A', 'B'], [-1, 0])).toEqual([1]);
  });
});

describe('events (chosen by BIDS events.tsv columns)', () => {
  const tone = (onset: number, condition: string): RecordingEvent => ({ onset, duration: 0, label: 'tone', source: 'events-tsv', columns: { condition } });
  const events = [
    tone(1, 'rare'), ev(2, 'target'), tone(3, 'standard'), ev(3.5, 'step'), ev(3.9, 'step'), ev(4.2, 'step'),
    ev(5, 'gap', 'boundary'), ev(6, 'gap', 'boundary'), ev(7, 'gap', 'boundary'), ev(8, 'tone/rare', 'annotation'),
  ];
  it('epochs the most frequent trial_type, leaving out steps and boundaries, as the evidence does', () => {
    expect(defaultEventLabel(events)).toBe('tone');
    expect(defaultEventLabel([])).toBeNull();
  });
  it('lists the onsets of a type, or of a type with a column value; a "/" label is its own type', () => {
    expect(eventOnsets(events, 'tone')).toEqual([1, 3]);
    expect(eventOnsets(events, 'tone\tcondition=rare')).toEqual([1]);
    expect(eventOnsets(events, 'tone/rare')).toEqual([8]);
    expect(eventOnsets(events, 'target')).toEqual([2]);
    expect(eventOnsets(events, null)).toEqual([]);
  });
});

describe('regionSpectra', () => {
  it('finds a 10 Hz sine of amplitude 2 µV as power A²/2 = 2 µV² in the alpha band (Parseval, docs/methods.md §1)', () => {
    const fs = 256;
    const x = Float64Array.from({ length: 10 * fs }, (_, j) => 2 * Math.sin((2 * Math.PI * 10 * j) / fs));
    const half = x.map((v) => v / 2);
    const s = regionSpectra(x, half, fs);
    const bp = regionBandPower(s, [8, 12]);
    expect(bp.before).toBeCloseTo(2, 2);
    expect(bp.after).toBeCloseTo(0.5, 3);
  });
});

describe('formatValue and defaultTraceChannels', () => {
  it('formats finite numbers and says n/a otherwise', () => {
    expect(formatValue(3.14159)).toBe('3.14');
    expect(formatValue(NaN)).toBe('n/a');
  });
  it('takes the first present channels', () => {
    expect(defaultTraceChannels([0, -1, 2, 3], 2)).toEqual([0, 2]);
  });
});

describe('eventChoices', () => {
  it('offers each type, then the type with each column value, most frequent first, without boundaries', async () => {
    const { eventChoices } = await import('../../../src/ui/preview/RegionControls.tsx');
    const t = (onset: number, condition: string): RecordingEvent => ({ onset, duration: 0, label: 'tone', source: 'events-tsv', columns: { condition } });
    const events = [t(1, 'rare'), t(2, 'standard'), t(3, 'standard'), ev(4, 'gap', 'boundary')];
    expect(eventChoices(events).map((c) => c.label)).toEqual(['tone (3)', 'tone, condition rare (1)', 'tone, condition standard (2)']);
  });
});
