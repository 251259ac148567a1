/**
 * Event selection by BIDS events.tsv columns. Source: BIDS specification v1.11, "Task events" — rows have
 * onset and duration, trial_type names the kind of event, any further column is dataset-defined and
 * described in events.json, and "n/a" marks a cell that does not apply ("Tabular files"). The tables below
 * are written in that form and read through our own events.tsv parser.
 */
import { describe, expect, it } from 'vitest';
import { parseEventsTsv } from '../../../src/core/formats/bids.ts';
import {
  defaultEventType,
  describeSelection,
  eventFactors,
  eventGroupName,
  eventTypes,
  parseSelectionKey,
  selectEvents,
  selectionChoices,
  selectionKey,
  splitEvents,
} from '../../../src/core/evidence/event-selection.ts';

const TSV = [
  'onset\tduration\ttrial_type\tcondition\tfoot\tsample\tresponse_time',
  '1.0\t0\ttone\tstandard\tn/a\t250\tn/a',
  '1.4\t0\tstep\tn/a\tleft\t350\tn/a',
  '2.0\t0\ttone\trare\tn/a\t500\t0.45',
  '2.5\t0\tstep\tn/a\tright\t625\tn/a',
  '3.0\t0\ttone\tstandard\tn/a\t750\tn/a',
  '3.6\t0\tstep\tn/a\tleft\t900\tn/a',
  '4.0\t0\ttone\tstandard\tn/a\t1000\tn/a',
  '4.7\t0\tstep\tn/a\tright\t1175\tn/a',
  '5.0\t0\ttone\trare\tn/a\t1250\t0.52',
  '5.8\t0\tstep\tn/a\tleft\t1450\tn/a',
  '6.2\t0\tstep\tn/a\tright\t1550\tn/a',
].join('\n');

function events() {
  const r = parseEventsTsv(TSV, 'sub-01_task-x_events.tsv');
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('event types and factors (BIDS "Task events")', () => {
  it('lists trial_type values most frequent first, each with the columns that group it', () => {
    const types = eventTypes(events());
    expect(types.map((t) => [t.type, t.count])).toEqual([['step', 6], ['tone', 5]]);
    const tone = types.find((t) => t.type === 'tone')!;
    // Among tones only condition varies: foot is n/a throughout, sample differs on every row (names trials).
    expect(tone.factors).toEqual([{ column: 'condition', values: ['standard', 'rare'], counts: [3, 2] }]);
    const step = types.find((t) => t.type === 'step')!;
    expect(step.factors.map((f) => f.column)).toEqual(['foot']);
  });

  it('never offers a column that differs on every row, nor the locating columns', () => {
    const f = eventFactors(events()).map((x) => x.column);
    expect(f).toEqual(['condition', 'foot']);
    expect(f).not.toContain('sample');
  });

  it('takes a label with "/" as one type (no prefix matching)', () => {
    const ev = [
      { onset: 1, label: 'tone/rare' },
      { onset: 2, label: 'tone/standard' },
      { onset: 3, label: 'tone' },
    ];
    expect(selectEvents(ev, { type: 'tone' }).map((e) => e.onset)).toEqual([3]);
    expect(eventTypes(ev).map((t) => t.type)).toEqual(['tone/rare', 'tone/standard', 'tone']);
  });

  it('skips boundaries of discontinuous recordings and events without a type', () => {
    const ev = [
      { onset: 1, label: 'boundary', source: 'boundary' },
      { onset: 2, label: '' },
      { onset: 3, label: 'go' },
    ];
    expect(eventTypes(ev).map((t) => t.type)).toEqual(['go']);
  });
});

describe('selecting and splitting', () => {
  it('selects a type, narrowed by column = value, in time order', () => {
    const ev = events();
    expect(selectEvents(ev, { type: 'tone' }).map((e) => e.onset)).toEqual([1, 2, 3, 4, 5]);
    expect(selectEvents(ev, { type: 'tone', where: { condition: 'rare' } }).map((e) => e.onset)).toEqual([2, 5]);
    expect(selectEvents(ev, { type: 'tone', where: { condition: 'n/a' } })).toEqual([]);
    expect(selectEvents(ev, { type: 'step', where: { foot: 'left' } }).map((e) => e.onset)).toEqual([1.4, 3.6, 5.8]);
    // response_time stays a number on the event, not a factor
    expect(selectEvents(ev, { type: 'tone', where: { condition: 'rare' } }).map((e) => e.responseTime)).toEqual([0.45, 0.52]);
  });

  it('splits the selection by a column (n/a left out)', () => {
    const groups = splitEvents(events(), { type: 'tone' }, 'condition');
    expect(groups.map((g) => [g.value, g.events.map((e) => e.onset)])).toEqual([
      ['standard', [1, 3, 4]],
      ['rare', [2, 5]],
    ]);
    expect(splitEvents(events(), { type: 'tone' }, 'foot')).toEqual([]);
  });

  it('epochs the most frequent non-step type by default', () => {
    expect(defaultEventType(events())).toBe('tone');
    expect(defaultEventType([{ onset: 1, label: 'step' }])).toBeNull();
  });

  it('writes a selection as one string and reads it back', () => {
    const sel = { type: 'tone', where: { condition: 'rare' } };
    expect(parseSelectionKey(selectionKey(sel))).toEqual(sel);
    expect(parseSelectionKey('tone')).toEqual({ type: 'tone' });
    expect(describeSelection(sel)).toBe('tone, condition rare');
  });

  it('offers every type and every type × level as a choice, with counts', () => {
    const labels = selectionChoices(events()).map((c) => c.label);
    expect(labels).toEqual(['step (6)', 'step, foot left (3)', 'step, foot right (3)', 'tone (5)', 'tone, condition standard (3)', 'tone, condition rare (2)']);
  });

  it('names the group of an event by its type and factor values', () => {
    const step = events()[1];
    expect(eventGroupName(step, ['condition', 'foot'])).toBe('step, foot left');
  });
});
