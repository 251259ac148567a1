/** Seeded random back-projection problems shared by the preview-projection and region-erp tests. */

/** Seeded LCG (Numerical Recipes constants) so every run sees the same data. */
export function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  };
}

export function randomProblem(n: number, k: number, L: number, seed: number) {
  const r = lcg(seed);
  const X = Float32Array.from({ length: n * L }, () => 40 * r());
  const W = Float64Array.from({ length: k * n }, () => r());
  const A = Float64Array.from({ length: n * k }, () => r());
  const m = Float64Array.from({ length: n }, () => 5 * r());
  return { X, W, A, m };
}
