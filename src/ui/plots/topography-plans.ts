/**
 * One scalp-map plan per montage and picture size, computed once and reused for every component (the
 * spherical-spline interpolation matrix is the expensive part). Cached in a WeakMap keyed by the electrode
 * positions array, so a new recording's positions get a new plan and the old one can be collected.
 * Electrodes without a known position (NaN) are left out of the interpolation and get no dot.
 */
import { createTopographyPlan, type TopographyPlan as CorePlan } from '../../core/headmodel/topography.ts';

/**
 * Radius of the drawn picture in projection units (ρ = 1 is the equator, docs/methods.md §9): a little below the
 * 10-20 ring so occipital and temporal electrodes at ρ ≈ 1.0–1.1 stay inside the coloured area.
 */
export const MAP_EXTENT = 1.15;

/**
 * The painted area: the electrodes' convex hull plus half a 10-20 step (the 10 % step is 0.2 in ρ, so 0.1 ρ
 * ≈ 9° of arc), the outer half of that margin fading to transparent (ours). Beyond it the spline would
 * extrapolate values no electrode measured.
 */
export const MAP_CLIP = { marginRho: 0.1, featherRho: 0.05 } as const;

export interface MontagePlan {
  readonly size: number;
  readonly extent: number;
  /** Electrode centres in picture pixels (x, y per channel of the full montage; NaN when unknown). */
  readonly electrodePx: Float64Array;
  /** Opacity per pixel, 0…1 (the clip's smooth edge; 0 where nothing is painted). */
  readonly alpha: Float32Array;
  /** Picture (row-major size × size, NaN outside the painted area) of one weight per channel of the full montage. */
  render(weights: Float64Array): Float32Array;
}

const plans = new WeakMap<Float64Array, Map<number, MontagePlan>>();

/** Indices of the channels whose position is a finite non-zero vector. */
export function knownPositionIndices(positionsUnit: Float64Array): number[] {
  const out: number[] = [];
  for (let i = 0; i < Math.floor(positionsUnit.length / 3); i++) {
    const x = positionsUnit[3 * i], y = positionsUnit[3 * i + 1], z = positionsUnit[3 * i + 2];
    if (Number.isFinite(x) && Number.isFinite(y) && Number.isFinite(z) && x * x + y * y + z * z > 0) out.push(i);
  }
  return out;
}

function buildPlan(positionsUnit: Float64Array, size: number): MontagePlan {
  const known = knownPositionIndices(positionsUnit);
  const n = Math.floor(positionsUnit.length / 3);
  const sub = new Float64Array(known.length * 3);
  known.forEach((c, j) => sub.set(positionsUnit.subarray(3 * c, 3 * c + 3), 3 * j));
  const core: CorePlan | null = known.length >= 3 ? createTopographyPlan(sub, { size, extent: MAP_EXTENT, clip: MAP_CLIP }) : null;
  const electrodePx = new Float64Array(2 * n).fill(NaN);
  if (core) {
    known.forEach((c, j) => {
      // core image coordinates are [−1, 1]² with y down (topography.ts); pixels run 0…size
      electrodePx[2 * c] = ((core.electrodeXY[2 * j] + 1) / 2) * size;
      electrodePx[2 * c + 1] = ((core.electrodeXY[2 * j + 1] + 1) / 2) * size;
    });
  }
  const w = new Float64Array(known.length);
  return {
    size,
    extent: MAP_EXTENT,
    electrodePx,
    alpha: core ? core.alpha : new Float32Array(size * size),
    render(weights: Float64Array): Float32Array {
      if (!core) return new Float32Array(size * size).fill(NaN);
      // An unknown weight contributes 0 rather than turning the whole spline into NaN.
      known.forEach((c, j) => (w[j] = Number.isFinite(weights[c]) ? weights[c] : 0));
      return core.render(w);
    },
  };
}

/** The cached plan for `positionsUnit` (n×3 unit vectors, RAS) at `size`×`size` pixels. */
export function topographyPlanFor(positionsUnit: Float64Array, size: number): MontagePlan {
  let bySize = plans.get(positionsUnit);
  if (!bySize) {
    bySize = new Map();
    plans.set(positionsUnit, bySize);
  }
  let plan = bySize.get(size);
  if (!plan) {
    plan = buildPlan(positionsUnit, size);
    bySize.set(size, plan);
  }
  return plan;
}
