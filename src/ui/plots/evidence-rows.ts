/**
 * The full evidence table of one component: every number with its unit and how it is computed. Nothing is
 * compared with a threshold here (issue 10 item 1): a row is marked when its measure appears among the rules
 * that fired for the current suggestion (review/suggest.ts suggestWithRules), and its threshold column then
 * shows that rule — value, direction, threshold and the threshold's source — exactly as the rule read it.
 * Pure: the table component only renders these rows.
 */
import { formatNumber } from './format-number.ts';
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import type { FiredRule, SuggestionWithRules } from '../../core/review/suggest.ts';

export interface EvidenceRow {
  readonly key: string;
  readonly label: string;
  /** Formatted value, or "n/a" when it could not be computed. */
  readonly value: string;
  readonly unit: string;
  /** The fired rules on this row's measure, e.g. "≥ 0.35 (ours)"; "" when no rule fired on it. */
  readonly threshold: string;
  /** How the value is computed (and, when a rule fired, where its threshold comes from). */
  readonly source: string;
  /** True when the current suggestion's fired rules include this row's measure. */
  readonly flagged: boolean;
  /** Those fired rules (empty when none). */
  readonly rules: readonly FiredRule[];
}

function num(v: number | null | undefined, digits = 2): string {
  return formatNumber(v, digits);
}

function pct(v: number | null | undefined, digits = 1): string {
  return v === null || v === undefined || !Number.isFinite(v) ? 'n/a' : formatNumber(v * 100, digits);
}

/** A threshold in the row's own unit: fractions shown as percentages where the value is. */
function ruleText(r: FiredRule, asPercent: boolean): string {
  const t = asPercent ? `${pct(r.threshold, 0)} %` : Number.isInteger(r.threshold) ? String(r.threshold) : String(Number(r.threshold.toFixed(3)));
  return `${r.direction} ${t} (${r.source})`;
}

const pValue = (p: number) => (!Number.isFinite(p) ? 'n/a' : p < 0.001 ? p.toExponential(1) : p.toFixed(3));

/**
 * Rows in reading order: size, spectrum, map, time course, events, dipole. `suggested` is the current
 * suggestion with its fired rules (selectSuggestion), or null: then no row is marked.
 */
export function evidenceRows(e: ComponentEvidence, suggested: SuggestionWithRules | null = null): EvidenceRow[] {
  const fired = suggested?.rules ?? [];
  const rows: EvidenceRow[] = [];
  /** `measures`: the evidence paths (FiredRule.measure) this row shows; `asPercent`: the value is a fraction shown in %. */
  const add = (r: Omit<EvidenceRow, 'threshold' | 'flagged' | 'rules'>, measures: readonly string[] = [], asPercent = false) => {
    const rules = fired.filter((f) => measures.includes(f.measure));
    // The same comparison can fire for two findings (e.g. low-frequency share for blink and gaze): shown once.
    const texts = [...new Set(rules.map((f) => ruleText(f, asPercent)))];
    rows.push({ ...r, threshold: texts.join('; '), flagged: rules.length > 0, rules });
  };
  add({ key: 'variance', label: 'Variance share', value: pct(e.varianceShare), unit: '%', source: 'Σ_c A[c,i]² var(s_i) / Σ_c var(x_c)' }, ['varianceShare'], true);
  add({ key: 'strongest', label: 'Strongest channel', value: e.strongestChannel.label, unit: '', source: 'largest |A[c,i]|; spectra, averages and trial stack are in µV there' });
  add(
    { key: 'exponent', label: '1/f exponent', value: num(e.oneOverF.exponent), unit: '', source: `log–log fit ${e.oneOverF.rangeHz[0]}–${e.oneOverF.rangeHz[1]} Hz (methods §2)` },
    ['oneOverF.exponent'],
  );
  add({ key: 'fitR2', label: '1/f fit R²', value: num(e.oneOverF.fitR2 ?? NaN), unit: '', source: 'R² of log power about the 1/f line outside 7–14 Hz (methods §3)' }, ['oneOverF.fitR2']);
  add({ key: 'alpha', label: 'Alpha peak', value: e.alphaPeakHz === null ? 'none' : num(e.alphaPeakHz, 1), unit: e.alphaPeakHz === null ? '' : 'Hz', source: 'largest local maximum in 7–14 Hz above the 1/f fit (methods §3)' });
  add({ key: 'alphaProminence', label: 'Alpha prominence', value: num(e.alphaProminence, 3), unit: 'log₁₀', source: 'height above the 1/f fit (methods §3)' }, ['alphaProminence']);
  add({ key: 'hf', label: 'High-frequency share', value: pct(e.highFrequencyShare), unit: '%', source: 'BP(20, line−2) / BP(2, line−2) Hz (methods §4)' }, ['highFrequencyShare'], true);
  add({ key: 'hfSlope', label: 'Slope above 20 Hz', value: num(e.highFrequencySlope), unit: 'log–log', source: 'log–log slope 20 Hz to line−2 Hz (methods §14)' }, ['highFrequencySlope']);
  add({ key: 'line', label: 'Mains share', value: pct(e.mainsShare), unit: '%', source: 'Σ_h BP(h·f0 ± 1 Hz) / BP(1, fmax) (methods §4)' }, ['mainsShare'], true);
  add({ key: 'linePeak', label: 'Line peak ratio', value: num(e.linePeakRatio, 1), unit: '×', source: 'P(f0) / median P in f0 ± 5 Hz (methods §4)' }, ['linePeakRatio']);
  add({ key: 'lf', label: 'Low-frequency share', value: pct(e.lowFrequencyShare), unit: '%', source: 'BP(1, 4) / BP(1, 45) Hz (methods §4)' }, ['lowFrequencyShare'], true);
  add({ key: 'frontal', label: 'Frontal gradient', value: num(e.frontalGradient), unit: '×', source: 'mean |a| at Fp/AF ÷ elsewhere (methods §14)' }, ['frontalGradient']);
  add({ key: 'frontalShare', label: 'Frontal share of map', value: pct(e.frontalShare), unit: '%', source: 'map energy in the front 20 % of the head' }, ['frontalShare'], true);
  add({ key: 'antisym', label: 'Left–right antisymmetry', value: num(e.lateralAntisymmetry), unit: '', source: 'mirror pairs, +1 antisymmetric (methods §14)' }, ['lateralAntisymmetry']);
  add({ key: 'focality', label: `Focality (${e.focality.channel})`, value: pct(e.focality.share), unit: '%', source: 'max a² / Σ a² (methods §14)' }, ['focality.share'], true);
  add({ key: 'kurtosis', label: 'Excess kurtosis', value: num(e.kurtosis, 1), unit: '', source: 'E[(s−μ)⁴]/σ⁴ − 3 of the activation' }, ['kurtosis']);
  add({ key: 'steps', label: 'Step-likeness', value: num(e.stepLikeness), unit: '', source: 'persistence of slow jumps (ours)' }, ['stepLikeness']);
  const eogSrc = `${e.eogCorrelation.source}`;
  add(
    { key: 'eogV', label: `|r| vertical EOG${e.eogCorrelation.channels.vertical ? ` (${e.eogCorrelation.channels.vertical})` : ''}`, value: num(e.eogCorrelation.vertical), unit: '', source: `Pearson r with ${eogSrc}` },
    ['eogCorrelation.vertical'],
  );
  add(
    { key: 'eogH', label: `|r| horizontal EOG${e.eogCorrelation.channels.horizontal ? ` (${e.eogCorrelation.channels.horizontal})` : ''}`, value: num(e.eogCorrelation.horizontal), unit: '', source: `Pearson r with ${eogSrc}` },
    ['eogCorrelation.horizontal'],
  );
  add(
    { key: 'cardiac', label: 'Cardiac periodicity', value: e.cardiac.bpm === null ? 'none' : `${num(e.cardiac.peak)} at ${num(e.cardiac.bpm, 0)} bpm`, unit: '', source: 'autocorrelation peak at 40–150 bpm (ours)' },
    ['cardiac.peak'],
  );
  if (e.stepLocking)
    add({ key: 'movement', label: `Step locking (${e.stepLocking.event})`, value: pct(e.stepLocking.share), unit: '%', source: `${e.stepLocking.nEpochs} step epochs (ours)` }, ['stepLocking.share'], true);
  if (e.erp) {
    const shuffles = e.erp.shuffles !== undefined ? `, ${e.erp.shuffles} shuffles` : '';
    add(
      {
        key: 'locking', label: `Time-locking (${e.erp.event})`, value: pct(e.erp.timeLockingStrength), unit: '%',
        source: `locked share above shuffled events, ${e.erp.nEpochs} epochs${e.erp.permutationP !== undefined ? `, p = ${pValue(e.erp.permutationP)}` : ''}${shuffles} (methods §5)`,
      },
      ['erp.timeLockingStrength', 'erp.permutationP'],
      true,
    );
    add({ key: 'itc', label: 'Inter-trial coherence', value: num(e.erp.itc), unit: '', source: `at ${num(e.erp.itcFrequencyHz, 1)} Hz` });
  }
  // Every other event type (and lock-column value): measures only, no rule reads them.
  for (const t of e.timeLocking ?? []) {
    if (e.erp && t.column === undefined && t.event === e.erp.event) continue;
    const what = t.column !== undefined ? `${t.event}, ${t.column} ${t.value}` : t.event;
    add({
      key: `locking:${what}`, label: `Time-locking (${what})`, value: pct(t.strength), unit: '%',
      source: `locked share above shuffled events, ${t.nEpochs} epochs, p = ${pValue(t.p)}, ${t.shuffles} shuffles (methods §5)`,
    });
  }
  if (e.dipole) {
    const [x, y, z] = e.dipole.position;
    add(
      { key: 'rv', label: 'Dipole residual variance', value: pct(e.dipole.residualVariance), unit: '%', source: 'single equivalent dipole, spherical model (methods §15)' },
      ['dipole.residualVariance'],
      true,
    );
    add(
      { key: 'depth', label: 'Dipole distance from centre', value: num(Math.hypot(x, y, z), 0), unit: 'mm', source: e.dipole.atBoundary ? 'the fit stopped at the brain boundary' : 'equivalent dipole fit (methods §15)' },
      ['dipole.distanceFromCentreMm', 'dipole.atBoundary'],
    );
    add({ key: 'region', label: 'Approximate region', value: e.dipole.region, unit: '', source: 'from the dipole position (approximate model estimate)' });
  }
  return rows;
}
