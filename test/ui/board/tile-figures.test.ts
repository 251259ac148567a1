import { describe, expect, it } from 'vitest';
import { tileFigures } from '../../../src/ui/board/tile-figures.ts';
import type { ComponentEvidence } from '../../../src/core/evidence/types.ts';
import type { SuggestionWithRules } from '../../../src/core/review/suggest.ts';
import type { ReasonCode, Verdict } from '../../../src/core/review/vocabulary.ts';

const evidence = {
  index: 1, varianceShare: 0.2, highFrequencyShare: 0.004, mainsShare: 0.01, kurtosis: 12.34, frontalGradient: 4.56,
  focality: { share: 0.3, channel: 'Fp1' }, cardiac: { bpm: 72.4, peak: 0.5 }, erp: null, dipole: { residualVariance: 0.052 },
  alphaPeakHz: null, oneOverF: { exponent: 1.5 }, stepLocking: null,
  eogCorrelation: { vertical: 0.91, horizontal: 0.2, source: 'EOG channels', channels: { vertical: 'VEOG', horizontal: 'HEOG' } },
} as unknown as ComponentEvidence;
const suggested = (verdict: Verdict, reason: ReasonCode): SuggestionWithRules => ({ suggestion: { verdict, reason, because: [] }, rules: [] });

describe('tileFigures', () => {
  it('shows the figures behind the suggested reason, each with its unit', () => {
    expect(tileFigures(evidence, suggested('remove', 'blink')).map((f) => `${f.label} ${f.value}`)).toEqual(['EOG |r| 0.91', 'frontal 4.6×', 'kurtosis 12.3']);
    expect(tileFigures(evidence, suggested('remove', 'cardiac')).map((f) => `${f.label} ${f.value}`)).toEqual(['beat 72 bpm', 'dipole RV 5.2\u00a0%', 'kurtosis 12.3']);
    expect(tileFigures(evidence, suggested('keep', 'neural')).map((f) => `${f.label} ${f.value}`)).toEqual(['dipole RV 5.2\u00a0%', 'alpha none', 'phase-locked n/a']);
    expect(tileFigures(evidence, null).map((f) => f.label)).toEqual(['dipole RV', 'EOG |r|', '20 Hz+ share']); // unclear
  });
});
