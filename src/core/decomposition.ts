/**
 * An ICA decomposition of a recording: X_c ≈ A S, S = W X_c (docs/methods.md §6–7). `mixing` is channels ×
 * components (column i = scalp map of component i), `unmixing` components × channels, both row-major
 * Float64Array. Components are ordered by variance accounted for (largest first).
 */
export type DecompositionMethod = 'infomax' | 'picard' | 'imported';

export interface DecompositionPreprocessing {
  /** e.g. "high-pass 1 Hz, windowed-sinc FIR (Hamming), zero phase". */
  readonly filter: string;
  readonly highpassHz: number | null;
  readonly lowpassHz: number | null;
  /** e.g. "average" or "as recorded". */
  readonly reference: string;
  readonly excludedChannels: readonly string[];
}

export interface Decomposition {
  readonly channels: readonly string[];
  readonly nChannels: number;
  readonly nComponents: number;
  /** nChannels × nComponents, row-major. */
  readonly mixing: Float64Array;
  /** nComponents × nChannels, row-major. */
  readonly unmixing: Float64Array;
  /** Channel means removed before unmixing (length nChannels), or null when the data were used as is. */
  readonly channelMeans: Float64Array | null;
  readonly method: DecompositionMethod;
  readonly rank: number;
  readonly iterations: number;
  readonly converged: boolean;
  readonly preprocessing: DecompositionPreprocessing;
  readonly recordingSha256: string;
  /** Seed of the run's randomness, when known (computed here, or recorded in the file read). */
  readonly seed?: number;
}
