import { describe, expect, it } from 'vitest';
import { median, medianAbsoluteDeviation, MAD_TO_SD, studyFlags, type StudyRecordingSummary } from '../../../src/core/study/flags.ts';

const row = (key: string, removed: number, removedVariance: number, reasons: string[], extra: Partial<StudyRecordingSummary> = {}): StudyRecordingSummary => ({
  key,
  removed,
  removedVariance,
  reasons,
  undecided: 0,
  aim: 'erp',
  ...extra,
});

describe('robust spread', () => {
  it('median absolute deviation of the worked example {1, 1, 2, 2, 4, 6, 9} is 1 about the median 2 (Wikipedia, "Median absolute deviation", example)', () => {
    expect(median([1, 1, 2, 2, 4, 6, 9])).toBe(2);
    expect(medianAbsoluteDeviation([1, 1, 2, 2, 4, 6, 9])).toBe(1);
  });
  it('scales the MAD by 1/Φ⁻¹(3/4) = 1.4826 to estimate σ for normal data (Hampel 1974; Leys et al. 2013)', () => {
    // Φ⁻¹(0.75) = 0.67449 (standard normal quantile, any statistical table)
    expect(1 / 0.67449).toBeCloseTo(MAD_TO_SD, 3);
  });
});

describe('study flags', () => {
  const ocular = ['blink', 'gaze', 'muscle'];
  it('flags the recording whose removals are far from the others (median ± 3 scaled MAD)', () => {
    const rows = [row('a', 4, 0.30, ocular), row('b', 5, 0.32, ocular), row('c', 4, 0.29, ocular), row('d', 5, 0.31, ocular), row('e', 14, 0.80, ocular)];
    const flags = studyFlags(rows);
    expect(flags.filter((f) => f.rule === 'removed-count').map((f) => f.key)).toEqual(['e']);
    expect(flags.filter((f) => f.rule === 'removed-variance').map((f) => f.key)).toEqual(['e']);
    expect(flags.find((f) => f.rule === 'removed-count')?.why).toMatch(/14 is far from the study's median 5/);
  });
  it('flags no ocular component where most recordings have one, a reason used nowhere else, undecided left and another aim', () => {
    const rows = [
      row('a', 3, 0.3, ['blink', 'muscle']),
      row('b', 3, 0.3, ['blink', 'muscle']),
      row('c', 3, 0.3, ['gaze', 'muscle', 'cardiac']),
      row('d', 3, 0.3, ['muscle'], { undecided: 2, aim: 'oscillations' }),
    ];
    const flags = studyFlags(rows).map((f) => `${f.key}:${f.rule}`);
    expect(flags).toContain('d:no-ocular');
    expect(flags).toContain('c:lone-reason');
    expect(flags).toContain('c:lone-reason');
    expect(flags).toContain('d:undecided');
    expect(flags).toContain('d:other-aim');
    expect(flags.filter((f) => f.startsWith('a:'))).toEqual([]);
  });
  it('says nothing about spread with fewer than 4 recordings', () => {
    expect(studyFlags([row('a', 1, 0.1, ['blink']), row('b', 9, 0.9, ['blink'])])).toEqual([]);
  });
});
