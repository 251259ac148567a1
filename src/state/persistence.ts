/**
 * What the page tells the reviewer about keeping their work: a saving problem (with an export offered),
 * another tab holding the same participant, damaged saved data, the saved reviews listed on the start page,
 * and questions asked before an action replaces work. A small store of its own beside the workbench store
 * (vanilla zustand; no React here).
 */
import { createStore } from 'zustand/vanilla';
import type { LostPart, ReviewSnapshot } from './review-snapshot.ts';

export interface SaveProblem {
  readonly kind: 'full' | 'interrupted' | 'unavailable';
  readonly text: string;
}

/** Another tab of this browser has the same participant open. */
export interface TabClash {
  /** True when this tab owns the review (the other one was told); false when the other tab owns it. */
  readonly thisTabOwns: boolean;
  /** The owning tab, as the reviewer can recognise it. */
  readonly ownerLabel: string;
}

/** A question asked before an action that replaces work; `replaces` says what. */
export interface ConfirmRequest {
  readonly title: string;
  readonly replaces: string;
  readonly confirmLabel: string;
  readonly cancelLabel?: string;
}

interface Pending extends ConfirmRequest {
  readonly resolve: (ok: boolean) => void;
}

export interface PersistenceState {
  saveProblem: SaveProblem | null;
  tabClash: TabClash | null;
  /** Damaged saved data that could not be read (shown until dismissed). */
  lost: readonly LostPart[];
  /** Every readable saved snapshot, newest first (the start page lists them by participant). */
  saved: readonly ReviewSnapshot[];
  /** A snapshot to open once its participant is loaded (reopened from the start page). */
  pendingRestore: ReviewSnapshot | null;
  confirm: Pending | null;
  /** Number of confirm dialogs mounted; with none (node tests, a host without UI) questions answer yes. */
  confirmHosts: number;
}

export const persistenceStore = createStore<PersistenceState>()(() => ({
  saveProblem: null,
  tabClash: null,
  lost: [],
  saved: [],
  pendingRestore: null,
  confirm: null,
  confirmHosts: 0,
}));

/**
 * Asks before an action replaces work. Resolves true when the reviewer confirms (or when no dialog is
 * mounted to ask with); a question still open is answered "no" when a new one arrives.
 */
export function askFirst(request: ConfirmRequest): Promise<boolean> {
  const s = persistenceStore.getState();
  if (s.confirmHosts === 0) return Promise.resolve(true);
  s.confirm?.resolve(false);
  return new Promise((resolve) => {
    persistenceStore.setState({
      confirm: {
        ...request,
        resolve: (ok) => {
          persistenceStore.setState({ confirm: null });
          resolve(ok);
        },
      },
    });
  });
}

/** Adds damaged parts to the list shown to the reviewer (each id once). */
export function reportLost(parts: readonly LostPart[]): void {
  if (parts.length === 0) return;
  const { lost } = persistenceStore.getState();
  const seen = new Set(lost.map((l) => `${l.id}|${l.what}`));
  persistenceStore.setState({ lost: [...lost, ...parts.filter((p) => !seen.has(`${p.id}|${p.what}`))] });
}
