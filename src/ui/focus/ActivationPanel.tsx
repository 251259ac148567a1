/**
 * The component's time course (back-projected to its strongest channel, µV) above chosen sensor traces,
 * on one time axis with the recording's event markers; a scrollable window.
 */
import { useCallback, useMemo } from 'react';
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { extractWindow } from '../../core/review/preview-projection.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { TracePlot } from '../plots/TracePlot.tsx';
import { clampWindowStart, markerEvents, niceScaleAbove, peakRowSpan, robustRowSpan } from '../plots/trace-layout.ts';
import { EventMarkerSelect } from '../plots/EventMarkerSelect.tsx';
import type { TraceSpec } from '../plots/trace-draw.ts';
import { useElementWidth } from '../plots/useElementWidth.ts';
import { SensorPicker } from '../plots/SensorPicker.tsx';
import { backProjectedActivation, strongestChannels } from './focus-logic.ts';

export interface ActivationSettings {
  readonly startS: number;
  readonly lengthS: number;
  /** Decomposition channel indices chosen by the reviewer; null = the three strongest for the component. */
  readonly sensors: readonly number[] | null;
  /** Events drawn as markers (event-selection.ts selection keys: a trial_type, optionally with a column value); null = all. */
  readonly markers: ReadonlySet<string> | null;
}

export interface ActivationPanelProps {
  readonly index: number;
  readonly recording: LoadedRecording;
  readonly decomposition: Decomposition;
  readonly rows: Int32Array;
  /** n × 3 electrode unit vectors in decomposition order (NaN rows unknown), for the sensor drawing; null = none. */
  readonly positions: Float64Array | null;
  readonly settings: ActivationSettings;
  readonly onSettings: (patch: Partial<ActivationSettings>) => void;
  readonly context: string;
}

const LENGTHS_S = [2, 5, 10, 20, 30];

export function ActivationPanel({ index, recording, decomposition, rows, positions, settings, onSettings, context }: ActivationPanelProps) {
  const { signals } = recording;
  const fs = signals.sampleRate;
  const n = decomposition.nChannels;
  const k = decomposition.nComponents;
  const i = index - 1;
  const durationS = signals.nSamples / fs;
  const startS = clampWindowStart(settings.startS, settings.lengthS, durationS);
  const start = Math.round(startS * fs);
  const end = Math.min(signals.nSamples, start + Math.round(settings.lengthS * fs));
  const L = Math.max(0, end - start);
  const strongest = useMemo(() => strongestChannels(decomposition.mixing, n, k, i, 3, rows), [decomposition, n, k, i, rows]);
  const sensors = useMemo(
    () => settings.sensors?.filter((c) => c >= 0 && c < n && rows[c] >= 0) ?? strongest,
    [settings.sensors, n, rows, strongest],
  );
  const [box, boxWidth] = useElementWidth<HTMLDivElement>(640);
  const usable = useCallback((c: number) => rows[c] >= 0, [rows]);

  const spec = useMemo((): TraceSpec => {
    const win = extractWindow(signals.data, signals.nSamples, rows, start, end);
    const top = strongest[0] ?? 0;
    const act = backProjectedActivation(decomposition.unmixing, decomposition.mixing, n, k, i, top, win, L, decomposition.channelMeans);
    const nRows = 1 + sensors.length;
    const data = new Float64Array(nRows * L);
    data.set(act, 0);
    sensors.forEach((c, r) => {
      for (let t = 0; t < L; t++) data[(r + 1) * L + t] = win[c * L + t];
    });
    // The component row gets its own scale, to its robust peak so its events (blinks, beats) fit the row;
    // the sensors share ±3 robust SD; both on the 1-2-5 sequence so the scale bars read (docs/methods.md §18).
    const sensorSpan = niceScaleAbove(sensors.length ? robustRowSpan(data.subarray(L), sensors.length, L) : 1);
    const rowSpans = Float64Array.from({ length: nRows }, (_, r) => (r === 0 ? peakRowSpan(act, L) : sensorSpan));
    return {
      width: Math.max(420, boxWidth),
      height: 60 + 46 * nRows,
      rowLabels: [`IC ${index} @ ${decomposition.channels[top] ?? '?'}`, ...sensors.map((c) => decomposition.channels[c])],
      length: L,
      sampleRate: fs,
      startS: start / fs,
      layers: [{ data, colour: '#1d232b', lineWidth: 1 }],
      rowSpan: sensorSpan,
      rowSpans,
      events: markerEvents(recording.events, settings.markers),
    };
  }, [signals, rows, start, end, L, decomposition, n, k, i, index, strongest, sensors, fs, recording.events, settings.markers, boxWidth]);

  const controls = (
    <>
      <label>
        From{' '}
        <input
          type="range" min={0} max={Math.max(0, durationS - settings.lengthS)} step={0.5} value={startS}
          onChange={(e) => onSettings({ startS: Number(e.target.value) })} aria-valuetext={`${startS.toFixed(1)} s`}
        />{' '}
        {startS.toFixed(1)} s
      </label>
      <label>
        Length{' '}
        <select value={settings.lengthS} onChange={(e) => onSettings({ lengthS: Number(e.target.value) })}>
          {LENGTHS_S.map((s) => (
            <option key={s} value={s}>{s} s</option>
          ))}
        </select>
      </label>
      <span className="sensors-field">
        Sensors{' '}
        <SensorPicker
          label="Sensors" labels={decomposition.channels} positions={positions} usable={usable} selected={sensors}
          onChange={(next) => onSettings({ sensors: next })} size={96} testId="focus-sensors"
        />
      </span>
      {settings.sensors ? <button type="button" onClick={() => onSettings({ sensors: null })}>strongest</button> : null}
      <EventMarkerSelect events={recording.events} shown={settings.markers} onChange={(markers) => onSettings({ markers })} />
    </>
  );
  return (
    <ExportablePanel title="Time course and sensors" context={context} className="panel-activation" controls={controls}>
      <div ref={box} className="trace-box" />
      <TracePlot spec={spec} ariaLabel={`Component ${index} time course with ${sensors.length} sensor traces`} />
      <p className="note">
        Top row: the component back-projected to its strongest channel (µV, scaled to its peak); below: the sensors on a shared
        scale. Scale bars at the right; dashed lines: events.
      </p>
    </ExportablePanel>
  );
}
