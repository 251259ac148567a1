import { describe, expect, it } from 'vitest';
import { KEY_BINDINGS, reviewActionForKey } from '../../../src/ui/layout/review-keys.ts';

const press = (key: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }> = {}) => ({
  key, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods,
});

describe('reviewActionForKey', () => {
  it('maps the documented keys to review actions', () => {
    expect(reviewActionForKey(press('ArrowRight'), 'other')).toBe('next');
    expect(reviewActionForKey(press('['), 'other')).toBe('previous');
    expect(reviewActionForKey(press('ArrowDown'), 'other')).toBe('row-down');
    expect(reviewActionForKey(press('x'), 'other')).toBe('remove');
    expect(reviewActionForKey(press('k'), 'other')).toBe('keep');
    expect(reviewActionForKey(press('0'), 'other')).toBe('undecided');
    expect(reviewActionForKey(press('r'), 'other')).toBe('reason-next');
    expect(reviewActionForKey(press('R', { shiftKey: true }), 'other')).toBe('reason-previous');
    expect(reviewActionForKey(press('z', { ctrlKey: true }), 'other')).toBe('undo');
    expect(reviewActionForKey(press('Z', { ctrlKey: true, shiftKey: true }), 'other')).toBe('redo');
    expect(reviewActionForKey(press('?', { shiftKey: true }), 'other')).toBe('help');
  });

  it('leaves keys to the text field being typed in, except Escape', () => {
    expect(reviewActionForKey(press('x'), 'text')).toBeNull();
    expect(reviewActionForKey(press('z', { ctrlKey: true }), 'text')).toBeNull();
    expect(reviewActionForKey(press('Escape'), 'text')).toBe('escape');
  });

  it('lets Enter press a focused button instead of opening the focus view', () => {
    expect(reviewActionForKey(press('Enter'), 'button')).toBeNull();
    expect(reviewActionForKey(press('Enter'), 'other')).toBe('open-focus');
  });

  it('lists a help line for every action the keys can trigger', () => {
    const listed = new Set(KEY_BINDINGS.map((b) => b.action));
    for (const a of ['next', 'previous', 'keep', 'remove', 'undecided', 'reason-next', 'note', 'open-focus', 'undo', 'redo', 'help']) {
      expect(listed.has(a as never)).toBe(true);
    }
  });
});
