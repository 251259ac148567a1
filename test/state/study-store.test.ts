import { describe, expect, it } from 'vitest';
import { datasetFiles, selectAgreement, selectStudyRows, studyExport } from '../../src/state/study-store.ts';
import { findRecordings } from '../../src/core/study/bids-dataset.ts';
import { buildDecisionsFile, type ReviewDecision } from '../../src/core/review/decisions-file.ts';

const recs = findRecordings(['sub-01/eeg/sub-01_task-a_eeg.edf', 'sub-02/eeg/sub-02_task-a_eeg.edf']);
const file = (reviewer: string, rec: string, decisions: Record<number, ReviewDecision>) =>
  buildDecisionsFile({ aim: 'erp', reviewer, createdAt: '2026-12-02T00:00:00Z', software: 'winnow test', recordingSha256: rec.repeat(64), decompositionSha256: 'd'.repeat(64), nComponents: 4, decisions });
const keep: ReviewDecision = { verdict: 'keep', reason: 'neural', note: '' };
const rm = (reason: 'blink' | 'gaze'): ReviewDecision => ({ verdict: 'remove', reason, note: '' });

describe('study store selectors', () => {
  it('strips the picked folder name from relative paths', () => {
    const f = (p: string) => Object.assign(new File(['x'], p.split('/').pop() ?? p), { webkitRelativePath: p });
    const { root, files } = datasetFiles([f('ds/dataset_description.json'), f('ds/sub-01/eeg/sub-01_task-a_eeg.edf')]);
    expect(root).toBe('ds');
    expect(files.map((x) => x.path)).toEqual(['dataset_description.json', 'sub-01/eeg/sub-01_task-a_eeg.edf']);
  });

  it('pools kappa over recordings, components matched by index (Cohen 1960: κ = (p_o − p_e)/(1 − p_e))', () => {
    const reviews = {
      [recs[0].path]: { decisions: file('a', '1', { 1: rm('blink'), 2: keep, 3: keep, 4: keep }), varianceShares: [0.3, 0.1, 0.1, 0.1] },
      [recs[1].path]: { decisions: file('a', '2', { 1: rm('blink'), 2: keep, 3: keep, 4: keep }), varianceShares: null },
    };
    const second = {
      name: 'b',
      byPath: { [recs[0].path]: file('b', '1', { 1: rm('blink'), 2: rm('gaze'), 3: keep, 4: keep }), [recs[1].path]: file('b', '2', { 1: rm('blink'), 2: keep, 3: keep, 4: keep }) },
      unmatched: [],
    };
    const a = selectAgreement({ reviews, second });
    expect(a.perRecording.map((r) => r.disagreements.map((d) => d.index))).toEqual([[2], []]);
    // pooled 8 components: agree on 7; A removes 2/8, B 3/8 → p_e = (2·3 + 6·5)/64 = 36/64
    expect(a.pooled?.verdicts.n).toBe(8);
    expect(a.pooled?.verdicts.observed).toBeCloseTo(7 / 8, 12);
    expect(a.pooled?.verdicts.chance).toBeCloseTo(36 / 64, 12);
    expect(a.pooled?.verdicts.kappa).toBeCloseTo((7 / 8 - 36 / 64) / (1 - 36 / 64), 12);
    const rows = selectStudyRows({ recordings: recs, reviews });
    expect(rows.map((r) => [r.state, r.removed, r.removedVariance])).toEqual([['done', 1, 0.3], ['done', 1, null]]);
    const files = studyExport({ recordings: recs, reviews, second, adjudicated: {} }, 'c', '2026-12-02T01:00:00Z').map((f) => f.path);
    expect(files).toContain('derivatives/winnow/sub-01/eeg/sub-01_task-a_desc-adjudicated_decisions.json');
  });
});
