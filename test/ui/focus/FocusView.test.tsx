/**
 * Server-side rendering of the focus view in node. The store's server snapshot is its initial state, so
 * this checks the empty view and the decision controls' test hooks; the filled view is covered by e2e.
 */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { FocusView } from '../../../src/ui/focus/FocusView.tsx';
import { DecisionControls } from '../../../src/ui/focus/DecisionControls.tsx';
import { SuggestionReasons } from '../../../src/ui/focus/SuggestionReasons.tsx';
import { syntheticEvidence } from '../plots/synthetic-evidence.ts';
import { suggestWithRules } from '../../../src/core/review/suggest.ts';
import { QuestionRail } from '../../../src/ui/focus/QuestionRail.tsx';
import { AnswerPanel } from '../../../src/ui/focus/AnswerPanel.tsx';
import { TrialStackPanel } from '../../../src/ui/focus/TrialStackPanel.tsx';
import { QUESTIONS } from '../../../src/ui/focus/focus-logic.ts';

describe('FocusView', () => {
  it('renders its test hook and a hint before a participant is open', () => {
    const html = renderToStaticMarkup(<FocusView />);
    expect(html).toContain('data-testid="focus-view"');
    expect(html).toContain('choose a component');
  });
});

describe('DecisionControls', () => {
  const html = renderToStaticMarkup(<DecisionControls index={4} />);
  it('offers keep, remove and undecided with a symbol and a word each, undecided pressed by default', () => {
    for (const v of ['keep', 'remove', 'undecided']) expect(html).toContain(`data-testid="decision-${v}"`);
    expect(html).toMatch(/aria-pressed="true"[^>]*data-testid="decision-undecided"/);
    expect(html).toContain('✕</span> remove');
  });
  it('offers every reason code of the vocabulary and a note field', () => {
    expect(html).toContain('data-testid="decision-reason"');
    expect(html.match(/<option/g)?.length).toBe(11); // (none) + 10 reason codes
    expect(html).toContain('data-testid="decision-note"');
  });
});

describe('SuggestionReasons', () => {
  it('lists every reason of the suggestion for the aim and the questions its rules answer', () => {
    const suggestion = suggestWithRules(syntheticEvidence(), 'erp');
    const html = renderToStaticMarkup(<SuggestionReasons index={1} suggestion={suggestion} aim="erp" onQuestion={() => {}} />);
    expect(html).toContain(`Suggested for the <strong>erp</strong> aim`);
    for (const b of suggestion.suggestion.because) expect(html).toContain(`<li>${b.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')}</li>`);
    expect(html).toContain('Take this suggestion');
  });
  it('says so when there is no suggestion', () => {
    expect(renderToStaticMarkup(<SuggestionReasons index={1} suggestion={null} aim="erp" />)).toContain('No suggestion');
  });
});

describe('QuestionRail', () => {
  const answers = { where: 'strongest at Fp1', when: 'kurtosis 23', locked: 'no task events to lock to', frequencies: 'no alpha peak' };
  const html = renderToStaticMarkup(<QuestionRail current="locked" onChoose={() => {}} answers={answers} ruleCounts={{ where: 1, when: 2, locked: 0, frequencies: 1 }} />);
  it('offers the four questions as tabs, the chosen one selected and alone in the Tab order (WAI-ARIA tabs pattern)', () => {
    expect(html).toContain('role="tablist"');
    expect(html).toContain('aria-orientation="vertical"');
    expect(html.match(/role="tab"/g)?.length).toBe(4);
    expect(html).toMatch(/aria-selected="true"[^>]*tabindex="0"[^>]*data-testid="focus-question-locked"/);
    expect(html.match(/tabindex="-1"/g)?.length).toBe(3);
  });
  it('shows each short answer and how many rules fired', () => {
    expect(html).toContain('Is it locked to the task?');
    expect(html).toContain('no task events to lock to');
    expect(html).toContain('2 rules fired');
    expect(html).toContain('1 rule fired');
    expect(html).toContain('no rule fired');
  });
});

describe('AnswerPanel', () => {
  it('puts the figures beside the fired rules and the evidence rows of its question', () => {
    const q = QUESTIONS[0];
    const html = renderToStaticMarkup(
      <AnswerPanel
        question={q}
        rows={[{ key: 'rv', label: 'Dipole residual variance', value: '4.0', unit: '%', threshold: '≤ 15 %', source: 'ours', flagged: false, rules: [] }]}
        rules={[{ measure: 'dipole.residualVariance', value: 0.04, threshold: 0.15, direction: '≤', source: 'ours' }]}
        context="component-03"
      >
        <svg data-figure="" />
      </AnswerPanel>,
    );
    expect(html).toContain('role="tabpanel"');
    expect(html).toContain('data-testid="focus-answer-where"');
    expect(html).toContain('<svg data-figure=""></svg>');
    expect(html).toContain('dipole residual variance');
    expect(html).toContain('4\u00a0% ≤ 15\u00a0% (ours)');
    expect(html).toContain('4.0\u00a0%');
    // the evidence table has its own SVG export button (issue 14 item 11)
    expect(html).toContain('data-testid="focus-evidence-where-svg"');
  });
});

describe('TrialStackPanel', () => {
  // Two condition values of one trial_type (BIDS events.tsv columns), on a 10 Hz trace with bumps after each event.
  const fs = 10;
  const trace = new Float64Array(300);
  const events = [2, 5, 8, 11, 14, 17].map((onset, i) => ({ onset, label: 'tone', source: 'events-tsv', columns: { condition: i % 3 === 2 ? 'rare' : 'standard' } }));
  for (const e of events) trace[Math.round(e.onset * fs) + 2] = e.columns.condition === 'rare' ? 3 : 1;
  const settings = { sort: 'order' as const, smoothing: 1, amplitudeWindowS: [0, 0.5] as const, lockTo: null, splitBy: null };
  const render = (patch: object) =>
    renderToStaticMarkup(
      <TrialStackPanel
        trace={trace} sampleRate={fs} events={events} defaultLockTo="tone" window={[-0.2, 0.5]} channel="Fz"
        settings={{ ...settings, ...patch }} onSettings={() => {}} context="component-01"
      />,
    );
  it('locks to a trial_type and offers its columns in plain words', () => {
    const html = render({});
    expect(html).toContain('data-epochs="6"');
    expect(html).toContain('tone (6)');
    expect(html).toContain('condition rare (2)');
    expect(html).toContain('Split by');
    expect(html).toContain('as they happened');
    expect(html).toContain('Blend each row with neighbours');
  });
  it('narrows to one column value and splits by a column', () => {
    expect(render({ lockTo: 'tone\tcondition=rare' })).toContain('data-epochs="2"');
    const split = render({ splitBy: 'condition' });
    expect(split).toContain('data-groups="2"');
    expect(split).toContain('split by condition');
    expect(split).toContain('standard (4)');
  });
});
