/**
 * The saved-review history seen from the page: the archive (IndexedDB + journal, opened once), the list
 * the start page shows, reopening a snapshot (directly when its participant is loaded; otherwise once the
 * reviewer opens that participant's files — the demo opens by itself), and the questions asked before an
 * action replaces work.
 */
import { workbenchStore } from './store.ts';
import { openReviewDb, type ReviewDb } from './review-db.ts';
import { reviewKey } from './services.ts';
import { askFirst, persistenceStore, reportLost } from './persistence.ts';
import { decidedCount, hasWork, type ReviewSnapshot } from './review-snapshot.ts';
import { demoFilePaths } from './demo-files.ts';
import { countOf } from './replace-guards.ts';
import type { WorkbenchState } from './types.ts';

let archive: Promise<ReviewDb> | null = null;

/** The page's saved-review archive (opened on first use; a failed opening is tried again next time). */
export function getReviewArchive(): Promise<ReviewDb> {
  archive ??= openReviewDb().then(
    (db) => {
      reportLost(db.journalLost);
      return db;
    },
    (e: unknown) => {
      archive = null;
      throw e;
    },
  );
  return archive;
}

/** Replaces the archive (tests). */
export function setReviewArchive(db: ReviewDb | null): void {
  archive = db ? Promise.resolve(db) : null;
}

/** Reloads the list of saved snapshots (start page); damaged records are reported, the rest listed. */
export async function refreshSavedReviews(): Promise<void> {
  try {
    const { snapshots, lost } = await (await getReviewArchive()).listSnapshots();
    reportLost(lost);
    persistenceStore.setState({ saved: snapshots.filter((s) => hasWork(s.decisions)) });
  } catch {
    persistenceStore.setState({ saved: [] });
  }
}

export const formatWhen = (iso: string): string => {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleString();
};

const currentKey = (s: WorkbenchState) =>
  s.recordingSha256 !== null && s.decompositionSha256 !== null ? reviewKey(s.recordingSha256, s.decompositionSha256) : null;


const demoRecordingNames = (): string[] => {
  try {
    return demoFilePaths().filter((p) => /\.(edf|bdf)$/i.test(p)).map((p) => p.slice(p.lastIndexOf('/') + 1));
  } catch {
    return [];
  }
};

/** Puts `snap` on the board (as an accepted offer, so undo does not reach back past it). */
function apply(snap: ReviewSnapshot) {
  const s = workbenchStore.getState();
  workbenchStore.setState({
    resumeOffer: { savedAt: snap.savedAt, aim: snap.aim, thresholds: snap.thresholds ?? {}, decisions: snap.decisions, decidedCount: decidedCount(snap.decisions) },
  });
  s.resume(true);
  workbenchStore.setState({
    reviewer: snap.reviewer || workbenchStore.getState().reviewer,
    screen: 'board',
    notice: { kind: 'info', text: `Restored the review saved ${formatWhen(snap.savedAt)} (${countOf(snap.decisions)}).` },
  });
}

/** Reopens a saved snapshot: asks first when it would replace work on the board. */
export async function reopenSnapshot(snap: ReviewSnapshot): Promise<void> {
  const s = workbenchStore.getState();
  const key = currentKey(s);
  if (key === snap.key && s.evidence !== null) {
    if (hasWork(s.decisions)) {
      const ok = await askFirst({
        title: `Restore the review saved ${formatWhen(snap.savedAt)}?`,
        replaces: `It replaces the ${countOf(s.decisions)} on the board now. Those stay saved as their own snapshot in this participant's history.`,
        confirmLabel: 'Restore it',
      });
      if (!ok) return;
    }
    apply(snap);
    void refreshSavedReviews();
    return;
  }
  if (s.decomposition !== null) {
    const ok = await askFirst({
      title: `Reopen the review of ${snap.recordingName ?? 'another participant'}?`,
      replaces: `It closes ${s.recording?.fileName ?? 'the participant'} under review (${countOf(s.decisions)}). That review is saved and listed here.`,
      confirmLabel: 'Reopen',
    });
    if (!ok) return;
  }
  persistenceStore.setState({ pendingRestore: snap });
  if (snap.recordingName !== null && demoRecordingNames().includes(snap.recordingName)) {
    await workbenchStore.getState().loadDemo();
    return;
  }
  workbenchStore.getState().setNotice({
    kind: 'info',
    text: `To reopen this review, open ${snap.recordingName ?? 'the recording'} with its decomposition (above): the saved review is put on the board as soon as they are read.`,
  });
}

/**
 * Watches for the participant a pending reopen waits for; when its evidence is ready the snapshot goes on
 * the board. Returns the function that stops watching.
 */
export function startRestoreWatch(): () => void {
  return workbenchStore.subscribe((s, prev) => {
    const pending = persistenceStore.getState().pendingRestore;
    if (!pending || s.evidence === null || prev.evidence === s.evidence) return;
    if (currentKey(s) !== pending.key) {
      if (s.recordingSha256 !== null) {
        persistenceStore.setState({ pendingRestore: null });
        workbenchStore.getState().setNotice({
          kind: 'error',
          text: `The files opened are not the participant of the saved review (${pending.recordingName ?? 'another recording'}, or another decomposition of it); the saved review was not put on the board and stays listed on the start page.`,
        });
      }
      return;
    }
    persistenceStore.setState({ pendingRestore: null });
    apply(pending);
  });
}

/** Asks before opening another recording replaces the participant under review; true = go ahead. */
export function confirmSwitchParticipant(newName: string): Promise<boolean> {
  const s = workbenchStore.getState();
  if (s.decomposition === null) return Promise.resolve(true);
  return askFirst({
    title: `Open ${newName}?`,
    replaces: `It replaces ${s.recording?.fileName ?? 'the participant'} under review (${countOf(s.decisions)}). That review is saved: reopen it from the start page.`,
    confirmLabel: `Open ${newName}`,
  });
}
