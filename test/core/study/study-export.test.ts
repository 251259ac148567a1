import { describe, expect, it } from 'vitest';
import { findRecordings } from '../../../src/core/study/bids-dataset.ts';
import { studyExportFiles } from '../../../src/core/study/study-export.ts';
import { studyRows } from '../../../src/core/study/study-overview.ts';
import { buildDecisionsFile, parseDecisionsJson, parseDecisionsTsv, type ReviewDecision } from '../../../src/core/review/decisions-file.ts';
import { buildAdjudicatedFile, disagreements } from '../../../src/core/review/adjudication.ts';

const recs = findRecordings(['sub-01/eeg/sub-01_task-walk_eeg.edf', 'sub-02/ses-b/eeg/sub-02_ses-b_task-walk_run-2_eeg.bdf']);
const file = (decisions: Record<number, ReviewDecision>, reviewer = 'ra', n = 4, rec = 'a') =>
  buildDecisionsFile({ aim: 'erp', reviewer, createdAt: '2026-12-02T10:00:00Z', software: 'winnow test', recordingSha256: rec.repeat(64), decompositionSha256: 'd'.repeat(64), nComponents: n, decisions });

describe('study export (BIDS specification v1.10, "Derivatives")', () => {
  it('writes one decisions JSON and TSV per recording under derivatives/winnow with desc-winnow, and a GeneratedBy description', () => {
    const files = studyExportFiles(
      recs.map((recording) => ({ recording, decisions: file({ 1: { verdict: 'remove', reason: 'blink', note: '' } }) })),
      '0.1.0',
    );
    expect(files.map((f) => f.path)).toEqual([
      'derivatives/winnow/dataset_description.json',
      'derivatives/winnow/sub-01/eeg/sub-01_task-walk_desc-winnow_decisions.json',
      'derivatives/winnow/sub-01/eeg/sub-01_task-walk_desc-winnow_decisions.tsv',
      'derivatives/winnow/sub-02/ses-b/eeg/sub-02_ses-b_task-walk_run-2_desc-winnow_decisions.json',
      'derivatives/winnow/sub-02/ses-b/eeg/sub-02_ses-b_task-walk_run-2_desc-winnow_decisions.tsv',
    ]);
    const desc = JSON.parse(files[0].text);
    expect(desc.DatasetType).toBe('derivative');
    expect(desc.GeneratedBy[0]).toMatchObject({ Name: 'winnow', Version: '0.1.0' });
    // both twins read back
    expect(parseDecisionsJson(files[1].text, 'x.json').ok).toBe(true);
    const tsv = parseDecisionsTsv(files[2].text, 'x.tsv');
    expect(tsv.ok && tsv.value[1]).toEqual({ verdict: 'remove', reason: 'blink', note: '' });
  });
});

describe('study overview rows', () => {
  it('states the review state and what was removed, and flags far recordings (median ± 3 scaled MAD)', () => {
    const rm = (reason: 'blink' | 'muscle'): ReviewDecision => ({ verdict: 'remove', reason, note: '' });
    const keep: ReviewDecision = { verdict: 'keep', reason: 'neural', note: '' };
    const mk = (d: Record<number, ReviewDecision>) => file(d, 'ra', 10);
    const rows = studyRows([
      { key: 's1', components: 10, decisions: mk({ 1: rm('blink'), 2: keep, 3: keep, 4: keep, 5: keep, 6: keep, 7: keep, 8: keep, 9: keep, 10: keep }), varianceShare: () => 0.05 },
      { key: 's2', components: 10, decisions: mk({ 1: rm('blink'), 2: rm('muscle') }), varianceShare: () => 0.05 },
      { key: 's3', components: 10, decisions: mk({ 1: rm('blink'), 2: rm('muscle') }), varianceShare: () => 0.05 },
      { key: 's4', components: 10, decisions: mk({ 1: rm('blink'), 2: rm('muscle') }), varianceShare: () => 0.05 },
      { key: 's5', components: 10, decisions: mk({ 1: rm('blink'), 2: rm('muscle'), 3: rm('muscle'), 4: rm('muscle'), 5: rm('muscle'), 6: rm('muscle'), 7: rm('muscle'), 8: rm('muscle') }), varianceShare: () => 0.05 },
      { key: 's6', components: 10, decisions: null },
    ]);
    expect(rows.map((r) => r.state)).toEqual(['done', 'in progress', 'in progress', 'in progress', 'in progress', 'not started']);
    expect(rows[4].removed).toBe(8);
    expect(rows[4].removedVariance).toBeCloseTo(0.4, 12);
    expect(rows[4].flags.map((f) => f.rule)).toContain('removed-count');
    expect(rows[1].flags.map((f) => f.rule)).toEqual(['undecided']);
    expect(rows[5].flags).toEqual([]);
  });
});

describe('adjudication', () => {
  const a = file({ 1: { verdict: 'remove', reason: 'blink', note: 'clear blink' }, 2: { verdict: 'keep', reason: 'neural', note: '' }, 3: { verdict: 'remove', reason: 'muscle', note: '' } }, 'ra');
  const b = file({ 1: { verdict: 'remove', reason: 'blink', note: '' }, 2: { verdict: 'remove', reason: 'gaze', note: 'step-like' }, 3: { verdict: 'remove', reason: 'contact', note: '' } }, 'rb');
  it('lists verdict and reason disagreements by index', () => {
    expect(disagreements(a, b).map((d) => [d.index, d.kind])).toEqual([[2, 'verdict'], [3, 'reason']]);
  });
  it('keeps both raters\' entries; agreed entries carry over, unresolved disagreements stay undecided', () => {
    const adj = buildAdjudicatedFile(a, b, { 2: { verdict: 'remove', reason: 'gaze', note: 'agreed with B' } }, { reviewer: 'rc', createdAt: '2026-12-02T11:00:00Z', software: 'winnow test' });
    expect(adj.adjudication.raters.map((r) => r.reviewer)).toEqual(['ra', 'rb']);
    expect(adj.components.map((c) => c.verdict)).toEqual(['remove', 'remove', 'undecided', 'undecided']);
    expect(adj.components[0].raters[0].note).toBe('clear blink');
    expect(adj.components[2].raters.map((r) => r.reason)).toEqual(['muscle', 'contact']);
    // still a decisions file: the workbench and `winnow clean` load it
    const parsed = parseDecisionsJson(JSON.stringify(adj), 'adj.json');
    expect(parsed.ok).toBe(true);
  });
  it('refuses files of different recordings', () => {
    expect(() => disagreements(a, file({}, 'rb', 4, 'z'))).toThrow(/different recordings/);
  });
});
