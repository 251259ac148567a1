/**
 * The full evidence table of one component: every number with its unit, the threshold the suggestion
 * rules compare it with (from the shared threshold table, src/core/review/thresholds.ts) and where the
 * number and its threshold come from. Pure: the table component only renders these rows.
 */
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import { defaultThresholds, type Thresholds } from '../../core/review/thresholds.ts';

export interface EvidenceRow {
  readonly key: string;
  readonly label: string;
  /** Formatted value, or "n/a" when it could not be computed. */
  readonly value: string;
  readonly unit: string;
  /** What the suggestion compares it with, e.g. "≥ 0.35 → muscle-like"; "" when no rule reads it. */
  readonly threshold: string;
  /** How the value is computed and where its threshold comes from. */
  readonly source: string;
  /** True when the value passes the threshold in the direction that points to an artifact sign. */
  readonly flagged: boolean;
}

function num(v: number | null | undefined, digits = 2): string {
  return v === null || v === undefined || !Number.isFinite(v) ? 'n/a' : v.toFixed(digits);
}

function pct(v: number | null | undefined, digits = 1): string {
  return v === null || v === undefined || !Number.isFinite(v) ? 'n/a' : (v * 100).toFixed(digits);
}

/** A threshold given as a fraction, written as a whole percentage with its unit. */
const pctU = (v: number) => `${pct(v, 0)} %`;

const ge = (v: number | null | undefined, t: number) => v !== null && v !== undefined && Number.isFinite(v) && v >= t;

/** Rows in reading order: size, spectrum, map, time course, events, dipole. */
export function evidenceRows(e: ComponentEvidence, t: Thresholds = defaultThresholds): EvidenceRow[] {
  const rows: EvidenceRow[] = [];
  const add = (r: EvidenceRow) => rows.push(r);
  add({ key: 'variance', label: 'Variance share', value: pct(e.varianceShare), unit: '%', threshold: '', source: 'Σ_c A[c,i]² var(s_i) / Σ_c var(x_c)', flagged: false });
  add({
    key: 'strongest', label: 'Strongest channel', value: e.strongestChannel.label, unit: '', threshold: '',
    source: 'largest |A[c,i]|; spectra, averages and trial stack are in µV there', flagged: false,
  });
  add({
    key: 'exponent', label: '1/f exponent', value: num(e.oneOverF.exponent), unit: '',
    threshold: `${t.neuralExponentMin}–${t.neuralExponentMax} brain-like`,
    source: `log–log fit ${e.oneOverF.rangeHz[0]}–${e.oneOverF.rangeHz[1]} Hz (methods §2); range: common practice`,
    flagged: false,
  });
  add({
    key: 'alpha', label: 'Alpha peak', value: e.alphaPeakHz === null ? 'none' : num(e.alphaPeakHz, 1), unit: e.alphaPeakHz === null ? '' : 'Hz',
    threshold: `prominence ≥ ${t.alphaProminence} log₁₀`, source: '7–14 Hz above the 1/f fit (methods §3)', flagged: false,
  });
  add({ key: 'alphaProminence', label: 'Alpha prominence', value: num(e.alphaProminence, 3), unit: 'log₁₀', threshold: `≥ ${t.alphaProminence}`, source: 'height above the 1/f fit (methods §3)', flagged: false });
  add({
    key: 'hf', label: 'High-frequency share', value: pct(e.highFrequencyShare), unit: '%',
    threshold: `≥ ${pctU(t.muscleHighFrequencyShare)} muscle-like (≥ ${pctU(t.muscleHighFrequencyShareStrong)} strong)`,
    source: 'BP(20, line−2) / BP(2, line−2) Hz (methods §4); threshold ours', flagged: ge(e.highFrequencyShare, t.muscleHighFrequencyShare),
  });
  add({
    key: 'hfSlope', label: 'Slope above 20 Hz', value: num(e.highFrequencySlope), unit: 'log–log',
    threshold: `≥ ${t.muscleSlope} flat or rising`, source: 'methods §14, common practice', flagged: ge(e.highFrequencySlope, t.muscleSlope),
  });
  add({
    key: 'line', label: 'Mains share', value: pct(e.mainsShare), unit: '%', threshold: `≥ ${pctU(t.mainsShare)}`,
    source: 'Σ_h BP(h·f0 ± 1 Hz) / BP(1, fmax) (methods §4); threshold ours', flagged: ge(e.mainsShare, t.mainsShare),
  });
  add({ key: 'linePeak', label: 'Line peak ratio', value: num(e.linePeakRatio, 1), unit: '×', threshold: '', source: 'P(f0) / median P in f0 ± 5 Hz (methods §4)', flagged: false });
  add({
    key: 'lf', label: 'Low-frequency share', value: pct(e.lowFrequencyShare), unit: '%', threshold: `≥ ${pctU(t.ocularLowFrequencyShare)} ocular-like`,
    source: 'BP(1, 4) / BP(1, 45) Hz (methods §4); threshold ours', flagged: ge(e.lowFrequencyShare, t.ocularLowFrequencyShare),
  });
  add({
    key: 'frontal', label: 'Frontal gradient', value: num(e.frontalGradient), unit: '×', threshold: `≥ ${t.blinkFrontalGradient} blink-like`,
    source: 'mean |a| at Fp/AF ÷ elsewhere (methods §14); threshold ours', flagged: ge(e.frontalGradient, t.blinkFrontalGradient),
  });
  add({ key: 'frontalShare', label: 'Frontal share of map', value: pct(e.frontalShare), unit: '%', threshold: '', source: 'map energy in the front 20 % of the head', flagged: false });
  add({
    key: 'antisym', label: 'Left–right antisymmetry', value: num(e.lateralAntisymmetry), unit: '', threshold: `≥ ${t.gazeAntisymmetry} gaze-like`,
    source: 'mirror pairs, +1 antisymmetric (methods §14); threshold ours', flagged: ge(e.lateralAntisymmetry, t.gazeAntisymmetry),
  });
  add({
    key: 'focality', label: `Focality (${e.focality.channel})`, value: pct(e.focality.share), unit: '%', threshold: `≥ ${pctU(t.electrodeFocality)} single electrode`,
    source: 'max a² / Σ a² (methods §14, common practice)', flagged: ge(e.focality.share, t.electrodeFocality),
  });
  add({
    key: 'kurtosis', label: 'Excess kurtosis', value: num(e.kurtosis, 1), unit: '', threshold: `≥ ${t.blinkKurtosis} blink-like`,
    source: 'E[(s−μ)⁴]/σ⁴ − 3 of the activation', flagged: ge(e.kurtosis, t.blinkKurtosis),
  });
  add({
    key: 'steps', label: 'Step-likeness', value: num(e.stepLikeness), unit: '', threshold: `≥ ${t.gazeStepLikeness} supports eye movement`,
    source: 'persistence of slow jumps (ours)', flagged: ge(e.stepLikeness, t.gazeStepLikeness),
  });
  const eogSrc = `${e.eogCorrelation.source}`;
  add({
    key: 'eogV', label: `|r| vertical EOG${e.eogCorrelation.channels.vertical ? ` (${e.eogCorrelation.channels.vertical})` : ''}`, value: num(e.eogCorrelation.vertical), unit: '',
    threshold: `≥ ${t.eogCorrelation} ocular`, source: `Pearson r with ${eogSrc}; threshold: common practice`, flagged: ge(e.eogCorrelation.vertical, t.eogCorrelation),
  });
  add({
    key: 'eogH', label: `|r| horizontal EOG${e.eogCorrelation.channels.horizontal ? ` (${e.eogCorrelation.channels.horizontal})` : ''}`, value: num(e.eogCorrelation.horizontal), unit: '',
    threshold: `≥ ${t.eogCorrelation} ocular`, source: `Pearson r with ${eogSrc}; threshold: common practice`, flagged: ge(e.eogCorrelation.horizontal, t.eogCorrelation),
  });
  add({
    key: 'cardiac', label: 'Cardiac periodicity', value: e.cardiac.bpm === null ? 'none' : `${num(e.cardiac.peak)} at ${num(e.cardiac.bpm, 0)} bpm`, unit: '',
    threshold: `≥ ${t.cardiacPeak}`, source: 'autocorrelation peak at 40–150 bpm (ours)', flagged: ge(e.cardiac.peak, t.cardiacPeak),
  });
  if (e.stepLocking) {
    add({
      key: 'movement', label: `Step locking (${e.stepLocking.event})`, value: pct(e.stepLocking.share), unit: '%', threshold: `≥ ${pctU(t.movementStepLocking)}`,
      source: `${e.stepLocking.nEpochs} step epochs (ours)`, flagged: ge(e.stepLocking.share, t.movementStepLocking),
    });
  }
  if (e.erp) {
    add({
      key: 'locking', label: `Time-locking (${e.erp.event})`, value: pct(e.erp.timeLockingStrength), unit: '%',
      threshold: `≥ ${pctU(t.timeLockingStrength)} with p ≤ ${t.timeLockingP}`,
      source: `locked share above shuffled events, ${e.erp.nEpochs} epochs${e.erp.permutationP !== undefined ? `, p = ${num(e.erp.permutationP, 3)}` : ''}`,
      flagged: false,
    });
    add({ key: 'itc', label: 'Inter-trial coherence', value: num(e.erp.itc), unit: '', threshold: '', source: `at ${num(e.erp.itcFrequencyHz, 1)} Hz`, flagged: false });
  }
  if (e.dipole) {
    add({
      key: 'rv', label: 'Dipole residual variance', value: pct(e.dipole.residualVariance), unit: '%', threshold: `≤ ${pctU(t.dipoleResidualVariance)} dipolar`,
      source: 'single equivalent dipole, spherical model (methods §15); level: common practice', flagged: !(e.dipole.residualVariance <= t.dipoleResidualVariance),
    });
    add({ key: 'region', label: 'Approximate region', value: e.dipole.region, unit: '', threshold: '', source: 'from the dipole position; a model estimate', flagged: false });
  }
  return rows;
}
