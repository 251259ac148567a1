import { describe, expect, it } from 'vitest';
import { isRimElectrode, recogniseComponent, suggestAllAims, suggestVerdict, suggestWithRules, type SuggestionInput } from '../../../src/core/review/suggest.ts';
import { defaultThresholds, resolveThresholds } from '../../../src/core/review/thresholds.ts';
import { AIMS } from '../../../src/core/review/vocabulary.ts';

/** A component with no signature at all: every number neutral. Tests override what they need. */
function evidence(over: Partial<SuggestionInput> = {}): SuggestionInput {
  const f = Float64Array.from({ length: 10 }, (_, i) => 1 + i);
  return {
    index: 1,
    varianceShare: 0.02,
    variancePerChannel: new Float64Array(4),
    strongestChannel: { index: 0, label: 'Cz', weight: 1 },
    map: new Float64Array(4),
    spectrum: { frequencies: f, power: f, powerDb: f, nfft: 512, df: 0.5 },
    oneOverF: { exponent: 0.2, offset: 1, rangeHz: [2, 40] },
    alphaPeakHz: null,
    alphaProminence: 0,
    highFrequencyShare: 0.1,
    highFrequencySlope: -2,
    mainsShare: 0.01,
    linePeakRatio: 1,
    lowFrequencyShare: 0.2,
    kurtosis: 0.1,
    focality: { share: 0.1, channel: 'Cz' },
    frontalGradient: 1,
    frontalShare: 0.1,
    lateralAntisymmetry: 0,
    stepLikeness: 0.3,
    eogCorrelation: { vertical: 0.05, horizontal: 0.05, source: 'frontal bipolar', channels: { vertical: 'Fp1+Fp2 vs average', horizontal: 'F8 − F7' } },
    cardiac: { bpm: null, peak: 0 },
    stepLocking: null,
    erp: null,
    trialStack: null,
    dipole: null,
    ...over,
  };
}

const erp = (strength: number, p: number) => ({
  event: 'tone',
  nEpochs: 100,
  times: new Float64Array(1),
  mean: new Float64Array(1),
  band: { lower: new Float64Array(1), upper: new Float64Array(1) },
  itc: 0.5,
  itcFrequencyHz: 4,
  timeLockingStrength: strength,
  lockedShare: strength,
  permutationP: p,
});

const blink = evidence({
  eogCorrelation: { vertical: 0.93, horizontal: 0.1, source: 'EOG channels', channels: { vertical: 'VEOG', horizontal: 'HEOG' } },
  frontalGradient: 4.5,
  frontalShare: 0.71,
  lateralAntisymmetry: -0.95,
  lowFrequencyShare: 0.9,
  kurtosis: 20,
  oneOverF: { exponent: 2.4, offset: 1, rangeHz: [2, 40] },
});
const saccade = evidence({ lateralAntisymmetry: 0.97, lowFrequencyShare: 0.8, stepLikeness: 0.95, frontalGradient: 2.5, oneOverF: { exponent: 3, offset: 1, rangeHz: [2, 40] } });
// Temporalis-like: flat above 20 Hz and a patchy map strongest at T8 (spatial support, issue 10 item 2b).
const muscle = evidence({
  highFrequencyShare: 0.8,
  highFrequencySlope: 0,
  kurtosis: 30,
  oneOverF: { exponent: -1.5, offset: 1, rangeHz: [2, 40] },
  strongestChannel: { index: 3, label: 'T8', weight: 1 },
  focality: { share: 0.3, channel: 'T8' },
});
const alpha = evidence({
  oneOverF: { exponent: 1.2, offset: 1, rangeHz: [2, 40] },
  alphaPeakHz: 10.2,
  alphaProminence: 0.8,
  dipole: { position: [0, -60, 20], moment: [0, 1, 0], residualVariance: 0.04, atBoundary: false, region: 'midline occipital, superficial' },
});

describe('suggestVerdict', () => {
  it('removes a blink component for every aim and says why with numbers (common practice: ocular always goes)', () => {
    for (const aim of AIMS) {
      const s = suggestVerdict(blink, aim);
      expect(s).toMatchObject({ verdict: 'remove', reason: 'blink' });
      expect(s.because[0]).toBe('r = 0.93 with vertical EOG (VEOG)');
      expect(s.because[1]).toMatch(/^map 71 % frontal-pole, 4\.5× the rest/);
    }
  });

  it('removes a horizontal eye movement (antisymmetric, slow, step-like) for every aim, even without EOG', () => {
    for (const aim of AIMS) expect(suggestVerdict(saccade, aim)).toMatchObject({ verdict: 'remove', reason: 'gaze' });
    expect(suggestVerdict(saccade, 'erp').because.join(' ')).toMatch(/antisymmetric \(0\.97/);
  });

  it('does not call an antisymmetric slow map an eye movement when it does not reach the front of the head', () => {
    const temporalPair = evidence({ lateralAntisymmetry: 0.98, lowFrequencyShare: 0.55, stepLikeness: 0.8, frontalGradient: 0.1, oneOverF: { exponent: 1.6, offset: 1, rangeHz: [2, 40] }, dipole: alpha.dipole });
    expect(suggestVerdict(temporalPair, 'erp')).toMatchObject({ verdict: 'keep', reason: 'neural' });
  });

  it('leaves a map-only ocular reading on a dipolar alpha component to the reviewer', () => {
    const m = { ...alpha, lateralAntisymmetry: 0.9, lowFrequencyShare: 0.6, frontalGradient: 1.2, stepLikeness: 0.1 };
    expect(suggestVerdict(m, 'erp')).toMatchObject({ verdict: 'undecided', reason: 'mixed' });
    expect(suggestVerdict(m, 'conservative')).toMatchObject({ verdict: 'keep', reason: 'mixed' });
  });

  it('keeps muscle that is not time-locked for ERPs but removes it for oscillations (common practice)', () => {
    const m = { ...muscle, erp: erp(0.001, 0.6) };
    expect(suggestVerdict(m, 'erp')).toMatchObject({ verdict: 'keep', reason: 'muscle' });
    expect(suggestVerdict(m, 'erp').because.join(' ')).toMatch(/averages out/);
    expect(suggestVerdict(m, 'oscillations')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
    expect(suggestVerdict(m, 'conservative')).toMatchObject({ verdict: 'remove', reason: 'muscle' }); // 80 % is unmistakable
  });

  it('removes time-locked muscle for ERPs too', () => {
    expect(suggestVerdict({ ...muscle, erp: erp(0.2, 0.02) }, 'erp')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
  });

  it('keeps a dipolar component with a 1/f spectrum and an alpha peak as neural for every aim', () => {
    for (const aim of AIMS) {
      const s = suggestVerdict(alpha, aim);
      expect(s).toMatchObject({ verdict: 'keep', reason: 'neural' });
      expect(s.because).toContain('alpha peak at 10.2 Hz, 0.80 log10 above the 1/f line');
    }
  });

  it('keeps an event-locked dipolar component as neural', () => {
    const evoked = evidence({ dipole: alpha.dipole, erp: erp(0.3, 0.02), highFrequencyShare: 0.4, highFrequencySlope: 0 });
    for (const aim of AIMS) expect(suggestVerdict(evoked, aim)).toMatchObject({ verdict: 'keep', reason: 'neural' });
  });

  it('keeps a component it cannot identify, as "unclear" (common practice)', () => {
    for (const aim of AIMS) expect(suggestVerdict(evidence(), aim)).toMatchObject({ verdict: 'keep', reason: 'unclear' });
  });

  it('removes a single-electrode component and names the electrode', () => {
    const s = suggestVerdict(evidence({ focality: { share: 0.91, channel: 'P7' } }), 'conservative');
    expect(s).toEqual({ verdict: 'remove', reason: 'contact', because: ['one electrode (P7) carries 91 % of the map'] });
  });

  it('names line noise before the muscle signs it also shows', () => {
    const s = suggestVerdict(evidence({ mainsShare: 0.86, linePeakRatio: 700, highFrequencyShare: 0.6, highFrequencySlope: 0, focality: { share: 0.3, channel: 'T8' } }), 'erp');
    expect(s.reason).toBe('mains');
    expect(s.because[1]).toMatch(/^also shows signs of muscle/);
  });

  it('suggests cardiac and motion removal from beat periodicity and step locking', () => {
    expect(suggestVerdict(evidence({ cardiac: { bpm: 72.4, peak: 0.8 } }), 'erp')).toEqual({
      verdict: 'remove',
      reason: 'cardiac',
      because: ['periodic at 72 beats per minute (autocorrelation 0.80)'],
    });
    expect(suggestVerdict(evidence({ stepLocking: { share: 0.9, event: 'step/left', nEpochs: 120 } }), 'oscillations').reason).toBe('movement');
  });

  it('reads a heart-rate periodicity as cardiac only when the beats are regular (inter-beat CV ≤ 0.12; heart rate at rest varies a few percent: common practice)', () => {
    // A heartbeat: periodic slope energy and beats that recur within 4 % of each other → cardiac, remove for every aim.
    const heart = evidence({ cardiac: { bpm: 70, peak: 0.8, beatSharpness: 2.2, intervalCv: 0.04 } });
    for (const aim of AIMS) expect(suggestVerdict(heart, aim)).toMatchObject({ verdict: 'remove', reason: 'cardiac' });
    const fired = suggestWithRules(heart, 'erp').rules;
    expect(fired).toContainEqual({ measure: 'cardiac.intervalCv', value: 0.04, threshold: 0.12, direction: '≤', source: 'ours' });
    expect(suggestVerdict(heart, 'erp').because[0]).toBe('periodic at 70 beats per minute (autocorrelation 0.80), beats regular (inter-beat intervals vary by 4 %)');
    // An alpha component whose burst envelope happens to recur at a heart-like lag: the same periodicity, but the
    // slope-energy maxima recur irregularly (CV 0.2) → no cardiac reading; its brain evidence keeps it, every aim.
    const alphaBursts = { ...alpha, cardiac: { bpm: 70, peak: 0.48, beatSharpness: 1.2, intervalCv: 0.2 } };
    for (const aim of AIMS) expect(suggestVerdict(alphaBursts, aim)).toMatchObject({ verdict: 'keep', reason: 'neural' });
    expect(recogniseComponent(alphaBursts).findings.map((f) => f.signature)).not.toContain('cardiac');
    // Without a measured interval CV (fewer than 10 beats, or evidence from before it was measured) the periodicity decides.
    expect(suggestVerdict(evidence({ cardiac: { bpm: 70, peak: 0.8, intervalCv: NaN } }), 'erp').reason).toBe('cardiac');
  });

  it('leaves brain-like components with a weak muscle sign to the reviewer ("mixed"), kept under conservative', () => {
    const m = { ...alpha, highFrequencyShare: 0.65, highFrequencySlope: 0, focality: { share: 0.3, channel: 'O2' } };
    expect(suggestVerdict(m, 'erp')).toMatchObject({ verdict: 'undecided', reason: 'mixed' });
    expect(suggestVerdict(m, 'oscillations')).toMatchObject({ verdict: 'undecided', reason: 'mixed' });
    expect(suggestVerdict(m, 'conservative')).toMatchObject({ verdict: 'keep', reason: 'mixed' });
  });

  it('follows the user’s thresholds when they override the defaults', () => {
    const e = evidence({ focality: { share: 0.65, channel: 'O1' } });
    expect(suggestVerdict(e, 'erp').reason).toBe('contact');
    expect(suggestVerdict(e, 'erp', resolveThresholds({ electrodeFocality: 0.8 })).reason).toBe('unclear');
    expect(resolveThresholds({ electrodeFocality: NaN }).electrodeFocality).toBe(defaultThresholds.electrodeFocality);
  });

  it('puts a number in every sentence of an artifact suggestion', () => {
    for (const e of [blink, saccade, muscle, alpha])
      for (const s of Object.values(suggestAllAims(e)))
        for (const sentence of s.because.filter((b) => !/common practice|removed for every aim|averages out|biases|no events/.test(b))) expect(sentence).toMatch(/\d/);
  });

  it('lists every signature it recognises', () => {
    expect(recogniseComponent(blink).findings.map((f) => f.signature)).toEqual(['blink']);
  });
});

/**
 * Issue 10 item 2: one test per precedence rule, on hand-built evidence. Each names the source of the rule
 * and of the numbers it turns on (thresholds.ts says the same beside each value).
 */
describe('suggestion precedence (docs/suggestion-rules.md)', () => {
  // Rule 1 — ours (precedence), threshold common practice (from memory): focality ≥ 0.6.
  it('1: a map on one electrode is a contact fault whatever its spectrum, removed for every aim (contact over muscle and mains)', () => {
    const e = evidence({ ...muscle, mainsShare: 0.7, focality: { share: 0.8, channel: 'T8' } });
    for (const aim of AIMS) {
      const { suggestion, rules } = suggestWithRules(e, aim);
      expect(suggestion).toMatchObject({ verdict: 'remove', reason: 'contact' });
      expect(suggestion.because[0]).toBe('one electrode (T8) carries 80 % of the map');
      expect(suggestion.because[1]).toMatch(/^also shows signs of mains and muscle/);
      expect(rules).toContainEqual({ measure: 'focality.share', value: 0.8, threshold: 0.6, direction: '≥', source: 'common practice' });
    }
    // Today's bug: this used to be "keep, muscle" for erp.
    expect(suggestVerdict(evidence({ ...muscle, focality: { share: 0.7, channel: 'T8' } }), 'erp')).toMatchObject({ verdict: 'remove', reason: 'contact' });
  });

  // Rule 2 — ours: muscle needs spectrum AND spatial support; spectrum thresholds ours / common practice (slope).
  it('2: muscle needs a flat spectrum above 20 Hz and spatial support (patchy, rim or shallow dipole)', () => {
    const flat = { highFrequencyShare: 0.7, highFrequencySlope: 0.1, varianceShare: 0.05 };
    // patchy map (focality ≥ 0.25, ours)
    expect(suggestVerdict(evidence({ ...flat, focality: { share: 0.3, channel: 'Cz' } }), 'oscillations')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
    // strongest at a rim electrode (common practice) with focality ≥ 0.1 (ours)
    const rim = suggestWithRules(evidence({ ...flat, focality: { share: 0.12, channel: 'FT7' } }), 'oscillations');
    expect(rim.suggestion).toMatchObject({ verdict: 'remove', reason: 'muscle' });
    expect(rim.suggestion.because[1]).toMatch(/strongest at FT7, on the rim/);
    expect(rim.rules.map((r) => r.measure)).toEqual(['highFrequencyShare', 'highFrequencySlope', 'highFrequencyShare', 'focality.share']);
    // shallow dipole (≥ 70 mm from the centre, ours) or one stopped at the boundary
    const shallow = { position: [62, 10, 35] as const, moment: [1, 0, 0] as const, residualVariance: 0.4, atBoundary: false, region: 'right temporal, superficial' };
    expect(suggestVerdict(evidence({ ...flat, dipole: shallow }), 'oscillations').reason).toBe('muscle');
    expect(suggestVerdict(evidence({ ...flat, dipole: { ...shallow, position: [20, 10, 30], atBoundary: true } }), 'oscillations').reason).toBe('muscle');
    // the same spectrum, diffuse map, deep dipole and a large variance share: not muscle
    const deep = suggestVerdict(evidence({ ...flat, dipole: { ...shallow, position: [10, 5, 30] } }), 'oscillations');
    expect(deep).toMatchObject({ verdict: 'keep', reason: 'unclear' });
    expect(deep.because.join(' ')).toMatch(/no spatial support for muscle/);
    expect(isRimElectrode('T7') && isRimElectrode('Fp1') && isRimElectrode('O2') && !isRimElectrode('Cz') && !isRimElectrode('C3')).toBe(true);
  });

  // Rule 3 — common practice (small flat diffuse components are sensor noise), 2 % cut ours.
  it('3: a flat white spectrum on a diffuse map with a tiny variance share is sensor noise: unclear, keep — never muscle', () => {
    const noise = evidence({ highFrequencyShare: 0.62, highFrequencySlope: 0, varianceShare: 0.004, focality: { share: 0.04, channel: 'C3' } });
    for (const aim of AIMS) {
      const { suggestion, rules } = suggestWithRules(noise, aim);
      expect(suggestion).toMatchObject({ verdict: 'keep', reason: 'unclear' });
      expect(suggestion.because.join(' ')).toMatch(/0\.4 % of the variance: .*sensor noise/);
      expect(rules).toContainEqual({ measure: 'varianceShare', value: 0.004, threshold: 0.02, direction: '≤', source: 'ours' });
    }
    expect(recogniseComponent(noise).findings).toEqual([]);
  });

  // Rule 4 — ours: strong conflicting artifact signatures give "mixed"; the verdict follows the aim.
  it('4: strong blink and strong muscle together are "mixed": remove for erp and oscillations, undecided when conservative', () => {
    const both = evidence({ ...blink, highFrequencyShare: 0.7, highFrequencySlope: 0, focality: { share: 0.35, channel: 'Fp1' }, strongestChannel: { index: 0, label: 'Fp1', weight: 1 } });
    expect(recogniseComponent(both).findings.map((f) => [f.signature, f.strong])).toEqual([
      ['blink', true],
      ['muscle', true],
    ]);
    expect(suggestVerdict(both, 'erp')).toMatchObject({ verdict: 'remove', reason: 'mixed' });
    expect(suggestVerdict(both, 'oscillations')).toMatchObject({ verdict: 'remove', reason: 'mixed' });
    expect(suggestVerdict(both, 'conservative')).toMatchObject({ verdict: 'undecided', reason: 'mixed' });
    expect(suggestVerdict(both, 'erp').because[0]).toBe('strong signs of both blink and muscle');
    // a weak second reading does not conflict: the blink names it
    const weakMuscle = { ...both, highFrequencyShare: 0.45 };
    expect(suggestVerdict(weakMuscle, 'conservative')).toMatchObject({ verdict: 'remove', reason: 'blink' });
  });

  // Rule 5 — as before (issue 6; our reading of common practice): weak artifact + strong brain evidence.
  it('5: a weak artifact sign on strong brain evidence stays "mixed" as before (undecided; keep when conservative)', () => {
    const m = { ...alpha, highFrequencyShare: 0.62, highFrequencySlope: 0, focality: { share: 0.3, channel: 'O2' } }; // ≥ 0.6 passes the dipole veto; the alpha peak keeps it weak
    const { suggestion, rules } = suggestWithRules(m, 'erp');
    expect(suggestion).toMatchObject({ verdict: 'undecided', reason: 'mixed' });
    expect(rules.map((r) => r.measure)).toContain('dipole.residualVariance');
    expect(suggestVerdict(m, 'conservative')).toMatchObject({ verdict: 'keep', reason: 'mixed' });
  });

  // Rule e — every suggestion lists its rules (ours); sources come from thresholds.ts.
  it('lists the fired rules, with their sources, and keeps suggestVerdict the same as suggestWithRules', () => {
    for (const e of [blink, saccade, muscle, alpha, evidence({ cardiac: { bpm: 70, peak: 0.8 } })])
      for (const aim of AIMS) {
        const { suggestion, rules } = suggestWithRules(e, aim);
        expect(suggestVerdict(e, aim)).toEqual(suggestion);
        expect(rules.length).toBeGreaterThan(0);
        for (const r of rules) {
          expect(['common practice', 'ours']).toContain(r.source);
          expect(r.direction === '≥' ? r.value >= r.threshold : r.value <= r.threshold).toBe(true);
        }
      }
    expect(suggestWithRules(blink, 'erp').rules[0]).toEqual({ measure: 'eogCorrelation.vertical', value: 0.93, threshold: 0.7, direction: '≥', source: 'common practice' });
  });
});

/**
 * Issue 10 items 2 and 7: the rules added while tuning on the validation family (tuning seeds 1–999 only;
 * docs/suggestion-rules.md). One test per rule on hand-built evidence; each names its source.
 */
describe('rules tuned on the validation family (docs/suggestion-rules.md)', () => {
  // A 19-electrode map: index 0 is the strongest electrode.
  const focalMap = (restValues: number[]) => Float64Array.from([1, ...restValues]);

  // Ours: a bad contact leaves the rest of the map flat (the reference's share on every other electrode).
  it('a focal map is a contact only when the rest of the map is flat; a focal muscle map with structure stays muscle', () => {
    const flatRest = focalMap(Array.from({ length: 18 }, () => -1 / 19)); // average-referenced single electrode
    const contact = suggestWithRules(evidence({ ...muscle, map: flatRest, focality: { share: 0.95, channel: 'T8' } }), 'erp');
    expect(contact.suggestion).toMatchObject({ verdict: 'remove', reason: 'contact' });
    expect(contact.rules.map((r) => r.measure)).toEqual(expect.arrayContaining(['focality.share', 'focality.restStructure']));
    // neighbours carry part of the map unevenly (a shallow muscle patch): not a single electrode
    const patch = focalMap([0.45, 0.4, 0.3, 0.2, ...Array.from({ length: 14 }, () => -0.1)]);
    const m = suggestWithRules(evidence({ ...muscle, map: patch, focality: { share: 0.7, channel: 'T8' }, erp: erp(0.001, 0.6) }), 'oscillations');
    expect(m.suggestion).toMatchObject({ verdict: 'remove', reason: 'muscle' });
  });

  // Common practice (EMG comes in bursts; sensor noise is Gaussian); 1 and 1 % ours.
  it('a Gaussian flat-spectrum component with a small variance share is noise even when strongest at a rim electrode', () => {
    const e = evidence({ highFrequencyShare: 0.6, highFrequencySlope: 0, kurtosis: 0.05, varianceShare: 0.004, focality: { share: 0.15, channel: 'F8' }, strongestChannel: { index: 0, label: 'F8', weight: 1 } });
    for (const aim of AIMS) {
      const { suggestion, rules } = suggestWithRules(e, aim);
      expect(suggestion).toMatchObject({ verdict: 'keep', reason: 'unclear' });
      expect(suggestion.because.join(' ')).toMatch(/no bursts \(excess kurtosis 0\.1\).*Gaussian broadband noise/);
      expect(rules).toContainEqual({ measure: 'kurtosis', value: 0.05, threshold: 1, direction: '≤', source: 'ours' });
    }
    // the same with bursts is muscle
    expect(suggestVerdict({ ...e, kurtosis: 12 }, 'oscillations')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
  });

  // Common practice: blinks return within ~0.3 s, vertical saccades shift the level; 6 ours.
  it('step-like vertical deflections without blink sparseness are gaze, not blink', () => {
    const vertical = { ...blink, stepLikeness: 0.9, kurtosis: 1.5 };
    for (const aim of AIMS) expect(suggestVerdict(vertical, aim)).toMatchObject({ verdict: 'remove', reason: 'gaze' });
    expect(suggestVerdict(vertical, 'erp').because.join(' ')).toMatch(/persist as steps \(0\.90\).*vertical eye movement/);
    expect(suggestVerdict({ ...vertical, kurtosis: 20 }, 'erp').reason).toBe('blink');
  });

  // Ours: the frontal proxy is built from the cap's own electrodes, so a correlation with it needs a slow spectrum.
  it('a correlation with the frontal EOG proxy alone, without a clearly slow spectrum, is not ocular', () => {
    const proxyEog = { vertical: 0.1, horizontal: 0.75, source: 'frontal bipolar' as const, channels: { vertical: 'Fp1+Fp2 vs average', horizontal: 'F8 − F7' } };
    const brainy = evidence({ eogCorrelation: proxyEog, stepLikeness: 0.9, lowFrequencyShare: 0.6, oneOverF: { exponent: 1.8, offset: 1, rangeHz: [2, 40] } });
    expect(suggestVerdict(brainy, 'erp').reason).not.toBe('gaze');
    expect(suggestVerdict({ ...brainy, lowFrequencyShare: 0.8 }, 'erp')).toMatchObject({ verdict: 'remove', reason: 'gaze' });
    // with real EOG channels the step-like time course still corroborates (unchanged)
    expect(suggestVerdict({ ...brainy, eogCorrelation: { ...proxyEog, source: 'EOG channels' } }, 'erp').reason).toBe('gaze');
  });

  // Ours: neck EMG fires with heel strikes, so step-locked bursty broadband activity is muscle, not movement.
  it('names step-locked muscle as muscle; slow step-locked sway stays movement', () => {
    const neck = { ...muscle, stepLocking: { share: 0.3, event: 'step', nEpochs: 200 } };
    expect(suggestVerdict(neck, 'oscillations')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
    expect(suggestVerdict(evidence({ stepLocking: { share: 0.3, event: 'step', nEpochs: 200 }, lowFrequencyShare: 0.8 }), 'oscillations').reason).toBe('movement');
  });

  // Ours: only a clear alpha peak (≥ 0.3 log10) keeps strong muscle weak.
  it('a small alpha bump does not weaken unmistakable muscle; a clear alpha peak does', () => {
    const bump = { ...muscle, alphaPeakHz: 10.5, alphaProminence: 0.15 };
    expect(suggestVerdict(bump, 'conservative')).toMatchObject({ verdict: 'remove', reason: 'muscle' });
    const peak = { ...muscle, alphaPeakHz: 10.5, alphaProminence: 0.5 };
    expect(suggestVerdict(peak, 'conservative')).toMatchObject({ verdict: 'keep', reason: 'muscle' });
  });
});
