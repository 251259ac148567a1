/**
 * One answer of the focus view: the question as a heading, its figures, and beside them the evidence rows
 * that answer it and the suggestion rules that fired on them.
 */
import type { ReactNode } from 'react';
import type { FiredRule } from '../../core/review/suggest.ts';
import type { EvidenceRow } from '../plots/evidence-rows.ts';
import type { Question } from './focus-logic.ts';
import { EvidenceExport } from './EvidenceExport.tsx';
import { FiredRules } from './FiredRules.tsx';

export interface AnswerPanelProps {
  readonly question: Question;
  readonly rows: readonly EvidenceRow[];
  readonly rules: readonly FiredRule[];
  /** "component-07", for the evidence table's export name. */
  readonly context: string;
  readonly children: ReactNode;
}

export function AnswerPanel({ question, rows, rules, context, children }: AnswerPanelProps) {
  const headingId = `answer-${question.id}-heading`;
  return (
    <section
      className={`answer answer-${question.id}`}
      role="tabpanel"
      id={`answer-${question.id}`}
      aria-labelledby={`question-${question.id}`}
      data-testid={`focus-answer-${question.id}`}
      tabIndex={-1}
    >
      <h3 id={headingId} className="answer-title">{question.title}</h3>
      <div className="answer-body">
        <div className="answer-figures">{children}</div>
        <aside className="answer-aside" aria-label={`Evidence for: ${question.title}`}>
          <h4>Rules that fired</h4>
          <FiredRules rules={rules} empty="No suggestion rule fired on these measures." />
          {rows.length ? (
            <EvidenceExport
              rows={rows} heading="Evidence" name={`Evidence ${question.short}`} context={context} testId={`focus-evidence-${question.id}`}
            />
          ) : (
            <>
              <h4>Evidence</h4>
              <p className="fired-none">No measures for this question.</p>
            </>
          )}
        </aside>
      </div>
    </section>
  );
}
