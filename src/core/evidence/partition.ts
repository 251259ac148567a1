/**
 * Splitting one evidence job across workers and joining the parts. Every per-component number depends only
 * on that component (the permutation test's seed is derived from the global component index), so the
 * joined result equals a single run over all components.
 */
import type { EvidenceResult } from './compute-evidence.ts';

/**
 * Contiguous 0-based [start, end) ranges covering `nComponents` in `parts` nearly equal pieces (the first
 * ones one larger when it does not divide); empty ranges are dropped.
 */
export function splitComponentRanges(nComponents: number, parts: number): [number, number][] {
  const p = Math.max(1, Math.min(Math.floor(parts), nComponents));
  const out: [number, number][] = [];
  let start = 0;
  for (let i = 0; i < p; i++) {
    const size = Math.floor(nComponents / p) + (i < nComponents % p ? 1 : 0);
    if (size > 0) out.push([start, start + size]);
    start += size;
  }
  return out;
}

/**
 * Joins partial results: components in index order, warnings without repeats, timings per stage as the
 * slowest part (the parts ran in parallel) plus `cpu` = the summed total.
 */
export function mergeEvidenceResults(parts: readonly EvidenceResult[]): EvidenceResult {
  const components = parts.flatMap((p) => p.components).sort((a, b) => a.index - b.index);
  const warnings = [...new Set(parts.flatMap((p) => p.warnings))];
  const timings: Record<string, number> = {};
  let cpu = 0;
  for (const p of parts) {
    for (const [k, v] of Object.entries(p.timings)) timings[k] = Math.max(timings[k] ?? 0, v);
    cpu += p.timings.total ?? 0;
  }
  timings.cpu = cpu;
  return { components, timings, warnings, epochEvent: parts[0]?.epochEvent ?? null };
}
