/**
 * The trial stack (sortable by event order, response time or amplitude in a window; smoothing over
 * trials; colour bar) with the event-locked average and its 95 % band beneath, on the same time axis.
 */
import { useMemo } from 'react';
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { TrialStack } from '../plots/TrialStack.tsx';
import { ErpPlot } from '../plots/ErpPlot.tsx';
import { trialStackRows, robustLimit, type EpochSort } from '../plots/trial-stack-rows.ts';

export interface EpochSettings {
  readonly sort: EpochSort;
  /** Moving-average width over trials (1 = none). */
  readonly smoothing: number;
  /** Window for the amplitude sort, s from the event. */
  readonly amplitudeWindowS: readonly [number, number];
}

export interface TrialStackPanelProps {
  readonly evidence: ComponentEvidence;
  readonly settings: EpochSettings;
  readonly onSettings: (patch: Partial<EpochSettings>) => void;
  readonly context: string;
}

const WIDTH = 400;

export function TrialStackPanel({ evidence, settings, onSettings, context }: TrialStackPanelProps) {
  const img = evidence.trialStack;
  const erp = evidence.erp;
  const rows = useMemo(
    () => (img ? trialStackRows(img, settings.sort, settings.smoothing, settings.amplitudeWindowS) : null),
    [img, settings.sort, settings.smoothing, settings.amplitudeWindowS],
  );
  const limit = useMemo(() => (rows ? robustLimit(rows.rows) : 1), [rows]);
  const controls = img ? (
    <>
      <label>
        Trials from top{' '}
        <select value={settings.sort} onChange={(e) => onSettings({ sort: e.target.value as EpochSort })}>
          <option value="order">as they happened</option>
          <option value="response-time" disabled={!img.responseTimes}>fastest reply first</option>
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
          aria-valuetext={`${settings.smoothing} rows`}
        />{' '}
        {settings.smoothing === 1 ? 'off' : `${settings.smoothing} rows`}
      </label>
    </>
  ) : null;
  return (
    <ExportablePanel title="Trial stack and average" context={context} testId="focus-trial-stack" className="panel-epochs" controls={controls}>
      {img && rows ? (
        <>
          <TrialStack rows={rows} nEpochs={img.nEpochs} length={img.length} times={img.times} maxAbs={limit} width={WIDTH} height={230} />
          {rows.sortApplied !== settings.sort ? <p className="note">No reply times in this recording; trials shown as they happened.</p> : null}
        </>
      ) : (
        <p>No events to epoch in this recording.</p>
      )}
      {erp ? (
        <>
          <ErpPlot
            times={erp.times}
            series={[{ values: erp.mean, label: 'average' }]}
            band={erp.band}
            width={WIDTH - 50}
            height={140}
            title={`Average of ${erp.nEpochs} epochs around “${erp.event}”`}
          />
          <p className="note">
            Average of {erp.nEpochs} epochs around “{erp.event}” at {evidence.strongestChannel.label} (µV), shaded: 95 % band (mean ± 1.96
            SEM).
          </p>
        </>
      ) : null}
    </ExportablePanel>
  );
}
