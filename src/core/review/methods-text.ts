/**
 * A short plain-text methods paragraph for a paper's methods section: how the decomposition was made, what
 * was removed, under which aim and with which suggestion thresholds. Plain text only (no markup).
 */
import type { Decomposition } from '../decomposition.ts';
import type { Aim, ReasonCode } from './vocabulary.ts';
import type { ReviewDecision } from './decisions-file.ts';
import type { Thresholds } from './thresholds.ts';
import type { FiredRule } from './suggest.ts';
import { thresholdChangesText } from './threshold-changes.ts';

export interface MethodsTextInput {
  readonly software: string;
  readonly recordingFileName: string;
  readonly recordingSha256: string;
  readonly decomposition: Pick<Decomposition, 'method' | 'nComponents' | 'nChannels' | 'rank' | 'converged' | 'iterations' | 'preprocessing' | 'seed'>;
  /** The recording's reference as its sidecars state it (channels.tsv `reference`, *_eeg.json EEGReference). */
  readonly recordingReference?: { readonly channels: string | null; readonly eegJson: string | null } | null;
  readonly aim: Aim;
  readonly decisions: Readonly<Record<number, ReviewDecision>>;
  /** Variance share (0…1) per 1-based component, when evidence was computed. */
  readonly varianceShare?: (index: number) => number | null;
  readonly thresholds: Thresholds;
  /** The rules that fired for the suggestion (suggestWithRules, same aim and thresholds) per 1-based component. */
  readonly firedRules?: (index: number) => readonly FiredRule[] | null;
  /** What the decomposition missed (review/residual.ts): one sentence with figures per warning. */
  readonly residualWarnings?: readonly string[];
}

const ruleFigure = (v: number) => (!Number.isFinite(v) ? 'n/a' : Math.abs(v) >= 100 ? v.toFixed(0) : String(Number(v.toPrecision(3))));

/** "focality.share 0.91 ≥ 0.6 (common practice)": the comparison exactly as the rule read it. */
export function firedRuleText(r: FiredRule): string {
  return `${r.measure} ${ruleFigure(r.value)} ${r.direction} ${ruleFigure(r.threshold)} (${r.source})`;
}

const METHOD_NAMES: Record<Decomposition['method'], string> = {
  infomax: 'extended Infomax independent component analysis',
  picard: 'independent component analysis with the Picard algorithm',
  imported: 'an independent component decomposition computed elsewhere and imported',
};

const AIM_PHRASES: Record<Aim, string> = {
  erp: 'event-related potential analysis (components that distort event-locked averages were the target)',
  oscillations: 'analysis of oscillatory power (components carrying power in the analysed bands were the target)',
  conservative: 'a conservative review (only unmistakable non-brain components were to be removed)',
};

const pct = (x: number) => `${(100 * x).toFixed(1)} %`;

/** Thresholds named in the paragraph, with their meaning and unit. */
export function thresholdSentence(t: Thresholds): string {
  return [
    `|r| with the EOG ≥ ${t.eogCorrelation}`,
    `frontal-pole weight ratio ≥ ${t.blinkFrontalGradient}`,
    `power share above 20 Hz ≥ ${pct(t.muscleHighFrequencyShare)}`,
    `line-frequency power share ≥ ${pct(t.mainsShare)}`,
    `single-electrode map energy share ≥ ${pct(t.electrodeFocality)}`,
    `cardiac autocorrelation peak ≥ ${t.cardiacPeak}`,
    `dipole residual variance ≤ ${pct(t.dipoleResidualVariance)} counted as dipolar`,
    `time-locked share above chance ≥ ${pct(t.timeLockingStrength)} (permutation p ≤ ${t.timeLockingP})`,
  ].join('; ');
}

/** The methods paragraph (one paragraph, ending with a newline). */
export function methodsText(input: MethodsTextInput): string {
  const d = input.decomposition;
  const pre = d.preprocessing;
  const removed: { index: number; reason: ReasonCode | null }[] = [];
  let kept = 0;
  for (let i = 1; i <= d.nComponents; i++) {
    const dec = input.decisions[i];
    if (dec?.verdict === 'remove') removed.push({ index: i, reason: dec.reason });
    else if (dec?.verdict === 'keep') kept++;
  }
  const undecided = d.nComponents - removed.length - kept;
  // pre.filter already names the high-pass ("high-pass 1 Hz, …"): say it once.
  const filter = pre.highpassHz !== null && !/high-pass/i.test(pre.filter) ? `after high-pass filtering at ${pre.highpassHz} Hz (${pre.filter})` : `after filtering (${pre.filter})`;
  const rr = input.recordingReference;
  const statedRef = rr ? (rr.channels ?? rr.eegJson) : null;
  const refText = statedRef ? `the recording's reference was ${statedRef} (${rr?.channels ? 'channels.tsv' : 'EEGReference in the *_eeg.json'})` : "the recording's sidecars did not state its reference";
  const seedText = d.method === 'imported' ? '' : d.seed !== undefined ? ` with random seed ${d.seed}` : ' (random seed not recorded)';
  const parts: string[] = [];
  parts.push(
    `The recording ${input.recordingFileName} (SHA-256 ${input.recordingSha256}) was decomposed into ${d.nComponents} components ` +
      `from ${d.nChannels} channels (rank ${d.rank}) by ${METHOD_NAMES[d.method]} ${filter}, reference ${pre.reference}` +
      `${pre.excludedChannels.length > 0 ? `, excluding ${pre.excludedChannels.join(', ')}` : ''}` +
      `${d.method !== 'imported' ? `; the algorithm ran${seedText} and ${d.converged ? 'converged' : 'stopped without converging'} after ${d.iterations} iterations` : ''}; ${refText}.`,
  );
  parts.push(`Each component was reviewed in ${input.software} for ${AIM_PHRASES[input.aim]}.`);
  if (removed.length === 0) {
    parts.push('No component was removed.');
  } else {
    const total = input.varianceShare
      ? removed.reduce((s, r) => s + (input.varianceShare!(r.index) ?? 0), 0)
      : null;
    const list = removed.map((r) => `${r.index} (${r.reason ?? 'no reason given'})`).join(', ');
    parts.push(
      `${removed.length} of ${d.nComponents} components were removed — ${list}` +
        `${total !== null ? `, together ${pct(total)} of the data's variance` : ''}; ` +
        `${kept} ${kept === 1 ? 'was' : 'were'} kept${undecided > 0 ? ` and ${undecided} left undecided ${undecided === 1 ? 'was' : 'were'} kept as well` : ''}.`,
    );
  }
  if (input.firedRules && removed.length > 0) {
    const lines = removed
      .map((r) => {
        const rules = input.firedRules!(r.index) ?? [];
        const unique = [...new Set(rules.map(firedRuleText))];
        return unique.length > 0 ? `${r.index}: ${unique.join(', ')}` : null;
      })
      .filter((x): x is string => x !== null);
    if (lines.length > 0) parts.push(`The suggestion rules that held for the removed components were — ${lines.join('; ')}.`);
  }
  parts.push(
    'The cleaned signal was obtained by subtracting the back-projection of the removed components, X − A_R S_R, ' +
      'which leaves the channel means and any activity outside the decomposition unchanged.',
  );
  parts.push(
    `Suggested verdicts (which the reviewer could overrule) used these thresholds: ${thresholdSentence(input.thresholds)}. ` +
      'These are starting points, not validated cut-offs.',
  );
  const changedThresholds = thresholdChangesText(input.thresholds);
  if (changedThresholds) parts.push(`The reviewer changed these thresholds from Winnow's defaults: ${changedThresholds}.`);
  if (input.residualWarnings && input.residualWarnings.length > 0)
    parts.push(`After cleaning, artefact remained that no removed component held: ${input.residualWarnings.join('; ')}.`);
  else if (input.residualWarnings) parts.push('After cleaning, no remaining ocular, mains or heartbeat artefact was found on the cleaned channels.');
  return `${parts.join(' ')}\n`;
}
