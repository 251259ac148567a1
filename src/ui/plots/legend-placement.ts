/**
 * Where a plot's legend goes: the first candidate corner whose box no drawn point falls in (e.g. not on the
 * 50 Hz mains peak of a spectrum, which rises into the top right). Pure; points in pixels.
 */

export interface LegendBox {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** Number of points inside `box` (a few px of margin around it). */
export function pointsInside(points: readonly (readonly [number, number])[], box: LegendBox, margin = 2): number {
  let n = 0;
  for (const [x, y] of points)
    if (x >= box.x - margin && x <= box.x + box.width + margin && y >= box.y - margin && y <= box.y + box.height + margin) n++;
  return n;
}

/** The candidate with the fewest points inside, the earlier one on a tie (so the preferred corner wins when free). */
export function placeLegend(points: readonly (readonly [number, number])[], candidates: readonly LegendBox[]): LegendBox {
  let best = candidates[0];
  let bestN = Infinity;
  for (const c of candidates) {
    const n = pointsInside(points, c);
    if (n < bestN) {
      best = c;
      bestN = n;
    }
  }
  return best;
}
