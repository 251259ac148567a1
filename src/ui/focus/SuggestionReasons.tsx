/** The suggestion for the current aim and every reason behind it; one click takes it over. */
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import type { Aim } from '../../core/review/vocabulary.ts';
import { useWorkbench } from '../../state/index.ts';
import { VERDICT_GLYPH } from '../board/VerdictMark.tsx';

export function SuggestionReasons({ evidence, aim }: { evidence: ComponentEvidence; aim: Aim }) {
  const decide = useWorkbench((s) => s.decide);
  const s = evidence.suggestions[aim];
  if (!s) return <p>No suggestion for this aim.</p>;
  return (
    <div className="suggestion-reasons">
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
      <button type="button" onClick={() => decide(evidence.index, { verdict: s.verdict, reason: s.reason })}>
        Take this suggestion
      </button>
      <p className="hint">The suggestion explains; the decision is yours.</p>
    </div>
  );
}
