/** Static rendering of the shared verdict buttons in both of their uses (board panel and focus view). */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { VerdictButtons } from '../../../src/ui/decision/VerdictButtons.tsx';

describe('VerdictButtons', () => {
  it('gives each verdict a test hook with the caller’s prefix, a symbol and the word, pressing only the current one', () => {
    const html = renderToStaticMarkup(<VerdictButtons verdict="remove" onChoose={() => {}} testIdPrefix="decision" />);
    for (const v of ['keep', 'remove', 'undecided']) expect(html).toContain(`data-testid="decision-${v}"`);
    expect(html).toMatch(/aria-pressed="true"[^>]*data-testid="decision-remove"/);
    expect(html.match(/aria-pressed="true"/g)?.length).toBe(1);
    expect(html).toContain('✓</span> keep');
    expect(html).not.toContain('role="group"');
    expect(html).not.toContain('title=');
  });
  it('forms a labelled group with per-verdict titles when asked', () => {
    const html = renderToStaticMarkup(
      <VerdictButtons verdict="keep" onChoose={() => {}} testIdPrefix="verdict" groupLabel="Verdict" title={(v) => `${v} (key)`} />,
    );
    expect(html).toContain('role="group" aria-label="Verdict"');
    expect(html).toContain('data-testid="verdict-undecided" title="undecided (key)"');
  });
});
