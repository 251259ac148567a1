/**
 * Progress of an iterative ICA run that never runs backwards, with a time estimate that does not swing
 * (issue 12; ours, docs/methods.md §7.7):
 *   - convergence model: the solver's measure c falls roughly geometrically; with c* the smallest value so
 *     far, the part done is p_c = (log c₀ − log c*)/(log c₀ − log tol) (clipped to [0, 1]); the part of the
 *     iteration budget used, it/maxIter, is a floor; the fraction reported is the running maximum of both;
 *   - time left = (iterations left) × (seconds per iteration, exponential moving average of weight 0.2);
 *     iterations left = (log c* − log tol) / (average decline of log c* per iteration since the start), capped
 *     by the budget: c* never rises, so a measure that oscillates does not swing the estimate; the estimate
 *     then moves at most halfway towards each new value.
 */
export interface IcaProgressModel {
  /** Records iteration `it` (1-based) finished at `seconds` since the start with measure `conv`. */
  update(it: number, conv: number, tol: number, seconds: number): void;
  /** Fraction of the ICA done, in [0, 1], never decreasing. */
  readonly fraction: number;
  /** Seconds left, or null before two iterations. */
  readonly etaSeconds: number | null;
}

const WEIGHT = 0.2;

export function createIcaProgressModel(maxIter: number): IcaProgressModel {
  let fraction = 0;
  let eta: number | null = null;
  let logC0 = NaN;
  let best = Infinity;
  let lastIt = 0;
  let lastT = 0;
  let perIter = NaN;
  return {
    get fraction() {
      return fraction;
    },
    get etaSeconds() {
      return eta;
    },
    update(it, conv, tol, seconds) {
      const logC = Math.log10(Math.max(conv, 1e-300));
      const logTol = Math.log10(Math.max(tol, 1e-300));
      if (!Number.isFinite(logC0)) logC0 = Math.max(logC, logTol + 1e-9);
      const span = logC0 - logTol;
      best = Math.min(best, logC);
      const pc = span > 0 ? Math.min(1, Math.max(0, (logC0 - best) / span)) : 1;
      fraction = Math.max(fraction, Math.min(1, Math.max(pc, it / maxIter)));
      const dIt = it - lastIt;
      if (lastIt > 0 && dIt > 0) {
        const cost = (seconds - lastT) / dIt;
        perIter = Number.isFinite(perIter) ? (1 - WEIGHT) * perIter + WEIGHT * cost : cost;
        const decline = (logC0 - best) / it;
        const budget = Math.max(0, maxIter - it);
        const left = decline > 0 ? Math.min(budget, Math.max(0, (best - logTol) / decline)) : budget;
        const fresh = left * perIter;
        const aged = eta === null ? fresh : Math.max(0, eta - (seconds - lastT));
        eta = eta === null ? fresh : aged + 0.5 * (fresh - aged);
      } else if (lastIt === 0) {
        perIter = seconds / Math.max(1, it);
      }
      lastIt = it;
      lastT = seconds;
    },
  };
}
