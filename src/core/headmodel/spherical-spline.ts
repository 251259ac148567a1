/**
 * Spherical spline interpolation of scalp values (Perrin, Pernier, Bertrand & Echallier 1989,
 * Electroencephalogr. Clin. Neurophysiol. 72:184–187; corrigendum 1990, 76:565), as in docs/methods.md §9:
 *
 *     g_m(x) = 1/(4π) Σ_{n=1}^{N} (2n+1) / (n(n+1))^m P_n(x),   m = 4, N = 50
 *     [ G + λI  1 ] [ c  ]   [ v ]
 *     [ 1ᵀ      0 ] [ c0 ] = [ 0 ],   G_ij = g_m(e_i · e_j)
 *     V(p) = c0 + Σ_j c_j g_m(p · e_j)
 *
 * The bordered system and the target kernel depend only on the montage, so the interpolator factors the
 * system once (LU with partial pivoting: G is ill-conditioned, coefficients ~1e3 for values ~1) and keeps the
 * targets × (M + 1) kernel; each map then costs two triangular solves (M² operations) and one
 * matrix–vector product. We do not fold A⁻¹ into the kernel: an explicit inverse raises the residual at the
 * electrodes from rounding level (~1e-14) to ~cond(G) × ε (~2e-12 for the 21-electrode check).
 */
import { luFactor, luSolve } from '../linalg/lu.ts';
import { electrodeDirections } from './sphere.ts';

/**
 * g_m(x) of Perrin et al. (1989), 1/(4π) included; x = cos(angle) is clamped to [−1, 1].
 * Defaults m = 4 and 50 terms (truncation error 1.5e-12 against 2000 terms: docs/methods.md §9).
 */
export function sphericalSplineG(x: number, m = 4, nTerms = 50): number {
  const c = x > 1 ? 1 : x < -1 ? -1 : x;
  let pPrev = 1;
  let p = c;
  let sum = 0;
  for (let n = 1; n <= nTerms; n++) {
    sum += ((2 * n + 1) / Math.pow(n * (n + 1), m)) * p;
    const pNext = ((2 * n + 1) * c * p - n * pPrev) / (n + 1);
    pPrev = p;
    p = pNext;
  }
  return sum / (4 * Math.PI);
}

/** Coefficients (2n+1)/(n(n+1))^m/(4π) of the series, index n − 1. */
function splineCoefficients(m: number, nTerms: number): Float64Array {
  const k = new Float64Array(nTerms);
  for (let n = 1; n <= nTerms; n++) k[n - 1] = (2 * n + 1) / Math.pow(n * (n + 1), m) / (4 * Math.PI);
  return k;
}

function splineFromCoefficients(k: Float64Array, x: number): number {
  const c = x > 1 ? 1 : x < -1 ? -1 : x;
  let pPrev = 1;
  let p = c;
  let sum = 0;
  for (let n = 1; n <= k.length; n++) {
    sum += k[n - 1] * p;
    const pNext = ((2 * n + 1) * c * p - n * pPrev) / (n + 1);
    pPrev = p;
    p = pNext;
  }
  return sum;
}

/** Values and derivatives of g_m at the nodes of a uniform grid on [−1, 1], for cubic Hermite evaluation. */
interface KernelTable {
  readonly intervals: number;
  readonly value: Float64Array;
  readonly slope: Float64Array;
}

const kernelTables = new Map<string, KernelTable>();

/**
 * Tabulates g_m and g_m′ (P′_n by the recurrence P′_{n+1} = P′_{n−1} + (2n+1) P_n) at `intervals` + 1 nodes.
 * Cubic Hermite interpolation between nodes has error ≤ h⁴/384 · max|g⁗| (h = 2/intervals): below 1e-14 for
 * m = 4 and 2048 intervals (checked against the series in spherical-spline.test.ts). docs/methods.md §9 [b]: a
 * lookup table of g is fine for rendering.
 */
function kernelTable(m: number, nTerms: number, intervals = 2048): KernelTable {
  const key = `${m}|${nTerms}|${intervals}`;
  const cached = kernelTables.get(key);
  if (cached) return cached;
  const k = splineCoefficients(m, nTerms);
  const value = new Float64Array(intervals + 1);
  const slope = new Float64Array(intervals + 1);
  for (let i = 0; i <= intervals; i++) {
    const x = -1 + (2 * i) / intervals;
    let pPrev = 1;
    let p = x;
    let dPrev = 0;
    let dp = 1;
    let v = 0;
    let d = 0;
    for (let n = 1; n <= nTerms; n++) {
      v += k[n - 1] * p;
      d += k[n - 1] * dp;
      const pNext = ((2 * n + 1) * x * p - n * pPrev) / (n + 1);
      const dNext = dPrev + (2 * n + 1) * p;
      pPrev = p;
      p = pNext;
      dPrev = dp;
      dp = dNext;
    }
    value[i] = v;
    slope[i] = d;
  }
  const table = { intervals, value, slope };
  kernelTables.set(key, table);
  return table;
}

function kernelFromTable(t: KernelTable, x: number): number {
  const c = x > 1 ? 1 : x < -1 ? -1 : x;
  const h = 2 / t.intervals;
  const u = (c + 1) / h;
  const i = Math.min(t.intervals - 1, Math.floor(u));
  const s = u - i;
  const s2 = s * s;
  const s3 = s2 * s;
  return (
    (2 * s3 - 3 * s2 + 1) * t.value[i] +
    (s3 - 2 * s2 + s) * h * t.slope[i] +
    (-2 * s3 + 3 * s2) * t.value[i + 1] +
    (s3 - s2) * h * t.slope[i + 1]
  );
}

export interface SplineInterpolator {
  readonly nTargets: number;
  readonly nElectrodes: number;
  /** Values at the targets (length nTargets) from values at the electrodes (length nElectrodes). */
  interpolate(values: Float64Array, out?: Float64Array): Float64Array;
}

export interface SplineOptions {
  /** Spline order m. Default 4 (Perrin et al. 1989). */
  m?: number;
  /** Legendre terms. Default 50. */
  nTerms?: number;
  /**
   * How g_m is evaluated for the targets: 'series' (default; the Legendre sum for every pair) or 'table'
   * (cubic Hermite on a 2048-interval table, ~20× faster for image grids; error < 1e-14 in g). The
   * electrode–electrode matrix always uses the series.
   */
  targetKernel?: 'series' | 'table';
}

/** Unit vectors of the whole triples in `v` (a trailing partial triple is dropped). */
function normalise(v: Float64Array): Float64Array {
  return electrodeDirections(v, new Float64Array(3 * Math.floor(v.length / 3)));
}

/**
 * Precomputes the factored spline system and the targets' kernel matrix for electrode directions `electrodesUnit`
 * (M × 3) and target directions `targetsUnit` (T × 3); both are normalised here, so any non-zero vectors
 * from the sphere centre will do. `lambda` (default 0: exact interpolation) regularises noisy maps.
 * A montage whose bordered matrix is singular (e.g. a repeated electrode with λ = 0) gives NaN outputs.
 */
export function createSplineInterpolator(
  electrodesUnit: Float64Array,
  targetsUnit: Float64Array,
  lambda = 0,
  opts: SplineOptions = {},
): SplineInterpolator {
  const e = normalise(electrodesUnit);
  const t = normalise(targetsUnit);
  const nE = e.length / 3;
  const nT = t.length / 3;
  const k = splineCoefficients(opts.m ?? 4, opts.nTerms ?? 50);
  const n = nE + 1;
  const a = new Float64Array(n * n);
  for (let i = 0; i < nE; i++) {
    for (let j = i; j < nE; j++) {
      const g = splineFromCoefficients(k, e[3 * i] * e[3 * j] + e[3 * i + 1] * e[3 * j + 1] + e[3 * i + 2] * e[3 * j + 2]);
      a[i * n + j] = g;
      a[j * n + i] = g;
    }
    a[i * n + i] += lambda;
    a[i * n + nE] = 1;
    a[nE * n + i] = 1;
  }
  const perm = new Int32Array(n);
  const ok = nE > 0 && luFactor(a, n, perm);
  // Target kernel K[t] = [g(t·e_1) … g(t·e_M), 1], so V(t) = K[t] · [c; c0].
  const kernel = new Float64Array(nT * n);
  const table = opts.targetKernel === 'table' ? kernelTable(opts.m ?? 4, opts.nTerms ?? 50) : null;
  for (let ti = 0; ti < nT; ti++) {
    const tx = t[3 * ti];
    const ty = t[3 * ti + 1];
    const tz = t[3 * ti + 2];
    const row = ti * n;
    if (table)
      for (let i = 0; i < nE; i++) kernel[row + i] = kernelFromTable(table, tx * e[3 * i] + ty * e[3 * i + 1] + tz * e[3 * i + 2]);
    else for (let i = 0; i < nE; i++) kernel[row + i] = splineFromCoefficients(k, tx * e[3 * i] + ty * e[3 * i + 1] + tz * e[3 * i + 2]);
    kernel[row + nE] = 1;
  }
  const rhs = new Float64Array(n);
  const coef = new Float64Array(n);
  return {
    nTargets: nT,
    nElectrodes: nE,
    interpolate(values: Float64Array, out: Float64Array = new Float64Array(nT)): Float64Array {
      if (!ok) return out.fill(NaN, 0, nT);
      for (let j = 0; j < nE; j++) rhs[j] = values[j];
      rhs[nE] = 0;
      luSolve(a, n, perm, rhs, coef);
      for (let ti = 0; ti < nT; ti++) {
        const row = ti * n;
        let s = 0;
        for (let j = 0; j < n; j++) s += kernel[row + j] * coef[j];
        out[ti] = s;
      }
      return out;
    },
  };
}
