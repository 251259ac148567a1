/**
 * The reviews saved in this browser, by participant: recording, when last saved, how many components were
 * decided, and each saved snapshot (the last 20 per participant), any of which reopens on the board.
 */
import { useEffect, useMemo } from 'react';
import { useStore } from 'zustand';
import { persistenceStore } from '../../state/persistence.ts';
import { formatWhen, refreshSavedReviews, reopenSnapshot } from '../../state/review-history.ts';
import { ORIGIN_LABELS, decidedCount, type ReviewSnapshot } from '../../state/review-snapshot.ts';
import { useWorkbench } from '../../state/index.ts';

const short = (key: string) => key.split(':').map((h) => h.slice(0, 8)).join(' / ');

export function SavedReviews() {
  const saved = useStore(persistenceStore, (s) => s.saved);
  const busy = useWorkbench((s) => s.progress !== null);
  useEffect(() => {
    void refreshSavedReviews();
  }, []);
  const groups = useMemo(() => {
    const by = new Map<string, ReviewSnapshot[]>();
    for (const s of saved) by.set(s.key, [...(by.get(s.key) ?? []), s]);
    return [...by.values()];
  }, [saved]);
  if (groups.length === 0) return null;
  return (
    <section className="saved-reviews" aria-label="Saved reviews" data-testid="saved-reviews">
      <h2>Saved reviews in this browser</h2>
      <ul>
        {groups.map((snaps) => {
          const latest = snaps[0];
          return (
            <li key={latest.key} data-testid="saved-participant" data-key={latest.key}>
              <strong>{latest.recordingName ?? `participant ${short(latest.key)}`}</strong>{' '}
              <span title={`recording / decomposition SHA-256 ${latest.key.replace(':', ' / ')}`}>({short(latest.key)})</span> — saved{' '}
              {formatWhen(latest.savedAt)}, {decidedCount(latest.decisions)} of {latest.nComponents ?? '?'} decided{' '}
              <button type="button" disabled={busy} onClick={() => void reopenSnapshot(latest)} data-testid="saved-reopen">Reopen</button>
              <details>
                <summary>{snaps.length} saved snapshot{snaps.length === 1 ? '' : 's'}</summary>
                <ol data-testid="saved-snapshots">
                  {snaps.map((s) => (
                    <li key={s.id} data-testid="saved-snapshot" data-decided={decidedCount(s.decisions)}>
                      {formatWhen(s.savedAt)} — {decidedCount(s.decisions)} decided, aim {s.aim}, {ORIGIN_LABELS[s.origin]}{' '}
                      <button type="button" disabled={busy} onClick={() => void reopenSnapshot(s)} data-testid="snapshot-restore">Restore</button>
                    </li>
                  ))}
                </ol>
              </details>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
