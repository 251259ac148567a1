import { describe, expect, it } from 'vitest';
import { hungarian, mapCorrelation, matchSourcesToComponents } from '../../../src/core/validate/match.ts';

/** Smallest total cost by trying every assignment (the definition of the assignment problem; for checking). */
function bruteForce(cost: number[], n: number, m: number): number {
  let best = Infinity;
  const used = new Array(m).fill(false);
  const go = (i: number, acc: number) => {
    if (i === n) return void (best = Math.min(best, acc));
    for (let j = 0; j < m; j++) {
      if (used[j]) continue;
      used[j] = true;
      go(i + 1, acc + cost[i * m + j]);
      used[j] = false;
    }
  };
  go(0, 0);
  return best;
}

describe('Hungarian assignment (Kuhn 1955; Munkres 1957)', () => {
  it('solves the worked example of the scipy.optimize.linear_sum_assignment documentation (total 5)', () => {
    // cost = [[4, 1, 3], [2, 0, 5], [3, 2, 2]] → columns [1, 0, 2], total cost 5 (SciPy reference manual example).
    const a = hungarian([4, 1, 3, 2, 0, 5, 3, 2, 2], 3, 3);
    expect(Array.from(a)).toEqual([1, 0, 2]);
  });

  it('reaches the brute-force optimum on random square and rectangular matrices (the problem’s definition)', () => {
    let s = 7;
    const rand = () => ((s = (1103515245 * s + 12345) >>> 0) / 2 ** 32);
    for (let trial = 0; trial < 40; trial++) {
      const n = 1 + (trial % 5);
      const m = n + (trial % 3);
      const cost = Array.from({ length: n * m }, rand);
      const a = hungarian(cost, n, m);
      expect(new Set(a).size).toBe(n);
      const total = Array.from(a).reduce((acc, j, i) => acc + cost[i * m + j], 0);
      expect(total).toBeCloseTo(bruteForce(cost, n, m), 12);
      // more rows than columns: the transpose is solved, surplus rows get −1
      const t = hungarian(Array.from({ length: m * n }, (_, k) => cost[(k % n) * m + Math.floor(k / n)]), m, n);
      expect(Array.from(t).filter((j) => j < 0).length).toBe(m - n);
    }
  });

  it('matches maps by |r| whatever their sign and scale (Pearson r, handbook definition)', () => {
    const maps = [
      [1, 0, 0, -1],
      [0, 1, -1, 0],
    ];
    // mixing 4 × 3 (row-major): column 0 ≈ −2 × map 1, column 2 ≈ 3 × map 0, column 1 unrelated
    const cols = [
      [0.1, -2, 2, -0.1],
      [0.5, 0.4, 0.6, -1.5],
      [3, 0.1, 0, -3],
    ];
    const mixing = Float64Array.from({ length: 12 }, (_, k) => cols[k % 3][Math.floor(k / 3)]);
    const m = matchSourcesToComponents(maps, mixing, 4, 3);
    expect(m.map((x) => x.component)).toEqual([2, 0]);
    expect(m[0].r).toBeGreaterThan(0.99);
    expect(mapCorrelation([1, 2, 3], [2, 4, 6])).toBeCloseTo(1, 12);
    expect(mapCorrelation([1, 2, 3], [3, 2, 1])).toBeCloseTo(-1, 12);
  });
});
