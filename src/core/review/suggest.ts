/**
 * Aim-aware suggestions: evidence → { verdict, reason, because }. The suggestion explains; it never
 * decides. Two steps:
 *
 * 1. `recogniseComponent` reads the evidence against the threshold table (thresholds.ts) and lists every
 *    signature it finds (ocular, muscle, cardiac, line noise, single electrode, motion, neural), each with
 *    the sentences — with numbers — that support it.
 * 2. A small rule table per aim turns the signatures into a verdict:
 *
 * | signature                      | erp        | oscillations | conservative            |
 * |--------------------------------|------------|--------------|-------------------------|
 * | blink / eye-movement           | remove     | remove       | remove                  |
 * | muscle, not time-locked        | keep       | remove       | remove only if strong   |
 * | muscle, time-locked            | remove     | remove       | remove only if strong   |
 * | cardiac, line-noise, electrode | remove     | remove       | remove                  |
 * | motion (step-locked)           | remove     | remove       | remove                  |
 * | neural                         | keep       | keep         | keep                    |
 * | weak artifact + strong brain   | undecided  | undecided    | keep                    |
 * | several artifact signatures    | the most specific one names it (SIGNATURE_PRECEDENCE)   |
 * | nothing recognised (unclear)   | keep       | keep         | keep                    |
 *
 * Common practice encoded (issue 6, docs/methods.md §14): ocular components go for every aim; muscle that is not
 * time-locked averages out of ERPs (and a low-pass helps) but biases induced power above ~15 Hz; a
 * component that cannot be identified is kept (removing brain signal is the costlier mistake — our reading
 * of common practice), so "unclear" is a keep, while "mixed" (a weak artifact signature alongside strong
 * brain evidence: a dipole inside the brain with 1/f, alpha or time-locking) is left undecided for the
 * reviewer except under `conservative`, which keeps it. A well-fitted dipole (low
 * RV) inside the brain with a 1/f spectrum and an alpha peak speaks for neural origin and, when present,
 * outweighs a weak muscle signature.
 */
import type { ComponentEvidence } from '../evidence/types.ts';
import { defaultThresholds, type Thresholds } from './thresholds.ts';
import type { Aim, ReasonCode, Suggestion } from './vocabulary.ts';

/** What the rules read: the evidence without its suggestions. */
export type SuggestionInput = Omit<ComponentEvidence, 'suggestions'>;

export type Signature = 'blink' | 'gaze' | 'muscle' | 'cardiac' | 'mains' | 'contact' | 'movement' | 'neural';

export interface Finding {
  readonly signature: Signature;
  /** Unmistakable: enough for the conservative aim to remove. */
  readonly strong: boolean;
  readonly because: string[];
}

export interface Recognition {
  readonly findings: Finding[];
  /** Whether the component is locked to the epoched events (null without events). */
  readonly timeLocked: boolean | null;
  readonly timeLockingSentence: string | null;
}

const pct = (v: number) => `${Math.round(v * 100)} %`;
const fix = (v: number, d = 2) => (Number.isFinite(v) ? v.toFixed(d) : 'n/a');

/** Lists every signature the evidence shows, with sentences and numbers. */
export function recogniseComponent(e: SuggestionInput, t: Thresholds = defaultThresholds): Recognition {
  const findings: Finding[] = [];
  const eog = e.eogCorrelation;
  const src = eog.source === 'EOG channels' ? 'EOG' : 'frontal EOG proxy';

  // Timing relative to the events
  let timeLocked: boolean | null = null;
  let timeLockingSentence: string | null = null;
  if (e.erp) {
    const p = e.erp.permutationP;
    timeLocked = e.erp.timeLockingStrength >= t.timeLockingStrength && (p === undefined || p <= t.timeLockingP);
    const pText = p !== undefined ? `, p = ${fix(p, 2)}` : '';
    timeLockingSentence = timeLocked
      ? `time-locked to "${e.erp.event}": ${pct(e.erp.lockedShare)} of trial variance locked (${pct(e.erp.timeLockingStrength)} above shuffled times${pText}), ITC ${fix(e.erp.itc)} at ${fix(e.erp.itcFrequencyHz, 1)} Hz`
      : `not time-locked to "${e.erp.event}" (${pct(Math.max(0, e.erp.timeLockingStrength))} above shuffled times${pText})`;
  }

  // Blink: vertical EOG, frontal map, slow spectrum, sparse deflections
  {
    const because: string[] = [];
    const rV = eog.vertical ?? 0;
    const eogHit = rV >= t.eogCorrelation;
    if (eogHit) because.push(`r = ${fix(rV)} with vertical ${src}${eog.channels.vertical ? ` (${eog.channels.vertical})` : ''}`);
    const frontal = e.frontalGradient >= t.blinkFrontalGradient && !(e.lateralAntisymmetry >= t.gazeAntisymmetry);
    if (frontal)
      because.push(
        `map ${pct(e.frontalShare)} frontal-pole, ${fix(e.frontalGradient, 1)}× the rest${e.lateralAntisymmetry < 0 ? ', symmetric left–right' : ''}, falls off posteriorly`,
      );
    const slow = e.lowFrequencyShare >= t.ocularLowFrequencyShare;
    if (slow && (eogHit || frontal)) because.push(`${pct(e.lowFrequencyShare)} of 1–45 Hz power below 4 Hz`);
    if (e.kurtosis >= t.blinkKurtosis && (eogHit || frontal)) because.push(`excess kurtosis ${fix(e.kurtosis, 1)}: sparse large deflections`);
    const hitsH = (eog.horizontal ?? 0) > rV + 0.1;
    if (!hitsH && ((eogHit && (frontal || slow)) || (frontal && slow))) findings.push({ signature: 'blink', strong: eogHit || (frontal && slow), because });
  }

  // Horizontal eye movement: horizontal EOG, antisymmetric frontal map, steps
  {
    const because: string[] = [];
    const rH = eog.horizontal ?? 0;
    const eogHit = rH >= t.eogCorrelation && rH >= (eog.vertical ?? 0) - 0.1;
    if (eogHit) because.push(`r = ${fix(rH)} with horizontal ${src}${eog.channels.horizontal ? ` (${eog.channels.horizontal})` : ''}`);
    const anti = e.lateralAntisymmetry >= t.gazeAntisymmetry;
    if (anti) because.push(`map left–right antisymmetric (${fix(e.lateralAntisymmetry)} on a −1…1 scale)`);
    const slow = e.lowFrequencyShare >= t.ocularLowFrequencyShare;
    if (slow && (eogHit || anti)) because.push(`${pct(e.lowFrequencyShare)} of 1–45 Hz power below 4 Hz`);
    const steps = e.stepLikeness >= t.gazeStepLikeness;
    if (steps && (eogHit || anti)) because.push(`slow jumps persist as steps (${fix(e.stepLikeness)})`);
    // Without an EOG correlation the map must also reach the front of the head: an antisymmetric slow
    // map over temporal or parietal sites is more likely a pair of brain sources merged into one component.
    const frontal = e.frontalGradient >= 1;
    if (anti && frontal && !eogHit) because.push(`frontal-pole weight ${fix(e.frontalGradient, 1)}× the rest`);
    if ((eogHit && (anti || slow || steps)) || (anti && slow && frontal))
      findings.push({ signature: 'gaze', strong: eogHit || (anti && slow && frontal && steps), because });
  }

  // Single electrode
  if (e.focality.share >= t.electrodeFocality)
    findings.push({
      signature: 'contact',
      strong: true,
      because: [`one electrode (${e.focality.channel}) carries ${pct(e.focality.share)} of the map`],
    });

  // Line noise
  if (e.mainsShare >= t.mainsShare)
    findings.push({
      signature: 'mains',
      strong: true,
      because: [
        `${pct(e.mainsShare)} of the power within ±1 Hz of the line frequency and its harmonics${Number.isFinite(e.linePeakRatio) ? ` (peak ${fix(e.linePeakRatio, 0)}× its neighbours)` : ''}`,
      ],
    });

  // Cardiac
  if (e.cardiac.bpm !== null && e.cardiac.peak >= t.cardiacPeak)
    findings.push({
      signature: 'cardiac',
      strong: true,
      because: [`periodic at ${Math.round(e.cardiac.bpm)} beats per minute (autocorrelation ${fix(e.cardiac.peak)})`],
    });

  // Motion
  if (e.stepLocking && e.stepLocking.share >= t.movementStepLocking)
    findings.push({
      signature: 'movement',
      strong: true,
      because: [`${pct(e.stepLocking.share)} of its activity locked to "${e.stepLocking.event}" events (${e.stepLocking.nEpochs} steps)`],
    });

  // Neural support
  const dipolar = e.dipole !== null && e.dipole.residualVariance <= t.dipoleResidualVariance && !e.dipole.atBoundary;
  const oneOverF = e.oneOverF.exponent >= t.neuralExponentMin && e.oneOverF.exponent <= t.neuralExponentMax;
  const alpha = e.alphaPeakHz !== null && e.alphaProminence >= t.alphaProminence;

  // Muscle: broadband, flat or rising above 20 Hz, and not a well-fitted dipole inside the brain unless
  // the high-frequency share is unmistakable (sparse evoked activity also looks flat between responses).
  const hf = e.highFrequencyShare >= t.muscleHighFrequencyShare && e.highFrequencySlope >= t.muscleSlope;
  const strongHf = e.highFrequencyShare >= t.muscleHighFrequencyShareStrong;
  if (hf && (!dipolar || strongHf)) {
    const because = [
      `${pct(e.highFrequencyShare)} of the power from 2 Hz to the line band lies above 20 Hz, spectrum ${e.highFrequencySlope >= -0.3 ? 'flat or rising' : 'falling only slowly'} above 20 Hz (log–log slope ${fix(e.highFrequencySlope, 1)})`,
    ];
    if (e.dipole && (e.dipole.atBoundary || e.dipole.residualVariance > t.dipoleResidualVariance))
      because.push(`dipole fits poorly or at the boundary (residual variance ${pct(e.dipole.residualVariance)})`);
    findings.push({ signature: 'muscle', strong: strongHf && !alpha, because });
  }

  const artifacts = findings.filter((f) => f.signature !== 'neural');
  const neuralBecause: string[] = [];
  if (dipolar && e.dipole) neuralBecause.push(`dipole fits with residual variance ${pct(e.dipole.residualVariance)} inside the brain (${e.dipole.region})`);
  if (oneOverF) neuralBecause.push(`1/f spectrum (1/f exponent ${fix(e.oneOverF.exponent, 1)})`);
  if (alpha) neuralBecause.push(`alpha peak at ${fix(e.alphaPeakHz ?? NaN, 1)} Hz, ${fix(e.alphaProminence)} log10 above the 1/f line`);
  if (timeLocked && timeLockingSentence) neuralBecause.push(timeLockingSentence);
  const clean = artifacts.length === 0;
  const neural =
    (clean && ((dipolar && (oneOverF || alpha || timeLocked === true)) || (oneOverF && (alpha || timeLocked === true)))) || (dipolar && alpha);
  if (neural) findings.push({ signature: 'neural', strong: dipolar && (alpha || oneOverF || timeLocked === true), because: neuralBecause });
  return { findings, timeLocked, timeLockingSentence };
}

/** Which artifact signature names the component when several are present (most specific first; ours). */
export const SIGNATURE_PRECEDENCE: readonly Signature[] = ['blink', 'gaze', 'mains', 'movement', 'cardiac', 'muscle', 'contact'];

/**
 * The suggested verdict for one component under one aim, with the reason code and the evidence sentences.
 * See the rule table at the top of this file.
 */
export function suggestVerdict(e: SuggestionInput, aim: Aim, t: Thresholds = defaultThresholds): Suggestion {
  const { findings, timeLocked, timeLockingSentence } = recogniseComponent(e, t);
  const neural = findings.find((f) => f.signature === 'neural');
  const artifacts = findings
    .filter((f) => f.signature !== 'neural')
    .sort((a, b) => SIGNATURE_PRECEDENCE.indexOf(a.signature) - SIGNATURE_PRECEDENCE.indexOf(b.signature));

  if (artifacts.length === 0) {
    if (neural) return { verdict: 'keep', reason: 'neural', because: neural.because };
    const because = ['no artifact signature found'];
    if (timeLockingSentence) because.push(timeLockingSentence);
    because.push('a component that cannot be identified is kept (common practice)');
    return { verdict: 'keep', reason: 'unclear', because };
  }

  const a = artifacts[0];
  const ocular = a.signature === 'blink' || a.signature === 'gaze';
  const others = artifacts.slice(1).map((f) => f.signature);
  const also = others.length ? [`also shows signs of ${others.join(' and ')}: ${artifacts.slice(1).flatMap((f) => f.because).join('; ')}`] : [];

  // Brain-like evidence against a weak artifact signature (ocular ones included: an ocular reading from
  // the map alone, without an EOG correlation, can be two brain sources merged): leave it to the reviewer.
  if (neural?.strong && artifacts.every((f) => !f.strong)) {
    return {
      verdict: aim === 'conservative' ? 'keep' : 'undecided',
      reason: 'mixed',
      because: [`signs of ${artifacts.map((f) => f.signature).join(' and ')} alongside brain-like evidence`, ...artifacts.flatMap((f) => f.because), ...neural.because],
    };
  }

  const reason: ReasonCode = a.signature;
  const because = [...a.because, ...also];
  if (ocular) {
    because.push('ocular components are removed for every aim');
    return { verdict: 'remove', reason, because };
  }
  if (a.signature === 'muscle') {
    if (aim === 'erp') {
      if (timeLocked === true) {
        if (timeLockingSentence) because.push(timeLockingSentence);
        because.push('time-locked muscle would survive averaging');
        return { verdict: 'remove', reason, because };
      }
      because.push(timeLockingSentence ?? 'no events to test time-locking');
      because.push('muscle activity that is not time-locked averages out of ERPs (a low-pass filter helps further)');
      return { verdict: 'keep', reason, because };
    }
    if (aim === 'oscillations') {
      because.push('muscle power biases induced power above ~15 Hz');
      return { verdict: 'remove', reason, because };
    }
  }
  if (aim === 'conservative' && !a.strong) {
    because.push('not unmistakable, so kept under the conservative aim');
    return { verdict: 'keep', reason, because };
  }
  return { verdict: 'remove', reason, because };
}

/** Suggestions for all three aims at once. */
export function suggestAllAims(e: SuggestionInput, t: Thresholds = defaultThresholds): Record<Aim, Suggestion> {
  return {
    erp: suggestVerdict(e, 'erp', t),
    oscillations: suggestVerdict(e, 'oscillations', t),
    conservative: suggestVerdict(e, 'conservative', t),
  };
}
