import { describe, expect, it } from 'vitest';
import { componentRuns, conflictingDecisions, undecidedComponents, verdictReasonConflict } from '../../../src/ui/decision/verdict-reason.ts';

describe('verdict/reason conflicts (our vocabulary: artefact reasons blink … movement, brain activity neural)', () => {
  it('names why a pair contradicts itself', () => {
    expect(verdictReasonConflict('keep', 'muscle')).toMatch(/names an artefact/);
    expect(verdictReasonConflict('remove', 'neural')).toMatch(/brain activity/);
    expect(verdictReasonConflict('keep', null)).toBeNull();
  });
  it('lists conflicting and undecided components in order', () => {
    const d = {
      1: { verdict: 'keep' as const, reason: 'blink' as const, note: '' },
      2: { verdict: 'remove' as const, reason: 'blink' as const, note: '' },
      4: { verdict: 'remove' as const, reason: 'neural' as const, note: '' },
    };
    expect(conflictingDecisions(d, 5).map((c) => c.index)).toEqual([1, 4]);
    expect(undecidedComponents(d, 6)).toEqual([3, 5, 6]);
    expect(componentRuns([9, 1, 2, 3, 7, 10])).toBe('1–3, 7, 9–10');
  });
});
