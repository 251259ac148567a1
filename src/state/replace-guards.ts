/**
 * Questions asked before an action replaces the decisions on the board (no store import, so the session
 * slice can use it). The answer is yes without asking when nothing would be replaced.
 */
import { askFirst } from './persistence.ts';
import { decidedCount, hasWork } from './review-snapshot.ts';
import type { ReviewDecision } from '../core/review/decisions-file.ts';
import type { WorkbenchState } from './types.ts';

export const countOf = (decisions: Record<number, ReviewDecision>): string => `${decidedCount(decisions)} decided`;

/** Asks before an imported decisions file replaces the decisions on the board; true = go ahead. */
export function confirmImport(name: string, s: Pick<WorkbenchState, 'decisions' | 'recording'>, incoming: number, tsv: boolean): Promise<boolean> {
  if (!hasWork(s.decisions)) return Promise.resolve(true);
  const unchecked = tsv
    ? ' A TSV file carries no recording or decomposition hash, so Winnow cannot check that it belongs to this participant.'
    : '';
  return askFirst({
    title: `Import ${name}?`,
    replaces: `It replaces the ${countOf(s.decisions)} of ${s.recording?.fileName ?? 'this review'} with the ${incoming} decision${incoming === 1 ? '' : 's'} in the file.${unchecked} The current decisions stay saved as their own snapshot (start page).`,
    confirmLabel: 'Import and replace',
  });
}

