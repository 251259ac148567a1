/**
 * Montages of the validation family (issue 10 item 6): 19 (10-20), 32 and 64 (10-10 subsets, the demo's
 * sets in simulate.ts) and 128 electrodes (10-10 plus 10-5-like intermediate sites). Positions are unit
 * vectors (RAS) from the idealised 10-20/10-10 construction (src/core/headmodel/montage-1020.ts, docs/methods.md
 * §10). The 10-5 sites are built the way the 10-5 system places its "h" sites (Oostenveld & Praamstra 2001,
 * Clin. Neurophysiol. 112:713–719; from memory): halfway between two neighbouring rows and two neighbouring
 * columns, here the normalised mean of the four surrounding 10-10 sites. They are a definition for the
 * simulation, not a measured template.
 */
import { standardPositions } from '../../headmodel/montage-1020.ts';
import { LABELS_32, LABELS_64 } from '../simulate.ts';

export type MontageSize = 19 | 32 | 64 | 128;
export const MONTAGE_SIZES: readonly MontageSize[] = [19, 32, 64, 128];

/** The 19 sites of the original 10-20 system, modern names (T7/T8/P7/P8; ACNS Guideline 2). */
export const LABELS_19: readonly string[] = [
  'Fp1', 'Fp2', 'F7', 'F3', 'Fz', 'F4', 'F8', 'T7', 'C3', 'Cz', 'C4', 'T8', 'P7', 'P3', 'Pz', 'P4', 'P8', 'O1', 'O2',
];

type Vec3 = [number, number, number];

const ROW_PAIRS: readonly (readonly [string, string, string])[] = [
  // upper row, lower row, 10-5 name of the row between them
  ['AF', 'F', 'AFF'],
  ['F', 'FC', 'FFC'],
  ['FC', 'C', 'FCC'],
  ['C', 'CP', 'CCP'],
  ['CP', 'P', 'CPP'],
  ['P', 'PO', 'PPO'],
];
/** Column pairs of a row and the "h" name of the site between them (left 7…1, midline z, right 2…8). */
const COLUMN_PAIRS: readonly (readonly [string, string, string])[] = [
  ['7', '5', '7h'], ['5', '3', '5h'], ['3', '1', '3h'], ['1', 'z', '1h'],
  ['z', '2', '2h'], ['2', '4', '4h'], ['4', '6', '6h'], ['6', '8', '8h'],
];
const EDGE: Record<string, Record<string, string>> = {
  FC: { '7': 'FT7', '8': 'FT8' },
  C: { '7': 'T7', '8': 'T8' },
  CP: { '7': 'TP7', '8': 'TP8' },
};
const siteName = (row: string, col: string) => EDGE[row]?.[col] ?? `${row}${col}`;

function unit(v: Vec3): Vec3 {
  const l = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / l, v[1] / l, v[2] / l];
}

/** All positions the family knows: the 10-10 table plus the 10-5-like intermediate sites. */
function familyPositions(): Map<string, Vec3> {
  const table = standardPositions();
  const P = new Map<string, Vec3>();
  for (const [k, v] of table) if (!['Nz', 'LPA', 'RPA'].includes(k)) P.set(k, v);
  for (const [upper, lower, name] of ROW_PAIRS) {
    for (const [c1, c2, h] of COLUMN_PAIRS) {
      const quad = [siteName(upper, c1), siteName(upper, c2), siteName(lower, c1), siteName(lower, c2)].map((l) => table.get(l));
      if (quad.some((q) => !q)) continue;
      const s: Vec3 = [0, 0, 0];
      for (const q of quad as Vec3[]) for (let k = 0; k < 3; k++) s[k] += q[k];
      P.set(`${name}${h}`, unit(s));
    }
  }
  // Midline sites between rows (10-5 names) and between the temporal rim sites.
  const between: [string, string, string][] = [
    ['AFpz', 'Fpz', 'AFz'], ['AFFz', 'AFz', 'Fz'], ['FFCz', 'Fz', 'FCz'], ['FCCz', 'FCz', 'Cz'], ['CCPz', 'Cz', 'CPz'],
    ['CPPz', 'CPz', 'Pz'], ['PPOz', 'Pz', 'POz'], ['POOz', 'POz', 'Oz'], ['FTT7', 'FT7', 'T7'], ['FTT8', 'FT8', 'T8'],
  ];
  for (const [name, a, b] of between) {
    const pa = table.get(a)!;
    const pb = table.get(b)!;
    P.set(name, unit([pa[0] + pb[0], pa[1] + pb[1], pa[2] + pb[2]]));
  }
  return P;
}

/** The 128 labels: the 70 sites of the 10-10 table (with FCz and Iz), 48 "h" sites and 10 midline/temporal 10-5 sites. */
function labels128(P: Map<string, Vec3>): string[] {
  const base = [...standardPositions().keys()].filter((k) => !['Nz', 'LPA', 'RPA'].includes(k));
  const extra = [...P.keys()].filter((k) => !base.includes(k));
  const all = [...base, ...extra];
  if (all.length < 128) throw new RangeError(`family montage: only ${all.length} sites for 128`);
  return all.slice(0, 128);
}

export interface FamilyMontage {
  readonly labels: string[];
  /** M × 3 unit directions, RAS. */
  readonly directions: Float64Array;
}

/** The montage of `size` electrodes with unit positions. */
export function familyMontage(size: MontageSize): FamilyMontage {
  const P = familyPositions();
  const labels = size === 19 ? [...LABELS_19] : size === 32 ? [...LABELS_32] : size === 64 ? [...LABELS_64] : labels128(P);
  if (labels.length !== size) throw new RangeError(`family montage: ${labels.length} labels for ${size}`);
  const directions = new Float64Array(3 * size);
  labels.forEach((l, c) => {
    const p = P.get(l);
    if (!p) throw new RangeError(`family montage: no position for "${l}"`);
    directions.set(p, 3 * c);
  });
  return { labels, directions };
}
