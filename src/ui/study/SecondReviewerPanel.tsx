/**
 * A second reviewer's decisions: import them (files or a study export folder), Cohen's kappa per recording
 * and pooled (observed and expected agreement beside it), and a walk through the disagreements one by one
 * with both entries, recording an adjudicated decision.
 */
import { useMemo, useState } from 'react';
import { useShallow } from 'zustand/react/shallow';
import { selectAgreement, studyStore, useStudy } from '../../state/study-hooks.ts';
import { kappaLabel, type KeyedAgreement } from '../../core/review/kappa.ts';
import type { ReviewDecision } from '../../core/review/decisions-file.ts';

const num = (v: number) => (Number.isFinite(v) ? v.toFixed(2) : '—');

function kappaText(a: KeyedAgreement<unknown>): string {
  if (a.n === 0) return 'nothing to compare';
  if (a.kappa === null) return `undefined: both used only "${a.constantCategory}" (p_e = 1)`;
  return `${a.kappa.toFixed(3)} (${kappaLabel(a.kappa)})`;
}

const entryText = (d: ReviewDecision) => `${d.verdict}${d.reason ? `, ${d.reason}` : ''}${d.note ? ` — “${d.note}”` : ''}`;

export function SecondReviewerPanel() {
  const { reviews, second, adjudicated, recordings } = useStudy(useShallow((s) => ({ reviews: s.reviews, second: s.second, adjudicated: s.adjudicated, recordings: s.recordings })));
  const agreement = useMemo(() => selectAgreement({ reviews, second }), [reviews, second]);
  const walk = agreement.perRecording.flatMap((r) => r.disagreements.map((d) => ({ ...d, path: r.path })));
  const [at, setAt] = useState(0);
  const cur = walk[Math.min(at, walk.length - 1)];
  const keyOf = (path: string) => recordings.find((r) => r.path === path)?.stem.replace(/_/g, ' ') ?? path;
  const decided = cur ? adjudicated[cur.path]?.[cur.index] : undefined;
  const take = (d: ReviewDecision) => {
    if (!cur) return;
    studyStore.getState().adjudicate(cur.path, cur.index, d);
    setAt((i) => Math.min(i + 1, walk.length - 1));
  };
  return (
    <section className="second-reviewer" aria-label="Second reviewer" data-testid="second-reviewer">
      <h3>Second reviewer</h3>
      <p>
        <label className="file-pick">
          Import a second reviewer's decisions (files or their study export folder):{' '}
          <input type="file" multiple accept=".json" onChange={(e) => void studyStore.getState().importSecondReviewer([...(e.currentTarget.files ?? [])])} data-testid="second-import" />
        </label>
      </p>
      {second && (
        <>
          {second.unmatched.length > 0 && (
            <ul className="study-problems">
              {second.unmatched.map((u) => <li key={u}>{u}</li>)}
            </ul>
          )}
          {agreement.problems.length > 0 && (
            <ul className="study-problems">
              {agreement.problems.map((u) => <li key={u}>{u}</li>)}
            </ul>
          )}
          {agreement.pooled && (
            <table className="agreement-table" data-testid="agreement-table">
              <thead>
                <tr>
                  <th scope="col">Recording</th>
                  <th scope="col">Components</th>
                  <th scope="col">Observed</th>
                  <th scope="col">Expected</th>
                  <th scope="col">Kappa over verdicts</th>
                  <th scope="col">Kappa over reasons (both removed)</th>
                </tr>
              </thead>
              <tbody>
                {agreement.perRecording.map((r) => (
                  <tr key={r.path}>
                    <th scope="row">{keyOf(r.path)}</th>
                    <td className="num">{r.verdicts.n}</td>
                    <td className="num">{num(r.verdicts.observed)}</td>
                    <td className="num">{num(r.verdicts.chance)}</td>
                    <td>{kappaText(r.verdicts)}</td>
                    <td>{kappaText(r.reasons)}</td>
                  </tr>
                ))}
                <tr className="pooled" data-testid="agreement-pooled">
                  <th scope="row">Study (pooled)</th>
                  <td className="num">{agreement.pooled.verdicts.n}</td>
                  <td className="num">{num(agreement.pooled.verdicts.observed)}</td>
                  <td className="num">{num(agreement.pooled.verdicts.chance)}</td>
                  <td data-testid="kappa-pooled">{kappaText(agreement.pooled.verdicts)}</td>
                  <td>{kappaText(agreement.pooled.reasons)}</td>
                </tr>
              </tbody>
            </table>
          )}
          <p className="kappa-source">Cohen's kappa (Cohen 1960), κ = (p_o − p_e) / (1 − p_e); labels after Landis &amp; Koch 1977 (methods §13).</p>
          {cur ? (
            <div className="disagreement-walk" data-testid="disagreement-walk">
              <h4>
                Disagreement {Math.min(at, walk.length - 1) + 1} of {walk.length}: {keyOf(cur.path)}, component {cur.index} ({cur.kind === 'verdict' ? 'verdicts differ' : 'reasons differ'})
              </h4>
              <dl>
                <dt>You</dt>
                <dd data-testid="walk-mine">{entryText(cur.a)}</dd>
                <dt>{second.name}</dt>
                <dd data-testid="walk-other">{entryText(cur.b)}</dd>
                <dt>Adjudicated</dt>
                <dd data-testid="walk-adjudicated">{decided ? entryText(decided) : 'not yet'}</dd>
              </dl>
              <div className="walk-actions">
                <button type="button" onClick={() => take(cur.a)} data-testid="walk-take-mine">Take yours</button>
                <button type="button" onClick={() => take(cur.b)} data-testid="walk-take-other">Take {second.name}'s</button>
                <button type="button" onClick={() => take({ verdict: 'undecided', reason: null, note: 'left undecided at adjudication' })}>Leave undecided</button>
                <button type="button" onClick={() => void studyStore.getState().openRecording(cur.path, cur.index)} data-testid="walk-open">
                  See its evidence
                </button>
                <button type="button" onClick={() => setAt((i) => Math.max(0, i - 1))} disabled={at === 0}>Previous</button>
                <button type="button" onClick={() => setAt((i) => Math.min(walk.length - 1, i + 1))} disabled={at >= walk.length - 1} data-testid="walk-next">Next</button>
              </div>
            </div>
          ) : (
            agreement.pooled && <p>No disagreements.</p>
          )}
        </>
      )}
    </section>
  );
}
