/**
 * Keep / remove / undecided, a reason code and a free-text note for one component, written to the store
 * with `decide`. Each verdict button carries a symbol and a word, so the choice reads without colour. The
 * note is committed 400 ms after typing stops, on leaving the field, and when the view closes.
 */
import { useEffect, useRef, useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { UNDECIDED } from '../../core/review/decisions-file.ts';
import { VerdictButtons } from '../decision/VerdictButtons.tsx';
import { ReasonSelect } from '../decision/ReasonSelect.tsx';

const NOTE_COMMIT_MS = 400;

export function DecisionControls({ index }: { index: number }) {
  const decision = useWorkbench((s) => s.decisions[index] ?? UNDECIDED);
  const decide = useWorkbench((s) => s.decide);
  const [note, setNote] = useState(decision.note);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const pending = useRef<string | null>(null);

  // Show the stored note when the component changes or the note changes elsewhere (undo, import).
  useEffect(() => {
    if (pending.current === null) setNote(decision.note);
  }, [decision.note, index]);

  const flush = () => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    if (pending.current !== null) {
      decide(index, { note: pending.current });
      pending.current = null;
    }
  };
  // Commit a pending note before switching component or leaving the view.
  useEffect(() => flush, [index]);

  return (
    <div className="decision-controls" role="group" aria-label={`Decision for component ${index}`}>
      <VerdictButtons verdict={decision.verdict} onChoose={(v) => decide(index, { verdict: v })} testIdPrefix="decision" />
      <ReasonSelect reason={decision.reason} verdict={decision.verdict} onChoose={(reason) => decide(index, { reason })} testId="decision-reason" />
      <label className="field">
        Note
        <textarea
          rows={3}
          value={note}
          data-testid="decision-note"
          data-note-field=""
          placeholder="What you saw and why"
          onChange={(e) => {
            setNote(e.target.value);
            pending.current = e.target.value;
            if (timer.current) clearTimeout(timer.current);
            timer.current = setTimeout(flush, NOTE_COMMIT_MS);
          }}
          onBlur={flush}
        />
      </label>
    </div>
  );
}
