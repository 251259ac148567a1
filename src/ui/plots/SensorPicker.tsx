/**
 * Choosing channels so the choice stays visible: the chosen ones as chips (each removes itself), a small
 * montage drawing where a click adds or removes an electrode, and an "add" list that does the same from
 * the keyboard (the drawing is for the mouse; the chips and the list are in the Tab order).
 */
import { useMemo } from 'react';
import { projectAzimuthalEquidistant } from '../../core/headmodel/topography.ts';
import { headOutlinePaths } from './head-outline.ts';
import './sensor-picker.css';

export interface SensorPickerProps {
  /** Channel labels, in the order of `positions` and the indices used. */
  readonly labels: readonly string[];
  /** n × 3 unit vectors (RAS); NaN rows are left out of the drawing. Null: no drawing. */
  readonly positions: Float64Array | null;
  /** Whether each channel can be chosen (e.g. present in the recording). */
  readonly usable: (c: number) => boolean;
  readonly selected: readonly number[];
  readonly onChange: (next: number[]) => void;
  /** Most channels at once (default 8). */
  readonly max?: number;
  /** Drawing size in px (default 120). */
  readonly size?: number;
  /** Names the group for assistive technology, e.g. "Sensors". */
  readonly label: string;
  readonly testId?: string;
}

/** The selection after clicking channel `c`: removed when chosen, else added (dropping the oldest beyond `max`). */
export function toggleChannel(selected: readonly number[], c: number, max: number): number[] {
  if (selected.includes(c)) return selected.filter((x) => x !== c);
  const next = [...selected, c];
  return next.length > max ? next.slice(next.length - max) : next;
}

export function SensorPicker({ labels, positions, usable, selected, onChange, max = 8, size = 120, label, testId }: SensorPickerProps) {
  const dots = useMemo(() => {
    if (!positions) return [];
    const plane = projectAzimuthalEquidistant(positions);
    const out: { c: number; x: number; y: number }[] = [];
    for (let c = 0; c < labels.length; c++) {
      const x = plane[2 * c];
      const y = plane[2 * c + 1];
      if (Number.isFinite(x) && Number.isFinite(y) && Number.isFinite(positions[3 * c]) && usable(c)) out.push({ c, x, y });
    }
    return out;
  }, [positions, labels, usable]);
  const extent = 1.15;
  const frame = { cx: size / 2, cy: size / 2, radius: size / 2 / extent };
  const outline = headOutlinePaths(frame);
  const chosen = new Set(selected);
  const addable = labels.map((l, c) => ({ l, c })).filter(({ c }) => usable(c) && !chosen.has(c));
  return (
    <div className="sensor-picker" role="group" aria-label={label} data-testid={testId}>
      <ul className="chips" aria-label={`${label} chosen`}>
        {selected.map((c) => (
          <li key={c}>
            <button type="button" className="chip" onClick={() => onChange(selected.filter((x) => x !== c))} aria-label={`remove ${labels[c]}`}>
              {labels[c]} <span aria-hidden="true">×</span>
            </button>
          </li>
        ))}
      </ul>
      <select
        value=""
        aria-label={`add to ${label.toLowerCase()}`}
        onChange={(e) => e.target.value !== '' && onChange(toggleChannel(selected, Number(e.target.value), max))}
        disabled={addable.length === 0}
      >
        <option value="">add…</option>
        {addable.map(({ l, c }) => (
          <option key={c} value={c}>{l}</option>
        ))}
      </select>
      {dots.length ? (
        <svg className="sensor-montage" width={size} height={size} viewBox={`0 0 ${size} ${size}`} aria-hidden="true">
          <g fill="none" stroke="#777" strokeWidth={1}>
            <path d={outline.head} />
            <path d={outline.nose} />
            <path d={outline.ears} />
          </g>
          {dots.map(({ c, x, y }) => {
            const on = chosen.has(c);
            return (
              <circle
                key={c}
                cx={frame.cx + x * frame.radius}
                cy={frame.cy - y * frame.radius}
                r={on ? 5 : 3.5}
                fill={on ? '#1d232b' : '#fffdf8'}
                stroke="#1d232b"
                strokeWidth={1}
                style={{ cursor: 'pointer' }}
                onClick={() => onChange(toggleChannel(selected, c, max))}
              >
                <title>{`${labels[c]}${on ? ' (chosen)' : ''}`}</title>
              </circle>
            );
          })}
        </svg>
      ) : null}
    </div>
  );
}
