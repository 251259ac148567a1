/**
 * The strip of components above the preview's traces: one chip per component with its verdict, a toggle
 * that removes it from (or restores it to) the cleaned signal, and the selected component marked, so the
 * cleaned signal can be watched while deciding. Choosing a chip's number selects that component (the same
 * selection as the board's and the focus view's).
 *
 * data-testid hooks: preview-strip (the list), preview-strip-<n> (one chip, data-verdict and
 * aria-current), preview-strip-toggle-<n> (its remove toggle, aria-pressed when removed),
 * preview-strip-select-<n> (its select button).
 */
import { UNDECIDED, type ReviewDecision } from '../../core/review/decisions-file.ts';
import { useWorkbench } from '../../state/index.ts';
import { VERDICT_GLYPH } from '../board/VerdictMark.tsx';
import { stripToggleVerdict } from './preview-logic.ts';

export interface ComponentStripProps {
  readonly nComponents: number;
}

export function ComponentStrip({ nComponents }: ComponentStripProps) {
  const decisions = useWorkbench((s) => s.decisions);
  const selected = useWorkbench((s) => s.selected);
  const decide = useWorkbench((s) => s.decide);
  const select = useWorkbench((s) => s.select);
  return <ComponentStripView nComponents={nComponents} decisions={decisions} selected={selected} decide={decide} select={select} />;
}

export interface ComponentStripViewProps {
  readonly nComponents: number;
  /** Keyed 1-based. */
  readonly decisions: Readonly<Record<number, ReviewDecision>>;
  readonly selected: number | null;
  readonly decide: (index: number, patch: Partial<ReviewDecision>) => void;
  readonly select: (index: number) => void;
}

/** The strip itself, from plain props (the store wiring is ComponentStrip). */
export function ComponentStripView({ nComponents, decisions, selected, decide, select }: ComponentStripViewProps) {
  const items = Array.from({ length: nComponents }, (_, i) => i + 1);
  return (
    <ol className="component-strip" aria-label="Components: remove or restore while watching the cleaned signal" data-testid="preview-strip">
      {items.map((n) => {
        const d = decisions[n] ?? UNDECIDED;
        const removed = d.verdict === 'remove';
        const isSelected = selected === n;
        return (
          <li
            key={n}
            className={`strip-chip verdict-${d.verdict}${isSelected ? ' strip-selected' : ''}`}
            data-testid={`preview-strip-${n}`}
            data-verdict={d.verdict}
            aria-current={isSelected ? 'true' : undefined}
          >
            <button
              type="button"
              className="strip-select"
              onClick={() => select(n)}
              data-testid={`preview-strip-select-${n}`}
              title={`Select component ${n}${d.reason ? ` (${d.verdict}, ${d.reason})` : ` (${d.verdict})`}`}
            >
              <span aria-hidden="true" className="strip-glyph">{VERDICT_GLYPH[d.verdict]}</span> {n}
            </button>
            <button
              type="button"
              className="strip-toggle"
              aria-pressed={removed}
              aria-label={removed ? `Restore component ${n} (now removed)` : `Remove component ${n} (now ${d.verdict})`}
              onClick={() => decide(n, { verdict: stripToggleVerdict(d.verdict) })}
              data-testid={`preview-strip-toggle-${n}`}
            >
              <span aria-hidden="true">✕</span>
            </button>
          </li>
        );
      })}
    </ol>
  );
}
