/** Installs the review keys (layout/review-keys.ts) on the window for the page's lifetime. */
import { useEffect, useRef } from 'react';
import { REASON_CODES } from '../../core/review/vocabulary.ts';
import { BOARD_SORTS, selectSuggestions, workbenchStore } from '../../state/index.ts';
import { boardOrder, nextUndecided } from '../board/board-order.ts';
import { reviewActionForKey, type KeyTarget, type ReviewAction } from './review-keys.ts';

export interface ReviewKeyHandlers {
  readonly toggleHelp: () => void;
  readonly toggleExport: () => void;
  readonly closePanels: () => void;
  readonly helpOpen: boolean;
  readonly exportOpen: boolean;
}

function targetKind(t: EventTarget | null): KeyTarget {
  if (!(t instanceof HTMLElement)) return 'other';
  if (t.isContentEditable || t instanceof HTMLTextAreaElement || t instanceof HTMLSelectElement) return 'text';
  if (t instanceof HTMLInputElement) return ['button', 'checkbox', 'radio', 'submit', 'reset', 'file'].includes(t.type) ? 'button' : 'text';
  if (t instanceof HTMLButtonElement || t instanceof HTMLAnchorElement || t.getAttribute('role') === 'button') return 'button';
  return 'other';
}

/** Columns of the board's tile grid as laid out now (1 when not on the board). */
function boardColumns(): number {
  const grid = document.querySelector('.tile-grid');
  if (!grid) return 1;
  const cols = getComputedStyle(grid).gridTemplateColumns.split(' ').filter((c) => c.trim() !== '').length;
  return Math.max(1, cols);
}

function focusNoteField(): void {
  const tryFocus = () => {
    const el = document.querySelector<HTMLElement>('[data-note-field]');
    if (el) el.focus();
    return el !== null;
  };
  if (!tryFocus()) setTimeout(tryFocus, 50);
}

/** Runs one action against the store; returns false when the action did not apply (key left to the browser). */
export function runReviewAction(action: ReviewAction, h: ReviewKeyHandlers, target: EventTarget | null): boolean {
  const s = workbenchStore.getState();
  const reviewing = s.evidence !== null && s.decomposition !== null;
  const n = s.decomposition?.nComponents ?? 0;
  const order = () => boardOrder(n, s.evidence, s.decisions, s.aim, s.boardSort, s.boardFilter, selectSuggestions(s));
  const move = (step: number) => {
    const o = order();
    if (o.length === 0) return;
    const at = s.selected === null ? -1 : o.indexOf(s.selected);
    const k = at < 0 ? (step > 0 ? 0 : o.length - 1) : Math.min(o.length - 1, Math.max(0, at + step));
    s.select(o[k]);
  };
  switch (action) {
    case 'escape':
      if (targetKind(target) === 'text' && target instanceof HTMLElement) { target.blur(); return true; }
      if (h.helpOpen || h.exportOpen) { h.closePanels(); return true; }
      if (s.screen === 'focus' || s.screen === 'preview') { s.setScreen('board'); return true; }
      return false;
    case 'help': h.toggleHelp(); return true;
    case 'export': if (!reviewing) return false; h.toggleExport(); return true;
    case 'undo': s.undo(); return true;
    case 'redo': s.redo(); return true;
    case 'open-start': s.setScreen('start'); return true;
    default: break;
  }
  if (!reviewing || s.screen === 'start') return false;
  const sel = s.selected;
  switch (action) {
    case 'next': move(1); return true;
    case 'previous': move(-1); return true;
    case 'row-down': move(s.screen === 'board' ? boardColumns() : 1); return true;
    case 'row-up': move(s.screen === 'board' ? -boardColumns() : -1); return true;
    case 'first': { const o = order(); if (o.length) s.select(o[0]); return true; }
    case 'last': { const o = order(); if (o.length) s.select(o[o.length - 1]); return true; }
    case 'next-undecided': { const i = nextUndecided(order(), s.decisions, sel); if (i !== null) s.select(i); return true; }
    case 'keep': case 'remove': case 'undecided':
      if (sel === null) return false;
      s.decide(sel, { verdict: action });
      return true;
    case 'accept-suggestion': {
      const sug = sel === null ? undefined : selectSuggestions(s).get(sel)?.suggestion;
      if (sel === null || !sug) return false;
      s.decide(sel, { verdict: sug.verdict, reason: sug.reason });
      return true;
    }
    case 'reason-next': case 'reason-previous': {
      if (sel === null) return false;
      const cur = s.decisions[sel]?.reason ?? null;
      const at = cur === null ? -1 : REASON_CODES.indexOf(cur);
      const m = REASON_CODES.length;
      const next = action === 'reason-next' ? (at + 1) % m : at <= 0 ? m - 1 : at - 1;
      s.decide(sel, { reason: REASON_CODES[next] });
      return true;
    }
    case 'note':
      if (s.screen === 'preview') s.setScreen('board');
      focusNoteField();
      return true;
    case 'open-focus': if (sel === null) return false; s.setScreen('focus'); return true;
    case 'open-board': s.setScreen('board'); return true;
    case 'open-preview': s.setScreen('preview'); return true;
    case 'sort-next': {
      const k = BOARD_SORTS.indexOf(s.boardSort);
      s.setBoardSort(BOARD_SORTS[(k + 1) % BOARD_SORTS.length]);
      if (s.screen !== 'board') s.setScreen('board');
      return true;
    }
    default:
      return false;
  }
}

export function useReviewKeys(handlers: ReviewKeyHandlers): void {
  const ref = useRef(handlers);
  ref.current = handlers;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || e.isComposing) return;
      const action = reviewActionForKey(e, targetKind(e.target));
      if (action === null) return;
      if (runReviewAction(action, ref.current, e.target)) e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}
