import { describe, expect, it } from 'vitest';
import { recogniseComponent, suggestAllAims, suggestVerdict, type SuggestionInput } from '../../../src/core/review/suggest.ts';
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
const muscle = evidence({ highFrequencyShare: 0.8, highFrequencySlope: 0, kurtosis: 30, oneOverF: { exponent: -1.5, offset: 1, rangeHz: [2, 40] } });
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

  it('names line noise before the muscle and electrode signs it also shows', () => {
    const s = suggestVerdict(evidence({ mainsShare: 0.86, linePeakRatio: 700, highFrequencyShare: 0.6, highFrequencySlope: 0, focality: { share: 0.7, channel: 'T8' } }), 'erp');
    expect(s.reason).toBe('mains');
    expect(s.because[1]).toMatch(/^also shows signs of muscle and contact/);
  });

  it('suggests cardiac and motion removal from beat periodicity and step locking', () => {
    expect(suggestVerdict(evidence({ cardiac: { bpm: 72.4, peak: 0.8 } }), 'erp')).toEqual({
      verdict: 'remove',
      reason: 'cardiac',
      because: ['periodic at 72 beats per minute (autocorrelation 0.80)'],
    });
    expect(suggestVerdict(evidence({ stepLocking: { share: 0.9, event: 'step/left', nEpochs: 120 } }), 'oscillations').reason).toBe('movement');
  });

  it('leaves brain-like components with a weak muscle sign to the reviewer ("mixed"), kept under conservative', () => {
    const m = { ...alpha, highFrequencyShare: 0.65, highFrequencySlope: 0 };
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
