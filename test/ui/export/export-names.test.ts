import { describe, expect, it } from 'vitest';
import { componentContext, panelFigureTitle, panelFileName, participantPrefix, slugify } from '../../../src/ui/export/export-names.ts';
import { wrapCaption } from '../../../src/ui/export/panel-export.ts';

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

describe('exported figures carry the participant (BIDS entities, specification "Entity table" order)', () => {
  it('names files after the recording’s entities, then the context and panel', () => {
    expect(participantPrefix('sub-01_ses-2_task-walk_run-1_eeg.edf')).toBe('sub-01_ses-2_task-walk_run-1');
    expect(panelFileName('Trial stack', 'svg', componentContext(7), participantPrefix('sub-01_task-oddball_eeg.bdf'))).toBe(
      'sub-01_task-oddball_winnow-component-07-trial-stack.svg',
    );
  });
  it('falls back to the slug of a name without entities, and to none without a recording', () => {
    expect(participantPrefix('recording.edf')).toBe('recording');
    expect(participantPrefix('../My Session 3.edf')).toBe('my-session-3');
    expect(participantPrefix(null)).toBe('');
    expect(panelFileName('Spectrum', 'png', 'preview', '')).toBe('winnow-preview-spectrum.png');
  });
  it('titles the figure with participant, context and panel', () => {
    expect(panelFigureTitle('Spectrum', 'component-07', 'sub-01_task-oddball')).toBe('sub-01 task-oddball · component-07 · Spectrum');
  });
});

describe('captions wrap to the figure width', () => {
  it('wraps greedily on spaces', () => {
    expect(wrapCaption('one two three  four', 9)).toEqual(['one two', 'three', 'four']);
    expect(wrapCaption('averyveryverylongword x', 5)).toEqual(['averyveryverylongword', 'x']);
  });
});
