/**
 * Two reviewers' decisions on the same recording and decomposition: where they disagree, and the
 * adjudicated file that records a third decision while keeping both raters' entries (issue 11). The
 * adjudicated file is a decisions file (winnow-decisions/2, so `winnow clean` and the workbench read it)
 * with two additions: `adjudication.raters` (who the two raters were) and, per component, `raters`
 * (each rater's verdict, reason and note, in the order of `adjudication.raters`).
 */
import { buildDecisionsFile, UNDECIDED, type DecisionsFile, type DecisionsFileComponent, type ReviewDecision } from './decisions-file.ts';

export interface Disagreement {
  readonly index: number;
  readonly a: ReviewDecision;
  readonly b: ReviewDecision;
  /** 'verdict' when the verdicts differ; 'reason' when both removed for different reasons. */
  readonly kind: 'verdict' | 'reason';
}

const entryOf = (f: DecisionsFile, index: number): ReviewDecision => {
  const c = f.components.find((x) => x.index === index);
  return c ? { verdict: c.verdict, reason: c.reason, note: c.note } : UNDECIDED;
};

/** Throws a RangeError when the files are for different recordings or decompositions. */
export function assertSameReview(a: DecisionsFile, b: DecisionsFile): void {
  if (a.recordingSha256 !== b.recordingSha256) throw new RangeError('the two decisions files are for different recordings (recordingSha256 differs)');
  if (a.decompositionSha256 !== b.decompositionSha256) throw new RangeError('the two decisions files are for different decompositions (decompositionSha256 differs)');
}

/** Every component index either file names, ascending; components matched by index, never by position. */
export function componentIndices(a: DecisionsFile, b: DecisionsFile): number[] {
  return [...new Set([...a.components.map((c) => c.index), ...b.components.map((c) => c.index)])].sort((x, y) => x - y);
}

export function disagreements(a: DecisionsFile, b: DecisionsFile): Disagreement[] {
  assertSameReview(a, b);
  const out: Disagreement[] = [];
  for (const index of componentIndices(a, b)) {
    const ea = entryOf(a, index);
    const eb = entryOf(b, index);
    if (ea.verdict !== eb.verdict) out.push({ index, a: ea, b: eb, kind: 'verdict' });
    else if (ea.verdict === 'remove' && ea.reason !== eb.reason) out.push({ index, a: ea, b: eb, kind: 'reason' });
  }
  return out;
}

export interface AdjudicatedComponent extends DecisionsFileComponent {
  readonly raters: readonly [ReviewDecision, ReviewDecision];
}

export interface AdjudicatedFile extends Omit<DecisionsFile, 'components'> {
  readonly adjudication: { readonly raters: readonly [{ reviewer: string; createdAt: string }, { reviewer: string; createdAt: string }] };
  readonly components: readonly AdjudicatedComponent[];
}

/**
 * The adjudicated decisions: `resolved` where the adjudicator decided, else the agreed entry where both
 * raters agree (verdict and, for removals, reason), else undecided — never silently one rater's choice.
 */
export function buildAdjudicatedFile(
  a: DecisionsFile,
  b: DecisionsFile,
  resolved: Readonly<Record<number, ReviewDecision>>,
  header: { reviewer: string; createdAt: string; software: string },
): AdjudicatedFile {
  assertSameReview(a, b);
  const indices = componentIndices(a, b);
  const decisions: Record<number, ReviewDecision> = {};
  for (const i of indices) {
    const ea = entryOf(a, i);
    const eb = entryOf(b, i);
    const agreed = ea.verdict === eb.verdict && (ea.verdict !== 'remove' || ea.reason === eb.reason);
    decisions[i] = resolved[i] ?? (agreed ? { verdict: ea.verdict, reason: ea.reason ?? eb.reason, note: [ea.note, eb.note].filter(Boolean).join(' | ') } : UNDECIDED);
  }
  const n = indices.length === 0 ? 0 : indices[indices.length - 1];
  const base = buildDecisionsFile({
    aim: a.aim,
    reviewer: header.reviewer,
    createdAt: header.createdAt,
    software: header.software,
    recordingSha256: a.recordingSha256,
    decompositionSha256: a.decompositionSha256,
    nComponents: n,
    decisions,
  });
  return {
    ...base,
    adjudication: { raters: [{ reviewer: a.reviewer, createdAt: a.createdAt }, { reviewer: b.reviewer, createdAt: b.createdAt }] },
    components: base.components.map((c) => ({ ...c, raters: [entryOf(a, c.index), entryOf(b, c.index)] as const })),
  };
}
