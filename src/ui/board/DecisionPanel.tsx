/**
 * The selected component's decision: verdict (three buttons), reason code, free-text note, the suggestion
 * with its reasons, and the way to the focus view and the preview. Every control is a native element, so
 * Tab reaches all of them.
 */
import { useEffect, useRef, useState } from 'react';
import { selectDecision, selectSuggestion, useWorkbench } from '../../state/index.ts';
import { VerdictMark } from './VerdictMark.tsx';
import { VerdictButtons } from '../decision/VerdictButtons.tsx';
import { ReasonSelect } from '../decision/ReasonSelect.tsx';

/** Milliseconds of typing pause after which a note is committed (also on blur). */
const NOTE_COMMIT_MS = 600;

export function DecisionPanel() {
  const index = useWorkbench((s) => s.selected);
  if (index === null) return <aside className="decision-panel" aria-label="Decision">Select a component.</aside>;
  return <DecisionPanelFor key={index} index={index} />;
}

function DecisionPanelFor({ index }: { index: number }) {
  const decision = useWorkbench(selectDecision(index));
  const suggested = useWorkbench(selectSuggestion(index));
  const aim = useWorkbench((s) => s.aim);
  const decide = useWorkbench((s) => s.decide);
  const setScreen = useWorkbench((s) => s.setScreen);
  const suggestion = suggested?.suggestion ?? null;

  const [note, setNote] = useState(decision.note);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  // Follow outside changes (undo, import) when the field is not being edited.
  const editing = useRef(false);
  useEffect(() => {
    if (!editing.current) setNote(decision.note);
  }, [decision.note]);
  const commit = (text: string) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    decide(index, { note: text });
  };
  useEffect(() => () => { if (timer.current) clearTimeout(timer.current); }, []);

  return (
    <aside className="decision-panel" aria-label={`Decision for component ${index}`} data-testid="decision-panel">
      <h2>Component {index}</h2>
      <VerdictButtons
        verdict={decision.verdict}
        onChoose={(v) => decide(index, { verdict: v })}
        testIdPrefix="verdict"
        groupLabel="Verdict"
        title={(v) => `${v} (key ${v === 'keep' ? 'k' : v === 'remove' ? 'x' : '0'})`}
      />
      <ReasonSelect
        reason={decision.reason}
        verdict={decision.verdict}
        onChoose={(reason) => decide(index, { reason })}
        testId="reason-select"
        title="Reason code (keys r / Shift+R cycle)"
      />
      <label className="field">
        Note
        <textarea
          value={note}
          rows={3}
          data-note-field=""
          data-testid="note-field"
          placeholder="Why? (key n to write, Escape to leave)"
          onFocus={() => { editing.current = true; }}
          onChange={(e) => {
            const text = e.target.value;
            setNote(text);
            if (timer.current) clearTimeout(timer.current);
            timer.current = setTimeout(() => commit(text), NOTE_COMMIT_MS);
          }}
          onBlur={(e) => { editing.current = false; commit(e.target.value); }}
        />
      </label>
      {suggestion && (
        <section className="suggestion" aria-label="Suggestion">
          <p>
            Suggested for the {aim} aim: <VerdictMark verdict={suggestion.verdict} kind="suggested" /> <strong>{suggestion.reason}</strong>
          </p>
          {suggestion.because.length > 0 && (
            <ul>
              {suggestion.because.map((b, i) => <li key={i}>{b}</li>)}
            </ul>
          )}
          <button type="button" onClick={() => decide(index, { verdict: suggestion.verdict, reason: suggestion.reason })} data-testid="accept-suggestion" title="Key a">
            Take the suggestion
          </button>
        </section>
      )}
      <div className="panel-actions">
        <button type="button" onClick={() => setScreen('focus')} data-testid="open-focus" title="Key Enter or f">Open focus view</button>
        <button type="button" onClick={() => setScreen('preview')} data-testid="open-preview" title="Key p">Before / after preview</button>
      </div>
    </aside>
  );
}
