/**
 * The "is it locked to the task?" answer for any choice of events (BIDS events.tsv columns,
 * core/evidence/event-selection.ts): epochs of the component's back-projected activation around the chosen
 * events, optionally one group per value of a column, each with its average, 95 % band and locked share.
 * The arithmetic is the evidence core's (signal/epochs.ts, evidence/time-locking.ts; docs/methods.md §5);
 * this file only chooses what to call, so the focus view can lock to any event without recomputing evidence.
 */
import { selectEvents, splitEvents, type EventSelection, type SelectableEvent } from '../../core/evidence/event-selection.ts';
import { lockedShare } from '../../core/evidence/time-locking.ts';
import { epochMean, epochSem, extractEpochs } from '../../core/signal/epochs.ts';
import { trialStackRows, type EpochSort, type TrialStackInput, type TrialStackRows } from '../plots/trial-stack-rows.ts';

/** Events as the focus view reads them (RecordingEvent fits). */
export interface LockableEvent extends SelectableEvent {
  readonly responseTime?: number;
}

export interface LockedGroup {
  /** The split column's value, or null for the whole selection. */
  readonly value: string | null;
  readonly nEpochs: number;
  /** First row of this group in the trial stack. */
  readonly rowStart: number;
  /** Event-locked average and its 95 % band (mean ± 1.96 SEM), µV. */
  readonly mean: Float64Array;
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** Phase-locked share of single-trial variance (time-locking.ts lockedShare); NaN below 2 epochs. */
  readonly lockedShare: number;
  /** Event-order trials of this group (nEpochs × length) and their response times (s) or null. */
  readonly input: TrialStackInput;
}

export interface LockedView {
  /** s from the event, per column. */
  readonly times: Float64Array;
  readonly length: number;
  readonly nEpochs: number;
  readonly groups: readonly LockedGroup[];
}

/** 1.96: the two-sided 95 % point of the standard normal (any statistics table). */
const Z95 = 1.96;

function groupOf(trace: Float64Array, fs: number, events: readonly LockableEvent[], win: readonly [number, number], value: string | null, rowStart: number): LockedGroup {
  const ep = extractEpochs(trace, fs, events.map((e) => e.onset), win[0], win[1]);
  const mean = epochMean(ep.epochs, ep.nEpochs, ep.length);
  const sem = epochSem(ep.epochs, ep.nEpochs, ep.length);
  const lower = Float64Array.from(mean, (m, j) => m - Z95 * sem[j]);
  const upper = Float64Array.from(mean, (m, j) => m + Z95 * sem[j]);
  const rts = ep.kept.map((k) => events[k].responseTime ?? NaN);
  return {
    value,
    nEpochs: ep.nEpochs,
    rowStart,
    mean,
    lower,
    upper,
    lockedShare: lockedShare(trace, ep.eventSamples, ep.firstOffset, ep.length),
    input: {
      nEpochs: ep.nEpochs,
      length: ep.length,
      data: ep.epochs,
      times: ep.times,
      responseTimes: rts.some(Number.isFinite) ? Float64Array.from(rts) : null,
    },
  };
}

/**
 * Epochs of `trace` (sampled at `fs` Hz) around the selected events, window `win` s (baseline: the part
 * before the event), split by `splitColumn` when given. Null when fewer than 2 epochs fit.
 */
export function lockedView(
  trace: Float64Array,
  fs: number,
  events: readonly LockableEvent[],
  selection: EventSelection,
  splitColumn: string | null,
  win: readonly [number, number],
): LockedView | null {
  const sets: { value: string | null; events: LockableEvent[] }[] = splitColumn
    ? splitEvents(events, selection, splitColumn)
    : [{ value: null, events: selectEvents(events, selection) }];
  const groups: LockedGroup[] = [];
  let row = 0;
  for (const s of sets) {
    const g = groupOf(trace, fs, s.events, win, s.value, row);
    if (g.nEpochs === 0) continue;
    groups.push(g);
    row += g.nEpochs;
  }
  if (row < 2 || groups.length === 0) return null;
  return { times: groups[0].input.times, length: groups[0].input.length, nEpochs: row, groups };
}

/**
 * The trial stack's rows, ordered and blended within each group (trial-stack-rows.ts), the groups one
 * below the other. `sortApplied` is the requested sort when every group could apply it.
 */
export function groupedStackRows(view: LockedView, sort: EpochSort, smoothing: number, amplitudeWindowS: readonly [number, number]): TrialStackRows {
  const rows = new Float64Array(view.nEpochs * view.length);
  const keys = new Float64Array(view.nEpochs);
  const order: number[] = [];
  let applied: EpochSort = sort;
  for (const g of view.groups) {
    const r = trialStackRows(g.input, sort, smoothing, amplitudeWindowS);
    rows.set(r.rows, g.rowStart * view.length);
    keys.set(r.keys, g.rowStart);
    for (const i of r.order) order.push(g.rowStart + i);
    if (r.sortApplied !== sort) applied = r.sortApplied;
  }
  return { rows, order, keys, sortApplied: applied };
}
