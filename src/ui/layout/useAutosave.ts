/** Installs autosave (IndexedDB through the workbench services) for the page's lifetime. */
import { useEffect } from 'react';
import { workbenchStore } from '../../state/index.ts';
import { startAutosave } from '../../state/autosave.ts';
import { getWorkbenchServices } from '../../state/services.ts';

export function useAutosave(): void {
  useEffect(() => {
    const handle = startAutosave(workbenchStore, getWorkbenchServices, (text) => workbenchStore.getState().setNotice({ kind: 'error', text }));
    return () => handle.stop();
  }, []);
}
