/**
 * Consistency flags of a study: a recording whose reviewed (or suggested) removals look unlike the
 * others'. Robust rules so that one odd recording cannot hide itself by moving the centre:
 * a value is far when |x − median| > 3 · 1.4826 · MAD (the scaled median absolute deviation, a
 * consistent estimate of the standard deviation for normal data; Hampel 1974, J. Am. Stat. Assoc.
 * 69:383–393; Leys et al. 2013, J. Exp. Soc. Psychol. 49:764–766, who discuss cut-offs of 2.5 and 3; Winnow takes
 * the more conservative 3 [ours]).
 * docs/methods.md §19.
 */

export function median(values: readonly number[]): number {
  if (values.length === 0) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Median absolute deviation from the median (unscaled). */
export function medianAbsoluteDeviation(values: readonly number[]): number {
  const m = median(values);
  return median(values.map((v) => Math.abs(v - m)));
}

/** 1.4826 = 1 / Φ⁻¹(3/4): makes the MAD estimate σ for normal data. */
export const MAD_TO_SD = 1.4826;
export const FAR_CUTOFF = 3;

export interface StudyRecordingSummary {
  /** A readable key, e.g. "sub-01 task-walk". */
  readonly key: string;
  readonly removed: number;
  /** Variance share (0…1) of the removed components; null when not known (left out of that rule). */
  readonly removedVariance: number | null;
  readonly reasons: readonly string[];
  readonly undecided: number;
  readonly aim: string | null;
}

export interface StudyFlag {
  readonly key: string;
  readonly rule: 'removed-count' | 'removed-variance' | 'no-ocular' | 'lone-reason' | 'undecided' | 'other-aim';
  /** A sentence that says why, with the figures. */
  readonly why: string;
}

const OCULAR = new Set(['blink', 'gaze']);

function farFlags(all: readonly StudyRecordingSummary[], pick: (r: StudyRecordingSummary) => number | null, rule: StudyFlag['rule'], what: string, fmt: (v: number) => string): StudyFlag[] {
  const rows = all.filter((r) => pick(r) !== null);
  if (rows.length < 4) return [];
  const values = rows.map((r) => pick(r) as number);
  const m = median(values);
  const spread = MAD_TO_SD * medianAbsoluteDeviation(values);
  const out: StudyFlag[] = [];
  for (const r of rows) {
    const v = pick(r) as number;
    // with no spread at all (every other recording identical), any difference is far
    const far = spread > 0 ? Math.abs(v - m) > FAR_CUTOFF * spread : v !== m;
    if (far) out.push({ key: r.key, rule, why: `${what} ${fmt(v)} is far from the study's median ${fmt(m)} (more than 3 scaled MAD = ${fmt(FAR_CUTOFF * spread)})` });
  }
  return out;
}

/** Every flag of the study, in recording order then rule order. Rules need at least 4 recordings. */
export function studyFlags(rows: readonly StudyRecordingSummary[]): StudyFlag[] {
  const flags: StudyFlag[] = [];
  const pct = (v: number) => `${(100 * v).toFixed(1)}\u00a0%`;
  flags.push(...farFlags(rows, (r) => r.removed, 'removed-count', 'components removed', (v) => String(Math.round(v * 10) / 10)));
  flags.push(...farFlags(rows, (r) => r.removedVariance, 'removed-variance', 'variance removed', pct));
  if (rows.length >= 4) {
    const withOcular = rows.filter((r) => r.reasons.some((x) => OCULAR.has(x))).length;
    if (withOcular > rows.length / 2)
      for (const r of rows)
        if (!r.reasons.some((x) => OCULAR.has(x)))
          flags.push({ key: r.key, rule: 'no-ocular', why: `no blink or gaze component removed, while ${withOcular} of ${rows.length} recordings have one` });
    const usedBy = new Map<string, number>();
    for (const r of rows) for (const x of new Set(r.reasons)) usedBy.set(x, (usedBy.get(x) ?? 0) + 1);
    for (const r of rows)
      for (const x of new Set(r.reasons))
        if (usedBy.get(x) === 1) flags.push({ key: r.key, rule: 'lone-reason', why: `reason "${x}" is used in no other recording` });
    const aims = rows.map((r) => r.aim).filter((a): a is string => a !== null);
    const counts = new Map<string, number>();
    for (const a of aims) counts.set(a, (counts.get(a) ?? 0) + 1);
    const [mainAim, mainN] = [...counts].sort((a, b) => b[1] - a[1])[0] ?? [null, 0];
    if (mainAim !== null && mainN > aims.length / 2)
      for (const r of rows) if (r.aim !== null && r.aim !== mainAim) flags.push({ key: r.key, rule: 'other-aim', why: `aim ${r.aim}, while ${mainN} of ${aims.length} recordings use ${mainAim}` });
  }
  for (const r of rows) if (r.undecided > 0) flags.push({ key: r.key, rule: 'undecided', why: `${r.undecided} component${r.undecided > 1 ? 's' : ''} left undecided` });
  const order = new Map(rows.map((r, i) => [r.key, i]));
  return flags.sort((a, b) => (order.get(a.key) ?? 0) - (order.get(b.key) ?? 0));
}
