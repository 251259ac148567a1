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
  it('lists every reason of the suggestion (suggestWithRules, computed from the evidence) for the aim', () => {
    const suggested = suggestWithRules(syntheticEvidence(), 'erp');
    const html = renderToStaticMarkup(<SuggestionReasons index={1} suggestion={suggested} aim="erp" />);
    expect(suggested.suggestion.because.length).toBeGreaterThan(0);
    for (const b of suggested.suggestion.because) expect(html).toContain(`<li>${b.replace(/&/g, '&amp;').replace(/"/g, '&quot;')}</li>`);
    expect(html).toContain(`(${suggested.suggestion.reason})`);
  });
  it('says so when there is no suggestion', () => {
    expect(renderToStaticMarkup(<SuggestionReasons index={1} suggestion={null} aim="erp" />)).toContain('No suggestion');
  });
});
