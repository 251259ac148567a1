/**
 * Autosaved reviews in IndexedDB: one record per recording + decomposition (key = both SHA-256 digests),
 * holding the aim, reviewer and decisions. `factory` defaults to the page's `indexedDB`; tests pass
 * fake-indexeddb's.
 */
import type { SavedReview } from './services.ts';

const DB_NAME = 'winnow-reviews';
const STORE = 'reviews';

export interface ReviewDb {
  load(key: string): Promise<SavedReview | null>;
  save(key: string, review: SavedReview): Promise<void>;
  close(): void;
}

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB request failed'));
  });
}

export async function openReviewDb(factory: IDBFactory = indexedDB): Promise<ReviewDb> {
  const open = factory.open(DB_NAME, 1);
  open.onupgradeneeded = () => {
    if (!open.result.objectStoreNames.contains(STORE)) open.result.createObjectStore(STORE);
  };
  const db = await request(open);
  return {
    async load(key) {
      const tx = db.transaction(STORE, 'readonly');
      const value = (await request(tx.objectStore(STORE).get(key))) as SavedReview | undefined;
      return value ?? null;
    },
    save(key, review) {
      return new Promise((resolve, reject) => {
        const tx = db.transaction(STORE, 'readwrite');
        tx.objectStore(STORE).put(review, key);
        tx.oncomplete = () => resolve();
        tx.onerror = () => reject(tx.error ?? new Error('IndexedDB write failed'));
        tx.onabort = () => reject(tx.error ?? new Error('IndexedDB write aborted'));
      });
    },
    close: () => db.close(),
  };
}
