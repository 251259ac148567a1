/**
 * A verdict readable without colour: a shape (✓ circle keep, ✕ square remove, ? dashed diamond undecided)
 * and the word, plus a colour for those who see it.
 */
import type { Verdict } from '../../core/review/vocabulary.ts';

export const VERDICT_GLYPH: Record<Verdict, string> = { keep: '✓', remove: '✕', undecided: '?' };

export interface VerdictMarkProps {
  readonly verdict: Verdict;
  /** 'current' = the reviewer's verdict (filled), 'suggested' = the suggestion (outlined). */
  readonly kind?: 'current' | 'suggested';
}

export function VerdictMark({ verdict, kind = 'current' }: VerdictMarkProps) {
  return (
    <span className={`verdict-mark verdict-${verdict} verdict-mark-${kind}`} data-verdict={verdict}>
      <span className="verdict-shape" aria-hidden="true">{VERDICT_GLYPH[verdict]}</span>
      <span className="verdict-word">{verdict}</span>
    </span>
  );
}
