/**
 * Concentric-shell sphere: exact Legendre series of the surface potential of a current dipole in the inner
 * shell, and a fast approximation by three dipoles in a homogeneous sphere for the dipole fit's inner loop.
 *
 * Series (docs/methods.md §8.3; de Munck & Peters 1993, IEEE TBME 40:1166–1174; Zhang 1995, Phys. Med. Biol.
 * 40:335–349), in units of the outer radius R (b = |r0| / R, c = r̂ · r̂0):
 *
 *     V = 1 / (4π σ₁ R²) Σ_{n≥1} g_n b^(n−1) [ n q_r P_n(c) + t P′_n(c) ],   q_r = q · r̂0,  t = q · r̂ − q_r c
 *
 * with g_n from the stable ratio recursion of docs/methods.md §8.3 (never propagating A_k, B_k directly: that loses
 * all accuracy beyond n ≈ 40 for the Rush & Driscoll radii).
 */
import { electrodeDirections, sphereLeadFieldAccumulate } from './sphere.ts';
import { createLevenbergMarquardtScratch, gramSchmidtBasis, levenbergMarquardt, solveUpperTriangular } from './least-squares.ts';

/**
 * Series coefficients g_n (index n − 1, n = 1 … nMax) of K concentric shells with outer radius 1.
 * `radii` are the shells' outer radii as fractions of R, innermost first, the last equal to 1; `conductivities`
 * the shells' conductivities (any unit: only ratios matter), innermost (source) shell first.
 * Ratio recursion on τ = A r^(2n+1) / B from the insulating exterior inwards (docs/methods.md §8.3, derived there and
 * checked against a 50-digit solution of the full interface system). With equal conductivities it returns
 * the homogeneous g_n = (2n + 1) / n.
 */
export function shellSeriesCoefficients(
  radii: ArrayLike<number>,
  conductivities: ArrayLike<number>,
  nMax: number,
): Float64Array {
  const k = radii.length;
  const g = new Float64Array(Math.max(0, nMax));
  const tauIn = new Float64Array(k);
  const tauOut = new Float64Array(k);
  for (let n = 1; n <= g.length; n++) {
    let tau = (n + 1) / n;
    for (let s = k - 1; s >= 1; s--) {
      tauOut[s] = tau;
      tauIn[s] = tau * Math.pow(radii[s - 1] / radii[s], 2 * n + 1);
      const q = ((conductivities[s] / conductivities[s - 1]) * (n * tauIn[s] - (n + 1))) / (tauIn[s] + 1);
      tau = (q + n + 1) / (n - q);
    }
    tauOut[0] = tau;
    // r_1^−(n+1) Π (r_{k−1}/r_k)^(n+1) telescopes to R^−(n+1) = 1: leave the powers out (they overflow).
    let gn = tauOut[0] + 1;
    for (let s = 1; s < k; s++) gn *= (tauOut[s] + 1) / (tauIn[s] + 1);
    g[n - 1] = gn;
  }
  return g;
}

/**
 * Number of series terms used for eccentricity b = |r0| / R: the first n at which the bound on the
 * remaining terms, g_n b^(n−1) n (n+1) / (1 − b) (|P_n| ≤ 1, |P′_n| ≤ n(n+1)/2, |t| ≤ |q|), falls below
 * `tol` × g_1 — the convergence criterion [b]. Capped at the length of `g`.
 */
export function seriesTermsNeeded(g: Float64Array, b: number, tol = 1e-16): number {
  if (b === 0) return Math.min(1, g.length);
  const limit = tol * g[0];
  let w = 1;
  for (let n = 1; n <= g.length; n++) {
    if (n > 1) w *= b;
    if (n >= 2 && (g[n - 1] * w * n * (n + 1)) / (1 - b) < limit) return n;
  }
  return g.length;
}

let weightScratch = new Float64Array(512);
/** n g_n b^(n−1), index n − 1. */
let weightScratch1 = new Float64Array(512);
let directionScratch = new Float64Array(384);
/** Legendre recurrence factors (2n+1)/(n+1) and n/(n+1), index n, shared by every series evaluation. */
let recurrenceA = new Float64Array(0);
let recurrenceB = new Float64Array(0);
function ensureRecurrence(nTerms: number) {
  if (recurrenceA.length > nTerms) return;
  const len = Math.max(nTerms + 1, 2 * recurrenceA.length);
  recurrenceA = new Float64Array(len);
  recurrenceB = new Float64Array(len);
  for (let n = 1; n < len; n++) {
    recurrenceA[n] = (2 * n + 1) / (n + 1);
    recurrenceB[n] = n / (n + 1);
  }
}

/**
 * F (M × 3 row-major, 1/unit²) of the shell model from its series coefficients `g` (unit outer radius);
 * V = q · F / (4π σ₁). Electrodes are any non-zero vectors (projected radially onto the sphere of radius
 * `radius`); `position` in the same unit. Row m = [(S1 − c S2) r̂0 + S2 r̂] / R² with
 * S1 = Σ g_n b^(n−1) n P_n(c), S2 = Σ g_n b^(n−1) P′_n(c); Legendre recurrences of docs/methods.md §8.3.
 * Returns NaN rows when b ≥ 1 (the caller checks the source shell).
 */
export function shellSeriesLeadField(
  g: Float64Array,
  electrodes: Float64Array,
  radius: number,
  position: ArrayLike<number>,
  out: Float64Array = new Float64Array(electrodes.length - (electrodes.length % 3)),
  tol = 1e-16,
): Float64Array {
  const m = Math.floor(electrodes.length / 3);
  const px = position[0];
  const py = position[1];
  const pz = position[2];
  const a = Math.sqrt(px * px + py * py + pz * pz);
  const b = a / radius;
  if (!(b < 1)) {
    out.fill(NaN, 0, 3 * m);
    return out;
  }
  // At the centre only n = 1 contributes and r̂0 is arbitrary.
  const ux = a > 0 ? px / a : 0;
  const uy = a > 0 ? py / a : 0;
  const uz = a > 0 ? pz / a : 1;
  const nTerms = seriesTermsNeeded(g, b, tol);
  if (weightScratch.length < nTerms) weightScratch = new Float64Array(nTerms * 2);
  const w = weightScratch;
  if (weightScratch1.length < nTerms) weightScratch1 = new Float64Array(nTerms * 2);
  const w1 = weightScratch1;
  let bp = 1;
  for (let n = 1; n <= nTerms; n++) {
    w[n - 1] = g[n - 1] * bp;
    w1[n - 1] = n * w[n - 1];
    bp *= b;
  }
  ensureRecurrence(nTerms);
  const ra = recurrenceA;
  const rb = recurrenceB;
  const scale = 1 / (radius * radius);
  for (let e = 0; e < m; e++) {
    let ex = electrodes[3 * e];
    let ey = electrodes[3 * e + 1];
    let ez = electrodes[3 * e + 2];
    const en = Math.sqrt(ex * ex + ey * ey + ez * ez);
    ex /= en;
    ey /= en;
    ez /= en;
    const c = ex * ux + ey * uy + ez * uz;
    // n = 1: P_1 = c, P′_1 = 1
    let pPrev = 1;
    let p = c;
    let dPrev = 0;
    let dp = 1;
    let s1 = w[0] * c;
    let s2 = w[0];
    for (let n = 1; n < nTerms; n++) {
      const pNext = ra[n] * c * p - rb[n] * pPrev;
      const dNext = dPrev + (2 * n + 1) * p;
      s1 += w1[n] * pNext;
      s2 += w[n] * dNext;
      pPrev = p;
      p = pNext;
      dPrev = dp;
      dp = dNext;
    }
    const radialPart = (s1 - c * s2) * scale;
    const surfacePart = s2 * scale;
    out[3 * e] = radialPart * ux + surfacePart * ex;
    out[3 * e + 1] = radialPart * uy + surfacePart * ey;
    out[3 * e + 2] = radialPart * uz + surfacePart * ez;
  }
  return out;
}

/**
 * Three (or more) dipoles in a homogeneous sphere standing in for one dipole in the shell model, after
 * Berg & Scherg 1994 (Electroencephalogr. Clin. Neurophysiol. 90:58–64): the dipole at r0 is replaced by
 * dipoles of the same direction at μ_i r0 with moments λ_i q, so that g_n ≈ g_n^hom Σ λ_i μ_i^(n−1).
 */
export interface EquivalentDipoles {
  /** μ_i: eccentricity factors in (0, 1), ascending. */
  readonly eccentricity: Float64Array;
  /** λ_i: magnitude factors. */
  readonly magnitude: Float64Array;
  /** Largest relative error of g_n reproduced, n = 1 … 10 (a quality figure of the fit). */
  readonly maxRelativeErrorLowOrders: number;
  /** Eccentricity b of the weighting the fit used. */
  readonly weightEccentricity: number;
}

/**
 * Fits the Berg & Scherg (1994) equivalent dipoles to the exact series coefficients `g` (unit radius).
 * Our fit (documented here because the published tables are for other parameters): minimise
 *
 *     Σ_{n=1}^{N} [ w_n (g_n / g_n^hom − Σ_i λ_i μ_i^(n−1)) ]²,   w_n = n b_w^(n−1),  b_w = 0.85,  N = 300,
 *
 * i.e. each degree weighted by how much it contributes to the potential of a source at eccentricity b_w
 * (near the brain surface, 0.87 R). The λ_i enter linearly and are eliminated (variable projection,
 * Golub & Pereyra 1973); μ_i = 1 / (1 + e^(−θ_i)) keeps them in (0, 1); θ is found by Levenberg–Marquardt
 * from two starts. For the Rush & Driscoll model this gives μ ≈ (0.447, 0.776, 0.992) and
 * λ ≈ (0.365, 0.232, 0.064). Measured against the series (average-referenced potentials, error relative to
 * the map's largest value, 200 random sources per radius, 73 idealised 10-10 electrodes): 0.07 % at 0.5 R,
 * 0.2 % at 0.85 R, 0.36 % at 0.869 R (the brain shell is 0.87 R); shells.test.ts asserts < 1 %.
 */
export function fitEquivalentDipoles(g: Float64Array, count = 3, weightEccentricity = 0.85, nFit = 300): EquivalentDipoles {
  const nRows = Math.min(nFit, g.length);
  // Equal conductivities: g_n = g_n^hom, and one dipole with μ = λ = 1 is exact.
  let homogeneous = true;
  for (let n = 1; n <= nRows && homogeneous; n++) homogeneous = Math.abs((g[n - 1] * n) / (2 * n + 1) - 1) < 1e-12;
  if (homogeneous) return { eccentricity: Float64Array.of(1), magnitude: Float64Array.of(1), maxRelativeErrorLowOrders: 0, weightEccentricity };
  const target = new Float64Array(nRows);
  const weights = new Float64Array(nRows);
  for (let n = 1; n <= nRows; n++) {
    const w = n * Math.pow(weightEccentricity, n - 1);
    weights[n - 1] = w;
    target[n - 1] = (w * g[n - 1] * n) / (2 * n + 1);
  }
  const design = new Float64Array(nRows * count);
  const q = new Float64Array(nRows * count);
  const r = new Float64Array(count * count);
  const qty = new Float64Array(count);
  const mu = new Float64Array(count);
  const setDesign = (theta: Float64Array) => {
    for (let i = 0; i < count; i++) mu[i] = 1 / (1 + Math.exp(-theta[i]));
    for (let i = 0; i < count; i++) {
      let pw = 1;
      for (let n = 0; n < nRows; n++) {
        design[i * nRows + n] = weights[n] * pw;
        pw *= mu[i];
      }
    }
    gramSchmidtBasis(design, nRows, count, q, r, 1e-13);
    for (let i = 0; i < count; i++) {
      let s = 0;
      for (let n = 0; n < nRows; n++) s += q[i * nRows + n] * target[n];
      qty[i] = s;
    }
  };
  const problem = {
    nParams: count,
    nResiduals: nRows,
    residual(theta: Float64Array, out: Float64Array) {
      setDesign(theta);
      for (let n = 0; n < nRows; n++) {
        let s = target[n];
        for (let i = 0; i < count; i++) s -= q[i * nRows + n] * qty[i];
        out[n] = s;
      }
    },
  };
  const scratch = createLevenbergMarquardtScratch(count, nRows);
  const logit = (x: number) => Math.log(x / (1 - x));
  // Two spread-out starts: μ from 0.3 to 0.95 and from 0.5 to 0.97.
  const starts: number[][] = [
    [0.3, 0.95],
    [0.5, 0.97],
  ].map(([lo, hi]) => Array.from({ length: count }, (_, i) => logit(count === 1 ? lo : lo + ((hi - lo) * i) / (count - 1))));
  let best: { p: Float64Array; cost: number } | null = null;
  for (const s of starts) {
    const res = levenbergMarquardt(problem, s, { step: 1e-6, maxIterations: 200, relativeCostTol: 1e-14 }, scratch);
    if (best === null || res.cost < best.cost) best = { p: res.p, cost: res.cost };
  }
  setDesign(best!.p);
  const lambda = solveUpperTriangular(r, count, qty, new Float64Array(count));
  const order = Array.from({ length: count }, (_, i) => i).sort((i, j) => mu[i] - mu[j]);
  const eccentricity = Float64Array.from(order, (i) => mu[i]);
  const magnitude = Float64Array.from(order, (i) => lambda[i]);
  let maxErr = 0;
  for (let n = 1; n <= Math.min(10, g.length); n++) {
    const f = (g[n - 1] * n) / (2 * n + 1);
    let approx = 0;
    for (let i = 0; i < count; i++) approx += magnitude[i] * Math.pow(eccentricity[i], n - 1);
    maxErr = Math.max(maxErr, Math.abs(approx - f) / Math.abs(f));
  }
  return { eccentricity, magnitude, maxRelativeErrorLowOrders: maxErr, weightEccentricity };
}

/**
 * F (M × 3, 1/unit²) of the shell model approximated by equivalent dipoles in a homogeneous sphere:
 * Σ_i λ_i F_hom(μ_i r0). About 3 closed-form evaluations per electrode instead of a Legendre series.
 */
export function equivalentDipolesLeadField(
  eq: EquivalentDipoles,
  electrodes: Float64Array,
  radius: number,
  position: ArrayLike<number>,
  out: Float64Array = new Float64Array(electrodes.length - (electrodes.length % 3)),
): Float64Array {
  if (directionScratch.length < electrodes.length) directionScratch = new Float64Array(electrodes.length);
  const unit = electrodeDirections(electrodes, directionScratch.subarray(0, electrodes.length - (electrodes.length % 3)));
  out.fill(0);
  for (let i = 0; i < eq.eccentricity.length; i++) {
    const mu = eq.eccentricity[i];
    sphereLeadFieldAccumulate(
      { electrodes: unit, radius, x0: mu * position[0], y0: mu * position[1], z0: mu * position[2], weight: eq.magnitude[i], electrodesAreUnit: true },
      out,
    );
  }
  return out;
}
