import { describe, expect, it } from 'vitest';
import { boardOrder, impactOnAim, nextUndecided } from '../../../src/ui/board/board-order.ts';
import type { ComponentEvidence } from '../../../src/core/evidence/types.ts';
import type { SuggestionWithRules } from '../../../src/core/review/suggest.ts';
import type { ReasonCode, Verdict } from '../../../src/core/review/vocabulary.ts';

const ev = (index: number, varianceShare: number, lockedShare: number, lowFrequencyShare: number) =>
  ({ index, varianceShare, lowFrequencyShare, erp: { lockedShare } }) as unknown as ComponentEvidence;
const evidence = [ev(1, 0.3, 0.01, 0.9), ev(2, 0.2, 0.5, 0.2), ev(3, 0.1, 0.2, 0.1), ev(4, 0.4, 0, 0.5)];
// The current suggestions (what selectSuggestions gives), by component.
const s = (verdict: Verdict, reason: ReasonCode): SuggestionWithRules => ({ suggestion: { verdict, reason, because: [] }, rules: [] });
const suggestions = new Map([[1, s('remove', 'blink')], [2, s('keep', 'neural')], [3, s('remove', 'muscle')], [4, s('keep', 'neural')]]);
const all = { verdict: 'all', reason: 'all' } as const;

describe('impactOnAim', () => {
  it('weights the variance share by the locked share for erp and by the share above 4 Hz for oscillations', () => {
    expect(impactOnAim(evidence[1], 'erp')).toBeCloseTo(0.2 * 0.5, 12);
    expect(impactOnAim(evidence[1], 'oscillations')).toBeCloseTo(0.2 * 0.8, 12);
    expect(impactOnAim(evidence[1], 'conservative')).toBeCloseTo(0.2, 12);
  });
});

describe('boardOrder', () => {
  it('sorts by component number, variance share, impact and suggestion', () => {
    expect(boardOrder(4, evidence, {}, 'erp', 'index', all, suggestions)).toEqual([1, 2, 3, 4]);
    expect(boardOrder(4, evidence, {}, 'erp', 'variance', all, suggestions)).toEqual([4, 1, 2, 3]);
    // erp impact: 0.003, 0.1, 0.02, 0
    expect(boardOrder(4, evidence, {}, 'erp', 'impact', all, suggestions)).toEqual([2, 3, 1, 4]);
    // remove first (larger variance first), then keep
    expect(boardOrder(4, evidence, {}, 'erp', 'suggestion', all, suggestions)).toEqual([1, 3, 4, 2]);
  });

  it('filters by verdict and by reason (the reviewer’s, else the suggested one)', () => {
    const decisions = { 2: { verdict: 'remove' as const, reason: 'muscle' as const, note: '' } };
    expect(boardOrder(4, evidence, decisions, 'erp', 'index', { verdict: 'remove', reason: 'all' }, suggestions)).toEqual([2]);
    expect(boardOrder(4, evidence, decisions, 'erp', 'index', { verdict: 'undecided', reason: 'all' }, suggestions)).toEqual([1, 3, 4]);
    expect(boardOrder(4, evidence, decisions, 'erp', 'index', { verdict: 'all', reason: 'muscle' }, suggestions)).toEqual([2, 3]);
  });

  it('sorts by the suggestions it is given: other suggestions, other order, same evidence', () => {
    const flipped = new Map([[1, s('keep', 'neural')], [2, s('remove', 'muscle')], [3, s('keep', 'neural')], [4, s('remove', 'contact')]]);
    expect(boardOrder(4, evidence, {}, 'erp', 'suggestion', all, flipped)).toEqual([4, 2, 1, 3]);
  });

  it('lists components without evidence in number order', () => {
    expect(boardOrder(3, null, {}, 'erp', 'variance', all)).toEqual([1, 2, 3]);
  });
});

describe('nextUndecided', () => {
  it('finds the next undecided component after the current one, wrapping around', () => {
    const d = { 2: { verdict: 'keep' as const, reason: null, note: '' }, 3: { verdict: 'remove' as const, reason: null, note: '' } };
    expect(nextUndecided([1, 2, 3, 4], d, 1)).toBe(4);
    expect(nextUndecided([1, 2, 3, 4], d, 4)).toBe(1);
    expect(nextUndecided([2, 3], d, 2)).toBeNull();
  });
});
