/** Static rendering of the checks shown before export (undecided components; contradicting verdict/reason pairs). */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { ExportChecks } from '../../../src/ui/layout/ExportPanel.tsx';

describe('ExportChecks', () => {
  it('warns about undecided components and lists contradicting pairs without refusing them', () => {
    const html = renderToStaticMarkup(
      <ExportChecks decisions={{ 1: { verdict: 'keep', reason: 'blink', note: '' }, 2: { verdict: 'remove', reason: 'gaze', note: '' } }} nComponents={5} />,
    );
    expect(html).toContain('data-testid="export-undecided-warning"');
    expect(html).toContain('3 of 5 components are undecided (3–5)');
    expect(html).toContain('component 1: kept, but the reason “blink” names an artefact');
  });
  it('says nothing when every component is decided consistently', () => {
    expect(renderToStaticMarkup(<ExportChecks decisions={{ 1: { verdict: 'keep', reason: 'neural', note: '' } }} nComponents={1} />)).toBe('');
  });
});
