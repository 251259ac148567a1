/**
 * The two or three evidence figures a tile shows, chosen by what the suggestion rests on, each with its
 * unit. Pure: the tile only renders the list.
 */
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import type { SuggestionWithRules } from '../../core/review/suggest.ts';
import { formatNumber } from '../plots/format-number.ts';

export interface TileFigure {
  readonly label: string;
  /** Formatted value with its unit. */
  readonly value: string;
  /** What the number is, for the tooltip. */
  readonly title: string;
}

// A non-breaking space keeps "%" on the line of its number; no negative zeros (plots/format-number.ts).
const pct = (x: number) => (Number.isFinite(x) ? `${formatNumber(100 * x, Math.abs(x) < 0.01 ? 2 : Math.abs(x) < 0.1 ? 1 : 0)}\u00a0%` : 'n/a');
const num = (x: number, digits = 2) => formatNumber(x, digits);

/** Every figure the tile knows how to show, keyed by a short id. */
export function allTileFigures(e: ComponentEvidence): Record<string, TileFigure> {
  const eog = Math.max(e.eogCorrelation.vertical ?? 0, e.eogCorrelation.horizontal ?? 0);
  return {
    eog: { label: 'EOG |r|', value: e.eogCorrelation.source === 'none' ? 'n/a' : num(eog), title: `Largest |Pearson r| with the EOG (${e.eogCorrelation.source}), unitless` },
    frontal: { label: 'frontal', value: `${num(e.frontalGradient, 1)}×`, title: 'Mean |weight| at frontal-pole sites ÷ mean elsewhere (ratio)' },
    hf: { label: '20 Hz+ share', value: pct(e.highFrequencyShare), title: 'Band power 20 Hz to line−2 Hz over 2 Hz to line−2 Hz (% of power)' },
    line: { label: 'line share', value: pct(e.mainsShare), title: 'Power within ±1 Hz of the line frequency and harmonics (% of 1 Hz–fmax power)' },
    focal: { label: 'one electrode', value: pct(e.focality.share), title: `Share of map energy on ${e.focality.channel} (%)` },
    cardiac: { label: 'beat', value: e.cardiac.bpm === null ? 'none' : `${e.cardiac.bpm.toFixed(0)} bpm`, title: `Autocorrelation peak ${num(e.cardiac.peak)} at the beat interval (beats per minute)` },
    kurtosis: { label: 'kurtosis', value: num(e.kurtosis, 1), title: 'Excess kurtosis of the activation (0 for Gaussian), unitless' },
    // Not the evidence table's "Time-locking" (the locked share above shuffled event times): the share of the
    // trials' variance in their average, which cannot be negative (an estimate below 0 shows as 0).
    locked: { label: 'phase-locked', value: e.erp ? pct(Math.max(0, e.erp.lockedShare)) : 'n/a', title: 'Share of single-trial variance phase-locked to the events (%); not the time-locking above chance of the evidence table' },
    rv: { label: 'dipole RV', value: e.dipole ? pct(e.dipole.residualVariance) : 'n/a', title: 'Residual variance of the single-dipole fit (%), a model estimate' },
    alpha: { label: 'alpha', value: e.alphaPeakHz === null ? 'none' : `${e.alphaPeakHz.toFixed(1)} Hz`, title: 'Alpha peak frequency above the 1/f fit (Hz)' },
    slope: { label: 'exponent', value: num(e.oneOverF.exponent, 2), title: '1/f exponent χ in P ∝ f^−χ, unitless' },
    step: { label: 'step-locked', value: e.stepLocking ? pct(e.stepLocking.share) : 'n/a', title: 'Share of activity phase-locked to step events (%)' },
  };
}

const BY_REASON: Record<string, readonly string[]> = {
  blink: ['eog', 'frontal', 'kurtosis'],
  'gaze': ['eog', 'frontal', 'kurtosis'],
  muscle: ['hf', 'slope', 'rv'],
  cardiac: ['cardiac', 'rv', 'kurtosis'],
  'mains': ['line', 'focal', 'hf'],
  contact: ['focal', 'rv', 'slope'],
  movement: ['step', 'hf', 'rv'],
  neural: ['rv', 'alpha', 'locked'],
  mixed: ['rv', 'eog', 'hf'],
  unclear: ['rv', 'eog', 'hf'],
};

/** Three figures for the tile, chosen by the suggested reason (selectSuggestion: current aim and thresholds). */
export function tileFigures(e: ComponentEvidence, suggestion: SuggestionWithRules | null): TileFigure[] {
  const all = allTileFigures(e);
  const ids = BY_REASON[suggestion?.suggestion.reason ?? 'unclear'] ?? BY_REASON.unclear;
  return ids.map((id) => all[id]);
}

export const formatPercent = pct;
