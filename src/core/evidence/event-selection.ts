/**
 * Choosing events the BIDS way (BIDS specification v1.11, "Task events": every row of *_events.tsv has
 * onset, duration, optionally trial_type, and any further columns the dataset defines, each described in
 * *_events.json). An event's type is its trial_type (RecordingEvent.label); every other column is a factor
 * the reviewer can filter on (condition = rare) or split the average by (one line per condition). A label
 * is never taken apart: "a/b" is one type, nothing more (docs/methods.md §5).
 *
 * Pure functions over any event shape with `onset`, `label` and optional `columns` / `source`.
 */

/** Event types treated as steps (case-insensitive): "step", "heel…", "gait…", "foot…" (our choice). */
export const STEP_EVENT_PATTERN = /step|heel|gait|foot/i;

/** The fields event selection reads (RecordingEvent and EvidenceEvent both fit). */
export interface SelectableEvent {
  readonly onset: number;
  readonly label: string;
  readonly source?: string;
  readonly columns?: Readonly<Record<string, string>>;
}

/** BIDS writes "n/a" for a cell that does not apply (BIDS specification, "Tabular files"). */
export const NOT_APPLICABLE = 'n/a';

/**
 * A column is offered as a factor when it has 2…MAX_FACTOR_LEVELS distinct values (n/a and empty cells not
 * counted) and fewer distinct values than rows: a column that differs on every row (a sample index, a stimulus
 * file per trial) names trials, it does not group them (our choice).
 */
export const MAX_FACTOR_LEVELS = 24;

/** Columns that locate a row rather than describe it (BIDS "Task events"), never offered as factors. */
const LOCATING_COLUMNS = new Set(['onset', 'duration', 'sample', 'response_time']);

export interface EventFactor {
  /** Column name in events.tsv, e.g. "condition". */
  readonly column: string;
  /** Distinct values in first-seen order (n/a and empty cells left out). */
  readonly values: readonly string[];
  /** How many events carry each value, same order as `values`. */
  readonly counts: readonly number[];
}

export interface EventTypeSummary {
  /** The trial_type value (RecordingEvent.label). */
  readonly type: string;
  readonly count: number;
  /** The factor columns among events of this type. */
  readonly factors: readonly EventFactor[];
}

/** Which events to lock to: one type, optionally narrowed by column = value filters (all must hold). */
export interface EventSelection {
  readonly type: string;
  readonly where?: Readonly<Record<string, string>>;
}

const usable = (e: SelectableEvent) => e.source !== 'boundary' && e.label !== '' && Number.isFinite(e.onset);
const cell = (e: SelectableEvent, column: string): string | null => {
  const v = e.columns?.[column];
  return v === undefined || v === '' || v === NOT_APPLICABLE ? null : v;
};

/** Factor columns (see MAX_FACTOR_LEVELS) among `events`, in the order the columns first appear. */
export function eventFactors(events: readonly SelectableEvent[]): EventFactor[] {
  const levels = new Map<string, Map<string, number>>();
  const rows = new Map<string, number>();
  for (const e of events) {
    if (!usable(e) || !e.columns) continue;
    for (const column of Object.keys(e.columns)) {
      if (LOCATING_COLUMNS.has(column)) continue;
      const v = cell(e, column);
      if (v === null) continue;
      let m = levels.get(column);
      if (!m) levels.set(column, (m = new Map()));
      m.set(v, (m.get(v) ?? 0) + 1);
      rows.set(column, (rows.get(column) ?? 0) + 1);
    }
  }
  const out: EventFactor[] = [];
  for (const [column, m] of levels) {
    if (m.size < 2 || m.size > MAX_FACTOR_LEVELS || m.size >= (rows.get(column) ?? 0)) continue;
    out.push({ column, values: [...m.keys()], counts: [...m.values()] });
  }
  return out;
}

/** Every event type (trial_type value) with its count and factors, most frequent first (ties: first seen). */
export function eventTypes(events: readonly SelectableEvent[]): EventTypeSummary[] {
  const byType = new Map<string, SelectableEvent[]>();
  for (const e of events) {
    if (!usable(e)) continue;
    const list = byType.get(e.label);
    if (list) list.push(e);
    else byType.set(e.label, [e]);
  }
  return [...byType.entries()]
    .map(([type, list], seen) => ({ type, count: list.length, factors: eventFactors(list), seen }))
    .sort((a, b) => b.count - a.count || a.seen - b.seen)
    .map(({ type, count, factors }) => ({ type, count, factors }));
}

/** Whether `e` is of the selection's type and meets every column = value filter. */
export function matchesSelection(e: SelectableEvent, selection: EventSelection): boolean {
  if (!usable(e) || e.label !== selection.type) return false;
  for (const [column, value] of Object.entries(selection.where ?? {})) if (cell(e, column) !== value) return false;
  return true;
}

/** The selected events in time order (boundaries of discontinuous files never selected). */
export function selectEvents<E extends SelectableEvent>(events: readonly E[], selection: EventSelection): E[] {
  return events.filter((e) => matchesSelection(e, selection)).sort((a, b) => a.onset - b.onset);
}

export interface EventGroup<E> {
  /** The column's value shared by the group's events. */
  readonly value: string;
  readonly events: E[];
}

/**
 * The selected events split by the values of `column` (groups in first-seen order, events in time order);
 * events whose cell is n/a or empty are left out.
 */
export function splitEvents<E extends SelectableEvent>(events: readonly E[], selection: EventSelection, column: string): EventGroup<E>[] {
  const groups = new Map<string, E[]>();
  for (const e of selectEvents(events, selection)) {
    const v = cell(e, column);
    if (v === null) continue;
    const list = groups.get(v);
    if (list) list.push(e);
    else groups.set(v, [e]);
  }
  return [...groups.entries()].map(([value, list]) => ({ value, events: list }));
}

/** Whether an event type names steps (heel strikes; STEP_EVENT_PATTERN). */
export const isStepType = (type: string) => STEP_EVENT_PATTERN.test(type);

/** The type epoched by default: the most frequent non-step type (ties: first seen), or null. */
export function defaultEventType(events: readonly SelectableEvent[]): string | null {
  return eventTypes(events).find((t) => !isStepType(t.type) && t.type !== 'boundary')?.type ?? null;
}

/** Plain words for a selection: `tone`, `tone, condition rare`, `step, foot left`. */
export function describeSelection(selection: EventSelection): string {
  const parts = Object.entries(selection.where ?? {}).map(([column, value]) => `${column} ${value}`);
  return [selection.type, ...parts].join(', ');
}

/**
 * The selection written as one string, for a store field or a `<select>` value: the type, then
 * `\tcolumn=value` per filter in column order. Tabs never occur in a TSV cell, so the text parses back.
 */
export function selectionKey(selection: EventSelection): string {
  const where = Object.entries(selection.where ?? {}).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return [selection.type, ...where.map(([c, v]) => `${c}=${v}`)].join('\t');
}

/** The inverse of selectionKey (a plain type name is a selection without filters). */
export function parseSelectionKey(key: string): EventSelection {
  const [type, ...rest] = key.split('\t');
  if (rest.length === 0) return { type };
  const where: Record<string, string> = {};
  for (const part of rest) {
    const eq = part.indexOf('=');
    if (eq > 0) where[part.slice(0, eq)] = part.slice(eq + 1);
  }
  return { type, where };
}

export interface SelectionChoice {
  readonly selection: EventSelection;
  readonly key: string;
  /** describeSelection plus the count, e.g. "tone, condition rare (36)". */
  readonly label: string;
  readonly count: number;
}

/** Every type, then every type × single factor level, as ready-made choices (types most frequent first). */
export function selectionChoices(events: readonly SelectableEvent[]): SelectionChoice[] {
  const out: SelectionChoice[] = [];
  const add = (selection: EventSelection, count: number) =>
    out.push({ selection, key: selectionKey(selection), label: `${describeSelection(selection)} (${count})`, count });
  for (const t of eventTypes(events)) {
    add({ type: t.type }, t.count);
    for (const f of t.factors) f.values.forEach((v, j) => add({ type: t.type, where: { [f.column]: v } }, f.counts[j]));
  }
  return out;
}

/**
 * A name for the group an event belongs to: its type followed by the values of its factor columns among
 * `factorColumns` (n/a left out), e.g. "step, foot left". Used to keep left and right steps apart.
 */
export function eventGroupName(e: SelectableEvent, factorColumns: readonly string[]): string {
  const where: Record<string, string> = {};
  for (const c of factorColumns) {
    const v = cell(e, c);
    if (v !== null) where[c] = v;
  }
  return describeSelection({ type: e.label, where });
}
