import { describe, expect, it } from 'vitest';
import { methodLabel } from '../../../src/ui/start/DecomposeForm.tsx';

describe('methodLabel', () => {
  it('names each method with its measured time on the recording, not a relative claim', () => {
    expect(methodLabel('picard', { picard: { seconds: 41, atLeast: false } }, true)).toBe('Picard — about 40 s here');
    expect(methodLabel('infomax', { picard: { seconds: 41, atLeast: false } }, true)).toBe('extended Infomax — timing…');
    expect(methodLabel('infomax', { infomax: 'failed' }, true)).toBe('extended Infomax');
    expect(methodLabel('picard', {}, false)).toBe('Picard');
  });
});
