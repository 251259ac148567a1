/**
 * Scalp topography images: spherical-spline interpolation (spherical-spline.ts) of per-electrode values
 * onto a square pixel grid in the azimuthal equidistant projection from the vertex (docs/methods.md §9):
 *
 *     ρ = arccos(z) / (π/2),  angle = atan2(y, x),  plane point (ρ cos angle, ρ sin angle)
 *
 * so the equator (z = 0) is ρ = 1 and Fpz / T7 / Oz of the 10-20 construction sit at ρ = 0.8. The image
 * spans ρ ∈ [−extent, extent] on both axes (default 1.1: a little below the electrode ring).
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
  /** 1 for pixels inside the head disc (ρ ≤ extent), 0 outside; row-major size × size. */
  readonly mask: Uint8Array;
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
      mask[r * size + c] = 1;
      inside.push(r * size + c);
      const theta = (rho * Math.PI) / 2;
      const s = Math.sin(theta);
      dirs.push(rho > 0 ? (s * px) / rho : 0, rho > 0 ? (s * py) / rho : 0, Math.cos(theta));
    }
  }
  const interpolator: SplineInterpolator = createSplineInterpolator(electrodesUnit, Float64Array.from(dirs), opts.lambda ?? 0, {
    targetKernel: 'table',
  });
  const plane = projectAzimuthalEquidistant(electrodesUnit);
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
    electrodeXY,
    render(weights: Float64Array, out: Float32Array = new Float32Array(size * size)): Float32Array {
      out.fill(NaN);
      interpolator.interpolate(weights, values);
      for (let i = 0; i < insideIdx.length; i++) out[insideIdx[i]] = values[i];
      return out;
    },
  };
}
