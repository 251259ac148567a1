/**
 * The thresholds panel's logic: every threshold of review/thresholds.ts listed with its source and a
 * methods section that exists in docs/methods.md; typed values validated; overrides hold exactly the
 * thresholds that differ from the defaults; a change re-suggests without recomputing evidence and is named
 * in the decisions file, the methods text and the saved review.
 */
import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { defaultThresholds, thresholdSources } from '../../../src/core/review/thresholds.ts';
import { parseDecisionsJson } from '../../../src/core/review/decisions-file.ts';
import { readSnapshot } from '../../../src/state/review-snapshot.ts';
import { changedCount, parseThreshold, THRESHOLD_KEYS, thresholdRows, withoutThreshold, withThreshold } from '../../../src/ui/thresholds/threshold-rows.ts';
import { workbenchStore, selectSuggestion } from '../../../src/state/index.ts';
import { setWorkbenchServices } from '../../../src/state/services.ts';
import { decisionsFileFromState, methodsTextFromState } from '../../../src/state/exports.ts';
import { fakeServices } from '../../state/fake-services.ts';
import { IDBFactory } from 'fake-indexeddb';
import { openReviewDb } from '../../../src/state/review-db.ts';
import { createJournal, memoryStorage } from '../../../src/state/review-journal.ts';
import { startAutosave } from '../../../src/state/autosave.ts';

const st = () => workbenchStore.getState();
afterEach(() => {
  workbenchStore.setState(workbenchStore.getInitialState(), true);
  setWorkbenchServices(null);
});

describe('threshold rows', () => {
  it('lists every threshold once, with the source of review/thresholds.ts and its default', () => {
    const rows = thresholdRows({});
    expect(rows.map((r) => r.key).sort()).toEqual(Object.keys(defaultThresholds).sort());
    for (const r of rows) {
      expect(r.source).toBe(thresholdSources[r.key]);
      expect(['common practice', 'ours']).toContain(r.source);
      expect(r.value).toBe(defaultThresholds[r.key]);
      expect(r.changed).toBe(false);
      // the default itself is a valid entry
      expect(parseThreshold(r.key, String(r.defaultValue))).toEqual({ ok: true, value: r.defaultValue });
    }
  });

  it('names a section that docs/methods.md has', () => {
    const methods = readFileSync(new URL('../../../docs/methods.md', import.meta.url), 'utf8');
    for (const r of thresholdRows({})) expect(methods).toMatch(new RegExp(`^##+ §${r.section.replace('.', '\\.')} `, 'm'));
  });

  it('shows an override and marks it changed; non-finite overrides are ignored like resolveThresholds does', () => {
    const rows = thresholdRows({ mainsShare: 0.3, cardiacPeak: Number.NaN });
    expect(rows.find((r) => r.key === 'mainsShare')).toMatchObject({ value: 0.3, defaultValue: 0.5, changed: true });
    expect(rows.find((r) => r.key === 'cardiacPeak')).toMatchObject({ value: 0.4, changed: false });
    expect(changedCount({ mainsShare: 0.3 })).toBe(1);
  });

  it('rejects empty, non-numeric and out-of-range values, and a crossed 1/f exponent range', () => {
    expect(parseThreshold('mainsShare', '').ok).toBe(false);
    expect(parseThreshold('mainsShare', 'abc').ok).toBe(false);
    expect(parseThreshold('mainsShare', '1.5')).toEqual({ ok: false, error: 'must be between 0 and 1' });
    expect(parseThreshold('mainsShare', '-0.1').ok).toBe(false);
    expect(parseThreshold('mainsShare', '0,45')).toEqual({ ok: true, value: 0.45 });
    expect(parseThreshold('timeLockingP', '0.01')).toEqual({ ok: true, value: 0.01 });
    expect(parseThreshold('neuralExponentMin', '3.5').ok).toBe(false); // = the default maximum
    expect(parseThreshold('neuralExponentMin', '3', { neuralExponentMax: 2 }).ok).toBe(false);
    expect(parseThreshold('neuralExponentMax', '0.4').ok).toBe(false); // below the default minimum 0.5
  });

  it('keeps only thresholds that differ from the defaults; reset per row and all', () => {
    let o = withThreshold({}, 'mainsShare', 0.3);
    o = withThreshold(o, 'eogCorrelation', 0.8);
    expect(o).toEqual({ mainsShare: 0.3, eogCorrelation: 0.8 });
    expect(withThreshold(o, 'mainsShare', defaultThresholds.mainsShare)).toEqual({ eogCorrelation: 0.8 });
    expect(withoutThreshold(o, 'eogCorrelation')).toEqual({ mainsShare: 0.3 });
    expect(o).toEqual({ mainsShare: 0.3, eogCorrelation: 0.8 }); // new objects, the old one untouched
    expect(THRESHOLD_KEYS.length).toBe(Object.keys(defaultThresholds).length);
  });
});

describe('threshold overrides in the review', () => {
  it('re-suggest without recomputing evidence, and are named in the decisions file and methods text', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await st().loadParticipant({ recordingFiles: [new File([new Uint8Array(4)], 'sub-01_eeg.edf')], decompositionFiles: [new File(['{}'], 'sub-01_decomposition.json')] });
    expect(selectSuggestion(1)(st())!.rules.some((r) => r.measure === 'eogCorrelation.vertical')).toBe(true);
    st().setThresholds(withThreshold(st().thresholds, 'eogCorrelation', 0.99));
    expect(selectSuggestion(1)(st())!.rules.some((r) => r.measure === 'eogCorrelation.vertical')).toBe(false);
    expect(services.evidenceCalls).toBe(1);

    const file = decisionsFileFromState(st(), '2026-01-01T00:00:00Z')!;
    expect(file.thresholdOverrides).toEqual({ eogCorrelation: 0.99 });
    const back = parseDecisionsJson(JSON.stringify(file), 'd.json');
    expect(back.ok && back.value.thresholdOverrides).toEqual({ eogCorrelation: 0.99 });
    expect(methodsTextFromState(st(), [])).toContain('changed these thresholds from Winnow\'s defaults: eogCorrelation 0.99 (default 0.7)');

    st().setThresholds({});
    expect(decisionsFileFromState(st(), '2026-01-01T00:00:00Z')!.thresholdOverrides).toBeUndefined();
    expect(methodsTextFromState(st(), [])).not.toContain('changed these thresholds');
  });

  it('are saved with the review (autosave, IndexedDB via fake-indexeddb) and come back when it is resumed', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    const open = async () => {
      const services = fakeServices();
      services.loadReview = (key) => db.load(key);
      setWorkbenchServices(services);
      await st().loadParticipant({ recordingFiles: [new File([new Uint8Array(4)], 'sub-01_eeg.edf')], decompositionFiles: [new File(['{}'], 'sub-01_decomposition.json')] });
    };
    const handle = startAutosave(workbenchStore, async () => db);
    await open();
    st().decide(1, { verdict: 'remove', reason: 'blink' });
    st().setThresholds({ mainsShare: 0.3 });
    await handle.flush();
    handle.stop();
    workbenchStore.setState(workbenchStore.getInitialState(), true);
    await open();
    expect(st().thresholds).toEqual({});
    expect(st().resumeOffer?.thresholds).toEqual({ mainsShare: 0.3 });
    st().resume(true);
    expect(st().thresholds).toEqual({ mainsShare: 0.3 });
    expect(st().decisions[1]?.verdict).toBe('remove');
    db.close();
  });

  it('are read back from a saved snapshot; unknown names are reported, not kept', () => {
    const raw = { id: 'a:b#1', key: 'a:b', savedAt: '2026-01-01T00:00:00Z', aim: 'erp', decisions: {}, thresholds: { mainsShare: 0.3, bogus: 1, cardiacPeak: 'x' } };
    const { snapshot, lost } = readSnapshot(raw, 'x');
    expect(snapshot!.thresholds).toEqual({ mainsShare: 0.3 });
    expect(lost.some((l) => l.what.includes('bogus') && l.what.includes('cardiacPeak'))).toBe(true);
    expect(readSnapshot({ ...raw, thresholds: undefined }, 'x').snapshot!.thresholds).toEqual({});
  });
});
