/**
 * Head outline for a scalp map drawn in the azimuthal equidistant projection (docs/methods.md §9): the vertex at
 * the centre, the equator (z = 0) on the unit circle, the nasion (+y) at the top of the picture and the
 * right ear (+x) on the right. Returns SVG path data in the caller's pixel frame; React renders it.
 */
import { path } from 'd3';

/** Where the unit disk of the projection lands in pixels: centre and the radius of ρ = 1. */
export interface DiskFrame {
  readonly cx: number;
  readonly cy: number;
  /** Pixels per unit of ρ. */
  readonly radius: number;
}

export interface HeadOutlinePaths {
  /** The head circle at ρ = 1 (the equator). */
  readonly head: string;
  /** A small triangle above the circle pointing towards the nasion. */
  readonly nose: string;
  /** Two half-ellipses outside the circle at the left and right pre-auricular points. */
  readonly ears: string;
}

/** Maps projection coordinates (ρ units, +y anterior) to pixels (+y down on screen). */
export function diskToPixel(frame: DiskFrame, x: number, y: number): [number, number] {
  return [frame.cx + x * frame.radius, frame.cy - y * frame.radius];
}

/**
 * SVG path data for the head outline. Nose: 0.18 ρ wide at the circle, 0.12 ρ tall; ears: 0.07 ρ deep,
 * 0.3 ρ tall. These proportions are our own drawing choice, not anatomy.
 */
export function headOutlinePaths(frame: DiskFrame): HeadOutlinePaths {
  const { cx, cy, radius: r } = frame;
  const head = path();
  head.arc(cx, cy, r, 0, 2 * Math.PI);
  head.closePath();

  const nose = path();
  const halfBase = 0.09;
  const baseY = Math.sqrt(1 - halfBase * halfBase);
  nose.moveTo(...diskToPixel(frame, -halfBase, baseY));
  nose.lineTo(...diskToPixel(frame, 0, 1.12));
  nose.lineTo(...diskToPixel(frame, halfBase, baseY));

  const ears = path();
  for (const side of [-1, 1]) {
    const depth = 0.07 * side;
    const top = 0.15;
    ears.moveTo(...diskToPixel(frame, side * Math.sqrt(1 - top * top), top));
    ears.bezierCurveTo(
      ...diskToPixel(frame, side + depth * 1.4, top + 0.02),
      ...diskToPixel(frame, side + depth * 1.4, -top - 0.02),
      ...diskToPixel(frame, side * Math.sqrt(1 - top * top), -top),
    );
  }
  return { head: head.toString(), nose: nose.toString(), ears: ears.toString() };
}
