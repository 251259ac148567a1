import { describe, expect, it } from 'vitest';
import { componentContext, panelFileName, slugify } from '../../../src/ui/export/export-names.ts';

describe('panel file names', () => {
  it('are lower-case words joined by hyphens', () => {
    expect(panelFileName('Trial stack', 'svg', componentContext(7))).toBe('winnow-component-07-trial-stack.svg');
    expect(panelFileName('Spectra before / after', 'png', 'preview')).toBe('winnow-preview-spectra-before-after.png');
  });
  it('drop path separators and markup from text that came from a file', () => {
    expect(slugify('../../etc/<script>')).toBe('etc-script');
    expect(slugify('µV² ≥')).toBe('v2'); // NFKD folds the superscript two to 2
  });
  it('fall back to "panel" when nothing usable is left', () => {
    expect(slugify('///')).toBe('panel');
  });
});
