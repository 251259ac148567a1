import { afterEach, describe, expect, it } from 'vitest';
import { datasetFiles, selectAgreement, selectStudyRows, studyExport, studyStore } from '../../src/state/study-store.ts';
import { workbenchStore } from '../../src/state/index.ts';
import { setWorkbenchServices } from '../../src/state/services.ts';
import { formatEvidenceJson } from '../../src/core/formats/evidence-file.ts';
import { defaultThresholds } from '../../src/core/review/thresholds.ts';
import { fakeServices } from './fake-services.ts';
import { syntheticEvidence } from '../ui/plots/synthetic-evidence.ts';
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

describe('study store: a batch run’s evidence (issue 11)', () => {
  // In-memory services (fake-services.ts): recording SHA-256 r…, decomposition d…, 2 channels, 3 components.
  const R = 'r'.repeat(64);
  const D = 'd'.repeat(64);
  const stem = 'sub-01_task-a';
  const twoChannel = (i: number) => syntheticEvidence(i, { map: Float64Array.from([0.6, 0.8]), variancePerChannel: Float64Array.from([0.1, 0.2]), strongestChannel: { index: 1, label: 'Cz', weight: 1 } });
  const evidenceText = (decompositionSha256: string) =>
    formatEvidenceJson(
      { recording: `${stem}_eeg.edf`, decomposition: `${stem}_desc-winnow_decomposition.json`, recordingSha256: R, decompositionSha256, aim: 'erp', lineHz: 50, lineHzSource: 'sidecar', epochEvent: 'stimulus', epochWindowS: [-0.2, 0.8], thresholds: defaultThresholds, warnings: [] },
      [1, 2, 3].map(twoChannel),
    );
  const evidencePath = `derivatives/winnow/sub-01/eeg/${stem}_desc-winnow_evidence.json`;
  const dataset = (evidence: string) => [
    { path: `sub-01/eeg/${stem}_eeg.edf`, file: new File([new Uint8Array(4)], `${stem}_eeg.edf`) },
    { path: `derivatives/winnow/sub-01/eeg/${stem}_desc-winnow_decomposition.json`, file: new File(['{}'], `${stem}_desc-winnow_decomposition.json`) },
    { path: evidencePath, file: new File([evidence], `${stem}_desc-winnow_evidence.json`, { lastModified: Date.UTC(2026, 11, 1, 9, 30) }) },
  ];
  afterEach(() => {
    studyStore.getState().closeStudy();
    workbenchStore.setState(workbenchStore.getInitialState(), true);
    setWorkbenchServices(null);
  });

  it('loads the matching evidence file instead of computing, and says so with its date', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await studyStore.getState().openDataset(dataset(evidenceText(D)), 'ds');
    await studyStore.getState().openRecording(`sub-01/eeg/${stem}_eeg.edf`);
    expect(services.evidenceCalls).toBe(0);
    const w = workbenchStore.getState();
    expect(w.evidence?.map((e) => e.index)).toEqual([1, 2, 3]);
    expect(w.evidence?.[0].variancePerChannel).toEqual(Float64Array.from([0.1, 0.2]));
    const batch = studyStore.getState().batchEvidence;
    expect(batch).toMatchObject({ file: evidencePath, date: '2026-12-01 09:30 UTC' });
    expect(batch?.evidence).toBe(w.evidence);
    expect(studyStore.getState().batchEvidenceNotice).toBeNull();
  });

  it('ignores a file made for another decomposition, with a notice naming it and why, and computes the evidence', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await studyStore.getState().openDataset(dataset(evidenceText('e'.repeat(64))), 'ds');
    await studyStore.getState().openRecording(`sub-01/eeg/${stem}_eeg.edf`);
    expect(services.evidenceCalls).toBe(1);
    expect(studyStore.getState().batchEvidence).toBeNull();
    const notice = studyStore.getState().batchEvidenceNotice?.text ?? '';
    expect(notice).toContain(evidencePath);
    expect(notice).toContain('made for another decomposition');
    expect(workbenchStore.getState().notice?.text).toBe(notice);
  });

  it('names a file that is not evidence at all', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await studyStore.getState().openDataset(dataset('{"format":"something-else"}'), 'ds');
    await studyStore.getState().openRecording(`sub-01/eeg/${stem}_eeg.edf`);
    expect(services.evidenceCalls).toBe(1);
    expect(studyStore.getState().batchEvidenceNotice?.text).toBe(`${evidencePath} was not used (format must be "winnow-evidence/1", got "something-else"); the evidence is computed here instead.`);
  });
});
