/**
 * Homogeneous conducting sphere: closed-form surface potential of a current dipole.
 *
 * Geometry only: the functions here return the factor F (1 / length², in the length unit of the inputs) with
 * V(r) = q · F / (4πσ) for a dipole q at r0 and an electrode at r on the sphere of radius R, against an
 * infinitely distant reference (docs/methods.md §8.2):
 *
 *     dv = r − r0,  d = |dv|,  r̂ = r / R
 *     F  = 2 dv / d³ + (d r̂ + dv) / (d (R d + r · dv))
 *
 * [a: closed form attributed to Brody, Terry & Ideker 1973, IEEE TBME 20:141–143 — attribution from memory;
 * the formula is checked against the Legendre series of shells.ts in test/core/headmodel/sphere.test.ts.]
 * Dipole at the centre: F = 3 r̂ / R², i.e. V = 3 q cos θ / (4πσR²).
 */

/** One dipole term of `sphereLeadFieldAccumulate`. Lengths in any one unit; F comes out in 1/unit². */
export interface SphereLeadFieldTerm {
  /** M × 3, any non-zero vectors: each is projected radially onto the sphere of radius `radius`. */
  readonly electrodes: Float64Array;
  readonly radius: number;
  /** Dipole position (x0, y0, z0), |r0| < radius. */
  readonly x0: number;
  readonly y0: number;
  readonly z0: number;
  /** Factor on F (1 for one dipole; the magnitudes of an equivalent-dipole set, shells.ts). */
  readonly weight: number;
  /** True when `electrodes` are already unit vectors (skips the projection). Default false. */
  readonly electrodesAreUnit?: boolean;
}

/**
 * Adds `weight` × F for a dipole at (x0, y0, z0) to `out` (M × 3 row-major; row m is F for unit moments
 * along x, y, z at electrode m). The caller guarantees |r0| < radius; at or beyond it the result is not
 * finite.
 */
export function sphereLeadFieldAccumulate(term: SphereLeadFieldTerm, out: Float64Array): Float64Array {
  const { electrodes, radius, x0, y0, z0, weight, electrodesAreUnit = false } = term;
  const m = Math.floor(electrodes.length / 3);
  for (let e = 0; e < m; e++) {
    let ex = electrodes[3 * e];
    let ey = electrodes[3 * e + 1];
    let ez = electrodes[3 * e + 2];
    if (!electrodesAreUnit) {
      const inv = 1 / Math.sqrt(ex * ex + ey * ey + ez * ez);
      ex *= inv;
      ey *= inv;
      ez *= inv;
    }
    const dx = radius * ex - x0;
    const dy = radius * ey - y0;
    const dz = radius * ez - z0;
    const d2 = dx * dx + dy * dy + dz * dz;
    const d = Math.sqrt(d2);
    const rDotD = radius * (ex * dx + ey * dy + ez * dz);
    const invD = 1 / d;
    const a = 2 * weight * invD * invD * invD;
    const b = (weight * invD) / (radius * d + rDotD);
    out[3 * e] += a * dx + b * (d * ex + dx);
    out[3 * e + 1] += a * dy + b * (d * ey + dy);
    out[3 * e + 2] += a * dz + b * (d * ez + dz);
  }
  return out;
}

/** Unit vectors of electrodes (M × 3, any non-zero length) written into `out`: the radial projection. */
export function electrodeDirections(electrodes: Float64Array, out: Float64Array = new Float64Array(electrodes.length)): Float64Array {
  const m = Math.floor(electrodes.length / 3);
  for (let e = 0; e < m; e++) {
    const x = electrodes[3 * e];
    const y = electrodes[3 * e + 1];
    const z = electrodes[3 * e + 2];
    const inv = 1 / Math.sqrt(x * x + y * y + z * z);
    out[3 * e] = x * inv;
    out[3 * e + 1] = y * inv;
    out[3 * e + 2] = z * inv;
  }
  return out;
}

/**
 * F (M × 3 row-major, 1/unit²) of the homogeneous sphere for a dipole at `position` (same length unit as
 * `radius`); V = q · F / (4πσ). See `sphereLeadFieldAccumulate` for the electrode convention.
 */
export function sphereLeadField(
  electrodes: Float64Array,
  radius: number,
  position: ArrayLike<number>,
  out: Float64Array = new Float64Array(electrodes.length - (electrodes.length % 3)),
): Float64Array {
  out.fill(0);
  return sphereLeadFieldAccumulate({ electrodes, radius, x0: position[0], y0: position[1], z0: position[2], weight: 1 }, out);
}

/**
 * Legendre-series coefficients g_n (n = 1 … nMax, stored at index n − 1) of the homogeneous sphere of unit
 * radius: g_n = (2n + 1) / n (docs/methods.md §8.3). Used to check the series code against the closed form.
 */
export function homogeneousSeriesCoefficients(nMax: number): Float64Array {
  const g = new Float64Array(Math.max(0, nMax));
  for (let n = 1; n <= g.length; n++) g[n - 1] = (2 * n + 1) / n;
  return g;
}
