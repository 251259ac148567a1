import { describe, expect, it } from 'vitest';
import { methodsHref, splitMethodsCitations } from '../../../src/ui/help/methods-link.ts';

describe('methods links', () => {
  it('points a section citation at its anchor on the methods page', () => {
    expect(methodsHref('7.2')).toBe('methods.html#s7-2');
    expect(methodsHref()).toBe('methods.html');
  });
  it('splits text into plain pieces and citations', () => {
    expect(splitMethodsCitations('log–log fit (methods §2); range: common practice')).toEqual([
      { text: 'log–log fit (' },
      { text: 'methods §2', section: '2' },
      { text: '); range: common practice' },
    ]);
    expect(splitMethodsCitations('no citation')).toEqual([{ text: 'no citation' }]);
  });
});
