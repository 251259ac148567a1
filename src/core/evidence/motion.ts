/**
 * Motion evidence for mobile recordings (issue 6): the share of a component's activity that is
 * phase-locked to step (heel-strike) events. Gait-related artifacts repeat with every step; brain
 * activity is not locked to steps at this strength (common practice).
 */
import { extractEpochs } from '../signal/epochs.ts';
import { lockedShare } from './time-locking.ts';
import { STEP_EVENT_PATTERN, eventFactors, eventGroupName, type SelectableEvent } from './event-selection.ts';

export { STEP_EVENT_PATTERN };

/** Window around each step, s: shorter than a typical step interval (~0.5 s; common practice). */
export const STEP_WINDOW_S: readonly [number, number] = [-0.1, 0.4];

/**
 * Locked share (time-locking.ts `lockedShare`) of `x` around `onsetsS`; null with < 10 usable steps.
 * Call it per step label: a lead bundle swinging one way after left steps and the other way after right
 * steps cancels when both feet are averaged together.
 */
export function stepLockedShare(x: Float32Array | Float64Array, fs: number, onsetsS: readonly number[]): { share: number; nEpochs: number } | null {
  const ep = extractEpochs(x, fs, onsetsS, STEP_WINDOW_S[0], STEP_WINDOW_S[1], null);
  if (ep.nEpochs < 10) return null;
  return { share: lockedShare(x, ep.eventSamples, ep.firstOffset, ep.length), nEpochs: ep.nEpochs };
}

/**
 * Step locking over step events grouped by type and factor columns (event-selection.ts; e.g. "step, foot
 * left" and "step, foot right" from a foot column): the largest locked share among the groups with at
 * least 10 usable steps, or null.
 */
export function stepLocking(
  x: Float32Array | Float64Array,
  fs: number,
  steps: readonly SelectableEvent[],
): { share: number; nEpochs: number; event: string } | null {
  const byLabel = new Map<string, number[]>();
  const stepsOnly = steps.filter((s) => STEP_EVENT_PATTERN.test(s.label));
  const factors = eventFactors(stepsOnly).map((f) => f.column);
  for (const s of stepsOnly) {
    const key = eventGroupName(s, factors);
    const list = byLabel.get(key) ?? [];
    list.push(s.onset);
    byLabel.set(key, list);
  }
  let best: { share: number; nEpochs: number; event: string } | null = null;
  for (const [label, onsets] of byLabel) {
    const r = stepLockedShare(x, fs, onsets);
    if (r && Number.isFinite(r.share) && (!best || r.share > best.share)) best = { ...r, event: label };
  }
  return best;
}
