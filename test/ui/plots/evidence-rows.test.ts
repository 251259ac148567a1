import { describe, expect, it } from 'vitest';
import { evidenceRows } from '../../../src/ui/plots/evidence-rows.ts';
import { suggestWithRules } from '../../../src/core/review/suggest.ts';
import { defaultThresholds, thresholdSources } from '../../../src/core/review/thresholds.ts';
import { syntheticEvidence } from './synthetic-evidence.ts';

describe('evidenceRows', () => {
  const e = syntheticEvidence();
  // The synthetic map puts 70 % of its energy on Oz: the contact rule (focality ≥ electrodeFocality) fires.
  const suggested = suggestWithRules(e, 'erp');
  const rows = evidenceRows(e, suggested);
  const row = (key: string) => rows.find((r) => r.key === key)!;

  it('gives each number its unit', () => {
    expect(row('hf').value).toBe('5.0');
    expect(row('hf').unit).toBe('%');
    expect(row('fitR2').value).toBe('0.95');
  });
  it('marks exactly the rows whose measure is among the fired rules, with the rule’s threshold, direction and source', () => {
    expect(suggested.suggestion.reason).toBe('contact');
    const fired = new Set(suggested.rules.map((r) => r.measure));
    expect(fired.has('focality.share')).toBe(true);
    expect(row('focality').flagged).toBe(true);
    expect(row('focality').threshold).toBe(`≥ ${defaultThresholds.electrodeFocality * 100} % (${thresholdSources.electrodeFocality})`);
    expect(row('focality').rules[0]).toMatchObject({ measure: 'focality.share', value: 0.7, threshold: defaultThresholds.electrodeFocality, direction: '≥' });
    expect(row('hf').flagged).toBe(false);
    expect(row('hf').threshold).toBe('');
    for (const r of rows) expect(r.flagged).toBe(r.rules.length > 0);
  });
  it('marks nothing without a suggestion: the rows show measures, not comparisons', () => {
    for (const r of evidenceRows(e)) {
      expect(r.flagged).toBe(false);
      expect(r.threshold).toBe('');
    }
  });
  it('follows the thresholds the suggestion used: raise the electrode threshold and the focality row is no longer marked', () => {
    const relaxed = suggestWithRules(e, 'erp', { ...defaultThresholds, electrodeFocality: 0.9 });
    expect(evidenceRows(e, relaxed).find((r) => r.key === 'focality')!.flagged).toBe(false);
  });
  it('shows the shuffle count of the permutation test and every event type tested', () => {
    expect(row('locking').source).toContain('999 shuffles');
    expect(row('locking').source).toContain('p = 0.010');
    expect(row('locking:response').source).toMatch(/3 epochs, p = 0\.400, 25 shuffles/);
    expect(rows.some((r) => r.key === 'locking:stimulus')).toBe(false); // the epoched type is the 'locking' row
  });
  it('writes n/a for a missing correlation and none for a missing alpha peak', () => {
    expect(row('eogH').value).toBe('n/a');
    const none = evidenceRows(syntheticEvidence(1, { alphaPeakHz: null }));
    expect(none.find((r) => r.key === 'alpha')!.value).toBe('none');
  });
  it('drops the event and dipole rows when that evidence is missing', () => {
    const bare = evidenceRows(syntheticEvidence(1, { erp: null, dipole: null, timeLocking: [] }));
    expect(bare.some((r) => r.key === 'rv' || r.key.startsWith('locking'))).toBe(false);
  });
  it('says the dipole region is a model estimate', () => {
    expect(row('region').source).toMatch(/model estimate/);
  });
});
