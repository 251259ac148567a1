import { describe, expectTypeOf, it } from 'vitest';
import type { TrueSourceClass } from '../../../src/core/simulate/truth.ts';

describe('TrueSourceClass', () => {
  it('is the review vocabulary’s origin codes (neither mixed nor unclear) plus noise', () => {
    // Checked by the type checker (tsc --noEmit covers test/); the list is the team brief's reason codes.
    expectTypeOf<TrueSourceClass>().toEqualTypeOf<
      'neural' | 'blink' | 'gaze' | 'muscle' | 'cardiac' | 'mains' | 'contact' | 'movement' | 'noise'
    >();
  });
});
