/**
 * The region of interest for the before/after figures: channels, the event the ERP is locked to, the
 * ERP measurement window and the band for band power. Writes to the store's `roi` (shared with the board's
 * impact figures).
 */
import type { RecordingEvent } from '../../core/recording.ts';
import { selectionChoices, type SelectionChoice } from '../../core/evidence/event-selection.ts';
import { useWorkbench } from '../../state/index.ts';
import { SensorPicker } from '../plots/SensorPicker.tsx';

export interface RegionControlsProps {
  readonly channels: readonly string[];
  readonly rows: Int32Array;
  /** Decomposition channel indices currently used (the defaults when the store names none). */
  readonly regionRows: readonly number[];
  readonly events: readonly RecordingEvent[];
  readonly eventLabel: string | null;
  /** n × 3 electrode positions in decomposition order (NaN when unknown), for picking from the montage. */
  readonly positions?: Float64Array | null;
}

/** Event choices by BIDS events.tsv columns: each trial_type, then each type with one column value (event-selection.ts). */
export function eventChoices(events: readonly RecordingEvent[]): SelectionChoice[] {
  return selectionChoices(events);
}

export function RegionControls({ channels, rows, regionRows, events, eventLabel, positions = null }: RegionControlsProps) {
  const roi = useWorkbench((s) => s.roi);
  const setRoi = useWorkbench((s) => s.setRoi);
  const choices = eventChoices(events);
  return (
    <div className="region-controls" role="group" aria-label="Region of interest">
      {/* The region's channels as chips (each removes itself), added from the montage or the list. */}
      <span className="region-channels">
        Region{' '}
        <SensorPicker
          label="Region" labels={channels} positions={positions} usable={(c) => rows[c] >= 0} selected={regionRows}
          onChange={(next) => setRoi({ channels: next.map((c) => channels[c]) })} max={16} size={84} testId="preview-region"
        />
      </span>
      <label>
        Event{' '}
        <select value={eventLabel ?? ''} onChange={(e) => setRoi({ epochEvent: e.target.value || null })} disabled={choices.length === 0}>
          {choices.length === 0 ? <option value="">(none)</option> : null}
          {choices.map((c) => (
            <option key={c.key} value={c.key}>{c.label}</option>
          ))}
        </select>
      </label>
      <label>
        ERP window{' '}
        <input
          type="number" step={0.05} value={roi.windowS[0]} aria-label="ERP window start (s)"
          onChange={(e) => setRoi({ windowS: [Number(e.target.value), roi.windowS[1]] })}
        />
        –
        <input
          type="number" step={0.05} value={roi.windowS[1]} aria-label="ERP window end (s)"
          onChange={(e) => setRoi({ windowS: [roi.windowS[0], Number(e.target.value)] })}
        />{' '}
        s
      </label>
      <label>
        Band{' '}
        <input
          type="number" step={0.5} value={roi.bandHz[0]} aria-label="band low edge (Hz)"
          onChange={(e) => setRoi({ bandHz: [Number(e.target.value), roi.bandHz[1]] })}
        />
        –
        <input
          type="number" step={0.5} value={roi.bandHz[1]} aria-label="band high edge (Hz)"
          onChange={(e) => setRoi({ bandHz: [roi.bandHz[0], Number(e.target.value)] })}
        />{' '}
        Hz
      </label>
    </div>
  );
}
