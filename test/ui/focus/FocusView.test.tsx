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
  it('lists every reason of the suggestion for the aim', () => {
    const html = renderToStaticMarkup(<SuggestionReasons evidence={syntheticEvidence()} aim="erp" />);
    expect(html).toContain('<li>dipolar map (RV 4 %)</li>');
    expect(html).toContain('<li>alpha peak at 10.0 Hz</li>');
  });
});
