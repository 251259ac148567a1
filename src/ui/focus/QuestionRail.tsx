/**
 * The four questions as a vertical list of tabs, each with its short answer and how many suggestion rules
 * fired on it. ↑/↓ (and Home/End) move between the questions; Tab leaves the list.
 */
import { useRef, type KeyboardEvent } from 'react';
import { QUESTIONS, stepQuestion, type QuestionId } from './focus-logic.ts';

export interface QuestionRailProps {
  readonly current: QuestionId;
  readonly onChoose: (id: QuestionId) => void;
  /** One short answer line per question. */
  readonly answers: Readonly<Record<QuestionId, string>>;
  /** Rules fired per question. */
  readonly ruleCounts: Readonly<Record<QuestionId, number>>;
}

export function QuestionRail({ current, onChoose, answers, ruleCounts }: QuestionRailProps) {
  const list = useRef<HTMLDivElement>(null);
  const go = (id: QuestionId) => {
    onChoose(id);
    // Move the keyboard focus with the selection (the tabs pattern: only the chosen tab is in the Tab order).
    requestAnimationFrame(() => list.current?.querySelector<HTMLElement>(`#question-${id}`)?.focus());
  };
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    let next: QuestionId | null = null;
    if (e.key === 'ArrowDown') next = stepQuestion(current, 1);
    else if (e.key === 'ArrowUp') next = stepQuestion(current, -1);
    else if (e.key === 'Home') next = QUESTIONS[0].id;
    else if (e.key === 'End') next = QUESTIONS[QUESTIONS.length - 1].id;
    if (next === null) return;
    // preventDefault also keeps the review keys (next/previous component) from acting on this press.
    e.preventDefault();
    go(next);
  };
  return (
    <div className="question-rail" role="tablist" aria-orientation="vertical" aria-label="Questions about this component" ref={list} onKeyDown={onKey}>
      {QUESTIONS.map((q) => {
        const selected = q.id === current;
        const n = ruleCounts[q.id];
        return (
          <button
            key={q.id}
            type="button"
            role="tab"
            id={`question-${q.id}`}
            aria-selected={selected}
            aria-controls={`answer-${q.id}`}
            tabIndex={selected ? 0 : -1}
            className={`question${selected ? ' question-current' : ''}`}
            data-testid={`focus-question-${q.id}`}
            onClick={() => go(q.id)}
          >
            <span className="question-title">{q.title}</span>
            <span className="question-answer">{answers[q.id]}</span>
            <span className={`question-rules${n > 0 ? ' has-rules' : ''}`}>{n === 0 ? 'no rule fired' : n === 1 ? '1 rule fired' : `${n} rules fired`}</span>
          </button>
        );
      })}
    </div>
  );
}
