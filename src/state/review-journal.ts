/**
 * The write-ahead journal of the review store: every snapshot write is first put here synchronously (the
 * page's localStorage), then into IndexedDB, which is asynchronous and may not finish before a reload or a
 * tab close. The next opening of the store replays what the journal still holds. `storage` is the page's
 * localStorage in the browser and an in-memory map in tests.
 */
import type { LostPart, ReviewSnapshot } from './review-snapshot.ts';
import { readSnapshot } from './review-snapshot.ts';

export interface SyncStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
  key(index: number): string | null;
  readonly length: number;
}

const PREFIX = 'winnow-journal:';

export interface ReviewJournal {
  /** Writes the snapshot; false when the storage refused it (full, or unavailable). */
  write(snapshot: ReviewSnapshot): boolean;
  /** Drops the entry for `id` when it holds write `seq` or an older one. */
  clear(id: string, seq: number): void;
  entries(): { snapshots: ReviewSnapshot[]; lost: LostPart[] };
}

export function createJournal(storage: SyncStorage | null): ReviewJournal {
  return {
    write(snapshot) {
      if (!storage) return false;
      try {
        storage.setItem(PREFIX + snapshot.id, JSON.stringify(snapshot));
        return true;
      } catch {
        return false;
      }
    },
    clear(id, seq) {
      if (!storage) return;
      try {
        const text = storage.getItem(PREFIX + id);
        if (text === null) return;
        const held = (JSON.parse(text) as { seq?: unknown }).seq;
        if (typeof held !== 'number' || held <= seq) storage.removeItem(PREFIX + id);
      } catch {
        storage.removeItem(PREFIX + id);
      }
    },
    entries() {
      const snapshots: ReviewSnapshot[] = [];
      const lost: LostPart[] = [];
      if (!storage) return { snapshots, lost };
      const keys: string[] = [];
      for (let i = 0; i < storage.length; i++) {
        const k = storage.key(i);
        if (k?.startsWith(PREFIX)) keys.push(k);
      }
      for (const k of keys) {
        let raw: unknown;
        try {
          raw = JSON.parse(storage.getItem(k) ?? 'null');
        } catch {
          raw = null;
        }
        const read = readSnapshot(raw, k.slice(PREFIX.length));
        if (read.snapshot) snapshots.push(read.snapshot);
        else storage.removeItem(k);
        lost.push(...read.lost);
      }
      return { snapshots, lost };
    },
  };
}

/** The page's localStorage, or null (node, or storage disabled). */
export function pageStorage(): SyncStorage | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null;
  }
}

/** In-memory storage with the same interface (tests). */
export function memoryStorage(): SyncStorage & { map: Map<string, string> } {
  const map = new Map<string, string>();
  return {
    map,
    getItem: (k) => map.get(k) ?? null,
    setItem: (k, v) => void map.set(k, v),
    removeItem: (k) => void map.delete(k),
    key: (i) => [...map.keys()][i] ?? null,
    get length() {
      return map.size;
    },
  };
}
