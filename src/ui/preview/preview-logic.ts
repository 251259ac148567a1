/**
 * Plain functions behind the before/after preview: which components are removed, the default region of
 * interest and event, the channels shown, and the region's spectra before/after in the shown window.
 */
import type { RecordingEvent } from '../../core/recording.ts';
import type { ReviewDecision } from '../../core/review/decisions-file.ts';
import type { Aim } from '../../core/review/vocabulary.ts';
import { defaultEpochEvent } from '../../core/evidence/compute-evidence.ts';
import { parseSelectionKey, selectEvents } from '../../core/evidence/event-selection.ts';
import { bandPower, createWelchPlan, welchFrequencies, welchPsd, welchSegmentLength } from '../../core/signal/welch.ts';

/** 0-based indices of the components whose verdict is remove (decisions are keyed 1-based). */
export function removedSetFromDecisions(decisions: Readonly<Record<number, ReviewDecision>>, nComponents: number): Set<number> {
  const out = new Set<number>();
  for (const [key, d] of Object.entries(decisions)) {
    const i = Number(key) - 1;
    if (d.verdict === 'remove' && Number.isInteger(i) && i >= 0 && i < nComponents) out.add(i);
  }
  return out;
}

/**
 * Region-of-interest channel candidates per aim, first match wins in each group (common practice: ERP
 * components such as the P300 are measured over centro-parietal midline sites; posterior alpha over
 * parieto-occipital sites; docs/methods.md §3 and §5 name these sites as typical). Up to three channels are taken.
 */
const ROI_CANDIDATES: Record<Aim, readonly string[]> = {
  erp: ['Pz', 'CPz', 'Cz', 'P3', 'P4', 'POz'],
  oscillations: ['Oz', 'POz', 'O1', 'O2', 'Pz', 'PO3', 'PO4'],
  conservative: ['Pz', 'CPz', 'Cz', 'P3', 'P4', 'POz'],
};

/**
 * Decomposition channel indices for the region: the store's chosen labels when given (unknown labels are
 * skipped), else the aim's defaults present in the montage, else the first channel.
 */
export function regionChannels(aim: Aim, chosen: readonly string[], labels: readonly string[], present?: ArrayLike<number>): number[] {
  const lower = labels.map((l) => l.trim().toLowerCase());
  const usable = (c: number) => c >= 0 && (!present || present[c] >= 0);
  const find = (names: readonly string[]) => names.map((l) => lower.indexOf(l.trim().toLowerCase())).filter(usable);
  const fromStore = find(chosen);
  if (fromStore.length) return [...new Set(fromStore)];
  const defaults = find(ROI_CANDIDATES[aim]).slice(0, 3);
  if (defaults.length) return defaults;
  for (let c = 0; c < labels.length; c++) if (usable(c)) return [c];
  return [];
}

/**
 * The event epoched by default: the evidence's own choice (the most frequent trial_type,
 * step events excluded; src/core/evidence/compute-evidence.ts), so the preview's ERP uses the same epochs
 * as the focus view. EDF+D boundaries are ignored. Null when there is none.
 */
export function defaultEventLabel(events: readonly RecordingEvent[]): string | null {
  return defaultEpochEvent(events.filter((e) => e.source !== 'boundary'));
}

/** Onsets (s) of the events chosen by `label`: a trial_type or a selectionKey with column filters (event-selection.ts). */
export function eventOnsets(events: readonly RecordingEvent[], label: string | null): number[] {
  if (label === null) return [];
  return selectEvents(events, parseSelectionKey(label)).map((e) => e.onset);
}

export interface RegionSpectra {
  readonly frequencies: Float64Array;
  readonly before: Float64Array;
  readonly after: Float64Array;
  readonly df: number;
}

/**
 * Welch PSD (src/core/signal/welch.ts: Hann, 50 % overlap, power-of-two segments of about 2 s, or shorter
 * for a short window) of the region's mean signal before and after cleaning, µV²/Hz.
 */
export function regionSpectra(before: Float64Array, after: Float64Array, sampleRate: number): RegionSpectra {
  const nfft = welchSegmentLength(sampleRate, before.length);
  const plan = createWelchPlan(nfft);
  return {
    frequencies: welchFrequencies(plan, sampleRate),
    before: welchPsd(plan, before, sampleRate),
    after: welchPsd(plan, after, sampleRate),
    df: sampleRate / nfft,
  };
}

/** Band power (µV²) in [lo, hi] Hz of both spectra (inclusive edges, docs/methods.md §4). */
export function regionBandPower(s: RegionSpectra, bandHz: readonly [number, number]): { before: number; after: number } {
  return { before: bandPower(s.before, s.df, bandHz[0], bandHz[1]), after: bandPower(s.after, s.df, bandHz[0], bandHz[1]) };
}

/** A number with two decimals for display and for the e2e hooks; "n/a" when not finite. */
export function formatValue(v: number, digits = 2): string {
  return Number.isFinite(v) ? v.toFixed(digits) : 'n/a';
}

/** The first `max` decomposition channels present in the recording (the default trace selection). */
export function defaultTraceChannels(rows: ArrayLike<number>, max = 16): number[] {
  const out: number[] = [];
  for (let c = 0; c < rows.length && out.length < max; c++) if (rows[c] >= 0) out.push(c);
  return out;
}

/**
 * The verdict the preview strip's toggle sets: a removed component is restored as keep (the reviewer has
 * watched the cleaned signal and chose to keep it); any other is removed.
 */
export function stripToggleVerdict(current: ReviewDecision['verdict']): ReviewDecision['verdict'] {
  return current === 'remove' ? 'keep' : 'remove';
}

/**
 * The component a key moves the preview strip's focus to (1-based), or null when the key is not the strip's:
 * ←/↑ previous, →/↓ next (stopping at the ends), Home first, End last (WAI-ARIA Authoring Practices Guide 1.2,
 * "Toolbar" pattern, keyboard interaction).
 */
export function stripFocusTarget(key: string, current: number, nComponents: number): number | null {
  if (nComponents < 1) return null;
  switch (key) {
    case 'ArrowLeft': case 'ArrowUp': return Math.max(1, current - 1);
    case 'ArrowRight': case 'ArrowDown': return Math.min(nComponents, current + 1);
    case 'Home': return 1;
    case 'End': return nComponents;
    default: return null;
  }
}
