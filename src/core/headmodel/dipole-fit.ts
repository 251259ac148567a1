/**
 * Equivalent current dipole fit to one scalp map (docs/methods.md §15).
 *
 *     H = I − 11ᵀ/M (average reference, applied to model and data alike)
 *     L̃(p) = H L(p),  ṽ = H v,  q(p) = pinv(L̃) ṽ,  r(p) = ṽ − L̃ q(p),  RV = |r|² / |ṽ|²
 *
 * The moment enters linearly and is eliminated (variable projection: Golub & Pereyra 1973, SIAM J. Numer.
 * Anal. 10:413–432); only the position (3 unknowns) is searched:
 *   1. a coarse grid (default 1 cm) inside the brain shell, whose average-referenced lead fields are
 *      orthonormalised ONCE per montage, so each map costs 3 dot products per grid point;
 *   2. Levenberg–Marquardt (Levenberg 1944; Marquardt 1963) from the best grid point with the fast forward
 *      model (Berg & Scherg equivalent dipoles for three shells);
 *   3. a short Levenberg–Marquardt polish with the exact model (Legendre series), from which position,
 *      moment and RV are reported.
 * Positions are kept inside |p| ≤ limitRadiusMm (default 0.85 R, just inside the brain shell at 0.87 R);
 * a fit that ends within 0.005 R (0.45 mm) of that limit is flagged `atBoundary`.
 *
 * Units: positions mm; the moment is in nA·m when the map is in µV (for an IC's map, in the map's relative
 * units per µV). The position is an approximate model estimate, not an anatomical location.
 */
import { leadField, leadFieldFast, type HeadModel } from './forward.ts';
import {
  createLevenbergMarquardtScratch,
  gramSchmidtBasis,
  levenbergMarquardt,
  solveUpperTriangular,
  type LevenbergMarquardtProblem,
} from './least-squares.ts';
import type { Millimetres } from '../units.ts';

export interface DipoleFit {
  /** Position in mm (RAS, origin at the sphere centre). */
  position: [number, number, number];
  /** Moment in nA·m for a map in µV. */
  moment: [number, number, number];
  /** Fraction of the average-referenced map's sum of squares left unexplained (0…1). */
  residualVariance: number;
  /** True when the fit stopped at the allowed source region's edge (or, symmetric fit, at the midline gap). */
  atBoundary: boolean;
  /** Levenberg–Marquardt iterations (fast phase + exact polish). */
  iterations: number;
}

/** Two dipoles mirrored in the midsagittal plane (x → −x), each with its own free moment. */
export interface SymmetricDipoleFit {
  left: DipoleFit;
  right: DipoleFit;
  /** RV of the pair together. */
  residualVariance: number;
  atBoundary: boolean;
  iterations: number;
}

export interface DipoleFitterOptions {
  /** Coarse grid spacing in mm. Default radius / 9, i.e. 10 mm at R = 90 mm (docs/methods.md §15: ≈ 1 cm). */
  gridSpacingMm?: Millimetres;
  /** Largest allowed distance of the dipole from the centre, mm. Default 0.85 × radius (brain shell 0.87). */
  limitRadiusMm?: Millimetres;
  /** Polish with the exact forward model after the fast fit. Default true. */
  refine?: boolean;
  /** Smallest |x| of the symmetric pair, mm (keeps the two dipoles apart). Default 0.05 × radius (4.5 mm). */
  minHalfSeparationMm?: Millimetres;
}

export interface DipoleFitter {
  readonly nElectrodes: number;
  /** Number of coarse-grid points searched for each map. */
  readonly gridPoints: number;
  fit(map: Float64Array): DipoleFit;
  fitSymmetric(map: Float64Array): SymmetricDipoleFit;
  /** The coarse-grid point (mm) the single-dipole fit of `map` starts from (NaN for a flat or NaN map). */
  coarseStart(map: Float64Array): [number, number, number];
}

type LeadFieldFn = (model: HeadModel, electrodes: Float64Array, positionMm: ArrayLike<number>, out: Float64Array) => Float64Array;

function sumSquares(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return s;
}

const nanFit = (iterations = 0): DipoleFit => ({
  position: [NaN, NaN, NaN],
  moment: [NaN, NaN, NaN],
  residualVariance: NaN,
  atBoundary: false,
  iterations,
});

/**
 * Precomputes everything that depends only on the montage (electrodes M × 3, mm) and returns a fitter whose
 * `fit` takes one map (M values, any reference) at a time. Not re-entrant: one fitter per worker.
 */
export function createDipoleFitter(model: HeadModel, electrodesMm: Float64Array, opts: DipoleFitterOptions = {}): DipoleFitter {
  const m = Math.floor(electrodesMm.length / 3);
  const electrodes = electrodesMm.slice(0, 3 * m);
  const radius = model.radiusMm;
  const spacing = opts.gridSpacingMm ?? radius / 9; // 10 mm at R = 90 mm
  const limit = Math.min(opts.limitRadiusMm ?? 0.85 * radius, model.innerRadiusMm * (1 - 1e-9));
  const minHalfSep = opts.minHalfSeparationMm ?? 0.05 * radius;
  const edgeTol = 0.005 * radius; // 0.45 mm at R = 90 mm
  const refine = (opts.refine ?? true) && !model.fast && model.kind !== 'sphere';
  const fdStep = 1e-6 * radius;

  // Scratch, allocated once.
  const rowMajor = new Float64Array(3 * m);
  const cols = new Float64Array(6 * m); // average-referenced lead field, column-major, up to 6 columns
  const basis = new Float64Array(6 * m);
  const rFactor = new Float64Array(36);
  const qtv = new Float64Array(6);
  const moment6 = new Float64Array(6);
  const vt = new Float64Array(m);
  const resid = new Float64Array(m);
  const pos = new Float64Array(3);
  const mirrored = new Float64Array(3);

  /** Writes H L(p) for the given forward function into `cols` at column offset `col0` (3 columns). */
  const referencedColumns = (fn: LeadFieldFn, p: ArrayLike<number>, col0: number) => {
    fn(model, electrodes, p, rowMajor);
    for (let k = 0; k < 3; k++) {
      let mean = 0;
      for (let e = 0; e < m; e++) mean += rowMajor[3 * e + k];
      mean /= m;
      const off = (col0 + k) * m;
      for (let e = 0; e < m; e++) cols[off + e] = rowMajor[3 * e + k] - mean;
    }
  };

  /** Projects vt onto the span of the first nCols columns of `basis`; writes residual into out (if given). */
  const project = (nCols: number, out: Float64Array | null): number => {
    let explained = 0;
    for (let k = 0; k < nCols; k++) {
      let s = 0;
      const off = k * m;
      for (let e = 0; e < m; e++) s += basis[off + e] * vt[e];
      qtv[k] = s;
      explained += s * s;
    }
    if (out) {
      for (let e = 0; e < m; e++) {
        let s = vt[e];
        for (let k = 0; k < nCols; k++) s -= basis[k * m + e] * qtv[k];
        out[e] = s;
      }
    }
    return explained;
  };

  // ---- single-dipole pieces
  const evalSingle = (fn: LeadFieldFn, p: ArrayLike<number>, out: Float64Array | null) => {
    referencedColumns(fn, p, 0);
    gramSchmidtBasis(cols, m, 3, basis, rFactor);
    return project(3, out);
  };
  const singleProblem = (fn: LeadFieldFn): LevenbergMarquardtProblem => ({
    nParams: 3,
    nResiduals: m,
    residual: (p, out) => void evalSingle(fn, p, out),
    feasible: (p) => Math.sqrt(p[0] * p[0] + p[1] * p[1] + p[2] * p[2]) <= limit,
  });
  const singleFast = singleProblem(leadFieldFast);
  const singleExact = singleProblem(leadField);

  // ---- symmetric-pair pieces: parameter p = (x, y, z), dipoles at (−|x|, y, z) and (|x|, y, z)
  const evalPair = (fn: LeadFieldFn, p: ArrayLike<number>, out: Float64Array | null) => {
    const ax = Math.abs(p[0]);
    mirrored[0] = -ax;
    mirrored[1] = p[1];
    mirrored[2] = p[2];
    referencedColumns(fn, mirrored, 0);
    mirrored[0] = ax;
    referencedColumns(fn, mirrored, 3);
    gramSchmidtBasis(cols, m, 6, basis, rFactor);
    return project(6, out);
  };
  const pairProblem = (fn: LeadFieldFn): LevenbergMarquardtProblem => ({
    nParams: 3,
    nResiduals: m,
    residual: (p, out) => void evalPair(fn, p, out),
    feasible: (p) => Math.sqrt(p[0] * p[0] + p[1] * p[1] + p[2] * p[2]) <= limit && p[0] >= minHalfSep,
  });
  const pairFast = pairProblem(leadFieldFast);
  const pairExact = pairProblem(leadField);

  const lmScratch = createLevenbergMarquardtScratch(3, Math.max(m, 1));

  // ---- coarse grids (single: whole ball; pair: x > 0 half), bases computed once
  const gridPositions: number[] = [];
  const nSide = Math.floor(limit / spacing);
  for (let i = -nSide; i <= nSide; i++)
    for (let j = -nSide; j <= nSide; j++)
      for (let k = -nSide; k <= nSide; k++) {
        const x = i * spacing;
        const y = j * spacing;
        const z = k * spacing;
        if (Math.hypot(x, y, z) <= limit) gridPositions.push(x, y, z);
      }
  const nGrid = gridPositions.length / 3;
  const grid = Float64Array.from(gridPositions);
  const gridBases = new Float64Array(nGrid * 3 * m);
  /** Copies the column-major basis into `dest` electrode-major (row e holds the nCols basis values). */
  const storeInterleaved = (dest: Float64Array, offset: number, nCols: number) => {
    for (let e = 0; e < m; e++) for (let k = 0; k < nCols; k++) dest[offset + e * nCols + k] = basis[k * m + e];
  };
  if (m >= 4) {
    for (let g = 0; g < nGrid; g++) {
      referencedColumns(leadFieldFast, grid.subarray(3 * g, 3 * g + 3), 0);
      gramSchmidtBasis(cols, m, 3, basis, rFactor);
      storeInterleaved(gridBases, g * 3 * m, 3);
    }
  }
  let pairGrid: Float64Array | null = null;
  let pairBases: Float64Array | null = null;
  const ensurePairGrid = () => {
    if (pairGrid) return;
    const pts: number[] = [];
    for (let g = 0; g < nGrid; g++) if (grid[3 * g] >= Math.max(minHalfSep, spacing / 2)) pts.push(grid[3 * g], grid[3 * g + 1], grid[3 * g + 2]);
    pairGrid = Float64Array.from(pts);
    const n = pts.length / 3;
    pairBases = new Float64Array(n * 6 * m);
    for (let g = 0; g < n; g++) {
      evalPair(leadFieldFast, pairGrid.subarray(3 * g, 3 * g + 3), null);
      storeInterleaved(pairBases, g * 6 * m, 6);
    }
  };

  /** Average-references the map into vt; returns |vt|² (NaN if the map holds NaN). */
  const loadMap = (map: Float64Array): number => {
    let mean = 0;
    for (let e = 0; e < m; e++) mean += map[e];
    mean /= m;
    let ss = 0;
    for (let e = 0; e < m; e++) {
      const v = map[e] - mean;
      vt[e] = v;
      ss += v * v;
    }
    return ss;
  };

  /**
   * Index of the grid point whose basis (nCols columns, stored electrode-major) explains most of vt: one pass
   * over the electrodes per point with independent accumulators (this scan is the fit's main fixed cost).
   */
  const bestGridPoint = (bases: Float64Array, nPoints: number, nCols: number): number => {
    let best = -1;
    let bestVal = -Infinity;
    const stride = nCols * m;
    if (nCols === 3) {
      for (let g = 0, o = 0; g < nPoints; g++) {
        let s0 = 0;
        let s1 = 0;
        let s2 = 0;
        for (let e = 0; e < m; e++, o += 3) {
          const v = vt[e];
          s0 += bases[o] * v;
          s1 += bases[o + 1] * v;
          s2 += bases[o + 2] * v;
        }
        const explained = s0 * s0 + s1 * s1 + s2 * s2;
        if (explained > bestVal) {
          bestVal = explained;
          best = g;
        }
      }
      return best;
    }
    const acc = qtv;
    for (let g = 0; g < nPoints; g++) {
      const base = g * stride;
      acc.fill(0, 0, nCols);
      for (let e = 0; e < m; e++) {
        const v = vt[e];
        const o = base + e * nCols;
        for (let k = 0; k < nCols; k++) acc[k] += bases[o + k] * v;
      }
      let explained = 0;
      for (let k = 0; k < nCols; k++) explained += acc[k] * acc[k];
      if (explained > bestVal) {
        bestVal = explained;
        best = g;
      }
    }
    return best;
  };

  const runLm = (fast: LevenbergMarquardtProblem, exact: LevenbergMarquardtProblem, start: ArrayLike<number>) => {
    // Without a polish the fast phase is the final one and runs to the tight tolerances of docs/methods.md §15.
    const coarse = levenbergMarquardt(
      fast,
      start,
      refine
        ? { step: fdStep, maxIterations: 60, relativeCostTol: 1e-9, stepTol: 1e-6 * radius }
        : { step: fdStep, maxIterations: 100, relativeCostTol: 1e-12, stepTol: 1e-10 * radius },
      lmScratch,
    );
    let p = coarse.p;
    let iterations = coarse.iterations;
    let blocked = coarse.blockedByBoundary;
    if (refine) {
      const fine = levenbergMarquardt(exact, p, { step: fdStep, maxIterations: 30, relativeCostTol: 1e-12, stepTol: 1e-8 * radius }, lmScratch);
      p = fine.p;
      iterations += fine.iterations;
      blocked = fine.blockedByBoundary;
    }
    return { p, iterations, blocked };
  };

  const validMap = (map: Float64Array) => m >= 4 && map.length >= m;

  return {
    nElectrodes: m,
    gridPoints: nGrid,

    fit(map: Float64Array): DipoleFit {
      if (!validMap(map)) return nanFit();
      const ss = loadMap(map);
      if (!(ss > 0) || !Number.isFinite(ss)) return nanFit();
      const g = bestGridPoint(gridBases, nGrid, 3);
      if (g < 0) return nanFit();
      const { p, iterations, blocked } = runLm(singleFast, singleExact, grid.subarray(3 * g, 3 * g + 3));
      pos.set(p);
      evalSingle(refine ? leadField : leadFieldFast, pos, resid);
      solveUpperTriangular(rFactor, 3, qtv, moment6);
      const r = Math.hypot(pos[0], pos[1], pos[2]);
      return {
        position: [pos[0], pos[1], pos[2]],
        moment: [moment6[0], moment6[1], moment6[2]],
        residualVariance: sumSquares(resid) / ss,
        atBoundary: blocked || r >= limit - edgeTol,
        iterations,
      };
    },

    coarseStart(map: Float64Array): [number, number, number] {
      if (!validMap(map)) return [NaN, NaN, NaN];
      const ss = loadMap(map);
      if (!(ss > 0) || !Number.isFinite(ss)) return [NaN, NaN, NaN];
      const g = bestGridPoint(gridBases, nGrid, 3);
      return g < 0 ? [NaN, NaN, NaN] : [grid[3 * g], grid[3 * g + 1], grid[3 * g + 2]];
    },

    fitSymmetric(map: Float64Array): SymmetricDipoleFit {
      if (!validMap(map)) return { left: nanFit(), right: nanFit(), residualVariance: NaN, atBoundary: false, iterations: 0 };
      const ss = loadMap(map);
      ensurePairGrid();
      const nPair = pairGrid!.length / 3;
      if (!(ss > 0) || !Number.isFinite(ss) || nPair === 0)
        return { left: nanFit(), right: nanFit(), residualVariance: NaN, atBoundary: false, iterations: 0 };
      const g = bestGridPoint(pairBases!, nPair, 6);
      const { p, iterations, blocked } = runLm(pairFast, pairExact, pairGrid!.subarray(3 * g, 3 * g + 3));
      const x = Math.abs(p[0]);
      evalPair(refine ? leadField : leadFieldFast, [x, p[1], p[2]], resid);
      solveUpperTriangular(rFactor, 6, qtv, moment6);
      const rv = sumSquares(resid) / ss;
      const atBoundary = blocked || Math.hypot(x, p[1], p[2]) >= limit - edgeTol || x <= minHalfSep + edgeTol;
      const one = (sign: number, k: number): DipoleFit => ({
        position: [sign * x, p[1], p[2]],
        moment: [moment6[k], moment6[k + 1], moment6[k + 2]],
        residualVariance: rv,
        atBoundary,
        iterations,
      });
      return { left: one(-1, 0), right: one(1, 3), residualVariance: rv, atBoundary, iterations };
    },
  };
}

/** One-off fit of a single dipole (builds a fitter; use `createDipoleFitter` for many maps). */
export function fitDipole(model: HeadModel, electrodesMm: Float64Array, map: Float64Array, opts?: DipoleFitterOptions): DipoleFit {
  return createDipoleFitter(model, electrodesMm, opts).fit(map);
}
