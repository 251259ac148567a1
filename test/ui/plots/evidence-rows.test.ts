import { describe, expect, it } from 'vitest';
import { evidenceRows } from '../../../src/ui/plots/evidence-rows.ts';
import { suggestWithRules, type SuggestionWithRules } from '../../../src/core/review/suggest.ts';
import { defaultThresholds, thresholdSources } from '../../../src/core/review/thresholds.ts';
import { syntheticEvidence } from './synthetic-evidence.ts';

describe('evidenceRows', () => {
  const e = syntheticEvidence();
  // A suggestion whose one fired rule reads the focality (70 % of the map on Oz) against its threshold.
  const focalityRule = { measure: 'focality.share', value: 0.7, threshold: defaultThresholds.electrodeFocality, direction: '≥' as const, source: thresholdSources.electrodeFocality };
  const suggested: SuggestionWithRules = { suggestion: { verdict: 'remove', reason: 'contact', because: [] }, rules: [focalityRule] };
  const rows = evidenceRows(e, suggested);
  const row = (key: string) => rows.find((r) => r.key === key)!;

  it('gives each number its unit', () => {
    expect(row('hf').value).toBe('5.0');
    expect(row('hf').unit).toBe('%');
    expect(row('fitR2').value).toBe('0.95');
  });
  it('marks exactly the rows whose measure is among the fired rules, with the rule’s threshold, direction and source', () => {
    expect(row('focality').flagged).toBe(true);
    expect(row('focality').threshold).toBe(`≥ ${defaultThresholds.electrodeFocality * 100} % (${thresholdSources.electrodeFocality})`);
    expect(row('focality').rules).toEqual([focalityRule]);
    expect(row('hf').flagged).toBe(false);
    expect(row('hf').threshold).toBe('');
    expect(rows.filter((r) => r.flagged).map((r) => r.key)).toEqual(['focality']);
  });
  it('marks, for the real rules, exactly the rows whose measure fired (and every fired measure that has a row)', () => {
    for (const aim of ['erp', 'oscillations', 'conservative'] as const) {
      const real = suggestWithRules(e, aim);
      const marked = evidenceRows(e, real).filter((r) => r.flagged);
      const fired = new Set(real.rules.map((r) => r.measure));
      for (const r of marked) for (const rule of r.rules) expect(fired.has(rule.measure)).toBe(true);
      expect(marked.flatMap((r) => r.rules).length).toBe(real.rules.filter((r) => marked.some((m) => m.rules.includes(r))).length);
    }
  });
  it('marks nothing without a suggestion: the rows show measures, not comparisons', () => {
    for (const r of evidenceRows(e)) {
      expect(r.flagged).toBe(false);
      expect(r.threshold).toBe('');
    }
  });
  it('shows a rule’s threshold in the row’s unit: fractions in per cent, other numbers as they are', () => {
    const eog = { measure: 'eogCorrelation.vertical', value: 0.1, threshold: 0.7, direction: '≥' as const, source: 'common practice' as const };
    const r = evidenceRows(e, { suggestion: { verdict: 'remove', reason: 'blink', because: [] }, rules: [eog] });
    expect(r.find((x) => x.key === 'eogV')!.threshold).toBe('≥ 0.7 (common practice)');
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
