/**
 * Matching decomposed components to true sources by the absolute correlation of their scalp maps
 * (issue 10 item 6). The assignment maximises the summed |r| with the Hungarian method (Kuhn 1955,
 * "The Hungarian method for the assignment problem", Naval Res. Logist. Q. 2:83–97; Munkres 1957), here in
 * the O(n²m) shortest-augmenting-path form with row and column potentials (common practice), on the cost
 * 1 − |r|. Each source gets at most one component and each component at most one source.
 */
import { pearson } from '../evidence/activations.ts';

/** Pearson correlation of two maps (mean removed over channels). NaN for a constant map. */
export function mapCorrelation(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return pearson(a, b);
}

/**
 * Minimum-cost assignment of rows to columns for an nRows × nCols cost matrix (row-major). Returns, for each
 * row, its column or −1 (when there are more rows than columns, the unassigned rows get −1).
 */
export function hungarian(cost: Float64Array | readonly number[], nRows: number, nCols: number): Int32Array {
  if (nRows > nCols) {
    const t = new Float64Array(nRows * nCols);
    for (let i = 0; i < nRows; i++) for (let j = 0; j < nCols; j++) t[j * nRows + i] = cost[i * nCols + j];
    const colToRow = hungarian(t, nCols, nRows);
    const out = new Int32Array(nRows).fill(-1);
    colToRow.forEach((r, c) => {
      if (r >= 0) out[r] = c;
    });
    return out;
  }
  const n = nRows;
  const m = nCols;
  const u = new Float64Array(n + 1);
  const v = new Float64Array(m + 1);
  const p = new Int32Array(m + 1);
  const way = new Int32Array(m + 1);
  for (let i = 1; i <= n; i++) {
    p[0] = i;
    let j0 = 0;
    const minv = new Float64Array(m + 1).fill(Infinity);
    const used = new Uint8Array(m + 1);
    do {
      used[j0] = 1;
      const i0 = p[j0];
      let delta = Infinity;
      let j1 = 0;
      for (let j = 1; j <= m; j++) {
        if (used[j]) continue;
        const cur = cost[(i0 - 1) * m + (j - 1)] - u[i0] - v[j];
        if (cur < minv[j]) {
          minv[j] = cur;
          way[j] = j0;
        }
        if (minv[j] < delta) {
          delta = minv[j];
          j1 = j;
        }
      }
      for (let j = 0; j <= m; j++) {
        if (used[j]) {
          u[p[j]] += delta;
          v[j] -= delta;
        } else minv[j] -= delta;
      }
      j0 = j1;
    } while (p[j0] !== 0);
    do {
      const j1 = way[j0];
      p[j0] = p[j1];
      j0 = j1;
    } while (j0 !== 0);
  }
  const out = new Int32Array(n).fill(-1);
  for (let j = 1; j <= m; j++) if (p[j] > 0) out[p[j] - 1] = j - 1;
  return out;
}

export interface SourceMatch {
  /** 0-based component matched to the source, or −1. */
  readonly component: number;
  /** |r| of the two maps (0 when unmatched). */
  readonly r: number;
}

/**
 * Matches sources (maps as arrays of channel values) to the columns of a mixing matrix (nChannels × nComponents,
 * row-major) by maximal total |r|.
 */
export function matchSourcesToComponents(sourceMaps: readonly ArrayLike<number>[], mixing: Float64Array, nChannels: number, nComponents: number): SourceMatch[] {
  const ns = sourceMaps.length;
  const absR = new Float64Array(ns * nComponents);
  const col = new Float64Array(nChannels);
  for (let j = 0; j < nComponents; j++) {
    for (let c = 0; c < nChannels; c++) col[c] = mixing[c * nComponents + j];
    for (let s = 0; s < ns; s++) {
      const r = Math.abs(mapCorrelation(sourceMaps[s], col));
      absR[s * nComponents + j] = Number.isFinite(r) ? r : 0;
    }
  }
  const cost = absR.map((r) => 1 - r);
  const assign = hungarian(cost, ns, nComponents);
  return Array.from(assign, (j, s) => ({ component: j, r: j >= 0 ? absR[s * nComponents + j] : 0 }));
}
