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
 * | muscle (spectrum AND spatial), not time-locked | keep | remove | remove only if strong |
 * | muscle, time-locked            | remove     | remove       | remove only if strong   |
 * | one electrode (contact)       | remove     | remove       | remove  (before all others) |
 * | cardiac, mains                 | remove     | remove       | remove                  |
 * | motion (step-locked)           | remove     | remove       | remove                  |
 * | neural                         | keep       | keep         | keep                    |
 * | weak artifact + strong brain   | undecided  | undecided    | keep                    |
 * | two strong conflicting ones   | remove (mixed) | remove (mixed) | undecided (mixed)  |
 * | several artifact signatures    | the most specific one names it (SIGNATURE_PRECEDENCE)   |
 * | flat spectrum, no spatial support (sensor noise) | keep (unclear) | keep | keep        |
 * | nothing recognised (unclear)   | keep       | keep         | keep                    |
 *
 * Common practice encoded (issue 6, docs/methods.md §14): ocular components go for every aim; muscle that is not
 * time-locked averages out of ERPs (and a low-pass helps) but biases induced power above ~15 Hz; a
 * component that cannot be identified is kept (removing brain signal is the costlier mistake — our reading
 * of common practice), so "unclear" is a keep, while "mixed" (a weak artifact signature alongside strong
 * brain evidence: a dipole inside the brain with 1/f, alpha or time-locking) is left undecided for the
 * reviewer except under `conservative`, which keeps it. A well-fitted dipole (low
 * RV) inside the brain with a 1/f spectrum and an alpha peak speaks for neural origin and, when present,
 * outweighs a weak muscle signature. Issue 10 item 2 (docs/suggestion-rules.md has the full table with every
 * number's source): contact first whatever the spectrum; muscle needs spatial support; two strong
 * conflicting artifact signatures are "mixed"; `suggestWithRules` lists the threshold comparisons that fired.
 */
import { restStructure } from '../evidence/focality.ts';
import type { ComponentEvidence } from '../evidence/types.ts';
import { defaultThresholds, thresholdSources, type ThresholdSource, type Thresholds } from './thresholds.ts';
import type { Aim, ReasonCode, Suggestion } from './vocabulary.ts';

/** What the rules read: the evidence (measures only; issue 10 item 1). */
export type SuggestionInput = ComponentEvidence;

export type Signature = 'blink' | 'gaze' | 'muscle' | 'cardiac' | 'mains' | 'contact' | 'movement' | 'neural';

/** One threshold comparison that held: `value direction threshold` (e.g. focality 0.91 ≥ 0.6). */
export interface FiredRule {
  /** Evidence field (dotted path into ComponentEvidence), e.g. 'focality.share'. */
  readonly measure: string;
  readonly value: number;
  readonly threshold: number;
  readonly direction: '≥' | '≤';
  /** Where the threshold comes from (thresholds.ts): 'common practice', 'ours', '… (from memory)'. */
  readonly source: ThresholdSource;
}

export interface Finding {
  readonly signature: Signature;
  /** Unmistakable: enough for the conservative aim to remove. */
  readonly strong: boolean;
  readonly because: string[];
  /** The threshold comparisons behind this finding. */
  readonly rules?: FiredRule[];
}

export interface Recognition {
  readonly findings: Finding[];
  /**
   * A flat or rising spectrum above 20 Hz without the spatial support muscle needs (issue 10 item 2b): the
   * sentences saying so, or null. Tiny and diffuse, it is read as sensor noise.
   */
  readonly unsupportedHighFrequency: { readonly sensorNoise: boolean; readonly because: string[]; readonly rules: FiredRule[] } | null;
  /** Whether the component is locked to the epoched events (null without events). */
  readonly timeLocked: boolean | null;
  readonly timeLockingSentence: string | null;
}

const pct = (v: number) => `${Math.round(v * 100)} %`;

/** The comparison `value ≥ t[key]` (or ≤) as a fired rule, or null when it does not hold (NaN never holds). */
function check(measure: string, value: number, t: Thresholds, key: keyof Thresholds, direction: '≥' | '≤'): FiredRule | null {
  const threshold = t[key];
  const holds = direction === '≥' ? value >= threshold : value <= threshold;
  return holds ? { measure, value, threshold, direction, source: thresholdSources[key] } : null;
}
const some = (...r: (FiredRule | null)[]): FiredRule[] => r.filter((x): x is FiredRule => x !== null);

/**
 * Electrodes on the rim of the 10-20 / 10-10 montage (frontal pole, lateral frontal, temporal, lower parietal,
 * occipital, mastoids/ears): the sites over frontalis, temporalis and neck muscles (common practice).
 */
const RIM_ELECTRODE = /^(fp[z12]?|af[78]|f[789]|f10|ft\d+|t\d+|tp\d+|p[789]|p10|po[789]|po10|o[z12]|i[z12]?|a[12]|m[12])$/i;
export function isRimElectrode(label: string): boolean {
  return RIM_ELECTRODE.test(label.trim());
}
const fix = (v: number, d = 2) => (Number.isFinite(v) ? v.toFixed(d) : 'n/a');

/** Lists every signature the evidence shows, with sentences and numbers. */
export function recogniseComponent(e: SuggestionInput, t: Thresholds = defaultThresholds): Recognition {
  const findings: Finding[] = [];
  const eog = e.eogCorrelation;
  const src = eog.source === 'EOG channels' ? 'EOG' : 'frontal EOG proxy';
  // A correlation with the frontal proxy (built from the cap's own frontal electrodes) is also met by brain
  // sources under those electrodes, whose 1/f activity is slow and step-like too; so a proxy hit needs a
  // clearly slow spectrum to count (issue 10, ours; tuning seeds of the validation family: ocular components
  // ≥ 0.78, frontal background ≤ 0.68).
  const proxy = eog.source !== 'EOG channels';
  const proxySlow = e.lowFrequencyShare >= t.ocularProxyLowFrequencyShare;

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
    const rules = some(
      check('eogCorrelation.vertical', rV, t, 'eogCorrelation', '≥'),
      frontal ? check('frontalGradient', e.frontalGradient, t, 'blinkFrontalGradient', '≥') : null,
      check('lowFrequencyShare', e.lowFrequencyShare, t, 'ocularLowFrequencyShare', '≥'),
      eogHit || frontal ? check('kurtosis', e.kurtosis, t, 'blinkKurtosis', '≥') : null,
    );
    if (!hitsH && ((eogHit && (proxy ? proxySlow : frontal || slow)) || (frontal && slow))) {
      // Vertical eye movements share the blink's vertical EOG and frontal map, but their slow deflections
      // persist as steps (the gaze stays up or down) where a blink returns within ~0.3 s (common practice:
      // blinks are brief, saccades shift the level; docs/methods.md §14). Step-likeness at the gaze level
      // without blink-like sparseness names a vertical eye movement (issue 10; ours).
      const stepRule = check('stepLikeness', e.stepLikeness, t, 'gazeStepLikeness', '≥');
      const sparse = e.kurtosis >= t.verticalGazeMaxKurtosis;
      if (stepRule && !sparse) {
        const gazeBecause = [...because.filter((b) => !b.startsWith('excess kurtosis')), `slow deflections persist as steps (${fix(e.stepLikeness)}), not brief returns: vertical eye movement`];
        const kRule = check('kurtosis', e.kurtosis, t, 'verticalGazeMaxKurtosis', '≤');
        findings.push({ signature: 'gaze', strong: eogHit || (frontal && slow), because: gazeBecause, rules: [...rules.filter((r) => r.measure !== 'kurtosis'), stepRule, ...some(kRule)] });
      } else findings.push({ signature: 'blink', strong: eogHit || (frontal && slow), because, rules });
    }
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
    const rules = some(
      eogHit ? check('eogCorrelation.horizontal', rH, t, 'eogCorrelation', '≥') : null,
      check('lateralAntisymmetry', e.lateralAntisymmetry, t, 'gazeAntisymmetry', '≥'),
      check('lowFrequencyShare', e.lowFrequencyShare, t, 'ocularLowFrequencyShare', '≥'),
      check('stepLikeness', e.stepLikeness, t, 'gazeStepLikeness', '≥'),
    );
    if ((eogHit && (proxy ? proxySlow : anti || slow || steps)) || (anti && slow && frontal))
      findings.push({ signature: 'gaze', strong: eogHit || (anti && slow && frontal && steps), because, rules });
  }

  // Line noise
  const mainsRule = check('mainsShare', e.mainsShare, t, 'mainsShare', '≥');
  if (mainsRule)
    findings.push({
      signature: 'mains',
      strong: true,
      rules: [mainsRule],
      because: [
        `${pct(e.mainsShare)} of the power within ±1 Hz of the line frequency and its harmonics${Number.isFinite(e.linePeakRatio) ? ` (peak ${fix(e.linePeakRatio, 0)}× its neighbours)` : ''}`,
      ],
    });

  // Cardiac: slope energy periodic at 40–150 bpm AND, where the beats could be marked, regular beat to beat (a
  // heartbeat's inter-beat intervals vary by a few percent at rest, common practice; the bursts of an alpha
  // rhythm whose envelope happens to recur at a heart-like lag do not: issue 10, docs/methods.md §14, ours).
  // Without a measured interval CV (hand-built evidence, fewer than 10 beats) the periodicity alone decides.
  const cardiacRule = e.cardiac.bpm !== null ? check('cardiac.peak', e.cardiac.peak, t, 'cardiacPeak', '≥') : null;
  const cv = e.cardiac.intervalCv;
  const cvMeasured = cv !== undefined && Number.isFinite(cv);
  const cvRule = cvMeasured ? check('cardiac.intervalCv', cv, t, 'cardiacIntervalCv', '≤') : null;
  if (cardiacRule && e.cardiac.bpm !== null && (!cvMeasured || cvRule))
    findings.push({
      signature: 'cardiac',
      strong: true,
      rules: some(cardiacRule, cvRule),
      because: [
        `periodic at ${Math.round(e.cardiac.bpm)} beats per minute (autocorrelation ${fix(e.cardiac.peak)})${cvMeasured ? `, beats regular (inter-beat intervals vary by ${pct(cv)})` : ''}`,
      ],
    });

  // Motion
  const stepRule = e.stepLocking ? check('stepLocking.share', e.stepLocking.share, t, 'movementStepLocking', '≥') : null;
  if (e.stepLocking && stepRule)
    findings.push({
      signature: 'movement',
      strong: true,
      rules: [stepRule],
      because: [`${pct(e.stepLocking.share)} of its activity locked to "${e.stepLocking.event}" events (${e.stepLocking.nEpochs} steps)`],
    });

  // Neural support
  const dipolar = e.dipole !== null && e.dipole.residualVariance <= t.dipoleResidualVariance && !e.dipole.atBoundary;
  const oneOverF = e.oneOverF.exponent >= t.neuralExponentMin && e.oneOverF.exponent <= t.neuralExponentMax;
  const alpha = e.alphaPeakHz !== null && e.alphaProminence >= t.alphaProminence;

  // Muscle (issue 10 item 2b) needs BOTH a spectrum flat or rising above 20 Hz AND spatial support — a focal
  // map, a map strongest at a rim electrode, or a shallow / boundary dipole — and is not read on a
  // well-fitted dipole inside the brain unless the high-frequency share is unmistakable (sparse evoked
  // activity also looks flat between responses). A flat spectrum without spatial support is not muscle:
  // tiny and diffuse it is sensor noise (`unsupportedHighFrequency`).
  const hfShareRule = check('highFrequencyShare', e.highFrequencyShare, t, 'muscleHighFrequencyShare', '≥');
  const hfSlopeRule = check('highFrequencySlope', e.highFrequencySlope, t, 'muscleSlope', '≥');
  const hf = hfShareRule !== null && hfSlopeRule !== null;
  const strongHfRule = check('highFrequencyShare', e.highFrequencyShare, t, 'muscleHighFrequencyShareStrong', '≥');
  const strongHf = strongHfRule !== null;
  let unsupportedHighFrequency: Recognition['unsupportedHighFrequency'] = null;
  if (hf) {
    const spectrumSentence = `${pct(e.highFrequencyShare)} of the power from 2 Hz to the line band lies above 20 Hz, spectrum ${e.highFrequencySlope >= -0.3 ? 'flat or rising' : 'falling only slowly'} above 20 Hz (log–log slope ${fix(e.highFrequencySlope, 1)})`;
    const spectrumRules = some(hfShareRule, hfSlopeRule, strongHfRule);
    const spatial: string[] = [];
    const spatialRules: FiredRule[] = [];
    const focalMuscle = check('focality.share', e.focality.share, t, 'muscleFocality', '≥');
    const rimFocal = isRimElectrode(e.focality.channel || e.strongestChannel.label) ? check('focality.share', e.focality.share, t, 'muscleRimFocality', '≥') : null;
    if (focalMuscle) {
      spatial.push(`patchy map: ${pct(e.focality.share)} of its energy on ${e.focality.channel}`);
      spatialRules.push(focalMuscle);
    } else if (rimFocal) {
      spatial.push(`map strongest at ${e.focality.channel || e.strongestChannel.label}, on the rim of the montage (${pct(e.focality.share)} of its energy there)`);
      spatialRules.push(rimFocal);
    }
    if (e.dipole) {
      const [x, y, z] = e.dipole.position;
      const r = Math.hypot(x, y, z);
      const shallow = check('dipole.distanceFromCentreMm', r, t, 'muscleDipoleDepthMm', '≥');
      if (e.dipole.atBoundary) {
        spatial.push(`dipole fit stops at the edge of the brain (${Math.round(r)} mm from the centre): the source is outside it`);
        spatialRules.push({ measure: 'dipole.atBoundary', value: 1, threshold: 1, direction: '≥', source: 'ours' });
      } else if (shallow) {
        spatial.push(`shallow dipole, ${Math.round(r)} mm from the centre`);
        spatialRules.push(shallow);
      }
    }
    // Sensor and background noise: a Gaussian activation (no bursts) carrying a small share of the variance is
    // noise even when its strongest electrode sits on the rim; EMG comes in bursts (super-Gaussian; common
    // practice), so it needs either bursts or enough variance to stand out (issue 10 item 2b; ours).
    const gaussianRule = check('kurtosis', e.kurtosis, t, 'muscleKurtosis', '≤');
    const smallRule = check('varianceShare', e.varianceShare, t, 'muscleNoiseVarianceShare', '≤');
    const gaussianNoise = gaussianRule !== null && smallRule !== null;
    if (spatial.length > 0 && gaussianNoise) {
      const because = [
        spectrumSentence,
        ...spatial,
        `but no bursts (excess kurtosis ${fix(e.kurtosis, 1)}) and ${fix(e.varianceShare * 100, 1)} % of the variance: Gaussian broadband noise, not muscle`,
      ];
      unsupportedHighFrequency = { sensorNoise: true, because, rules: some(hfShareRule, hfSlopeRule, gaussianRule, smallRule) };
    } else if (spatial.length > 0 && (!dipolar || strongHf)) {
      const because = [spectrumSentence, ...spatial];
      if (e.dipole && !e.dipole.atBoundary && e.dipole.residualVariance > t.dipoleResidualVariance)
        because.push(`dipole fits poorly (residual variance ${pct(e.dipole.residualVariance)})`);
      // A clear alpha peak (≥ muscleAlphaVeto above the 1/f line) keeps muscle weak, so brain evidence can make it
      // "mixed"; a small bump in a spectrum dominated by high frequencies does not (ours, issue 10).
      const clearAlpha = alpha && e.alphaProminence >= t.muscleAlphaVeto;
      findings.push({ signature: 'muscle', strong: strongHf && !clearAlpha, because, rules: [...spectrumRules, ...spatialRules] });
    } else if (spatial.length === 0) {
      const tiny = check('varianceShare', e.varianceShare, t, 'noiseVarianceShare', '≤');
      const because = [
        spectrumSentence,
        `but no spatial support for muscle: diffuse map (${pct(e.focality.share)} of its energy on the strongest electrode, ${e.focality.channel || e.strongestChannel.label})${e.dipole ? ', dipole deep inside the head' : ''}`,
      ];
      if (tiny) because.push(`${fix(e.varianceShare * 100, 1)} % of the variance: a flat, diffuse, tiny component looks like sensor noise, not muscle`);
      unsupportedHighFrequency = { sensorNoise: tiny !== null, because, rules: some(hfShareRule, hfSlopeRule, tiny) };
    }
  }

  // Single electrode (takes precedence over every other signature: SIGNATURE_PRECEDENCE). The map must be
  // concentrated on one electrode AND flat elsewhere: a bad contact leaves every other electrode with the same
  // value (the reference's share), while a focal brain or muscle source spreads unevenly onto its neighbours
  // (restStructure, evidence/focality.ts; issue 10, ours). A clearly flat rest is a contact whatever the
  // spectrum; a slightly structured rest (an imperfectly separated contact, or a muscle patch under one
  // electrode) is a contact unless the component also reads as unmistakable muscle. Without a map (NaN) focality alone decides.
  {
    const focalRule = check('focality.share', e.focality.share, t, 'electrodeFocality', '≥');
    const rest = e.map && e.map.length ? restStructure(e.map) : NaN;
    const flatRule = Number.isFinite(rest) ? check('focality.restStructure', rest, t, 'electrodeRestStructure', '≤') : null;
    const nearlyFlatRule = Number.isFinite(rest) ? check('focality.restStructure', rest, t, 'electrodeRestStructureMuscle', '≤') : null;
    // Only unmistakable muscle (high-frequency share ≥ the strong level) outweighs a nearly flat rest: a noisy
    // electrode's broadband noise falls off below the muscle band's flat top (tuning seeds: ≤ 0.61 vs ≥ 0.65).
    const muscleToo = findings.some((f) => f.signature === 'muscle') && e.highFrequencyShare >= t.muscleHighFrequencyShareStrong;
    const restRule = flatRule ?? (muscleToo ? null : nearlyFlatRule);
    if (focalRule && (!Number.isFinite(rest) || restRule))
      findings.push({
        signature: 'contact',
        strong: true,
        because: [`one electrode (${e.focality.channel}) carries ${pct(e.focality.share)} of the map${restRule ? `, the rest of the map is ${flatRule ? 'flat' : 'nearly flat'} (${pct(rest)} structured)` : ''}`],
        rules: some(focalRule, restRule),
      });
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
  if (neural) {
    const rules = some(
      e.dipole ? check('dipole.residualVariance', e.dipole.residualVariance, t, 'dipoleResidualVariance', '≤') : null,
      oneOverF ? check('oneOverF.exponent', e.oneOverF.exponent, t, 'neuralExponentMin', '≥') : null,
      oneOverF ? check('oneOverF.exponent', e.oneOverF.exponent, t, 'neuralExponentMax', '≤') : null,
      alpha ? check('alphaProminence', e.alphaProminence, t, 'alphaProminence', '≥') : null,
      timeLocked && e.erp ? check('erp.timeLockingStrength', e.erp.timeLockingStrength, t, 'timeLockingStrength', '≥') : null,
    );
    findings.push({ signature: 'neural', strong: dipolar && (alpha || oneOverF || timeLocked === true), because: neuralBecause, rules });
  }
  return { findings, timeLocked, timeLockingSentence, unsupportedHighFrequency };
}

/**
 * Which artifact signature names the component when several are present (most specific first; ours).
 * `contact` comes first (issue 10 item 2a): a map with most of its energy on one electrode is a contact
 * fault whatever its spectrum — a loose electrode picks up line noise, cable sway and broadband noise that
 * read as mains, movement or muscle — and a blink or eye-movement map always spans two or more electrodes.
 * `muscle` comes before `movement` and `cardiac` (issue 10, ours): neck muscle fires with every heel strike, so
 * EMG is step-locked in walking recordings, while cable sway and heartbeats are slow and never read as muscle
 * (muscle needs a flat spectrum above 20 Hz, bursts and spatial support).
 */
export const SIGNATURE_PRECEDENCE: readonly Signature[] = ['contact', 'blink', 'gaze', 'mains', 'muscle', 'movement', 'cardiac'];

/** Artifact families whose strong signatures contradict each other: their origins differ (ours, issue 10 item 2d). */
const FAMILY: Partial<Record<Signature, 'ocular' | 'muscle' | 'cardiac'>> = { blink: 'ocular', gaze: 'ocular', muscle: 'muscle', cardiac: 'cardiac' };

/** A suggestion with the threshold comparisons that led to it. */
export interface SuggestionWithRules {
  readonly suggestion: Suggestion;
  readonly rules: FiredRule[];
}

/**
 * The suggested verdict for one component under one aim, with the reason code and the evidence sentences.
 * See the rule table at the top of this file.
 */
export function suggestVerdict(e: SuggestionInput, aim: Aim, t: Thresholds = defaultThresholds): Suggestion {
  return suggestWithRules(e, aim, t).suggestion;
}

/**
 * `suggestVerdict` with the rules that fired: every threshold comparison behind the findings the suggestion
 * names (its own and the ones it lists as "also"), each with its source. Precedence, in order:
 * 1. contact (one electrode) → remove for every aim;
 * 2. strong neural evidence against only weak artifact signatures → mixed (undecided; keep under conservative);
 * 3. two strong signatures of different artifact families (ocular, muscle, cardiac) → mixed (remove for erp and
 *    oscillations: both are artifacts; undecided under conservative);
 * 4. the first artifact signature in SIGNATURE_PRECEDENCE and its aim rule;
 * 5. otherwise neural → keep; a flat spectrum without spatial support → unclear, keep; nothing → unclear, keep.
 */
export function suggestWithRules(e: SuggestionInput, aim: Aim, t: Thresholds = defaultThresholds): SuggestionWithRules {
  const { findings, timeLocked, timeLockingSentence, unsupportedHighFrequency } = recogniseComponent(e, t);
  const neural = findings.find((f) => f.signature === 'neural');
  const artifacts = findings
    .filter((f) => f.signature !== 'neural')
    .sort((a, b) => SIGNATURE_PRECEDENCE.indexOf(a.signature) - SIGNATURE_PRECEDENCE.indexOf(b.signature));
  const rulesOf = (fs: readonly Finding[]) => fs.flatMap((f) => f.rules ?? []);
  const out = (suggestion: Suggestion, rules: FiredRule[]): SuggestionWithRules => ({ suggestion, rules });

  if (artifacts.length === 0) {
    if (neural) return out({ verdict: 'keep', reason: 'neural', because: neural.because }, rulesOf([neural]));
    if (unsupportedHighFrequency) {
      const because = [...unsupportedHighFrequency.because, 'a component that cannot be identified is kept (common practice)'];
      return out({ verdict: 'keep', reason: 'unclear', because }, unsupportedHighFrequency.rules);
    }
    const because = ['no artifact signature found'];
    if (timeLockingSentence) because.push(timeLockingSentence);
    because.push('a component that cannot be identified is kept (common practice)');
    return out({ verdict: 'keep', reason: 'unclear', because }, []);
  }

  const a = artifacts[0];
  const ocular = a.signature === 'blink' || a.signature === 'gaze';
  const others = artifacts.slice(1).map((f) => f.signature);
  const also = others.length ? [`also shows signs of ${others.join(' and ')}: ${artifacts.slice(1).flatMap((f) => f.because).join('; ')}`] : [];
  const rules = rulesOf(artifacts);

  if (a.signature === 'contact') {
    return out({ verdict: 'remove', reason: 'contact', because: [...a.because, ...also] }, rules);
  }

  // Brain-like evidence against a weak artifact signature (ocular ones included: an ocular reading from
  // the map alone, without an EOG correlation, can be two brain sources merged): leave it to the reviewer.
  if (neural?.strong && artifacts.every((f) => !f.strong)) {
    return out(
      {
        verdict: aim === 'conservative' ? 'keep' : 'undecided',
        reason: 'mixed',
        because: [`signs of ${artifacts.map((f) => f.signature).join(' and ')} alongside brain-like evidence`, ...artifacts.flatMap((f) => f.because), ...neural.because],
      },
      [...rules, ...rulesOf([neural])],
    );
  }

  // Two strong signatures that contradict each other (e.g. an unmistakable blink and unmistakable muscle):
  // the component mixes two artifacts, or one of the readings is wrong. Both are artifacts, so the data are
  // better without it for erp and oscillations; the conservative aim leaves it to the reviewer.
  const strongFamilies = [...new Set(artifacts.filter((f) => f.strong && FAMILY[f.signature]).map((f) => FAMILY[f.signature]))];
  if (strongFamilies.length >= 2) {
    const conflicting = artifacts.filter((f) => f.strong && FAMILY[f.signature]);
    return out(
      {
        verdict: aim === 'conservative' ? 'undecided' : 'remove',
        reason: 'mixed',
        because: [
          `strong signs of both ${conflicting.map((f) => f.signature).join(' and ')}`,
          ...artifacts.flatMap((f) => f.because),
          aim === 'conservative' ? 'two conflicting artifact readings are left to the reviewer under the conservative aim' : 'both readings are artifacts, so it goes either way',
        ],
      },
      rules,
    );
  }

  const reason: ReasonCode = a.signature;
  const because = [...a.because, ...also];
  if (ocular) {
    because.push('ocular components are removed for every aim');
    return out({ verdict: 'remove', reason, because }, rules);
  }
  if (a.signature === 'muscle') {
    if (aim === 'erp') {
      if (timeLocked === true) {
        if (timeLockingSentence) because.push(timeLockingSentence);
        because.push('time-locked muscle would survive averaging');
        const lockRule = e.erp ? check('erp.timeLockingStrength', e.erp.timeLockingStrength, t, 'timeLockingStrength', '≥') : null;
        return out({ verdict: 'remove', reason, because }, [...rules, ...some(lockRule)]);
      }
      because.push(timeLockingSentence ?? 'no events to test time-locking');
      because.push('muscle activity that is not time-locked averages out of ERPs (a low-pass filter helps further)');
      return out({ verdict: 'keep', reason, because }, rules);
    }
    if (aim === 'oscillations') {
      because.push('muscle power biases induced power above ~15 Hz');
      return out({ verdict: 'remove', reason, because }, rules);
    }
  }
  if (aim === 'conservative' && !a.strong) {
    because.push('not unmistakable, so kept under the conservative aim');
    return out({ verdict: 'keep', reason, because }, rules);
  }
  return out({ verdict: 'remove', reason, because }, rules);
}

/** Suggestions for all three aims at once. */
export function suggestAllAims(e: SuggestionInput, t: Thresholds = defaultThresholds): Record<Aim, Suggestion> {
  return {
    erp: suggestVerdict(e, 'erp', t),
    oscillations: suggestVerdict(e, 'oscillations', t),
    conservative: suggestVerdict(e, 'conservative', t),
  };
}
