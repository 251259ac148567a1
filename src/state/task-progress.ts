/**
 * Progress reporting for long steps: the estimated time left is the elapsed time scaled by the remaining
 * fraction (linear extrapolation), shown once 3 % is done so the first noisy ticks do not flash an ETA.
 */
import type { Progress } from './types.ts';

/** Seconds left at `fraction` done after `elapsedS` seconds, or null when too early to tell. */
export function estimateSecondsLeft(fraction: number, elapsedS: number): number | null {
  if (!(fraction >= 0.03) || !(fraction < 1) || !(elapsedS > 0)) return null;
  return (elapsedS * (1 - fraction)) / fraction;
}

/**
 * Builds a progress record for `task` from a start time (ms, performance.now()) and the fraction done; an
 * engine's own estimate of seconds left, when given, replaces the linear extrapolation.
 */
export function progressAt(task: string, fraction: number, startedMs: number, nowMs: number, cancel?: () => void, etaSeconds?: number | null): Progress {
  const f = Math.min(1, Math.max(0, Number.isFinite(fraction) ? fraction : 0));
  const eta = etaSeconds !== undefined && etaSeconds !== null && Number.isFinite(etaSeconds) ? Math.max(0, etaSeconds) : estimateSecondsLeft(f, (nowMs - startedMs) / 1000);
  return { task, fraction: f, etaSeconds: eta, ...(cancel ? { cancel } : {}) };
}
