/**
 * Three orthogonal views of an equivalent dipole in a spherical head (RAS mm: +x right, +y anterior,
 * +z up; METHODS global conventions). Each view maps head coordinates to a unit square frame in which the
 * head circle has radius 1 (centre 0, screen y down):
 * - top:  seen from above, anterior up, right on the right  (sx = x, sy = −y)
 * - side: seen from the right, anterior to the right, up up  (sx = y, sy = −z)
 * - back: seen from behind, right on the right, up up        (sx = x, sy = −z)
 */

export type DipoleViewName = 'top' | 'side' | 'back';

export const DIPOLE_VIEWS: readonly DipoleViewName[] = ['top', 'side', 'back'];

export interface ProjectedDipole {
  /** Dipole position in view units (head radius = 1). */
  readonly at: readonly [number, number];
  /** End of the moment arrow (direction only; length `arrowLength`), view units. */
  readonly tip: readonly [number, number];
  /** Length of the moment's component in the view plane relative to its full length (0…1). */
  readonly inPlane: number;
}

function toView(view: DipoleViewName, v: readonly [number, number, number]): [number, number] {
  switch (view) {
    case 'top':
      return [v[0], -v[1]];
    case 'side':
      return [v[1], -v[2]];
    case 'back':
      return [v[0], -v[2]];
  }
}

/**
 * Projects `positionMm` and the direction of `moment` into `view`, scaling by `headRadiusMm`. The arrow is
 * drawn `arrowLength` long (view units) for a moment lying in the view plane, shorter when it points
 * out of the plane. A zero moment gives tip = at.
 */
export function projectDipole(
  view: DipoleViewName,
  positionMm: readonly [number, number, number],
  moment: readonly [number, number, number],
  headRadiusMm: number,
  arrowLength = 0.35,
): ProjectedDipole {
  const [px, py] = toView(view, positionMm);
  const at: [number, number] = [px / headRadiusMm, py / headRadiusMm];
  const norm = Math.hypot(moment[0], moment[1], moment[2]);
  if (!(norm > 0)) return { at, tip: at, inPlane: 0 };
  const [mx, my] = toView(view, moment);
  const inPlane = Math.hypot(mx, my) / norm;
  return { at, tip: [at[0] + (mx / norm) * arrowLength, at[1] + (my / norm) * arrowLength], inPlane };
}

/**
 * Head radius for drawing: the head model's default 90 mm (issue 3), enlarged when the dipole sits
 * further out so the dot stays inside the picture.
 */
export function drawingRadiusMm(positionMm: readonly [number, number, number], defaultMm = 90): number {
  return Math.max(defaultMm, Math.hypot(positionMm[0], positionMm[1], positionMm[2]) * 1.1);
}
