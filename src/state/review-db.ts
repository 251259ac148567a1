/**
 * Saved reviews in IndexedDB. Each participant (key = recording hash + decomposition hash) keeps a history
 * of review snapshots (review-snapshot.ts), the newest SNAPSHOT_LIMIT of them; `load` gives the newest one
 * holding any work (the resume offer). Every snapshot write goes to the synchronous journal first
 * (review-journal.ts), so a write the page did not live to finish is replayed at the next opening.
 * Decompositions computed in this browser are cached here too. `factory` defaults to the page's
 * `indexedDB`; tests pass fake-indexeddb's.
 */
import type { SavedReview } from './services.ts';
import { createJournal, pageStorage, type ReviewJournal } from './review-journal.ts';
import { SNAPSHOT_LIMIT, hasWork, newestFirst, readSnapshot, type LostPart, type ReviewSnapshot } from './review-snapshot.ts';

const DB_NAME = 'winnow-reviews';
const VERSION = 3;
/** Version 2's one record per participant; read once into the history on upgrade. */
const LEGACY = 'reviews';
const SNAPSHOTS = 'snapshots';
/** Decompositions computed in this browser, as our JSON text, keyed by recording hash + options. */
const DECOMPOSITIONS = 'decompositions';

export interface ReviewDb {
  /** The newest saved snapshot of this participant that holds any work (null when none). */
  load(key: string): Promise<SavedReview | null>;
  /** Saves a review as this participant's "saved directly" snapshot (kept for callers without a history). */
  save(key: string, review: SavedReview): Promise<void>;
  /** Writes a snapshot (journal first, then IndexedDB) and trims the participant's history. */
  saveSnapshot(snapshot: ReviewSnapshot): Promise<void>;
  /** Saved snapshots, newest first (of one participant, or of all), with what could not be read. */
  listSnapshots(key?: string): Promise<{ snapshots: ReviewSnapshot[]; lost: LostPart[] }>;
  /** What the journal replay at opening could not read. */
  readonly journalLost: readonly LostPart[];
  loadDecomposition(key: string): Promise<string | null>;
  saveDecomposition(key: string, json: string): Promise<void>;
  close(): void;
}

/** A storage failure in words the user can act on; `cause` keeps the browser's error. */
export class ReviewStorageError extends Error {
  constructor(
    readonly kind: 'full' | 'interrupted' | 'unavailable',
    message: string,
    override readonly cause?: unknown,
  ) {
    super(message);
    this.name = 'ReviewStorageError';
  }
}

function storageError(e: unknown, doing: string): ReviewStorageError {
  if (e instanceof ReviewStorageError) return e;
  const name = (e as { name?: string } | null)?.name ?? '';
  if (name === 'QuotaExceededError') {
    return new ReviewStorageError('full', `This browser's storage for Winnow is full, so ${doing} failed.`, e);
  }
  if (name === 'AbortError' || name === 'TransactionInactiveError' || name === '') {
    return new ReviewStorageError('interrupted', `The browser interrupted ${doing} before it finished.`, e);
  }
  return new ReviewStorageError('unavailable', `${doing} failed: ${(e as Error)?.message ?? String(e)}`, e);
}

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB request failed'));
  });
}

function done(tx: IDBTransaction, doing: string): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    tx.oncomplete = () => resolve();
    // An error on a request aborts the transaction; report once, from onabort, with the transaction's error.
    tx.onerror = (ev) => ev.preventDefault();
    tx.onabort = () => reject(storageError(tx.error ?? { name: 'AbortError' }, doing));
  });
}

export interface OpenOptions {
  /** The synchronous journal (default: the page's localStorage; none in node). */
  readonly journal?: ReviewJournal;
}

export async function openReviewDb(factory: IDBFactory = indexedDB, options: OpenOptions = {}): Promise<ReviewDb> {
  const journal = options.journal ?? createJournal(pageStorage());
  const open = factory.open(DB_NAME, VERSION);
  open.onupgradeneeded = () => {
    const db = open.result;
    if (!db.objectStoreNames.contains(DECOMPOSITIONS)) db.createObjectStore(DECOMPOSITIONS);
    if (!db.objectStoreNames.contains(SNAPSHOTS)) {
      const snaps = db.createObjectStore(SNAPSHOTS, { keyPath: 'id' });
      snaps.createIndex('key', 'key');
      // Version 2 kept one review per participant: each becomes the first snapshot of its history.
      if (db.objectStoreNames.contains(LEGACY)) {
        const legacy = open.transaction!.objectStore(LEGACY);
        const cursor = legacy.openCursor();
        cursor.onsuccess = () => {
          const c = cursor.result;
          if (!c) return;
          const v = c.value as Partial<SavedReview> | null;
          const key = String(c.key);
          if (v && typeof v === 'object' && typeof v.savedAt === 'string') {
            snaps.put({ ...v, id: `${key}#saved`, key, startedAt: v.savedAt, seq: 0, recordingName: null, nComponents: null, origin: 'review' });
          }
          c.continue();
        };
      }
    }
  };
  const db = await new Promise<IDBDatabase>((resolve, reject) => {
    open.onsuccess = () => resolve(open.result);
    open.onerror = () => reject(storageError(open.error, 'opening the saved reviews'));
    // A tab still running an older Winnow holds the database open: say so rather than wait for ever.
    open.onblocked = () =>
      reject(new ReviewStorageError('unavailable', 'Another tab running an older version of Winnow holds the saved reviews open; reload or close it, then saving resumes.'));
  });
  // Another tab upgrading the database: let it, and reopen on next use.
  db.onversionchange = () => db.close();

  const get = async <T>(store: string, key: string): Promise<T | null> => {
    const tx = db.transaction(store, 'readonly');
    const value = (await request(tx.objectStore(store).get(key))) as T | undefined;
    return value ?? null;
  };

  const put = async (store: string, key: string, value: unknown) => {
    const tx = db.transaction(store, 'readwrite');
    const finished = done(tx, 'saving');
    tx.objectStore(store).put(value, key);
    await finished;
  };

  /** Puts the snapshot unless a newer write of it is stored, then drops the participant's oldest beyond the limit. */
  async function writeSnapshot(snapshot: ReviewSnapshot): Promise<void> {
    let tx: IDBTransaction;
    try {
      tx = db.transaction(SNAPSHOTS, 'readwrite');
    } catch (e) {
      throw storageError(e, 'saving the review');
    }
    const finished = done(tx, 'saving the review');
    const store = tx.objectStore(SNAPSHOTS);
    const existing = store.get(snapshot.id);
    existing.onsuccess = () => {
      const held = existing.result as { seq?: unknown } | undefined;
      if (held && typeof held.seq === 'number' && held.seq > snapshot.seq) return;
      store.put(snapshot).onsuccess = () => {
        const all = store.index('key').getAll(snapshot.key);
        all.onsuccess = () => {
          const kept = (all.result as unknown[])
            .map((r, i) => readSnapshot(r, `#${i}`).snapshot)
            .filter((s): s is ReviewSnapshot => s !== null)
            .sort(newestFirst);
          for (const old of kept.slice(SNAPSHOT_LIMIT)) store.delete(old.id);
        };
      };
    };
    await finished;
  }

  async function listSnapshots(key?: string) {
    const tx = db.transaction(SNAPSHOTS, 'readonly');
    const store = tx.objectStore(SNAPSHOTS);
    const [values, keys] = await Promise.all([
      request(key === undefined ? store.getAll() : store.index('key').getAll(key)),
      request(key === undefined ? store.getAllKeys() : store.index('key').getAllKeys(key)),
    ]);
    const snapshots: ReviewSnapshot[] = [];
    const lost: LostPart[] = [];
    values.forEach((v, i) => {
      const read = readSnapshot(v, String(keys[i]));
      if (read.snapshot) snapshots.push(read.snapshot);
      lost.push(...read.lost);
    });
    snapshots.sort(newestFirst);
    return { snapshots, lost };
  }

  // Replay what the journal still holds (writes a previous page did not finish); keep what fails for next time.
  const replay = journal.entries();
  for (const s of replay.snapshots) {
    try {
      await writeSnapshot(s);
      journal.clear(s.id, s.seq);
    } catch {
      /* stays in the journal */
    }
  }

  return {
    async load(key) {
      const { snapshots } = await listSnapshots(key);
      // The journal may hold a newer write of this participant than IndexedDB (a replay that failed).
      const pending = journal.entries().snapshots.filter((s) => s.key === key);
      const best = [...pending, ...snapshots].sort(newestFirst).find((s) => hasWork(s.decisions));
      return best ? { savedAt: best.savedAt, aim: best.aim, ...(best.thresholds ? { thresholds: best.thresholds } : {}), reviewer: best.reviewer, decisions: best.decisions } : null;
    },
    save: (key, review) =>
      writeSnapshot({
        ...review, id: `${key}#saved`, key, startedAt: review.savedAt, seq: Date.now(), recordingName: null, nComponents: null, origin: 'review',
      }),
    async saveSnapshot(snapshot) {
      journal.write(snapshot);
      await writeSnapshot(snapshot);
      journal.clear(snapshot.id, snapshot.seq);
    },
    listSnapshots,
    journalLost: replay.lost,
    loadDecomposition: (key) => get<string>(DECOMPOSITIONS, key),
    saveDecomposition: (key, json) => put(DECOMPOSITIONS, key, json),
    close: () => db.close(),
  };
}
