/**
 * The suggestion for the current aim (review/suggest.ts suggestWithRules) with every reason behind it and
 * the rules that fired, each rule naming the question it answers (a click opens that answer). One click
 * takes the suggestion over.
 */
import type { SuggestionWithRules } from '../../core/review/suggest.ts';
import type { Aim } from '../../core/review/vocabulary.ts';
import { useWorkbench } from '../../state/index.ts';
import { VERDICT_GLYPH } from '../board/VerdictMark.tsx';
import { QUESTIONS, questionOfMeasure, type QuestionId } from './focus-logic.ts';

export interface SuggestionReasonsProps {
  readonly index: number;
  readonly suggestion: SuggestionWithRules | null;
  readonly aim: Aim;
  /** Opens the answer a rule belongs to (optional). */
  readonly onQuestion?: (id: QuestionId) => void;
}

export function SuggestionReasons({ index, suggestion, aim, onQuestion }: SuggestionReasonsProps) {
  const decide = useWorkbench((s) => s.decide);
  if (!suggestion) return <p>No suggestion for this aim.</p>;
  const s = suggestion.suggestion;
  const counts = new Map<QuestionId, number>();
  for (const r of suggestion.rules) {
    const q = questionOfMeasure(r.measure);
    if (q) counts.set(q, (counts.get(q) ?? 0) + 1);
  }
  return (
    <div className="suggestion-reasons" data-testid="focus-suggestion">
      <p>
        Suggested for the <strong>{aim}</strong> aim:{' '}
        <strong>
          {VERDICT_GLYPH[s.verdict]} {s.verdict}
        </strong>{' '}
        ({s.reason})
      </p>
      {s.because.length > 0 ? (
        <ol>
          {s.because.map((b, i) => (
            <li key={i}>{b}</li>
          ))}
        </ol>
      ) : (
        <p>No evidence sentence recorded.</p>
      )}
      {counts.size > 0 ? (
        <p className="rules-by-question">
          Rules fired:{' '}
          {QUESTIONS.filter((q) => counts.has(q.id)).map((q, i) => (
            <span key={q.id}>
              {i > 0 ? ', ' : ''}
              {onQuestion ? (
                <button type="button" className="link-button" onClick={() => onQuestion(q.id)}>{q.short} ({counts.get(q.id)})</button>
              ) : (
                `${q.short} (${counts.get(q.id)})`
              )}
            </span>
          ))}
        </p>
      ) : null}
      <button type="button" onClick={() => decide(index, { verdict: s.verdict, reason: s.reason })}>
        Take this suggestion
      </button>
      <p className="hint">The suggestion explains; the decision is yours.</p>
    </div>
  );
}
