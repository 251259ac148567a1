import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { ComponentStripView } from '../../../src/ui/preview/ComponentStrip.tsx';
import { stripFocusTarget, stripToggleVerdict } from '../../../src/ui/preview/preview-logic.ts';

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
  // WAI-ARIA Authoring Practices Guide 1.2, Toolbar pattern: one Tab stop (roving tabindex) on the selected item.
  it('is a toolbar with one Tab stop, on the selected component', () => {
    const html = renderToStaticMarkup(<ComponentStripView nComponents={4} decisions={{}} selected={3} decide={() => {}} select={() => {}} />);
    expect(html).toContain('role="toolbar"');
    expect(html.match(/tabindex="0"/g)).toHaveLength(1);
    expect(html).toMatch(/tabindex="0"[^>]*data-testid="preview-strip-toggle-3"/);
    const none = renderToStaticMarkup(<ComponentStripView nComponents={4} decisions={{}} selected={null} decide={() => {}} select={() => {}} />);
    expect(none).toMatch(/tabindex="0"[^>]*data-testid="preview-strip-toggle-1"/);
  });
  it('moves with the arrows, Home and End, stopping at the ends (APG Toolbar keyboard interaction)', () => {
    expect(stripFocusTarget('ArrowRight', 2, 4)).toBe(3);
    expect(stripFocusTarget('ArrowDown', 4, 4)).toBe(4);
    expect(stripFocusTarget('ArrowLeft', 2, 4)).toBe(1);
    expect(stripFocusTarget('ArrowUp', 1, 4)).toBe(1);
    expect(stripFocusTarget('Home', 3, 4)).toBe(1);
    expect(stripFocusTarget('End', 1, 4)).toBe(4);
    expect(stripFocusTarget(' ', 1, 4)).toBeNull();
    expect(stripFocusTarget('Enter', 1, 4)).toBeNull();
  });
  it('toggles remove on, and a removed component back to keep', () => {
    expect(stripToggleVerdict('undecided')).toBe('remove');
    expect(stripToggleVerdict('keep')).toBe('remove');
    expect(stripToggleVerdict('remove')).toBe('keep');
  });
});
