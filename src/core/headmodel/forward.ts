/**
 * Forward models of the head: potentials at scalp electrodes from a current dipole.
 *
 * Units throughout: positions in mm, RAS (+x right, +y nasion, +z up), origin at the sphere centre;
 * moments in nA·m; conductivities in S/m; potentials in µV against an infinitely distant reference
 * (apply the average reference to model and data alike before comparing with recorded maps: docs/methods.md §8.1).
 *
 * Unit bookkeeping: with F in mm⁻², V[V] = q[A·m] F[m⁻²] / (4πσ) = (1e−9 q[nA·m]) (1e6 F[mm⁻²]) / (4πσ),
 * so V[µV] = 1e3 · q[nA·m] · F[mm⁻²] / (4πσ). Check: a centred radial 10 nA·m dipole, R = 90 mm,
 * σ = 0.33 S/m gives 3q/(4πσR²) = 0.8931 µV at the vertex (docs/methods.md §8.4).
 */
import { homogeneousSeriesCoefficients, sphereLeadField } from './sphere.ts';
import {
  equivalentDipolesLeadField,
  fitEquivalentDipoles,
  shellSeriesCoefficients,
  shellSeriesLeadField,
  type EquivalentDipoles,
} from './shells.ts';
import { millimetres, type Lenient, type Millimetres } from '../units.ts';

export type HeadModelKind = 'sphere' | 'three-shell';

export interface HeadModel {
  readonly kind: HeadModelKind;
  /** Outer (scalp) radius. */
  readonly radiusMm: Millimetres;
  /** Conductivity of the source compartment (brain; also the scalp in the three-shell model), S/m. */
  readonly conductivity: number;
  /** When true, `leadField` uses the fast approximation (equivalent dipoles) instead of the exact series. */
  readonly fast: boolean;
  /** Outer radii of the shells as fractions of `radiusMm`, innermost first ([1] for the sphere). */
  readonly shellRadii: Float64Array;
  /** Conductivities of the shells in S/m, innermost first. */
  readonly shellConductivities: Float64Array;
  /** Radius of the compartment that may hold sources (the brain shell), mm. */
  readonly innerRadiusMm: Millimetres;
  /** Exact Legendre-series coefficients g_n, unit outer radius, index n − 1. */
  readonly seriesCoefficients: Float64Array;
  /** Berg & Scherg equivalent dipoles approximating the shells (null for the homogeneous sphere). */
  readonly equivalentDipoles: EquivalentDipoles | null;
}

export interface HeadModelOptions {
  /** 'three-shell' (default) or 'sphere' (homogeneous). */
  kind?: HeadModelKind;
  /** Outer radius. Default 90 mm. */
  radiusMm?: Lenient<Millimetres>;
  /** Brain (= scalp) conductivity in S/m. Default 0.33 [c: docs/methods.md §8.1]. */
  conductivity?: number;
  /** Use the fast approximation in `leadField`. Default false. */
  fast?: boolean;
  /** Three-shell outer radii as fractions of R. Default [0.87, 0.92, 1] (Rush & Driscoll 1969). */
  shellRadii?: ArrayLike<number>;
  /** Skull / brain conductivity ratio. Default 1/80 (Rush & Driscoll 1969). */
  skullRatio?: number;
}

/** Series length held per model: enough for eccentricities up to ≈ 0.97 R at the 1e-16 criterion. */
const SERIES_TERMS = 2000;

const equivalentDipoleCache = new Map<string, { g: Float64Array; eq: EquivalentDipoles }>();

/**
 * Builds a head model. Defaults: three shells (brain, skull, scalp) with outer radii 0.87 / 0.92 / 1.0 × 90 mm
 * and conductivities σ, σ/80, σ with σ = 0.33 S/m [a: Rush & Driscoll 1969, IEEE TBME 16:15–22 for the radii
 * and ratio; c for σ]. The series coefficients and the equivalent-dipole fit depend only on the radius and
 * conductivity ratios, so they are computed once per geometry and shared.
 */
export function createHeadModel(opts: HeadModelOptions = {}): HeadModel {
  const kind = opts.kind ?? 'three-shell';
  const radiusMm = (opts.radiusMm ?? 90) as Millimetres; // checked > 0 below
  const conductivity = opts.conductivity ?? 0.33;
  if (!(radiusMm > 0)) throw new RangeError(`createHeadModel: radiusMm must be > 0, got ${radiusMm}`);
  if (!(conductivity > 0)) throw new RangeError(`createHeadModel: conductivity must be > 0, got ${conductivity}`);
  if (kind === 'sphere') {
    return {
      kind,
      radiusMm,
      conductivity,
      fast: opts.fast ?? false,
      shellRadii: Float64Array.of(1),
      shellConductivities: Float64Array.of(conductivity),
      innerRadiusMm: radiusMm,
      seriesCoefficients: homogeneousSeriesCoefficients(SERIES_TERMS),
      equivalentDipoles: null,
    };
  }
  if (kind !== 'three-shell') throw new RangeError(`createHeadModel: kind must be 'sphere' or 'three-shell', got "${String(kind)}"`);
  const radii = Float64Array.from(opts.shellRadii ?? [0.87, 0.92, 1]);
  const skullRatio = opts.skullRatio ?? 1 / 80;
  if (radii.length !== 3 || radii[2] !== 1 || !(radii[0] > 0 && radii[0] < radii[1] && radii[1] < 1))
    throw new RangeError(`createHeadModel: shellRadii must be 3 increasing fractions ending at 1, got [${Array.from(radii).join(', ')}]`);
  if (!(skullRatio > 0)) throw new RangeError(`createHeadModel: skullRatio must be > 0, got ${skullRatio}`);
  const ratios = [1, skullRatio, 1];
  const key = `${Array.from(radii).join(',')}|${skullRatio}`;
  let cached = equivalentDipoleCache.get(key);
  if (!cached) {
    const g = shellSeriesCoefficients(radii, ratios, SERIES_TERMS);
    cached = { g, eq: fitEquivalentDipoles(g) };
    equivalentDipoleCache.set(key, cached);
  }
  return {
    kind,
    radiusMm,
    conductivity,
    fast: opts.fast ?? false,
    shellRadii: radii,
    shellConductivities: Float64Array.from(ratios, (r) => r * conductivity),
    innerRadiusMm: (radii[0] * radiusMm) as Millimetres,
    seriesCoefficients: cached.g,
    equivalentDipoles: cached.eq,
  };
}

function positionInside(model: HeadModel, positionMm: ArrayLike<number>): boolean {
  const x = positionMm[0];
  const y = positionMm[1];
  const z = positionMm[2];
  const a = Math.sqrt(x * x + y * y + z * z);
  return a < model.innerRadiusMm;
}

function scaleToMicrovolts(model: HeadModel, out: Float64Array, m: number): Float64Array {
  const k = 1e3 / (4 * Math.PI * model.conductivity);
  for (let i = 0; i < 3 * m; i++) out[i] *= k;
  return out;
}

/**
 * Lead field: potentials (µV per nA·m, infinite reference) at M electrodes for unit dipoles along x, y, z at
 * `positionMm`, as an M × 3 row-major matrix. Electrodes (M × 3, mm) are projected radially onto the model
 * sphere. Homogeneous sphere: closed form; three shells: exact Legendre series (or the equivalent-dipole
 * approximation when `model.fast`). A position outside the source compartment gives NaN rows.
 */
export function leadField(
  model: HeadModel,
  electrodes: Float64Array,
  positionMm: ArrayLike<number>,
  out: Float64Array = new Float64Array(electrodes.length - (electrodes.length % 3)),
): Float64Array {
  // The homogeneous sphere's closed form is exact, so the fast path is the exact one there.
  if (model.fast || model.kind === 'sphere') return leadFieldFast(model, electrodes, positionMm, out);
  const m = Math.floor(electrodes.length / 3);
  if (!positionInside(model, positionMm)) return out.fill(NaN, 0, 3 * m);
  shellSeriesLeadField(model.seriesCoefficients, electrodes, model.radiusMm, positionMm, out);
  return scaleToMicrovolts(model, out, m);
}

/**
 * The fast lead field used inside the dipole fit: closed form for the sphere, Berg & Scherg equivalent
 * dipoles for three shells (within 1 % of the series over the brain region: see forward.test.ts).
 * Same units and conventions as `leadField`.
 */
export function leadFieldFast(
  model: HeadModel,
  electrodes: Float64Array,
  positionMm: ArrayLike<number>,
  out: Float64Array = new Float64Array(electrodes.length - (electrodes.length % 3)),
): Float64Array {
  const m = Math.floor(electrodes.length / 3);
  if (!positionInside(model, positionMm)) return out.fill(NaN, 0, 3 * m);
  if (model.equivalentDipoles === null) sphereLeadField(electrodes, model.radiusMm, positionMm, out);
  else equivalentDipolesLeadField(model.equivalentDipoles, electrodes, model.radiusMm, positionMm, out);
  return scaleToMicrovolts(model, out, m);
}

/**
 * Potentials in µV (infinite reference) at M electrodes (M × 3, mm) of a dipole at `positionMm` with moment
 * `momentNAm` (nA·m). NaN when the position is outside the source compartment.
 */
export function dipolePotentials(
  model: HeadModel,
  electrodes: Float64Array,
  positionMm: ArrayLike<number>,
  momentNAm: ArrayLike<number>,
): Float64Array {
  const m = Math.floor(electrodes.length / 3);
  const lf = leadField(model, electrodes, positionMm);
  const v = new Float64Array(m);
  for (let e = 0; e < m; e++) v[e] = lf[3 * e] * momentNAm[0] + lf[3 * e + 1] * momentNAm[1] + lf[3 * e + 2] * momentNAm[2];
  return v;
}

/**
 * Radial projection of positions (N × 3, mm, relative to the sphere centre) onto the sphere of radius
 * `radiusMm` (default 90). A zero vector has no direction and gives NaN.
 */
export function projectToSphere(positionsMm: Float64Array, radiusMm: Millimetres = millimetres(90)): Float64Array {
  const n = Math.floor(positionsMm.length / 3);
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const x = positionsMm[3 * i];
    const y = positionsMm[3 * i + 1];
    const z = positionsMm[3 * i + 2];
    const len = Math.hypot(x, y, z);
    const k = len > 0 ? radiusMm / len : NaN;
    out[3 * i] = x * k;
    out[3 * i + 1] = y * k;
    out[3 * i + 2] = z * k;
  }
  return out;
}
