/**
 * Scalp topography images: spherical-spline interpolation (spherical-spline.ts) of per-electrode values
 * onto a square pixel grid in the azimuthal equidistant projection from the vertex (docs/methods.md §9):
 *
 *     ρ = arccos(z) / (π/2),  angle = atan2(y, x),  plane point (ρ cos angle, ρ sin angle)
 *
 * so the equator (z = 0) is ρ = 1 and Fpz / T7 / Oz of the 10-20 construction sit at ρ = 0.8. The image
 * spans ρ ∈ [−extent, extent] on both axes (default 1.1: a little below the electrode ring).
 *
 * With `clip`, only the pixels within a margin of the electrodes' convex hull are painted (the
 * interpolation is an extrapolation beyond the outermost electrodes, so colour there would show values no
 * electrode measured), and the last part of the margin fades out (`alpha`) so the edge is smooth.
 *
 * Image coordinates: x ∈ [−1, 1] from left to right (head left → right, +x), y ∈ [−1, 1] from top to
 * bottom, with the nose (+y in head coordinates) at the top. Pixel (row r, column c) has its centre at
 * x = −1 + (2c + 1)/size, y = −1 + (2r + 1)/size and is stored at index r × size + c.
 */
import { createSplineInterpolator, type SplineInterpolator } from './spherical-spline.ts';

export interface TopographyPlan {
  /** Width = height of the image in pixels. */
  readonly size: number;
  /** ρ at the image edge (x = ±1 or y = ±1). */
  readonly extent: number;
  /** 1 for painted pixels (inside the disc ρ ≤ extent, and within the hull margin when clipped), 0 outside; row-major. */
  readonly mask: Uint8Array;
  /** Opacity of each pixel, 0…1 (1 inside, falling smoothly to 0 across the clip's feather; = mask without clip). */
  readonly alpha: Float32Array;
  /** Electrode positions in image coordinates, 2 per electrode (x, y) in [−1, 1]² (see module doc). */
  readonly electrodeXY: Float64Array;
  /** Interpolated image (row-major size × size) of per-electrode weights; NaN outside the mask. */
  render(weights: Float64Array, out?: Float32Array): Float32Array;
}

export interface TopographyOptions {
  /** Pixels per side. Default 64. */
  size?: number;
  /** ρ of the outer edge. Default 1.1. */
  extent?: number;
  /** Spline regularisation λ. Default 0 (exact at the electrodes). */
  lambda?: number;
  /**
   * Paint only within `marginRho` (ρ units) of the electrodes' convex hull in the projection plane, fading
   * to transparent over the outer `featherRho` of that margin. Default null: the whole disc.
   */
  clip?: { readonly marginRho: number; readonly featherRho: number } | null;
}

/**
 * Convex hull of 2-D points (x, y interleaved) by the monotone chain (Andrew 1979, Inf. Process. Lett.
 * 9:216–219): vertices counter-clockwise, collinear points dropped. Fewer than 3 vertices when degenerate.
 */
export function convexHull(xy: ArrayLike<number>): number[][] {
  const pts: number[][] = [];
  for (let i = 0; i + 1 < xy.length; i += 2) if (Number.isFinite(xy[i]) && Number.isFinite(xy[i + 1])) pts.push([xy[i], xy[i + 1]]);
  pts.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (pts.length < 3) return pts;
  const cross = (o: number[], a: number[], b: number[]) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: number[][] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: number[][] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/**
 * Signed distance from (x, y) to a convex polygon with counter-clockwise vertices: negative inside (minus the
 * distance to the nearest edge), positive outside (distance to the nearest point of the boundary).
 */
export function signedHullDistance(hull: readonly number[][], x: number, y: number): number {
  let inside = hull.length >= 3;
  let best = Infinity;
  for (let i = 0; i < hull.length; i++) {
    const [ax, ay] = hull[i];
    const [bx, by] = hull[(i + 1) % hull.length];
    const ex = bx - ax;
    const ey = by - ay;
    const len2 = ex * ex + ey * ey;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - ax) * ex + (y - ay) * ey) / len2)) : 0;
    best = Math.min(best, Math.hypot(x - (ax + t * ex), y - (ay + t * ey)));
    if (ex * (y - ay) - ey * (x - ax) < 0) inside = false; // right of a counter-clockwise edge
  }
  return inside ? -best : best;
}

/** Hermite smoothstep: 0 at e0, 1 at e1, zero slope at both ends (common practice in graphics). */
function smoothstep(e0: number, e1: number, v: number): number {
  if (!(e1 > e0)) return v < e0 ? 0 : 1;
  const t = Math.max(0, Math.min(1, (v - e0) / (e1 - e0)));
  return t * t * (3 - 2 * t);
}

/** Azimuthal equidistant projection of unit vectors (N × 3) to plane points (N × 2, ρ units, +y = nose). */
export function projectAzimuthalEquidistant(unit: Float64Array, out: Float64Array = new Float64Array((unit.length / 3) * 2)): Float64Array {
  const n = Math.floor(unit.length / 3);
  for (let i = 0; i < n; i++) {
    const x = unit[3 * i];
    const y = unit[3 * i + 1];
    const z = unit[3 * i + 2];
    const len = Math.sqrt(x * x + y * y + z * z);
    const cz = Math.max(-1, Math.min(1, z / len));
    const rho = Math.acos(cz) / (Math.PI / 2);
    const h = Math.sqrt(x * x + y * y);
    out[2 * i] = h > 0 ? (rho * x) / h : 0;
    out[2 * i + 1] = h > 0 ? (rho * y) / h : 0;
  }
  return out;
}

/**
 * Builds the per-montage plan: the pixel mask, the pixels' directions on the sphere and the spline matrix
 * from electrodes to inside pixels (computed once; every component's map then costs one matrix–vector
 * product). `electrodesUnit` are electrode directions (M × 3; any non-zero vectors from the sphere centre).
 */
export function createTopographyPlan(electrodesUnit: Float64Array, opts: TopographyOptions = {}): TopographyPlan {
  const size = Math.max(1, Math.floor(opts.size ?? 64));
  const extent = opts.extent ?? 1.1;
  if (!(extent > 0 && extent < 2)) throw new RangeError(`createTopographyPlan: extent must be in (0, 2), got ${extent}`);
  const mask = new Uint8Array(size * size);
  const alpha = new Float32Array(size * size);
  const plane = projectAzimuthalEquidistant(electrodesUnit);
  const hull = opts.clip ? convexHull(plane) : [];
  const clip = opts.clip && hull.length >= 3 ? opts.clip : null;
  const inside: number[] = [];
  const dirs: number[] = [];
  for (let r = 0; r < size; r++) {
    const yImg = -1 + (2 * r + 1) / size;
    for (let c = 0; c < size; c++) {
      const xImg = -1 + (2 * c + 1) / size;
      const px = xImg * extent;
      const py = -yImg * extent; // image y grows downwards; the nose (+y) is at the top
      const rho = Math.sqrt(px * px + py * py);
      if (rho > extent) continue;
      let a = 1;
      if (clip) {
        const d = signedHullDistance(hull, px, py);
        if (d > clip.marginRho) continue;
        a = 1 - smoothstep(clip.marginRho - clip.featherRho, clip.marginRho, d);
      }
      mask[r * size + c] = 1;
      alpha[r * size + c] = a;
      inside.push(r * size + c);
      const theta = (rho * Math.PI) / 2;
      const s = Math.sin(theta);
      dirs.push(rho > 0 ? (s * px) / rho : 0, rho > 0 ? (s * py) / rho : 0, Math.cos(theta));
    }
  }
  const interpolator: SplineInterpolator = createSplineInterpolator(electrodesUnit, Float64Array.from(dirs), opts.lambda ?? 0, {
    targetKernel: 'table',
  });
  const electrodeXY = new Float64Array(plane.length);
  for (let i = 0; i < plane.length / 2; i++) {
    electrodeXY[2 * i] = plane[2 * i] / extent;
    electrodeXY[2 * i + 1] = -plane[2 * i + 1] / extent;
  }
  const insideIdx = Int32Array.from(inside);
  const values = new Float64Array(insideIdx.length);
  return {
    size,
    extent,
    mask,
    alpha,
    electrodeXY,
    render(weights: Float64Array, out: Float32Array = new Float32Array(size * size)): Float32Array {
      out.fill(NaN);
      interpolator.interpolate(weights, values);
      for (let i = 0; i < insideIdx.length; i++) out[insideIdx[i]] = values[i];
      return out;
    },
  };
}
