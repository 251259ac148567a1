/**
 * Actions that replace work ask first and say what they replace (issue 14); reopening a saved snapshot puts
 * it on the board with no undo step reaching past it, and a snapshot waits for its own participant.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { IDBFactory } from 'fake-indexeddb';
import { workbenchStore } from '../../src/state/index.ts';
import { reviewKey, setWorkbenchServices } from '../../src/state/services.ts';
import { persistenceStore } from '../../src/state/persistence.ts';
import { openReviewDb } from '../../src/state/review-db.ts';
import { createJournal, memoryStorage } from '../../src/state/review-journal.ts';
import { reopenSnapshot, setReviewArchive, startRestoreWatch } from '../../src/state/review-history.ts';
import type { ReviewSnapshot } from '../../src/state/review-snapshot.ts';
import { fakeServices } from './fake-services.ts';

const edf = () => new File([new Uint8Array(4)], 'sub-01_eeg.edf');
const json = () => new File(['{}'], 'sub-01_decomposition.json');
const st = () => workbenchStore.getState();
const KEY = reviewKey('r'.repeat(64), 'd'.repeat(64));

const snap = (key: string): ReviewSnapshot => ({
  id: `${key}#s`, key, startedAt: '2026-01-01T00:00:00.000Z', savedAt: '2026-01-01T00:00:00.000Z', seq: 1, aim: 'erp', reviewer: 'R. One',
  decisions: { 2: { verdict: 'remove', reason: 'muscle', note: '' }, 3: { verdict: 'keep', reason: 'neural', note: '' } },
  recordingName: 'sub-01_eeg.edf', nComponents: 3, origin: 'review',
});

/** Stands in for the mounted dialog: answers every question with `answer` and keeps the questions asked. */
function dialog(answer: boolean) {
  const asked: string[] = [];
  persistenceStore.setState({ confirmHosts: 1 });
  const stop = persistenceStore.subscribe((s) => {
    if (s.confirm) {
      asked.push(`${s.confirm.title} ${s.confirm.replaces}`);
      s.confirm.resolve(answer);
    }
  });
  return { asked, stop };
}

afterEach(() => {
  workbenchStore.setState(workbenchStore.getInitialState(), true);
  persistenceStore.setState(persistenceStore.getInitialState(), true);
  setWorkbenchServices(null);
  setReviewArchive(null);
});

describe('replacing work asks first', () => {
  it('a TSV import over decisions on the board asks, says it carries no hashes, and a "no" keeps the decisions', async () => {
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    st().decide(1, { verdict: 'keep' });
    const d = dialog(false);
    expect(await st().importDecisions(new File(['index\tverdict\treason\tnote\n1\tremove\tblink\t\n'], 'sub-02_decisions.tsv'))).toBe(false);
    expect(d.asked[0]).toMatch(/replaces the 1 decided/);
    expect(d.asked[0]).toMatch(/carries no recording or decomposition hash/);
    expect(st().decisions[1]?.verdict).toBe('keep');
    d.stop();
  });

  it('restoring a snapshot over work asks, then puts it on the board with no undo step past it', async () => {
    setWorkbenchServices(fakeServices());
    setReviewArchive(await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) }));
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    st().decide(1, { verdict: 'keep' });
    const d = dialog(true);
    await reopenSnapshot(snap(KEY));
    expect(d.asked[0]).toMatch(/replaces the 1 decided/);
    expect(st().decisions).toEqual(snap(KEY).decisions);
    expect(st().past).toEqual([]);
    expect(st().reviewer).toBe('R. One');
    d.stop();
  });

  it('a snapshot of a participant not loaded waits for it, and is not applied to other files', async () => {
    setWorkbenchServices(fakeServices());
    const stop = startRestoreWatch();
    const other = { ...snap(reviewKey('f'.repeat(64), 'd'.repeat(64))), recordingName: 'sub-07_eeg.edf' };
    await reopenSnapshot(other);
    expect(st().notice?.text).toMatch(/open sub-07_eeg\.edf/);
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    expect(st().decisions).toEqual({});
    expect(st().notice?.text).toMatch(/not the participant of the saved review/);

    await reopenSnapshot(snap(KEY)); // same participant as loaded: applies at once
    expect(st().decisions).toEqual(snap(KEY).decisions);
    stop();
  });
});
