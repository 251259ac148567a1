/**
 * Autosaved reviews in IndexedDB: one record per recording + decomposition (key = both SHA-256 digests),
 * holding the aim, reviewer and decisions. `factory` defaults to the page's `indexedDB`; tests pass
 * fake-indexeddb's.
 */
import type { SavedReview } from './services.ts';

const DB_NAME = 'winnow-reviews';
const STORE = 'reviews';
/** Decompositions computed in this browser, as our JSON text, keyed by recording hash + options. */
const DECOMPOSITIONS = 'decompositions';

export interface ReviewDb {
  load(key: string): Promise<SavedReview | null>;
  save(key: string, review: SavedReview): Promise<void>;
  loadDecomposition(key: string): Promise<string | null>;
  saveDecomposition(key: string, json: string): Promise<void>;
  close(): void;
}

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB request failed'));
  });
}

export async function openReviewDb(factory: IDBFactory = indexedDB): Promise<ReviewDb> {
  const open = factory.open(DB_NAME, 2);
  open.onupgradeneeded = () => {
    if (!open.result.objectStoreNames.contains(STORE)) open.result.createObjectStore(STORE);
    if (!open.result.objectStoreNames.contains(DECOMPOSITIONS)) open.result.createObjectStore(DECOMPOSITIONS);
  };
  const db = await request(open);
  const get = async <T>(store: string, key: string): Promise<T | null> => {
    const tx = db.transaction(store, 'readonly');
    const value = (await request(tx.objectStore(store).get(key))) as T | undefined;
    return value ?? null;
  };
  const put = (store: string, key: string, value: unknown) =>
    new Promise<void>((resolve, reject) => {
      const tx = db.transaction(store, 'readwrite');
      tx.objectStore(store).put(value, key);
      tx.oncomplete = () => resolve();
      tx.onerror = () => reject(tx.error ?? new Error('IndexedDB write failed'));
      tx.onabort = () => reject(tx.error ?? new Error('IndexedDB write aborted'));
    });
  return {
    load: (key) => get<SavedReview>(STORE, key),
    save: (key, review) => put(STORE, key, review),
    loadDecomposition: (key) => get<string>(DECOMPOSITIONS, key),
    saveDecomposition: (key, json) => put(DECOMPOSITIONS, key, json),
    close: () => db.close(),
  };
}
