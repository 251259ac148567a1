/**
 * Verdict/reason pairs that contradict themselves: a component kept although its reason names an artefact
 * (kept as "blink"), or removed although its reason says it is brain activity (removed as "neural").
 * Flagged, never forbidden — a reviewer may keep a small artefact on purpose (e.g. so as not to lose the
 * brain activity mixed into it). "mixed" and "unclear" fit either verdict.
 */
import type { ReasonCode, Verdict } from '../../core/review/vocabulary.ts';
import type { ReviewDecision } from '../../core/review/decisions-file.ts';

/** Reasons that name a non-brain origin (our vocabulary, src/core/review/vocabulary.ts). */
const ARTEFACT_REASONS: ReadonlySet<ReasonCode> = new Set(['blink', 'gaze', 'muscle', 'cardiac', 'contact', 'mains', 'movement']);

/** Why the pair contradicts itself, in a short sentence; null when it does not. */
export function verdictReasonConflict(verdict: Verdict, reason: ReasonCode | null): string | null {
  if (reason === null) return null;
  if (verdict === 'keep' && ARTEFACT_REASONS.has(reason)) return `kept, but the reason “${reason}” names an artefact`;
  if (verdict === 'remove' && reason === 'neural') return 'removed, but the reason “neural” says it is brain activity';
  return null;
}

/** Components (1-based, ascending) whose verdict and reason contradict each other, with why. */
export function conflictingDecisions(decisions: Readonly<Record<number, ReviewDecision>>, nComponents: number): { index: number; why: string }[] {
  const out: { index: number; why: string }[] = [];
  for (let i = 1; i <= nComponents; i++) {
    const d = decisions[i];
    const why = d ? verdictReasonConflict(d.verdict, d.reason) : null;
    if (why) out.push({ index: i, why });
  }
  return out;
}

/** Components (1-based) without a keep or remove verdict. */
export function undecidedComponents(decisions: Readonly<Record<number, ReviewDecision>>, nComponents: number): number[] {
  const out: number[] = [];
  for (let i = 1; i <= nComponents; i++) {
    const v = decisions[i]?.verdict ?? 'undecided';
    if (v === 'undecided') out.push(i);
  }
  return out;
}

/** "1–3, 7, 9–10": component numbers as short runs. */
export function componentRuns(indices: readonly number[]): string {
  const s = [...indices].sort((a, b) => a - b);
  const parts: string[] = [];
  for (let i = 0; i < s.length; ) {
    let j = i;
    while (j + 1 < s.length && s[j + 1] === s[j] + 1) j++;
    parts.push(j > i ? `${s[i]}–${s[j]}` : String(s[i]));
    i = j + 1;
  }
  return parts.join(', ');
}
