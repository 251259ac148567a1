/** Window position and length (zoom), vertical gain, overlay / side by side, and the channels shown. */
import type { RecordingEvent } from '../../core/recording.ts';
import { clampWindowStart, formatScale, stepScale } from '../plots/trace-layout.ts';
import { EventMarkerSelect } from '../plots/EventMarkerSelect.tsx';
import { SensorPicker } from '../plots/SensorPicker.tsx';

export interface PreviewSettings {
  readonly startS: number;
  readonly lengthS: number;
  /** Decomposition channel indices drawn, top to bottom. */
  readonly channels: readonly number[];
  readonly mode: 'overlay' | 'side-by-side';
  /**
   * Vertical scale in µV per division (one row spacing), on the 1-2-5 sequence; null = chosen from the
   * window (about ±3 robust SD per row, the nearest value of the sequence).
   */
  readonly uvPerDiv: number | null;
  /** Events drawn as markers (event-selection.ts selection keys: a trial_type, optionally with a column value); null = all. */
  readonly markers: ReadonlySet<string> | null;
}

export interface PreviewToolbarProps {
  readonly settings: PreviewSettings;
  /** The scale in use, µV per division (the chosen one, or the one picked from the window). */
  readonly uvPerDiv: number;
  readonly durationS: number;
  readonly channels: readonly string[];
  readonly rows: Int32Array;
  readonly regionRows: readonly number[];
  readonly events: readonly RecordingEvent[];
  /** n × 3 electrode positions in decomposition order (NaN when unknown); null: no montage drawing. */
  readonly positions?: Float64Array | null;
  readonly onChange: (patch: Partial<PreviewSettings>) => void;
}

const LENGTHS_S = [2, 5, 10, 20, 30, 60];

export function PreviewToolbar({ settings, uvPerDiv, durationS, channels, rows, regionRows, events, positions = null, onChange }: PreviewToolbarProps) {
  const { startS, lengthS } = settings;
  const step = (dir: number) => onChange({ startS: clampWindowStart(startS + dir * lengthS * 0.8, lengthS, durationS) });
  const present = channels.map((_, c) => c).filter((c) => rows[c] >= 0);
  return (
    <div className="preview-toolbar" role="toolbar" aria-label="Preview window">
      <button type="button" onClick={() => step(-1)} disabled={startS <= 0} aria-label="Earlier">‹</button>
      <input
        type="range" min={0} max={Math.max(0, durationS - lengthS)} step={0.5} value={startS}
        onChange={(e) => onChange({ startS: Number(e.target.value) })}
        aria-label="Window start (s)" aria-valuetext={`${startS.toFixed(1)} s`}
      />
      <button type="button" onClick={() => step(1)} disabled={startS >= durationS - lengthS} aria-label="Later">›</button>
      <span className="time">{startS.toFixed(1)}–{Math.min(durationS, startS + lengthS).toFixed(1)} s of {durationS.toFixed(0)} s</span>
      <label>
        Window{' '}
        <select value={lengthS} onChange={(e) => onChange({ lengthS: Number(e.target.value) })}>
          {LENGTHS_S.map((s) => (
            <option key={s} value={s}>{s} s</option>
          ))}
        </select>
      </label>
      <span className="gain" role="group" aria-label="Vertical scale">
        <button type="button" onClick={() => onChange({ uvPerDiv: stepScale(uvPerDiv, 1) })} aria-label="Smaller traces (more µV per division)">−</button>
        <span data-testid="preview-scale">{formatScale(uvPerDiv)}/div</span>
        <button type="button" onClick={() => onChange({ uvPerDiv: stepScale(uvPerDiv, -1) })} aria-label="Larger traces (fewer µV per division)">+</button>
        {settings.uvPerDiv !== null ? (
          <button type="button" onClick={() => onChange({ uvPerDiv: null })} title="Scale chosen from the shown window">auto</button>
        ) : null}
      </span>
      {/* A toggle labelled with its own mode: pressed = side by side, unpressed = overlaid. */}
      <button
        type="button"
        data-testid="preview-mode"
        aria-pressed={settings.mode === 'side-by-side'}
        onClick={() => onChange({ mode: settings.mode === 'overlay' ? 'side-by-side' : 'overlay' })}
        title={settings.mode === 'overlay' ? 'Now overlaid; press to show original and cleaned side by side' : 'Now side by side; press to overlay'}
      >
        side by side
      </button>
      <EventMarkerSelect events={events} shown={settings.markers} onChange={(markers) => onChange({ markers })} />
      {/* The channels drawn as chips (each removes itself), added from the montage or the list. */}
      <span className="channel-select">
        Channels{' '}
        <SensorPicker
          label="Channels" labels={channels} positions={positions} usable={(c) => rows[c] >= 0} selected={settings.channels}
          onChange={(next) => onChange({ channels: next })} max={Math.max(1, present.length)} size={72} testId="preview-channels"
        />
        <span className="channel-presets">
          <button type="button" onClick={() => onChange({ channels: present.slice(0, 16) })}>first 16</button>
          <button type="button" onClick={() => onChange({ channels: present })}>all</button>
          <button type="button" onClick={() => onChange({ channels: [...regionRows] })}>region</button>
        </span>
      </span>
    </div>
  );
}
