/**
 * The review's own words, shared by the evidence code, the suggestion rules, the workbench and the CLI.
 * Import them from here (src/core/evidence/types.ts re-exports them for convenience).
 */

/**
 * What the researcher will do with the cleaned data; the suggestion rules differ per aim.
 * - `erp`: event-related averages (activity that is not time-locked averages out).
 * - `oscillations`: induced spectral power (anything with power in the analysed bands matters).
 * - `conservative`: remove only the unmistakable.
 */
export type Aim = 'erp' | 'oscillations' | 'conservative';

export const AIMS: readonly Aim[] = ['erp', 'oscillations', 'conservative'];

/** A reviewer's (or a suggestion's) decision for one component. */
export type Verdict = 'keep' | 'remove' | 'undecided';

export const VERDICTS: readonly Verdict[] = ['keep', 'remove', 'undecided'];

/**
 * The most likely origin of a component, as a short code, in the order the workbench shows them:
 * blink; gaze (lateral or vertical eye movement); muscle; cardiac; contact (a poor or loose electrode contact);
 * mains (power-line interference); movement (cable or gait motion); neural; mixed; unclear.
 */
export type ReasonCode =
  | 'blink'
  | 'gaze'
  | 'muscle'
  | 'cardiac'
  | 'contact'
  | 'mains'
  | 'movement'
  | 'neural'
  | 'mixed'
  | 'unclear';

export const REASON_CODES: readonly ReasonCode[] = [
  'blink',
  'gaze',
  'muscle',
  'cardiac',
  'contact',
  'mains',
  'movement',
  'neural',
  'mixed',
  'unclear',
];

/** Reason codes of `winnow-decisions/1` files and what they are called now. */
export const LEGACY_REASON_CODES: Readonly<Record<string, ReasonCode>> = {
  'eye-movement': 'gaze',
  'line-noise': 'mains',
  electrode: 'contact',
  motion: 'movement',
};

/**
 * A suggested verdict with its reasoning. The suggestion never decides: `because` lists the evidence
 * sentences, each with its numbers (e.g. "map 71 % frontal, falls off posteriorly",
 * "r = 0.93 with vertical EOG"), in the order they weighed.
 */
export interface Suggestion {
  readonly verdict: Verdict;
  readonly reason: ReasonCode;
  readonly because: readonly string[];
}
