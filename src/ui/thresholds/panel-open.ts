/** Whether the thresholds panel is open: a tiny external store, so the top bar's button and the panel share it. */
import { useSyncExternalStore } from 'react';

let open = false;
const listeners = new Set<() => void>();

export function setThresholdsOpen(next: boolean): void {
  if (next === open) return;
  open = next;
  for (const l of listeners) l();
}

export const toggleThresholdsOpen = () => setThresholdsOpen(!open);

const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};

export const useThresholdsOpen = (): boolean => useSyncExternalStore(subscribe, () => open, () => false);
