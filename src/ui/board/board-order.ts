/**
 * The board's order and filter, as plain functions of the evidence and decisions (tested without
 * rendering). "Impact on the aim" is the share of the data's variance that this component carries in what
 * the aim measures:
 * - erp: variance share × phase-locked share of its single trials (its contribution to event-locked averages);
 * - oscillations: variance share × (1 − BP(1–4 Hz)/BP(1–45 Hz)) (its power above the slow band);
 * - conservative: the variance share itself.
 * These are our own summaries for ranking, not published indices.
 */
import { UNDECIDED, type ReviewDecision } from '../../core/review/decisions-file.ts';
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import type { Aim, ReasonCode, Verdict } from '../../core/review/vocabulary.ts';
import type { BoardFilter, BoardSort } from '../../state/types.ts';
import type { SuggestionWithRules } from '../../core/review/suggest.ts';
import { suggestionsFor, type SuggestionMap } from '../../state/selectors.ts';

/** 0…1 share of the data's variance this component carries in what the aim measures (NaN-safe: 0). */
export function impactOnAim(e: ComponentEvidence, aim: Aim): number {
  const v = Number.isFinite(e.varianceShare) ? e.varianceShare : 0;
  if (aim === 'erp') {
    const locked = e.erp ? e.erp.lockedShare : 0;
    return v * (Number.isFinite(locked) ? Math.max(0, Math.min(1, locked)) : 0);
  }
  if (aim === 'oscillations') {
    const lf = Number.isFinite(e.lowFrequencyShare) ? e.lowFrequencyShare : 1;
    return v * Math.max(0, Math.min(1, 1 - lf));
  }
  return v;
}

/** One line saying what the impact number means for the aim. */
export const IMPACT_MEANING: Record<Aim, string> = {
  erp: 'share of data variance that is event-locked activity of this component',
  oscillations: 'share of data variance above 4 Hz carried by this component',
  conservative: 'share of data variance carried by this component',
};

const SUGGESTION_RANK: Record<Verdict, number> = { remove: 0, undecided: 1, keep: 2 };

/** The reason shown for filtering: the reviewer's, else the suggestion's. */
export function effectiveReason(d: ReviewDecision, suggestion: SuggestionWithRules | null | undefined): ReasonCode | null {
  return d.reason ?? suggestion?.suggestion.reason ?? null;
}

/**
 * 1-based component indices in board order after the filter. Ties keep component order. Components
 * without evidence sort last for evidence-based orders. `suggestions` are the current ones (selectSuggestions);
 * by default those of `aim` with the default thresholds.
 */
export function boardOrder(
  nComponents: number,
  evidence: readonly ComponentEvidence[] | null,
  decisions: Readonly<Record<number, ReviewDecision>>,
  aim: Aim,
  sort: BoardSort,
  filter: BoardFilter,
  suggestions: SuggestionMap = suggestionsFor(evidence, aim),
): number[] {
  const byIndex = new Map<number, ComponentEvidence>();
  for (const e of evidence ?? []) byIndex.set(e.index, e);
  const keyOf = (i: number): number => {
    const e = byIndex.get(i);
    if (sort === 'index') return i;
    if (!e) return Infinity;
    if (sort === 'variance') return -e.varianceShare;
    if (sort === 'impact') return -impactOnAim(e, aim);
    const s = suggestions.get(i)?.suggestion;
    return SUGGESTION_RANK[s?.verdict ?? 'undecided'] * 10 - e.varianceShare; // remove first, big first
  };
  const out: number[] = [];
  for (let i = 1; i <= nComponents; i++) {
    const d = decisions[i] ?? UNDECIDED;
    if (filter.verdict !== 'all' && d.verdict !== filter.verdict) continue;
    if (filter.reason !== 'all' && effectiveReason(d, suggestions.get(i)) !== filter.reason) continue;
    out.push(i);
  }
  const keys = new Map(out.map((i) => [i, keyOf(i)] as const));
  return out.sort((a, b) => {
    const ka = keys.get(a)!;
    const kb = keys.get(b)!;
    if (ka === kb || (Number.isNaN(ka) && Number.isNaN(kb))) return a - b;
    if (Number.isNaN(ka)) return 1;
    if (Number.isNaN(kb)) return -1;
    return ka - kb;
  });
}

/** The next undecided component after `current` in `order` (wrapping), or null when all are decided. */
export function nextUndecided(order: readonly number[], decisions: Readonly<Record<number, ReviewDecision>>, current: number | null): number | null {
  if (order.length === 0) return null;
  const start = current === null ? -1 : order.indexOf(current);
  for (let k = 1; k <= order.length; k++) {
    const i = order[(start + k + order.length) % order.length];
    if ((decisions[i]?.verdict ?? 'undecided') === 'undecided') return i;
  }
  return null;
}
