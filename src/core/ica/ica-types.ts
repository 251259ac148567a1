/** Shared types of the ICA solvers (infomax.ts, picard.ts). */

/**
 * Hooks a solver calls while it runs: `iteration` after each completed iteration (1-based) with the
 * convergence measure the solver stops on, and `poll` every few thousand samples inside an iteration so a
 * caller can report progress and cancel: returning true stops the solver with a cancellation error.
 */
export interface IcaMonitor {
  iteration?(iteration: number, convergence: number, tolerance: number): void;
  poll?(): boolean;
}

export interface IcaResult {
  /** k × k row-major unmixing in the whitened space: Y = W Z. */
  readonly W: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  /** Final value of the convergence measure (solver-specific; see each solver's doc). */
  readonly convergence: number;
  /** +1 super-Gaussian, −1 sub-Gaussian density chosen for each output row at the end. */
  readonly signs: Int8Array;
  readonly warnings: string[];
}

/** Thrown (as a plain Error named 'AbortError') when a monitor's poll asks to stop. */
export function cancellationError(): Error {
  const e = new Error('decomposition cancelled');
  e.name = 'AbortError';
  return e;
}
