/**
 * Nothing the reviewer did is lost (issue 14): write-through autosave into a per-participant snapshot
 * history in IndexedDB (fake-indexeddb, an implementation of the W3C Indexed Database API used as the
 * reference store here), the synchronous journal replayed after a reload, and the faults a browser's
 * storage can show: an interrupted transaction, a full quota (the DOMException name "QuotaExceededError"
 * from the WebIDL/Storage standards), and a damaged record.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { IDBFactory, IDBObjectStore } from 'fake-indexeddb';
import { workbenchStore } from '../../src/state/index.ts';
import { reviewKey, setWorkbenchServices } from '../../src/state/services.ts';
import { startAutosave, type SnapshotSink } from '../../src/state/autosave.ts';
import { openReviewDb, ReviewStorageError } from '../../src/state/review-db.ts';
import { createJournal, memoryStorage } from '../../src/state/review-journal.ts';
import { SNAPSHOT_LIMIT, describeLost, type ReviewSnapshot } from '../../src/state/review-snapshot.ts';
import type { SaveProblem } from '../../src/state/persistence.ts';
import { fakeServices } from './fake-services.ts';

const edf = () => new File([new Uint8Array(4)], 'sub-01_eeg.edf');
const json = () => new File(['{}'], 'sub-01_decomposition.json');
const st = () => workbenchStore.getState();
const KEY = reviewKey('r'.repeat(64), 'd'.repeat(64));

afterEach(() => {
  workbenchStore.setState(workbenchStore.getInitialState(), true);
  setWorkbenchServices(null);
});

function snapshot(seg: string, savedAt: string, decisions: ReviewSnapshot['decisions'], seq = 1): ReviewSnapshot {
  return {
    id: `${KEY}#${seg}`, key: KEY, startedAt: savedAt, savedAt, seq, aim: 'erp', reviewer: '', decisions,
    recordingName: 'sub-01_eeg.edf', nComponents: 3, origin: 'review',
  };
}

const remove1 = { 1: { verdict: 'remove' as const, reason: 'blink' as const, note: '' } };

async function loaded(db: SnapshotSink & { load: (k: string) => Promise<unknown> }, saved?: Parameters<typeof fakeServices>[0]) {
  const services = fakeServices(saved);
  services.loadReview = (key) => db.load(key) as never;
  setWorkbenchServices(services);
  await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
  return services;
}

describe('snapshot history in IndexedDB', () => {
  it(`keeps the newest ${SNAPSHOT_LIMIT} snapshots per participant, newest first`, async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    for (let i = 0; i < SNAPSHOT_LIMIT + 5; i++) {
      await db.saveSnapshot(snapshot(`s${i}`, new Date(Date.UTC(2026, 0, 1, 0, i)).toISOString(), { 1: { verdict: 'keep', reason: null, note: `n${i}` } }));
    }
    const { snapshots, lost } = await db.listSnapshots(KEY);
    expect(lost).toEqual([]);
    expect(snapshots).toHaveLength(SNAPSHOT_LIMIT);
    expect(snapshots[0].decisions[1].note).toBe(`n${SNAPSHOT_LIMIT + 4}`);
    expect(snapshots.at(-1)!.decisions[1].note).toBe('n5');
    expect((await db.load(KEY))?.decisions[1].note).toBe(`n${SNAPSHOT_LIMIT + 4}`);
    db.close();
  });

  it('never lets an older write of a snapshot replace a newer one', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    await db.saveSnapshot(snapshot('a', '2026-01-01T00:00:02.000Z', remove1, 2));
    await db.saveSnapshot(snapshot('a', '2026-01-01T00:00:01.000Z', {}, 1));
    expect((await db.listSnapshots(KEY)).snapshots[0].decisions).toEqual(remove1);
    db.close();
  });

  it('an interrupted transaction leaves the stored history as it was, and the journal replays the write at the next opening', async () => {
    const factory = new IDBFactory();
    const storage = memoryStorage();
    const db = await openReviewDb(factory, { journal: createJournal(storage) });
    await db.saveSnapshot(snapshot('a', '2026-01-01T00:00:00.000Z', remove1));
    const put = IDBObjectStore.prototype.put;
    IDBObjectStore.prototype.put = function (this: IDBObjectStore, ...args: Parameters<IDBObjectStore['put']>) {
      const req = put.apply(this, args);
      this.transaction.abort();
      return req;
    };
    let error: unknown;
    try {
      await db.saveSnapshot(snapshot('b', '2026-01-01T00:01:00.000Z', { 2: { verdict: 'keep', reason: 'neural', note: 'x' } }));
    } catch (e) {
      error = e;
    } finally {
      IDBObjectStore.prototype.put = put;
    }
    expect(error).toBeInstanceOf(ReviewStorageError);
    expect((error as ReviewStorageError).kind).toBe('interrupted');
    expect((await db.listSnapshots(KEY)).snapshots.map((s) => s.id)).toEqual([`${KEY}#a`]);
    db.close();
    // The page goes away; the next opening replays the journal.
    const again = await openReviewDb(factory, { journal: createJournal(storage) });
    expect((await again.listSnapshots(KEY)).snapshots.map((s) => s.id)).toEqual([`${KEY}#b`, `${KEY}#a`]);
    expect(storage.map.size).toBe(0);
    again.close();
  });

  it('a damaged record is skipped and named, a damaged decision is dropped, and everything else is recovered', async () => {
    const factory = new IDBFactory();
    const db = await openReviewDb(factory, { journal: createJournal(memoryStorage()) });
    await db.saveSnapshot(snapshot('good', '2026-01-01T00:00:00.000Z', remove1));
    db.close();
    // Damage written behind the store's back (as a faulty disk or another program would).
    const raw = await new Promise<IDBDatabase>((resolve, reject) => {
      const r = factory.open('winnow-reviews');
      r.onsuccess = () => resolve(r.result);
      r.onerror = () => reject(r.error);
    });
    await new Promise<void>((resolve) => {
      const tx = raw.transaction('snapshots', 'readwrite');
      const s = tx.objectStore('snapshots');
      s.put({ id: `${KEY}#broken`, key: KEY, savedAt: 42, decisions: 'garbage' });
      s.put({ ...snapshot('half', '2026-01-01T00:05:00.000Z', {}), decisions: { 1: { verdict: 'keep', reason: null, note: 'fine' }, 2: { verdict: 'maybe', reason: 7, note: null } } });
      tx.oncomplete = () => resolve();
    });
    raw.close();
    const again = await openReviewDb(factory, { journal: createJournal(memoryStorage()) });
    const { snapshots, lost } = await again.listSnapshots(KEY);
    expect(snapshots.map((s) => s.id)).toEqual([`${KEY}#half`, `${KEY}#good`]);
    expect(snapshots[0].decisions).toEqual({ 1: { verdict: 'keep', reason: null, note: 'fine' } });
    expect(lost).toHaveLength(2);
    const text = describeLost(lost);
    expect(text).toMatch(/could not be read/);
    expect(text).toMatch(/component 2/);
    expect(text).toMatch(/Everything else was recovered/);
    again.close();
  });

  it('a damaged journal entry is reported and the rest replayed', async () => {
    const storage = memoryStorage();
    storage.setItem('winnow-journal:x', '{not json');
    createJournal(storage).write(snapshot('j', '2026-01-01T00:00:00.000Z', remove1));
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(storage) });
    expect(db.journalLost).toHaveLength(1);
    expect((await db.load(KEY))?.decisions).toEqual(remove1);
    db.close();
  });
});

describe('autosave', () => {
  it('writes every decision change through, and a reopened store offers it back', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    const handle = startAutosave(workbenchStore, async () => db);
    await loaded(db);
    st().decide(2, { verdict: 'remove', reason: 'muscle' });
    st().decide(2, { note: 'temporal bursts' });
    await handle.flush();
    expect((await db.load(KEY))?.decisions).toEqual({ 2: { verdict: 'remove', reason: 'muscle', note: 'temporal bursts' } });
    handle.stop();
    workbenchStore.setState(workbenchStore.getInitialState(), true);
    await loaded(db);
    expect(st().resumeOffer?.decisions).toEqual({ 2: { verdict: 'remove', reason: 'muscle', note: 'temporal bursts' } });
    db.close();
  });

  it('keeps saving while a saved review is offered, as its own snapshot, without touching the offered one', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    await db.saveSnapshot(snapshot('old', '2026-01-01T00:00:00.000Z', remove1));
    const handle = startAutosave(workbenchStore, async () => db);
    await loaded(db);
    expect(st().resumeOffer?.decisions).toEqual(remove1);
    st().decide(2, { verdict: 'keep' });
    st().decide(3, { verdict: 'remove', reason: 'cardiac' });
    await handle.flush();
    const { snapshots } = await db.listSnapshots(KEY);
    expect(snapshots).toHaveLength(2);
    expect(snapshots.find((s) => s.id === `${KEY}#old`)?.decisions).toEqual(remove1);
    const pending = snapshots.find((s) => s.id !== `${KEY}#old`)!;
    expect(pending.origin).toBe('while-offered');
    expect(Object.keys(pending.decisions)).toEqual(['2', '3']);

    // Resuming: the offered review goes on the board, undo cannot reach past it, and nothing is written until a change.
    st().resume(true);
    expect(st().decisions).toEqual(remove1);
    expect(st().past).toEqual([]);
    st().undo();
    expect(st().decisions).toEqual(remove1);
    await handle.flush();
    expect((await db.listSnapshots(KEY)).snapshots).toHaveLength(2);
    st().decide(2, { verdict: 'remove', reason: 'gaze' });
    await handle.flush();
    const after = (await db.listSnapshots(KEY)).snapshots;
    expect(after).toHaveLength(3);
    expect(after[0].origin).toBe('resumed');
    expect(Object.keys(after[0].decisions)).toEqual(['1', '2']);
    handle.stop();
    db.close();
  });

  it('an import that replaces several decisions opens a new snapshot, so what was there stays saved', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    const handle = startAutosave(workbenchStore, async () => db);
    await loaded(db);
    st().decide(1, { verdict: 'keep' });
    st().decide(2, { verdict: 'keep' });
    expect(await st().importDecisions(new File(['index\tverdict\treason\tnote\n1\tremove\tblink\t\n2\tremove\tgaze\t\n'], 'other.tsv'))).toBe(true);
    await handle.flush();
    const { snapshots } = await db.listSnapshots(KEY);
    expect(snapshots).toHaveLength(2);
    expect(snapshots[0].origin).toBe('imported');
    expect(snapshots[1].decisions[1].verdict).toBe('keep');
    handle.stop();
    db.close();
  });

  it('writes a note draft per keystroke batch, synchronously to the journal, before the field commits it', async () => {
    const storage = memoryStorage();
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(storage) });
    const never: SnapshotSink = { saveSnapshot: () => new Promise(() => {}) }; // the page goes away before IndexedDB finishes
    const handle = startAutosave(workbenchStore, async () => never, { journal: createJournal(storage) });
    await loaded(db);
    st().decide(1, { verdict: 'remove' });
    handle.noteDraft(1, 'half a sen');
    handle.noteDraft(1, 'half a sentence');
    handle.stop();
    // Next page: the journal is replayed into IndexedDB at opening.
    const again = await openReviewDb(new IDBFactory(), { journal: createJournal(storage) });
    expect((await again.load(KEY))?.decisions).toEqual({ 1: { verdict: 'remove', reason: null, note: 'half a sentence' } });
    db.close();
    again.close();
  });

  it('storage full: the reviewer is told in words and offered the export; saving resumes when space is back', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    let full = true;
    const sink: SnapshotSink = {
      saveSnapshot: async (s) => {
        if (full) throw new ReviewStorageError('full', 'full', new DOMException('quota', 'QuotaExceededError'));
        await db.saveSnapshot(s);
      },
    };
    const problems: (SaveProblem | null)[] = [];
    const handle = startAutosave(workbenchStore, async () => sink, { onProblem: (p) => problems.push(p), retryMs: 5 });
    await loaded(db);
    st().decide(1, { verdict: 'remove' });
    await handle.flush();
    expect(problems[0]?.kind).toBe('full');
    expect(problems[0]?.text).toMatch(/storage for Winnow is full/);
    expect(problems[0]?.text).toMatch(/Export the decisions now/);
    full = false;
    st().decide(2, { verdict: 'keep' });
    await handle.flush();
    await new Promise((r) => setTimeout(r, 20));
    await handle.flush();
    expect(problems.at(-1)).toBeNull();
    expect(Object.keys((await db.load(KEY))?.decisions ?? {})).toEqual(['1', '2']);
    handle.stop();
    db.close();
  });

  it('an interrupted write is retried by itself', async () => {
    const db = await openReviewDb(new IDBFactory(), { journal: createJournal(memoryStorage()) });
    let fails = 1;
    const sink: SnapshotSink = {
      saveSnapshot: async (s) => {
        if (fails-- > 0) throw new ReviewStorageError('interrupted', 'interrupted');
        await db.saveSnapshot(s);
      },
    };
    const problems: (SaveProblem | null)[] = [];
    const handle = startAutosave(workbenchStore, async () => sink, { onProblem: (p) => problems.push(p), retryMs: 5 });
    await loaded(db);
    st().decide(1, { verdict: 'remove' });
    await handle.flush();
    expect(problems[0]?.kind).toBe('interrupted');
    await new Promise((r) => setTimeout(r, 30));
    await handle.flush();
    expect(problems.at(-1)).toBeNull();
    expect((await db.load(KEY))?.decisions[1].verdict).toBe('remove');
    handle.stop();
    db.close();
  });
});
