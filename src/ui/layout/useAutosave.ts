/**
 * Installs, for the page's lifetime: autosave (journal + IndexedDB) with its problems shown, note drafts
 * written per keystroke batch, a last write when the page is hidden or goes away (pagehide,
 * visibilitychange), the second-tab watch, reopening a saved review once its participant loads, and the
 * way back to the start page when a load ends without evidence.
 */
import { useEffect } from 'react';
import { workbenchStore } from '../../state/index.ts';
import { startAutosave } from '../../state/autosave.ts';
import { createJournal, pageStorage } from '../../state/review-journal.ts';
import { persistenceStore } from '../../state/persistence.ts';
import { getReviewArchive, refreshSavedReviews, startRestoreWatch } from '../../state/review-history.ts';
import { startTabWatch } from '../../state/tab-watch.ts';
import { startWayForwardWatch } from '../../state/recompute-evidence.ts';

/** The note field being typed in, if any (the decision panel's and the focus view's carry data-note-field). */
function focusedNote(): HTMLTextAreaElement | null {
  const el = document.activeElement;
  return el instanceof HTMLTextAreaElement && el.hasAttribute('data-note-field') ? el : null;
}

export function useAutosave(): void {
  useEffect(() => {
    const handle = startAutosave(workbenchStore, getReviewArchive, {
      journal: createJournal(pageStorage()),
      onProblem: (saveProblem) => persistenceStore.setState({ saveProblem }),
    });
    const draft = (el: HTMLTextAreaElement) => {
      const index = workbenchStore.getState().selected;
      if (index !== null) handle.noteDraft(index, el.value);
    };
    // Every keystroke batch of a note is written as a draft (the field commits it to the review later).
    let scheduled = false;
    const onInput = (e: Event) => {
      const el = e.target;
      if (!(el instanceof HTMLTextAreaElement) || !el.hasAttribute('data-note-field') || scheduled) return;
      scheduled = true;
      queueMicrotask(() => {
        scheduled = false;
        draft(el);
      });
    };
    const lastWrite = () => {
      const el = focusedNote();
      if (el) draft(el);
    };
    const onVisibility = () => {
      if (document.visibilityState === 'hidden') lastWrite();
    };
    document.addEventListener('input', onInput, true);
    window.addEventListener('pagehide', lastWrite);
    document.addEventListener('visibilitychange', onVisibility);

    const tabs = startTabWatch(workbenchStore, {
      onClash: (tabClash) => persistenceStore.setState({ tabClash }),
      onTakeOver: () => workbenchStore.getState().setNotice({ kind: 'info', text: 'The other tab with this participant closed: this tab owns the review now.' }),
    });
    window.addEventListener('pagehide', tabs.stop);
    const stopRestore = startRestoreWatch();
    const stopWayForward = startWayForwardWatch();
    void refreshSavedReviews();
    return () => {
      handle.stop();
      tabs.stop();
      stopRestore();
      stopWayForward();
      document.removeEventListener('input', onInput, true);
      window.removeEventListener('pagehide', lastWrite);
      window.removeEventListener('pagehide', tabs.stop);
      document.removeEventListener('visibilitychange', onVisibility);
    };
  }, []);
}
