/**
 * The suggestion thresholds, each editable: its meaning, value, default, source ("common practice" or
 * "ours") and the methods section that describes it. A valid change re-suggests at once on the board (the
 * store's memoised selector; no evidence is recomputed); the overrides are saved with the review and
 * written into the decisions file and the methods text.
 */
import { useEffect, useRef, useState } from 'react';
import type { Thresholds } from '../../core/review/thresholds.ts';
import { useWorkbench, workbenchStore } from '../../state/index.ts';
import { methodsHref } from '../help/methods-link.ts';
import { parseThreshold, thresholdRows, withThreshold, withoutThreshold, type ThresholdRow } from './threshold-rows.ts';
import { setThresholdsOpen, toggleThresholdsOpen, useThresholdsOpen } from './panel-open.ts';
import './thresholds.css';

const NO_OVERRIDES: Partial<Thresholds> = {};

/** The top bar's button. */
export function ThresholdsButton() {
  const open = useThresholdsOpen();
  const changed = useWorkbench((s) => Object.keys(s.thresholds ?? {}).length);
  return (
    <button type="button" onClick={toggleThresholdsOpen} aria-expanded={open} data-testid="thresholds-open" title="Suggestion thresholds">
      Thresholds{changed > 0 ? ` (${changed} changed)` : ''}…
    </button>
  );
}

/** The panel, shown while open. */
export function ThresholdsPanelHost() {
  const open = useThresholdsOpen();
  return open ? <ThresholdsPanel onClose={() => setThresholdsOpen(false)} /> : null;
}

function Row({ row, onSet, onReset }: { row: ThresholdRow; onSet: (text: string) => string | null; onReset: () => void }) {
  const [text, setText] = useState(String(row.value));
  const [error, setError] = useState<string | null>(null);
  // Follow the value when it changes from elsewhere (reset, resume, import); keep what is typed when it already says so ("0." while typing 0.5).
  useEffect(() => {
    setText((t) => (Number(t.trim().replace(',', '.')) === row.value && t.trim() !== '' ? t : String(row.value)));
    setError(null);
  }, [row.value]);
  const id = `threshold-${row.key}`;
  return (
    <tr data-testid={`threshold-row-${row.key}`} className={row.changed ? 'changed' : undefined}>
      <th scope="row"><label htmlFor={id}>{row.label}</label><div className="threshold-key">{row.key}</div></th>
      <td>
        <input
          id={id}
          type="number"
          inputMode="decimal"
          step={row.step}
          min={row.min}
          max={row.max}
          value={text}
          aria-invalid={error !== null}
          aria-describedby={error ? `${id}-error` : undefined}
          data-testid={`threshold-input-${row.key}`}
          onChange={(e) => {
            setText(e.target.value);
            setError(onSet(e.target.value));
          }}
        />
        {error && <div className="threshold-error" id={`${id}-error`} role="alert">{error}</div>}
      </td>
      <td>{row.defaultValue}</td>
      <td>{row.source}</td>
      <td><a href={methodsHref(row.section)} target="_blank" rel="noopener">methods §{row.section}</a></td>
      <td>
        <button type="button" disabled={!row.changed} onClick={onReset} data-testid={`threshold-reset-${row.key}`} aria-label={`Reset ${row.label} to ${row.defaultValue}`}>
          Reset
        </button>
      </td>
    </tr>
  );
}

export function ThresholdsPanel({ onClose }: { onClose: () => void }) {
  const thresholds = useWorkbench((s) => s.thresholds ?? NO_OVERRIDES);
  const setThresholds = useWorkbench((s) => s.setThresholds);
  return <ThresholdsView thresholds={thresholds} current={currentThresholds} setThresholds={setThresholds} onClose={onClose} />;
}

export interface ThresholdsViewProps {
  /** The overrides shown. */
  readonly thresholds: Partial<Thresholds>;
  /** The overrides as they are at the moment of an edit (two edits within one render both count). */
  readonly current: () => Partial<Thresholds>;
  readonly setThresholds: (thresholds: Partial<Thresholds>) => void;
  readonly onClose: () => void;
}

/** The panel's content from props (no store). */
export function ThresholdsView({ thresholds, current, setThresholds, onClose }: ThresholdsViewProps) {
  const closeRef = useRef<HTMLButtonElement>(null);
  useEffect(() => closeRef.current?.focus(), []);
  const rows = thresholdRows(thresholds);
  const changed = rows.filter((r) => r.changed).length;
  return (
    <section
      className="thresholds-panel"
      role="dialog"
      aria-label="Suggestion thresholds"
      data-testid="thresholds-panel"
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.stopPropagation();
          onClose();
        }
      }}
    >
      <h2>Suggestion thresholds</h2>
      <p>
        The numbers the suggestions are made with. Each is a starting point: change one and the board re-suggests at once (the evidence
        is not computed again). Changed thresholds are saved with the review and named in the decisions file and the methods text.
        Suggestions are starting points; the decision is the reviewer's. Research tool, not for clinical diagnosis.
      </p>
      <p data-testid="thresholds-changed">{changed === 0 ? 'All thresholds at their defaults.' : `${changed} of ${rows.length} thresholds differ from the defaults.`}</p>
      <table>
        <thead>
          <tr><th scope="col">Threshold</th><th scope="col">Value</th><th scope="col">Default</th><th scope="col">Source</th><th scope="col">Described in</th><th scope="col"><span className="visually-hidden">Reset</span></th></tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <Row
              key={row.key}
              row={row}
              onSet={(text) => {
                const now = current();
                const parsed = parseThreshold(row.key, text, now);
                if (!parsed.ok) return parsed.error;
                setThresholds(withThreshold(now, row.key, parsed.value));
                return null;
              }}
              onReset={() => setThresholds(withoutThreshold(current(), row.key))}
            />
          ))}
        </tbody>
      </table>
      <div className="thresholds-actions">
        <button type="button" disabled={changed === 0} onClick={() => setThresholds({})} data-testid="thresholds-reset-all">Reset all to defaults</button>
        <button ref={closeRef} type="button" onClick={onClose} data-testid="thresholds-close">Close (Escape)</button>
      </div>
    </section>
  );
}

/** The overrides as they are now (not as of the last render: two edits within one render both count). */
function currentThresholds(): Partial<Thresholds> {
  return workbenchStore.getState().thresholds ?? NO_OVERRIDES;
}
