import { describe, expect, it } from 'vitest';
import { evidenceRows } from '../../../src/ui/plots/evidence-rows.ts';
import { defaultThresholds } from '../../../src/core/review/thresholds.ts';
import { syntheticEvidence } from './synthetic-evidence.ts';

describe('evidenceRows', () => {
  const rows = evidenceRows(syntheticEvidence());
  const row = (key: string) => rows.find((r) => r.key === key)!;

  it('gives each number its unit and the threshold from the shared table', () => {
    expect(row('hf').value).toBe('5.0');
    expect(row('hf').unit).toBe('%');
    expect(row('hf').threshold).toContain(`${defaultThresholds.muscleHighFrequencyShare * 100} %`);
    expect(row('rv').threshold).toContain('15 %');
  });
  it('flags values past an artifact threshold and leaves the others', () => {
    expect(row('focality').flagged).toBe(true); // 0.7 ≥ 0.6
    expect(row('hf').flagged).toBe(false);
    expect(row('rv').flagged).toBe(false); // 4 % ≤ 15 %
  });
  it('writes n/a for a missing correlation and none for a missing alpha peak', () => {
    expect(row('eogH').value).toBe('n/a');
    const none = evidenceRows(syntheticEvidence(1, { alphaPeakHz: null }));
    expect(none.find((r) => r.key === 'alpha')!.value).toBe('none');
  });
  it('drops the event and dipole rows when that evidence is missing', () => {
    const bare = evidenceRows(syntheticEvidence(1, { erp: null, dipole: null }));
    expect(bare.some((r) => r.key === 'rv' || r.key === 'locking')).toBe(false);
  });
  it('says the dipole region is a model estimate', () => {
    expect(row('region').source).toMatch(/model estimate/);
  });
});
