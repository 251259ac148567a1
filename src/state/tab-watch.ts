/**
 * A second tab on the same participant: tabs of this browser tell each other over a BroadcastChannel which
 * participant (recording + decomposition hashes) they have open and since when. The tab that opened it
 * first owns the review; a later one is told which tab that is, and the owner is told another tab opened
 * it too. When the owner closes or moves to another participant, the next tab in line takes over.
 * Each tab's changes are saved as their own snapshot (autosave.ts), so neither overwrites the other.
 */
import type { StoreApi } from 'zustand/vanilla';
import { reviewKey } from './services.ts';
import type { WorkbenchState } from './types.ts';
import type { TabClash } from './persistence.ts';

type Message =
  | { t: 'hello'; key: string; id: string; since: number; label: string }
  | { t: 'owner'; key: string; id: string; since: number; label: string; to: string }
  | { t: 'bye'; key: string; id: string };

export interface TabWatchOptions {
  readonly channel?: { postMessage(m: unknown): void; close(): void; onmessage: ((ev: MessageEvent) => void) | null } | null;
  readonly onClash: (clash: TabClash | null) => void;
  /** Told when this tab became the owner because the owner went away. */
  readonly onTakeOver?: () => void;
}

const CHANNEL = 'winnow-review-tabs';

/** How the reviewer can recognise a tab: when it opened the participant, and a short id. */
export const tabLabel = (id: string, since: number) =>
  `the tab that opened it at ${new Date(since).toLocaleTimeString()} (tab ${id.slice(0, 4)})`;

export function startTabWatch(store: StoreApi<WorkbenchState>, options: TabWatchOptions): { stop(): void; label(): string | null } {
  const channel = options.channel !== undefined ? options.channel : typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel(CHANNEL) : null;
  const id = Math.random().toString(36).slice(2, 10);
  let key: string | null = null;
  let since = 0;
  /** The earlier tab that owns this participant, when not this one. */
  let owner: { id: string; since: number; label: string } | null = null;
  const others = new Map<string, number>();
  const me = () => tabLabel(id, since);
  const post = (m: Message) => channel?.postMessage(m);
  const earlier = (aSince: number, aId: string, bSince: number, bId: string) => aSince < bSince || (aSince === bSince && aId < bId);

  function leave() {
    if (key !== null) post({ t: 'bye', key, id });
    key = null;
    owner = null;
    others.clear();
    options.onClash(null);
  }

  function enter(next: string) {
    leave();
    key = next;
    since = Date.now();
    post({ t: 'hello', key, id, since, label: me() });
  }

  if (channel) {
    channel.onmessage = (ev: MessageEvent) => {
      const m = ev.data as Message;
      if (!m || typeof m !== 'object' || m.id === id || key === null || m.key !== key) return;
      if (m.t === 'hello' || m.t === 'owner') {
        if (m.t === 'owner' && m.to !== id) return;
        others.set(m.id, m.since);
        if (earlier(m.since, m.id, since, id)) {
          if (!owner || earlier(m.since, m.id, owner.since, owner.id)) {
            owner = { id: m.id, since: m.since, label: m.label };
            options.onClash({ thisTabOwns: false, ownerLabel: m.label });
          }
        } else if (owner === null) {
          // This tab opened it first: it owns the review; tell the newcomer, and tell the reviewer here.
          if (m.t === 'hello') post({ t: 'owner', key, id, since, label: me(), to: m.id });
          options.onClash({ thisTabOwns: true, ownerLabel: me() });
        }
      } else if (m.t === 'bye') {
        others.delete(m.id);
        if (owner?.id === m.id) {
          owner = null;
          // Any other tab still open and earlier than this one becomes the owner; else this tab.
          const first = [...others.entries()].filter(([oid, s]) => earlier(s, oid, since, id)).sort((a, b) => a[1] - b[1])[0];
          if (first) {
            owner = { id: first[0], since: first[1], label: tabLabel(first[0], first[1]) };
            options.onClash({ thisTabOwns: false, ownerLabel: owner.label });
          } else {
            options.onClash(others.size > 0 ? { thisTabOwns: true, ownerLabel: me() } : null);
            options.onTakeOver?.();
          }
        } else if (others.size === 0 && owner === null) {
          options.onClash(null);
        }
      }
    };
  }

  const check = (s: WorkbenchState) => {
    const next = s.recordingSha256 !== null && s.decompositionSha256 !== null && s.evidence !== null ? reviewKey(s.recordingSha256, s.decompositionSha256) : null;
    if (next === key) return;
    if (next === null) leave();
    else enter(next);
  };
  const unsubscribe = store.subscribe(check);
  check(store.getState());
  return {
    stop() {
      unsubscribe();
      leave();
      channel?.close();
    },
    label: () => (key === null ? null : me()),
  };
}
