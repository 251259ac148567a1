/**
 * A coarse, approximate region label for a fitted dipole position in the spherical head model.
 *
 * The rules below are our own and deliberately simple [b]: they read the direction of the position from the
 * sphere centre against the idealised 10-20 layout (docs/methods.md §10) — the central region under the C3–Cz–C4
 * arc (y ≈ 0), frontal in front of it, parietal behind it, occipital towards Oz/O1/O2, temporal low and
 * lateral under the F7–T7–P7 / F8–T8–P8 ring — and its distance from the centre for depth. A sphere is not a
 * brain, and the equivalent dipole of a spread-out source sits deeper than the source: the label is an
 * approximate model estimate, never an anatomical location.
 *
 * Thresholds (direction u = p / |p|, R = outer radius):
 *   hemisphere: midline when |x| < 0.06 R (about 5 mm at R = 90 mm), else left (x < 0) / right (x > 0);
 *   temporal:   u_z < 0.45 and |u_x| > 0.6 and −0.65 < u_y < 0.55;
 *   frontal:    u_y > 0.25;   central: −0.2 ≤ u_y ≤ 0.25;
 *   occipital:  u_y < −0.7 (behind the PO row);  parietal: −0.7 ≤ u_y < −0.2;
 *   depth:      superficial when |p| ≥ 0.55 R (within ≈ 28 mm of the brain shell at 0.87 R), else deep.
 */
import { millimetres, type Lenient, type Millimetres } from '../units.ts';

export type Hemisphere = 'left' | 'right' | 'midline';
export type Lobe = 'frontal' | 'central' | 'parietal' | 'occipital' | 'temporal';
export type Depth = 'superficial' | 'deep';

export interface RegionEstimate {
  hemisphere: Hemisphere;
  lobe: Lobe;
  depth: Depth;
  /** e.g. "left frontal, superficial" or "midline parietal, deep". */
  label: string;
  /** Always present: the label is a model estimate, not an anatomical location. */
  caution: string;
}

export const REGION_CAUTION =
  'Approximate estimate from a spherical head model; not an anatomical location. Equivalent dipoles of extended sources lie deeper than the sources themselves.';

/**
 * Approximate region of a position (mm, RAS, origin at the sphere centre) in a head of radius `radiusMm`
 * (default 90). A position with NaN coordinates gives hemisphere 'midline', lobe 'central', depth 'deep'
 * and a label saying the position is unknown.
 */
export function approximateRegion(positionMm: ArrayLike<number>, radiusMm: Lenient<Millimetres> = millimetres(90)): RegionEstimate {
  const x = positionMm[0];
  const y = positionMm[1];
  const z = positionMm[2];
  if (!(Number.isFinite(x) && Number.isFinite(y) && Number.isFinite(z)))
    return { hemisphere: 'midline', lobe: 'central', depth: 'deep', label: 'unknown position', caution: REGION_CAUTION };
  const r = Math.sqrt(x * x + y * y + z * z);
  const hemisphere: Hemisphere = Math.abs(x) < 0.06 * radiusMm ? 'midline' : x < 0 ? 'left' : 'right';
  const ux = r > 0 ? x / r : 0;
  const uy = r > 0 ? y / r : 0;
  const uz = r > 0 ? z / r : 1;
  let lobe: Lobe;
  if (uz < 0.45 && Math.abs(ux) > 0.6 && uy > -0.65 && uy < 0.55) lobe = 'temporal';
  else if (uy > 0.25) lobe = 'frontal';
  else if (uy >= -0.2) lobe = 'central';
  else if (uy < -0.7) lobe = 'occipital';
  else lobe = 'parietal';
  const depth: Depth = r >= 0.55 * radiusMm ? 'superficial' : 'deep';
  return { hemisphere, lobe, depth, label: `${hemisphere} ${lobe}, ${depth}`, caution: REGION_CAUTION };
}
