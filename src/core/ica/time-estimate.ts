/**
 * How long a decomposition of the loaded recording will take, from a short timed run of the same method
 * on its first seconds. Every stage of the pipeline (decompose.ts: filtering, covariance, whitening and each
 * solver iteration) costs time proportional to the number of samples for a fixed channel count, and the
 * number of iterations to convergence depends mostly on the sources' statistics rather than on the length
 * (ours, an approximation: a longer recording may need somewhat more or fewer iterations), so the full run
 * takes about measured × (full samples / sampled samples). A timing run stopped at its iteration cap gives
 * a lower bound.
 */
import type { DecomposeInput } from './decompose.ts';

/** The first `seconds` of the recording (all of it when shorter), a channel-major copy with its boundaries. */
export function timingSlice(input: DecomposeInput, seconds = 30): DecomposeInput {
  const L = Math.min(input.nSamples, Math.max(1, Math.round(seconds * input.sampleRate)));
  if (L === input.nSamples) return input;
  const data = new Float32Array(input.nChannels * L);
  for (let c = 0; c < input.nChannels; c++) data.set(input.data.subarray(c * input.nSamples, c * input.nSamples + L), c * L);
  return { ...input, data, nSamples: L, boundaries: input.boundaries?.filter((b) => b < L) };
}

export interface TimeEstimate {
  /** Estimated seconds for the whole recording. */
  readonly seconds: number;
  /** True when the timing run stopped at its iteration cap: the full run takes at least this long. */
  readonly atLeast: boolean;
}

/** Scales a timed run on `sampledSamples` to `fullSamples` (see the module comment). */
export function estimateFullSeconds(measuredSeconds: number, sampledSamples: number, fullSamples: number, capped: boolean): TimeEstimate {
  const ratio = sampledSamples > 0 ? Math.max(1, fullSamples / sampledSamples) : 1;
  return { seconds: measuredSeconds * ratio, atLeast: capped };
}

/** "about 40 s", "about 3 min", "at least 12 min" (rounded to a figure a reader can plan with). */
export function formatEstimate(e: TimeEstimate): string {
  const s = e.seconds;
  const text = s < 1 ? 'under 1 s' : s < 60 ? `${s < 10 ? Math.round(s) : Math.round(s / 5) * 5} s` : s < 3600 ? `${Math.round(s / 60)} min` : `${(s / 3600).toFixed(1)} h`;
  if (s < 1) return e.atLeast ? 'at least 1 s' : text;
  return `${e.atLeast ? 'at least' : 'about'} ${text}`;
}
