/**
 * Sphere fitted to electrode positions (mm), for models whose electrodes do not sit on one sphere.
 *
 * Algebraic least squares [b: common practice; e.g. the "linear" sphere fit]: |p|² = 2 c · p + d is linear in
 * (c, d); the centre is c and the radius √(d + |c|²). Positions are centred on their mean first so that the
 * 4 × 4 normal equations are well scaled. Minimises the algebraic, not the geometric, distance: fine for
 * positions close to a sphere, biased for very noisy ones.
 */
import { solveSmallSystem } from './least-squares.ts';
import { electrodeNameFromLabel } from './montage-1020.ts';
import type { Millimetres } from '../units.ts';

export interface SphereFit {
  /** Centre in mm, in the frame of the input positions. */
  centre: [number, number, number];
  radiusMm: Millimetres;
}

/**
 * Fits a sphere to positions (N × 3, mm). Fewer than 4 points, or points that do not fix a sphere (all in one
 * plane), give the centre at the origin and the mean distance from it as the radius; no points give NaN.
 */
export function fitSphere(positionsMm: Float64Array): SphereFit {
  const n = Math.floor(positionsMm.length / 3);
  if (n === 0) return { centre: [NaN, NaN, NaN], radiusMm: NaN as Millimetres };
  let mx = 0;
  let my = 0;
  let mz = 0;
  for (let i = 0; i < n; i++) {
    mx += positionsMm[3 * i];
    my += positionsMm[3 * i + 1];
    mz += positionsMm[3 * i + 2];
  }
  mx /= n;
  my /= n;
  mz /= n;
  const fallback = (): SphereFit => {
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.hypot(positionsMm[3 * i], positionsMm[3 * i + 1], positionsMm[3 * i + 2]);
    return { centre: [0, 0, 0], radiusMm: (s / n) as Millimetres };
  };
  if (n < 4) return fallback();
  const ata = new Float64Array(16);
  const atb = new Float64Array(4);
  const row = new Float64Array(4);
  let scale = 0;
  for (let i = 0; i < n; i++) {
    const x = positionsMm[3 * i] - mx;
    const y = positionsMm[3 * i + 1] - my;
    const z = positionsMm[3 * i + 2] - mz;
    scale = Math.max(scale, Math.abs(x), Math.abs(y), Math.abs(z));
    row[0] = 2 * x;
    row[1] = 2 * y;
    row[2] = 2 * z;
    row[3] = 1;
    const rhs = x * x + y * y + z * z;
    for (let a = 0; a < 4; a++) {
      atb[a] += row[a] * rhs;
      for (let b = 0; b < 4; b++) ata[a * 4 + b] += row[a] * row[b];
    }
  }
  // A plane of points makes the normal matrix singular up to rounding: test its smallest pivot relative to
  // the data scale by checking the solution's plausibility instead of a condition number.
  const sol = new Float64Array(4);
  if (!solveSmallSystem(ata, atb, 4, sol)) return fallback();
  const r2 = sol[3] + sol[0] * sol[0] + sol[1] * sol[1] + sol[2] * sol[2];
  const centreOffset = Math.hypot(sol[0], sol[1], sol[2]);
  if (!(r2 > 0) || !Number.isFinite(r2) || centreOffset > 1e6 * Math.max(scale, 1e-300)) return fallback();
  return { centre: [sol[0] + mx, sol[1] + my, sol[2] + mz], radiusMm: Math.sqrt(r2) as Millimetres };
}

/**
 * Unit directions (RAS) for channel `labels` from electrode positions (mm, any frame): each electrode minus
 * the centre of the sphere fitted to all electrodes with finite coordinates (`fitSphere`), normalised. A
 * label finds its electrode by name, case-insensitively, or by the electrode name inside it ("EEG Fz" → Fz).
 * Labels without a finite electrode (or one at the centre) get NaN rows and are listed in `missing`.
 */
export function electrodeDirections(
  labels: readonly string[],
  names: readonly string[],
  positionsMm: Float64Array,
): { positions: Float64Array; missing: string[] } {
  const finite: number[] = [];
  for (let i = 0; i < names.length; i++) if ([0, 1, 2].every((k) => Number.isFinite(positionsMm[3 * i + k]))) finite.push(i);
  const pts = new Float64Array(finite.length * 3);
  finite.forEach((i, j) => pts.set(positionsMm.subarray(3 * i, 3 * i + 3), 3 * j));
  const { centre } = finite.length > 0 ? fitSphere(pts) : { centre: [0, 0, 0] };
  const usable = new Set(finite);
  const lower = new Map(names.map((n, i) => [n.toLowerCase(), i] as const));
  const positions = new Float64Array(labels.length * 3).fill(NaN);
  const missing: string[] = [];
  labels.forEach((label, j) => {
    const e = lower.get(label.toLowerCase()) ?? lower.get(electrodeNameFromLabel(label).toLowerCase());
    if (e === undefined || !usable.has(e)) {
      missing.push(label);
      return;
    }
    const v = [0, 1, 2].map((k) => positionsMm[3 * e + k] - centre[k]);
    const r = Math.hypot(v[0], v[1], v[2]);
    if (r > 0) for (let k = 0; k < 3; k++) positions[3 * j + k] = v[k] / r;
    else missing.push(label);
  });
  return { positions, missing };
}
