/**
 * The trial stack (one row per trial, time across, amplitude as colour) with the event-locked average
 * beneath it on the same time axis, for any events the reviewer picks by their BIDS events.tsv columns:
 * a trial_type, optionally only one value of another column (condition rare), optionally split by a
 * column (one block of rows and one average line per value). Computed here from the component's trace
 * (locked-view.ts), so it follows every choice without recomputing the evidence.
 */
import { useMemo } from 'react';
import { describeSelection, eventTypes, parseSelectionKey, selectionKey, type EventSelection } from '../../core/evidence/event-selection.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { TrialStack } from '../plots/TrialStack.tsx';
import { ErpPlot } from '../plots/ErpPlot.tsx';
import { robustLimit, type EpochSort } from '../plots/trial-stack-rows.ts';
import { groupedStackRows, lockedView, type LockableEvent } from './locked-view.ts';
import { trimZero } from './focus-logic.ts';
import { useElementWidth } from '../plots/useElementWidth.ts';

export interface EpochSettings {
  readonly sort: EpochSort;
  /** Moving-average width over trials (1 = none). */
  readonly smoothing: number;
  /** Window for the amplitude sort, s from the event. */
  readonly amplitudeWindowS: readonly [number, number];
  /** The events locked to (event-selection.ts selectionKey); null = the evidence's epoched type. */
  readonly lockTo: string | null;
  /** events.tsv column to split by, or null. */
  readonly splitBy: string | null;
}

export interface TrialStackPanelProps {
  /** The component's back-projected trace over the whole recording, µV, at `channel`. */
  readonly trace: Float64Array | null;
  readonly sampleRate: number;
  readonly events: readonly LockableEvent[];
  /** Used when settings.lockTo is null (the evidence's epoched event), or null without events. */
  readonly defaultLockTo: string | null;
  readonly window: readonly [number, number];
  readonly channel: string;
  readonly settings: EpochSettings;
  readonly onSettings: (patch: Partial<EpochSettings>) => void;
  readonly context: string;
}


export function TrialStackPanel({ trace, sampleRate, events, defaultLockTo, window, channel, settings, onSettings, context }: TrialStackPanelProps) {
  const types = useMemo(() => eventTypes(events), [events]);
  const [box, boxWidth] = useElementWidth<HTMLDivElement>(440);
  const WIDTH = Math.max(380, Math.min(620, boxWidth));
  // A choice made on another recording whose types differ falls back to the default.
  const chosen = settings.lockTo !== null && types.some((t) => t.type === parseSelectionKey(settings.lockTo!).type) ? settings.lockTo : null;
  const key = chosen ?? defaultLockTo;
  const selection: EventSelection | null = key ? parseSelectionKey(key) : null;
  const type = types.find((t) => t.type === selection?.type) ?? null;
  const splitBy = settings.splitBy && type?.factors.some((f) => f.column === settings.splitBy) ? settings.splitBy : null;
  const view = useMemo(
    () => (trace && selection ? lockedView(trace, sampleRate, events, selection, splitBy, window) : null),
    [trace, sampleRate, events, key, splitBy, window],
  );
  const rows = useMemo(
    () => (view ? groupedStackRows(view, settings.sort, settings.smoothing, settings.amplitudeWindowS) : null),
    [view, settings.sort, settings.smoothing, settings.amplitudeWindowS],
  );
  const limit = useMemo(() => (rows ? robustLimit(rows.rows) : 1), [rows]);
  const hasReplies = view?.groups.some((g) => g.input.responseTimes) ?? false;
  const filterValue = selection?.where ? Object.entries(selection.where).map(([c, v]) => `${c}=${v}`)[0] ?? '' : '';
  const words = selection ? describeSelection(selection) : 'no events';

  const chooseType = (t: string) => onSettings({ lockTo: selectionKey({ type: t }), splitBy: null });
  const chooseFilter = (v: string) => {
    if (!selection) return;
    if (!v) return onSettings({ lockTo: selectionKey({ type: selection.type }) });
    const eq = v.indexOf('=');
    onSettings({ lockTo: selectionKey({ type: selection.type, where: { [v.slice(0, eq)]: v.slice(eq + 1) } }) });
  };

  const controls =
    types.length > 0 ? (
      <>
        <label>
          Lock to{' '}
          <select value={selection?.type ?? ''} onChange={(e) => chooseType(e.target.value)} data-testid="focus-lock-type">
            {types.map((t) => (
              <option key={t.type} value={t.type}>{t.type} ({t.count})</option>
            ))}
          </select>
        </label>
        {type && type.factors.length > 0 ? (
          <>
            <label>
              Only{' '}
              <select value={filterValue} onChange={(e) => chooseFilter(e.target.value)} data-testid="focus-lock-only">
                <option value="">every {type.type}</option>
                {type.factors.flatMap((f) =>
                  f.values.map((v, j) => (
                    <option key={`${f.column}=${v}`} value={`${f.column}=${v}`}>{f.column} {v} ({f.counts[j]})</option>
                  )),
                )}
              </select>
            </label>
            <label>
              Split by{' '}
              <select value={splitBy ?? ''} onChange={(e) => onSettings({ splitBy: e.target.value || null })} data-testid="focus-lock-split">
                <option value="">no split</option>
                {type.factors.map((f) => (
                  <option key={f.column} value={f.column}>{f.column}</option>
                ))}
              </select>
            </label>
          </>
        ) : null}
        <label>
          Trials from top{' '}
          <select value={settings.sort} onChange={(e) => onSettings({ sort: e.target.value as EpochSort })} data-testid="focus-trial-order">
            <option value="order">as they happened</option>
            <option value="response-time" disabled={!hasReplies}>fastest reply first</option>
            <option value="amplitude">largest in a time span</option>
          </select>
        </label>
        {settings.sort === 'amplitude' ? (
          <span className="window-inputs">
            <input
              type="number" step={0.05} aria-label="time span start (s)" value={settings.amplitudeWindowS[0]}
              onChange={(e) => onSettings({ amplitudeWindowS: [Number(e.target.value), settings.amplitudeWindowS[1]] })}
            />
            –
            <input
              type="number" step={0.05} aria-label="time span end (s)" value={settings.amplitudeWindowS[1]}
              onChange={(e) => onSettings({ amplitudeWindowS: [settings.amplitudeWindowS[0], Number(e.target.value)] })}
            />{' '}
            s
          </span>
        ) : null}
        <label>
          Blend each row with neighbours{' '}
          <input
            type="range" min={1} max={15} step={1} value={settings.smoothing}
            onChange={(e) => onSettings({ smoothing: Number(e.target.value) })}
            aria-valuetext={settings.smoothing === 1 ? 'off' : `${settings.smoothing} rows`}
          />{' '}
          {settings.smoothing === 1 ? 'off' : `${settings.smoothing} rows`}
        </label>
      </>
    ) : null;

  const groups = view?.groups ?? [];
  return (
    <ExportablePanel title="Trial stack and average" context={context} testId="focus-trial-stack" className="panel-epochs" controls={controls}>
      <div ref={box} className="trace-box" />
      {view && rows ? (
        <div data-testid="focus-trial-summary" data-epochs={view.nEpochs} data-groups={groups.length}>
          <TrialStack
            rows={rows} nEpochs={view.nEpochs} length={view.length} times={view.times} maxAbs={limit} width={WIDTH} height={210}
            groups={groups.length > 1 ? groups.map((g) => ({ label: g.value ?? '', start: g.rowStart, count: g.nEpochs })) : undefined}
          />
          {rows.sortApplied !== settings.sort ? <p className="note">No reply times for these events; trials shown as they happened.</p> : null}
          <ErpPlot
            times={view.times}
            series={groups.map((g) => ({ values: g.mean, label: g.value === null ? 'average' : `${g.value} (${g.nEpochs})` }))}
            band={groups.length === 1 ? { lower: groups[0].lower, upper: groups[0].upper } : null}
            width={WIDTH - 50}
            height={140}
            title={`Average of ${view.nEpochs} trials around ${words}`}
          />
          <p className="note" data-testid="focus-lock-words">
            {view.nEpochs} trials around “{words}”{splitBy ? `, split by ${splitBy}` : ''}, at {channel} (µV, before-event mean removed).{' '}
            {groups.length === 1 ? 'Shaded: 95\u00a0% band (mean ± 1.96 SEM). ' : ''}
            Locked share of trial variance:{' '}
            {groups.map((g) => `${g.value === null ? '' : `${g.value} `}${Number.isFinite(g.lockedShare) ? `${trimZero((Math.max(0, g.lockedShare) * 100).toFixed(0))}\u00a0%` : 'n/a'}`).join(', ')}.
          </p>
        </div>
      ) : (
        <p data-testid="focus-trial-summary" data-epochs={0}>
          {types.length === 0 ? 'No events in this recording to lock to.' : `Fewer than two “${words}” trials fit in the recording.`}
        </p>
      )}
    </ExportablePanel>
  );
}
