import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { ComponentStripView } from '../../../src/ui/preview/ComponentStrip.tsx';
import { stripToggleVerdict } from '../../../src/ui/preview/preview-logic.ts';

describe('ComponentStrip', () => {
  it('lists every component with its verdict, the removed ones pressed and the selected one marked', () => {
    const decisions = { 2: { verdict: 'remove' as const, reason: 'blink' as const, note: '' }, 3: { verdict: 'keep' as const, reason: 'neural' as const, note: '' } };
    const html = renderToStaticMarkup(<ComponentStripView nComponents={4} decisions={decisions} selected={3} decide={() => {}} select={() => {}} />);
    expect(html.match(/data-testid="preview-strip-\d"/g)).toHaveLength(4);
    expect(html).toMatch(/data-testid="preview-strip-2" data-verdict="remove"/);
    expect(html).toMatch(/aria-pressed="true"[^>]*data-testid="preview-strip-toggle-2"/);
    expect(html).toMatch(/aria-pressed="false"[^>]*data-testid="preview-strip-toggle-1"/);
    expect(html).toMatch(/data-testid="preview-strip-3" data-verdict="keep" aria-current="true"/);
    expect(html).not.toMatch(/data-testid="preview-strip-1"[^>]*aria-current/);
  });
  it('toggles remove on, and a removed component back to keep', () => {
    expect(stripToggleVerdict('undecided')).toBe('remove');
    expect(stripToggleVerdict('keep')).toBe('remove');
    expect(stripToggleVerdict('remove')).toBe('keep');
  });
});
