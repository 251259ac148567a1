/**
 * Idealised 10-20 / 10-10 electrode directions on the unit sphere, RAS (+x right pre-auricular point,
 * +y nasion, +z vertex), built from the percentage rules exactly as docs/methods.md §10 constructs them
 * [Jasper 1958; 10-10: Chatrian, Lettich & Nelson 1985; names: ACNS Guideline 2, Acharya et al. 2016]:
 *
 * - midline Nz→Cz→Iz in 10 % steps of 180°: (0, cos(p·180°), sin(p·180°)), Fpz .1 … Oz .9;
 * - the 10 % ring through Fpz, T7, Oz, T8 (plane z = sin 18°), azimuth β from +y towards +x in 18° steps:
 *   (cos18°·sin β, cos18°·cos β, sin18°);
 * - each row AF, F, FC, C, CP, P, PO lies on the circle through X7 (ring), Xz (midline) and X8 (ring); the
 *   arc X7→Xz is cut into 4 equal arcs: X7, X5, X3, X1, Xz (mirrored on the right).
 *
 * This is a definition for defaults and tests, not a measured template: real heads differ by several
 * degrees (docs/methods.md §10, §16).
 */

type Vec3 = [number, number, number];
const DEG = Math.PI / 180;

function midline(frac: number): Vec3 {
  const a = frac * Math.PI;
  return [0, Math.cos(a), Math.sin(a)];
}

function ring(betaDeg: number): Vec3 {
  const b = betaDeg * DEG;
  return [Math.cos(18 * DEG) * Math.sin(b), Math.cos(18 * DEG) * Math.cos(b), Math.sin(18 * DEG)];
}

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
const scale = (a: Vec3, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const norm = (a: Vec3) => Math.sqrt(dot(a, a));
const unit = (a: Vec3) => scale(a, 1 / norm(a));

/** Rodrigues rotation of v about the unit axis k by angle a (radians). */
function rotate(v: Vec3, k: Vec3, a: number): Vec3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return add(add(scale(v, c), scale(cross(k, v), s)), scale(k, dot(k, v) * (1 - c)));
}

/** Points on the circle through L, M, R at the given fractions of the arc L→M. */
function arcPoints(L: Vec3, M: Vec3, R: Vec3, fracs: readonly number[]): Vec3[] {
  const n = unit(cross(sub(M, L), sub(R, L)));
  const c = scale(n, dot(n, L)); // centre of the circle: the plane's closest point to the origin
  const u = sub(L, c);
  const v = sub(M, c);
  const theta = Math.atan2(norm(cross(u, v)), dot(u, v));
  const sgn = dot(cross(u, v), n) > 0 ? 1 : -1;
  return fracs.map((f) => add(c, rotate(u, scale(n, sgn), f * theta)));
}

const ROWS: readonly (readonly [string, number, number])[] = [
  // row prefix, midline fraction of Xz, ring azimuth of X7 (left, degrees)
  ['AF', 0.2, -36],
  ['F', 0.3, -54],
  ['FC', 0.4, -72],
  ['C', 0.5, -90],
  ['CP', 0.6, -108],
  ['P', 0.7, -126],
  ['PO', 0.8, -144],
];
/** The lateral-most electrode of rows FC, C, CP sits on the ring and takes the temporal names. */
const EDGE_NAMES: Record<string, [string, string]> = { FC: ['FT7', 'FT8'], C: ['T7', 'T8'], CP: ['TP7', 'TP8'] };
const MIDLINE: readonly (readonly [string, number])[] = [
  ['Fpz', 0.1], ['AFz', 0.2], ['Fz', 0.3], ['FCz', 0.4], ['Cz', 0.5], ['CPz', 0.6], ['Pz', 0.7], ['POz', 0.8], ['Oz', 0.9],
];

let cache: Map<string, Vec3> | null = null;

/**
 * Idealised 10-20/10-10 positions (unit vectors, RAS) keyed by their modern names (T7/T8/P7/P8), plus the
 * landmarks Nz, Iz, LPA, RPA. A fresh Map is returned on each call (callers may edit it).
 */
export function standardPositions(): Map<string, [number, number, number]> {
  if (!cache) {
    const P = new Map<string, Vec3>();
    P.set('Nz', [0, 1, 0]);
    P.set('Iz', [0, -1, 0]);
    P.set('LPA', [-1, 0, 0]);
    P.set('RPA', [1, 0, 0]);
    for (const [name, f] of MIDLINE) P.set(name, midline(f));
    P.set('Fp1', ring(-18));
    P.set('Fp2', ring(18));
    P.set('O1', ring(-162));
    P.set('O2', ring(162));
    const fracs = [0, 0.25, 0.5, 0.75];
    for (const [row, mf, beta] of ROWS) {
      const M = midline(mf);
      const L = ring(beta);
      const R = ring(-beta);
      const left = arcPoints(L, M, R, fracs);
      const right = arcPoints(R, M, L, fracs);
      const names = [7, 5, 3, 1];
      names.forEach((k, i) => {
        const [ln, rn] = i === 0 && EDGE_NAMES[row] ? EDGE_NAMES[row] : [`${row}${k}`, `${row}${k + 1}`];
        P.set(ln, left[i]);
        P.set(rn, right[i]);
      });
    }
    cache = P;
  }
  return new Map([...cache].map(([k, v]) => [k, [v[0], v[1], v[2]] as [number, number, number]]));
}

/** Old 10-20 names → modern combinatorial names (ACNS Guideline 2): T3→T7, T4→T8, T5→P7, T6→P8. */
const ALIASES: Record<string, string> = { t3: 'T7', t4: 'T8', t5: 'P7', t6: 'P8' };

/**
 * The electrode name in a channel label, by two rules of the trade: an EDF+ type prefix "EEG " (EDF+ §2.1.3.1
 * recommends "EEG Fpz" style labels) and a "-REF"/"-Ref" reference suffix are removed. Anything else (a
 * bipolar "Fp1-F3", "EOG L") is kept whole and so stays unmatched rather than guessed.
 */
export function electrodeNameFromLabel(label: string): string {
  let s = label.trim();
  if (/^eeg[ _-]/i.test(s)) s = s.slice(4).trim();
  s = s.replace(/-ref$/i, '');
  return s;
}

/**
 * Positions for channel labels, matched case-insensitively against standardPositions() with the aliases
 * T3/T7, T4/T8, T5/P7, T6/P8. Unknown labels get a NaN row and are listed in `unmatched`.
 * @returns positions n×3 (row-major unit vectors), and the labels matched / not matched
 */
export function matchMontage(labels: readonly string[]): { positions: Float64Array; matched: string[]; unmatched: string[] } {
  const table = standardPositions();
  const byLower = new Map<string, [number, number, number]>();
  for (const [k, v] of table) byLower.set(k.toLowerCase(), v);
  const positions = new Float64Array(labels.length * 3).fill(NaN);
  const matched: string[] = [];
  const unmatched: string[] = [];
  labels.forEach((label, i) => {
    const name = electrodeNameFromLabel(label).toLowerCase();
    const v = byLower.get(ALIASES[name]?.toLowerCase() ?? name);
    if (v) {
      positions.set(v, 3 * i);
      matched.push(label);
    } else unmatched.push(label);
  });
  return { positions, matched, unmatched };
}
