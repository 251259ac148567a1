import { describe, expect, it } from 'vitest';
import { agreementTable, cohenKappa, kappaLabel, weightedKappa } from '../../../src/core/review/kappa.ts';
// Published Cohen (1968) Table 1 values and a computed IC-review example, by test/fixtures/evidence/kappa.py.
import fixture from '../../fixtures/evidence/kappa.json';

describe('Cohen’s kappa', () => {
  it('reproduces Cohen (1968) Table 1: κ = .492 and weighted κ = .348', () => {
    const t = fixture.cohen1968_table1;
    const r = cohenKappa(t.proportions);
    expect(r.observed).toBeCloseTo(t.computed.p_o, 12);
    expect(r.chance).toBeCloseTo(t.computed.p_e, 12);
    expect(r.kappa!).toBeCloseTo(t.computed.kappa, 12);
    expect(r.kappa!.toFixed(3)).toBe(t.published_kappa.toFixed(3));
    expect(weightedKappa(t.proportions, t.weights_disagreement)!).toBeCloseTo(t.computed.kappa_w, 12);
  });

  it('gives κ = 0.7163 for the 24-component example from its label lists, and 0.589 on keep/reject', () => {
    const ex = fixture.ic_review_example;
    const { table } = agreementTable(ex.reviewer_a, ex.reviewer_b, ex.categories);
    expect(table).toEqual(ex.confusion_rows_a_cols_b);
    expect(cohenKappa(table).kappa!).toBeCloseTo(ex.kappa_from_labels, 12);
    const keep = (l: string) => (l === 'brain' || l === 'other' ? 'keep' : 'reject');
    const binary = agreementTable(ex.reviewer_a.map(keep), ex.reviewer_b.map(keep));
    expect(cohenKappa(binary.table).kappa!).toBeCloseTo(ex.binary_reject_keep.kappa, 12);
  });

  it('handles the edge cases: perfect 1, chance 0, opposite −1, one shared category undefined', () => {
    expect(cohenKappa([[5, 0], [0, 5]]).kappa).toBe(1);
    expect(cohenKappa([[25, 25], [25, 25]]).kappa).toBe(0);
    expect(cohenKappa([[0, 10], [10, 0]]).kappa).toBe(-1);
    expect(cohenKappa([[7, 0], [0, 0]]).kappa).toBeNull();
    expect(cohenKappa(fixture.fleiss_cohen_everitt1969_counts.table).kappa!).toBeCloseTo(fixture.fleiss_cohen_everitt1969_counts.computed.kappa, 12);
  });

  it('labels κ with the Landis & Koch (1977) words', () => {
    expect([-0.1, 0.1, 0.3, 0.5, 0.7, 0.9].map(kappaLabel)).toEqual(['poor', 'slight', 'fair', 'moderate', 'substantial', 'almost perfect']);
    expect(kappaLabel(null)).toBe('n/a');
  });
});
