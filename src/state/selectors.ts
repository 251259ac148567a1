/**
 * Derived values, never stored. Selectors returning arrays or objects must be used with `useShallow`
 * (or memoised by the caller): they build a new value on each call.
 */
import { UNDECIDED } from '../core/review/decisions-file.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import { suggestWithRules, type SuggestionWithRules } from '../core/review/suggest.ts';
import { resolveThresholds, type Thresholds } from '../core/review/thresholds.ts';
import type { Aim } from '../core/review/vocabulary.ts';
import type { ReviewDecision, WorkbenchState } from './types.ts';

export const selectRecording = (s: WorkbenchState) => s.recording;
export const selectDecomposition = (s: WorkbenchState) => s.decomposition;
export const selectEvidence = (s: WorkbenchState) => s.evidence;
export const selectAim = (s: WorkbenchState) => s.aim;
export const selectDecisions = (s: WorkbenchState) => s.decisions;
export const selectSelected = (s: WorkbenchState) => s.selected;
export const selectScreen = (s: WorkbenchState) => s.screen;
export const selectRoi = (s: WorkbenchState) => s.roi;
export const selectProgress = (s: WorkbenchState) => s.progress;

/** Number of components (0 before a decomposition is loaded). */
export const selectComponentCount = (s: WorkbenchState) => s.decomposition?.nComponents ?? 0;

/** The decision of a 1-based component (undecided when none was made). Stable object per index. */
export const selectDecision = (index: number) => (s: WorkbenchState): ReviewDecision => s.decisions[index] ?? UNDECIDED;

/** The evidence of a 1-based component, or null. */
export const selectComponentEvidence = (index: number) => (s: WorkbenchState) =>
  s.evidence?.find((e) => e.index === index) ?? null;

/**
 * 1-based indices of the components marked remove, ascending. The reference changes only when decisions
 * change, so this may be used without useShallow when the caller memoises on `decisions`.
 */
export const selectRemovedIndices = (s: WorkbenchState): number[] => {
  const out: number[] = [];
  for (const [k, d] of Object.entries(s.decisions)) if (d.verdict === 'remove') out.push(Number(k));
  return out.sort((a, b) => a - b);
};

/** 1-based indices still undecided (no verdict yet), ascending. */
export const selectUndecidedIndices = (s: WorkbenchState): number[] => {
  const n = selectComponentCount(s);
  const out: number[] = [];
  for (let i = 1; i <= n; i++) if ((s.decisions[i]?.verdict ?? 'undecided') === 'undecided') out.push(i);
  return out;
};

/** Components with a keep or remove verdict. */
export const selectDecidedCount = (s: WorkbenchState): number => {
  const n = selectComponentCount(s);
  let c = 0;
  for (const [k, d] of Object.entries(s.decisions)) if (d.verdict !== 'undecided' && Number(k) <= n) c++;
  return c;
};

export const selectCanUndo = (s: WorkbenchState) => s.past.length > 0;
export const selectCanRedo = (s: WorkbenchState) => s.future.length > 0;

const positionsCache = new WeakMap<object, { recording: object; positions: Float64Array }>();

/**
 * Electrode unit vectors (n×3, RAS, row-major) for the decomposition's channels, taken from the recording's
 * positions by label; NaN rows for channels without a position. Cached per decomposition, so the array is
 * stable (the topography plans are cached by its identity). Null before both are loaded or without positions.
 */
export const selectDecompositionPositions = (s: WorkbenchState): Float64Array | null => {
  const { recording, decomposition } = s;
  if (!recording || !decomposition || !recording.positions) return null;
  const hit = positionsCache.get(decomposition);
  if (hit && hit.recording === recording) return hit.positions;
  const rowOf = new Map(recording.signals.labels.map((l, i) => [l.toLowerCase(), i] as const));
  const out = new Float64Array(decomposition.nChannels * 3).fill(NaN);
  decomposition.channels.forEach((label, c) => {
    const r = rowOf.get(label.toLowerCase());
    if (r === undefined) return;
    for (let k = 0; k < 3; k++) out[c * 3 + k] = recording.positions![r * 3 + k];
  });
  positionsCache.set(decomposition, { recording, positions: out });
  return out;
};

/** The suggestions of every component for one aim and threshold table, by 1-based index. */
export type SuggestionMap = ReadonlyMap<number, SuggestionWithRules>;

const EMPTY_SUGGESTIONS: SuggestionMap = new Map();
let suggestionsMemo: { evidence: readonly ComponentEvidence[]; aim: Aim; thresholds: Partial<Thresholds>; map: SuggestionMap } | null = null;

/**
 * Pure: each component's suggestion with its fired rules (review/suggest.ts suggestWithRules) for `aim` and
 * the threshold overrides; no evidence is recomputed.
 */
export function suggestionsFor(evidence: readonly ComponentEvidence[] | null, aim: Aim, thresholds: Partial<Thresholds> = {}): SuggestionMap {
  if (!evidence) return EMPTY_SUGGESTIONS;
  const t = resolveThresholds(thresholds);
  return new Map(evidence.map((e) => [e.index, suggestWithRules(e, aim, t)] as const));
}

/**
 * Every component's suggestion for the current aim and thresholds, memoised on (evidence, aim, thresholds):
 * the same Map (and the same entries) until one of the three changes, so it may be used without useShallow.
 * Changing the aim or a threshold re-suggests at once (the rules are cheap); the evidence stays as it is.
 */
export const selectSuggestions = (s: WorkbenchState): SuggestionMap => {
  if (!s.evidence) return EMPTY_SUGGESTIONS;
  const thresholds = s.thresholds ?? {};
  const m = suggestionsMemo;
  if (m && m.evidence === s.evidence && m.aim === s.aim && m.thresholds === thresholds) return m.map;
  const map = suggestionsFor(s.evidence, s.aim, thresholds);
  suggestionsMemo = { evidence: s.evidence, aim: s.aim, thresholds, map };
  return map;
};

/** The suggestion (with fired rules) of a 1-based component for the current aim and thresholds, or null. */
export const selectSuggestion = (index: number) => (s: WorkbenchState): SuggestionWithRules | null => selectSuggestions(s).get(index) ?? null;
