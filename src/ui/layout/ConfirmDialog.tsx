/** Asks before an action replaces work, saying what it replaces (state/persistence.ts askFirst). */
import { useEffect } from 'react';
import { useStore } from 'zustand';
import { persistenceStore } from '../../state/persistence.ts';

export function ConfirmDialog() {
  const confirm = useStore(persistenceStore, (s) => s.confirm);
  useEffect(() => {
    persistenceStore.setState((s) => ({ confirmHosts: s.confirmHosts + 1 }));
    return () => persistenceStore.setState((s) => ({ confirmHosts: s.confirmHosts - 1 }));
  }, []);
  if (!confirm) return null;
  return (
    <div
      className="export-panel confirm-dialog"
      role="alertdialog"
      aria-modal="true"
      aria-labelledby="confirm-title"
      aria-describedby="confirm-replaces"
      data-testid="confirm-dialog"
      style={{ left: '50%', right: 'auto', transform: 'translateX(-50%)', zIndex: 40 }}
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.stopPropagation();
          confirm.resolve(false);
        }
      }}
    >
      <h2 id="confirm-title">{confirm.title}</h2>
      <p id="confirm-replaces" data-testid="confirm-replaces">{confirm.replaces}</p>
      <div className="panel-actions">
        <button type="button" onClick={() => confirm.resolve(true)} data-testid="confirm-ok">{confirm.confirmLabel}</button>
        <button type="button" onClick={() => confirm.resolve(false)} data-testid="confirm-cancel" autoFocus>{confirm.cancelLabel ?? 'Cancel'}</button>
      </div>
    </div>
  );
}
