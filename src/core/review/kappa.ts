/**
 * Agreement between two reviewers (docs/methods.md §13): Cohen's kappa (Cohen 1960, Educ. Psychol. Meas.
 * 20:37–46), its weighted form (Cohen 1968, Psychol. Bull. 70:213–220) and the verbal labels of Landis &
 * Koch 1977 (Biometrics 33:159–174). Used to tune the threshold table against reviewers' labels.
 */

export interface KappaResult {
  /** Observed agreement p_o = Σ p_ii. */
  readonly observed: number;
  /** Chance agreement p_e = Σ p_i. p_.i. */
  readonly chance: number;
  /** (p_o − p_e) / (1 − p_e); null when p_e = 1 (both reviewers used one identical category: undefined). */
  readonly kappa: number | null;
  readonly n: number;
}

/** κ from a square table of counts or proportions (rows: reviewer A, columns: reviewer B). */
export function cohenKappa(table: readonly (readonly number[])[]): KappaResult {
  const k = table.length;
  let n = 0;
  for (const row of table) for (const v of row) n += v;
  if (!(n > 0)) return { observed: NaN, chance: NaN, kappa: null, n: 0 };
  let po = 0;
  let pe = 0;
  for (let i = 0; i < k; i++) {
    po += table[i][i] / n;
    let row = 0;
    let col = 0;
    for (let j = 0; j < k; j++) {
      row += table[i][j] / n;
      col += table[j][i] / n;
    }
    pe += row * col;
  }
  const kappa = Math.abs(1 - pe) < 1e-12 ? null : (po - pe) / (1 - pe);
  return { observed: po, chance: pe, kappa, n };
}

/** Weighted κ_w = 1 − Σ v_ij p_ij / Σ v_ij p_i. p_.j with disagreement weights v (v_ii = 0); null if undefined. */
export function weightedKappa(table: readonly (readonly number[])[], weights: readonly (readonly number[])[]): number | null {
  const k = table.length;
  let n = 0;
  for (const row of table) for (const v of row) n += v;
  const rows = table.map((r) => r.reduce((s, v) => s + v, 0) / n);
  const cols = table[0].map((_, j) => table.reduce((s, r) => s + r[j], 0) / n);
  let num = 0;
  let den = 0;
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      num += (weights[i][j] * table[i][j]) / n;
      den += weights[i][j] * rows[i] * cols[j];
    }
  return den > 0 ? 1 - num / den : null;
}

/** The count table of two label lists over `categories` (default: the labels seen, sorted). */
export function agreementTable(a: readonly string[], b: readonly string[], categories?: readonly string[]): { categories: string[]; table: number[][] } {
  const cats = categories ? [...categories] : [...new Set([...a, ...b])].sort();
  const index = new Map(cats.map((c, i) => [c, i]));
  const table = cats.map(() => cats.map(() => 0));
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    const r = index.get(a[i]);
    const c = index.get(b[i]);
    if (r !== undefined && c !== undefined) table[r][c]++;
  }
  return { categories: cats, table };
}

/** Landis & Koch (1977) wording for κ. */
export function kappaLabel(kappa: number | null): string {
  if (kappa === null || !Number.isFinite(kappa)) return 'n/a';
  if (kappa < 0) return 'poor';
  if (kappa <= 0.2) return 'slight';
  if (kappa <= 0.4) return 'fair';
  if (kappa <= 0.6) return 'moderate';
  if (kappa <= 0.8) return 'substantial';
  return 'almost perfect';
}

/** One item rated by two reviewers: its key (e.g. a component's 1-based index) and each reviewer's label. */
export interface KeyedPair<K> {
  readonly key: K;
  readonly a: string;
  readonly b: string;
}

export interface KeyedAgreement<K = number> extends KappaResult {
  /** Keys whose labels differ, in the order given. */
  readonly disagreements: K[];
  /** When κ is undefined because both reviewers used one identical category throughout: that category. */
  readonly constantCategory: string | null;
}

/**
 * Cohen's κ (Cohen 1960) of items already paired by key (never by list position): the count table over
 * `categories`, κ from it, and the keys on which the two labels differ. Labels outside `categories` are
 * left out of the table, as in agreementTable.
 */
export function agreementByKey<K>(pairs: readonly KeyedPair<K>[], categories: readonly string[]): KeyedAgreement<K> {
  const { table } = agreementTable(pairs.map((p) => p.a), pairs.map((p) => p.b), categories);
  const result = cohenKappa(table);
  const disagreements = pairs.filter((p) => p.a !== p.b).map((p) => p.key);
  const seen = new Set(pairs.flatMap((p) => [p.a, p.b]));
  const constantCategory = result.kappa === null && result.n > 0 && seen.size === 1 ? [...seen][0] : null;
  return { ...result, disagreements, constantCategory };
}
