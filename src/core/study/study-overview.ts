/**
 * One row per recording of a study: its review state and what was removed, with the study's consistency
 * flags (flags.ts) attached. Pure: the browser's study overview and `winnow batch … group` read the same.
 */
import { studyFlags, type StudyFlag } from './flags.ts';
import type { DecisionsFile } from '../review/decisions-file.ts';

export type ReviewState = 'not started' | 'in progress' | 'done';

export interface StudyRowInput {
  /** Readable key, e.g. "sub-01 task-walk". */
  readonly key: string;
  /** Number of components of the decomposition (null before it is known). */
  readonly components: number | null;
  /** The saved review, or null when none exists yet. */
  readonly decisions: Pick<DecisionsFile, 'components' | 'aim' | 'reviewer'> | null;
  /** Variance share (0…1) of each component by 1-based index, when evidence is known. */
  readonly varianceShare?: (index: number) => number | null;
}

export interface StudyRow {
  readonly key: string;
  readonly state: ReviewState;
  readonly decided: number;
  readonly components: number | null;
  readonly removed: number;
  /** Sum of the removed components' variance shares; null when not known. */
  readonly removedVariance: number | null;
  /** Reasons of the removed components, each once, in vocabulary order of first use. */
  readonly reasons: readonly string[];
  readonly aim: string | null;
  readonly reviewer: string | null;
  readonly flags: readonly StudyFlag[];
}

export function studyRows(inputs: readonly StudyRowInput[]): StudyRow[] {
  const base = inputs.map((r) => {
    const comps = r.decisions?.components ?? [];
    const decided = comps.filter((c) => c.verdict !== 'undecided').length;
    const removedList = comps.filter((c) => c.verdict === 'remove');
    const total = r.components ?? comps.length;
    let removedVariance: number | null = r.varianceShare ? 0 : null;
    for (const c of removedList) {
      const v = r.varianceShare?.(c.index);
      if (v === null || v === undefined) removedVariance = null;
      else if (removedVariance !== null) removedVariance += v;
    }
    const state: ReviewState = r.decisions === null || decided === 0 ? 'not started' : decided >= total ? 'done' : 'in progress';
    return {
      key: r.key,
      state,
      decided,
      components: r.components,
      removed: removedList.length,
      removedVariance,
      reasons: [...new Set(removedList.map((c) => c.reason).filter((x): x is NonNullable<typeof x> => x !== null))],
      aim: r.decisions?.aim ?? null,
      reviewer: r.decisions?.reviewer ?? null,
      undecided: Math.max(0, total - decided),
    };
  });
  const reviewed = base.filter((b) => b.state !== 'not started');
  const flags = studyFlags(
    reviewed.map((b) => ({ key: b.key, removed: b.removed, removedVariance: b.removedVariance, reasons: b.reasons, undecided: b.state === 'done' ? 0 : b.undecided, aim: b.aim })),
  );
  return base.map(({ undecided: _u, ...b }) => ({ ...b, flags: flags.filter((f) => f.key === b.key) }));
}
