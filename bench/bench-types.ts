/** One line of the `npm run bench` table. Ratios compare ours with a reference run in the same process run. */
export interface BenchRow {
  readonly area: string;
  readonly case: string;
  /** Our time in milliseconds (median of the repeats). */
  readonly oursMs: number;
  /** The reference implementation's time in ms, or null when it is unavailable here. */
  readonly referenceMs: number | null;
  /** What the reference is (e.g. "numpy FastICA, python3"), or why it is unavailable. */
  readonly reference: string;
  /** Any quality figure reached (e.g. "Amari 0.004"). */
  readonly note?: string;
}

export type BenchModule = { bench: () => Promise<BenchRow[]> };

/** Median wall time of `repeats` runs of `fn` after one warm-up, in ms. */
export async function medianMs(fn: () => unknown | Promise<unknown>, repeats = 5): Promise<number> {
  await fn();
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}
