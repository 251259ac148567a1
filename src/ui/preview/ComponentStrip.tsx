/**
 * The strip of components above the preview's traces: one chip per component with its verdict, a toggle
 * that removes it from (or restores it to) the cleaned signal, and the selected component marked, so the
 * cleaned signal can be watched while deciding. Choosing a chip's number selects that component (the same
 * selection as the board's and the focus view's).
 *
 * Keyboard: the strip is one Tab stop, a toolbar of toggle buttons with a roving tabindex (WAI-ARIA
 * Authoring Practices Guide 1.2, "Toolbar" pattern and "Managing Focus Within Components Using a Roving
 * tabindex", https://www.w3.org/WAI/ARIA/apg/patterns/toolbar/). Only the selected component's toggle has
 * tabindex 0; ←/→ (and ↑/↓) move to the previous/next component, Home/End to the first/last, and the
 * selection follows the focus (as the review keys' arrows do on every screen); Space/Enter toggle the focused
 * component (native buttons, aria-pressed when removed). The number buttons stay for the mouse, out of the
 * Tab order.
 *
 * data-testid hooks: preview-strip (the toolbar), preview-strip-<n> (one chip, data-verdict and
 * aria-current), preview-strip-toggle-<n> (its remove toggle, aria-pressed when removed, tabindex 0 on the
 * selected one), preview-strip-select-<n> (its select button).
 */
import { useRef, type KeyboardEvent } from 'react';
import { UNDECIDED, type ReviewDecision } from '../../core/review/decisions-file.ts';
import { useWorkbench } from '../../state/index.ts';
import { VERDICT_GLYPH } from '../board/VerdictMark.tsx';
import { stripFocusTarget, stripToggleVerdict } from './preview-logic.ts';

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
  const strip = useRef<HTMLDivElement>(null);
  const items = Array.from({ length: nComponents }, (_, i) => i + 1);
  // The one toggle in the Tab order: the selected component's, else the first.
  const active = selected !== null && selected >= 1 && selected <= nComponents ? selected : 1;
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const next = stripFocusTarget(e.key, active, nComponents);
    if (next === null) return;
    // preventDefault also keeps the review keys (next/previous component, first/last) from acting on this press.
    e.preventDefault();
    if (next !== active) select(next);
    strip.current?.querySelector<HTMLElement>(`[data-testid="preview-strip-toggle-${next}"]`)?.focus();
  };
  return (
    <div
      className="component-strip"
      role="toolbar"
      aria-label="Components: remove or restore while watching the cleaned signal"
      data-testid="preview-strip"
      ref={strip}
      onKeyDown={onKey}
    >
      {items.map((n) => {
        const d = decisions[n] ?? UNDECIDED;
        const removed = d.verdict === 'remove';
        const isSelected = selected === n;
        return (
          <div
            key={n}
            className={`strip-chip verdict-${d.verdict}${isSelected ? ' strip-selected' : ''}`}
            data-testid={`preview-strip-${n}`}
            data-verdict={d.verdict}
            aria-current={isSelected ? 'true' : undefined}
          >
            <button
              type="button"
              className="strip-select"
              tabIndex={-1}
              onClick={() => select(n)}
              data-testid={`preview-strip-select-${n}`}
              title={`Select component ${n}${d.reason ? ` (${d.verdict}, ${d.reason})` : ` (${d.verdict})`}`}
            >
              <span aria-hidden="true" className="strip-glyph">{VERDICT_GLYPH[d.verdict]}</span> {n}
            </button>
            <button
              type="button"
              className="strip-toggle"
              tabIndex={n === active ? 0 : -1}
              aria-pressed={removed}
              aria-label={`${removed ? `Restore component ${n} (now removed)` : `Remove component ${n} (now ${d.verdict})`}${isSelected ? ', selected' : ''}`}
              onClick={() => decide(n, { verdict: stripToggleVerdict(d.verdict) })}
              data-testid={`preview-strip-toggle-${n}`}
            >
              <span aria-hidden="true">✕</span>
            </button>
          </div>
        );
      })}
    </div>
  );
}
