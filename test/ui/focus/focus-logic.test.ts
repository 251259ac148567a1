import { describe, expect, it } from 'vitest';
import { backProjectedActivation, mixingColumn, neighbourIndex, strongestChannels } from '../../../src/ui/focus/focus-logic.ts';

describe('neighbourIndex', () => {
  it('steps within 1…n and stops at the ends', () => {
    expect(neighbourIndex(3, 5, 1)).toBe(4);
    expect(neighbourIndex(5, 5, 1)).toBe(5);
    expect(neighbourIndex(1, 5, -1)).toBe(1);
    expect(neighbourIndex(null, 5, 1)).toBe(2);
    expect(neighbourIndex(2, 0, 1)).toBeNull();
  });
});

// 3 channels × 2 components, row-major: A = [[1, 0.5], [-3, 0], [2, 1]]
const A = Float64Array.from([1, 0.5, -3, 0, 2, 1]);

describe('strongestChannels', () => {
  it('orders channels by the magnitude of the map weight', () => {
    expect(strongestChannels(A, 3, 2, 0, 2)).toEqual([1, 2]);
    expect(strongestChannels(A, 3, 2, 1, 3)).toEqual([2, 0, 1]);
  });
  it('skips channels the recording lacks', () => {
    expect(strongestChannels(A, 3, 2, 0, 2, [0, -1, 2])).toEqual([2, 0]);
  });
});

describe('backProjectedActivation', () => {
  it('is A[c,i] · W[i,:] (x − m), worked by hand', () => {
    const W = Float64Array.from([1, 1, 0, 0, 0, 1]); // component 0 = ch0 + ch1
    const X = Float32Array.from([1, 2, 10, 20, 0, 0]); // 3 channels × 2 samples
    const m = Float64Array.from([1, 10, 0]);
    const s = backProjectedActivation(W, A, 3, 2, 0, 1, X, 2, m);
    // s_0 = (1 − 1) + (10 − 10) = 0, then (2 − 1) + (20 − 10) = 11; times A[1,0] = −3
    expect(Array.from(s)).toEqual([-0, -33]);
  });
});

describe('mixingColumn', () => {
  it('reads column i of the row-major mixing matrix', () => {
    expect(Array.from(mixingColumn(A, 3, 2, 1))).toEqual([0.5, 0, 1]);
  });
});

describe('the four questions', () => {
  it('gives every evidence row and every rule measure of the suggestion rules one question', async () => {
    const { questionOfRow, questionOfMeasure, QUESTIONS } = await import('../../../src/ui/focus/focus-logic.ts');
    expect(QUESTIONS.map((q) => q.title)).toEqual(['Where does it come from?', 'When does it happen?', 'Is it locked to the task?', 'Which frequencies?']);
    // Measures the rules compare (src/core/review/suggest.ts check(…) calls).
    const measures = ['alphaProminence', 'cardiac.peak', 'dipole.distanceFromCentreMm', 'dipole.residualVariance', 'eogCorrelation.horizontal',
      'eogCorrelation.vertical', 'erp.timeLockingStrength', 'focality.share', 'frontalGradient', 'highFrequencyShare', 'highFrequencySlope',
      'kurtosis', 'lateralAntisymmetry', 'lowFrequencyShare', 'mainsShare', 'oneOverF.exponent', 'stepLikeness', 'stepLocking.share', 'varianceShare'];
    for (const m of measures) expect(questionOfMeasure(m), m).not.toBeNull();
    expect(questionOfMeasure('dipole.residualVariance')).toBe('where');
    expect(questionOfMeasure('eogCorrelation.vertical')).toBe('when');
    expect(questionOfMeasure('stepLocking.share')).toBe('locked');
    expect(questionOfMeasure('oneOverF.exponent')).toBe('frequencies');
    expect(questionOfMeasure('alphaProminenceX')).toBeNull(); // a prefix only matches whole path parts
    expect(questionOfRow('rv')).toBe('where');
    expect(questionOfRow('hf')).toBe('frequencies');
    expect(questionOfRow('locking:tone')).toBe('locked');
  });
  it('splits items by question and steps through the questions with wrap-around', async () => {
    const { byQuestion, stepQuestion } = await import('../../../src/ui/focus/focus-logic.ts');
    const g = byQuestion(['rv', 'hf', 'zzz'], (k) => (k === 'rv' ? 'where' : k === 'hf' ? 'frequencies' : null));
    expect(g).toEqual({ where: ['rv'], when: [], locked: [], frequencies: ['hf'], other: ['zzz'] });
    expect(stepQuestion('where', 1)).toBe('when');
    expect(stepQuestion('where', -1)).toBe('frequencies');
    expect(stepQuestion('frequencies', 1)).toBe('where');
  });
  it('writes a fired rule with its source and never a negative zero', async () => {
    const { firedRuleText, trimZero } = await import('../../../src/ui/focus/focus-logic.ts');
    expect(firedRuleText({ value: 0.912, threshold: 0.6, direction: '≥', source: 'common practice' }, true)).toBe('91\u00a0% ≥ 60\u00a0% (common practice)');
    expect(firedRuleText({ value: 12.3456, threshold: 5, direction: '≥', source: 'ours' }, false)).toBe('12.3 ≥ 5 (ours)');
    expect(trimZero('-0.0')).toBe('0');
    expect(trimZero('2.50')).toBe('2.5');
  });
});

describe('componentTrace', () => {
  it('is A[c,i] · W[i,:] (x − m) over the whole recording, skipping missing channels (worked by hand)', async () => {
    const { componentTrace } = await import('../../../src/ui/focus/focus-logic.ts');
    // data rows: ch0 = [1, 2], ch1 = [10, 20]; decomposition channel 0 ↔ row 1, channel 1 ↔ row 0, channel 2 missing
    const data = Float32Array.from([1, 2, 10, 20]);
    const t = componentTrace(data, 2, [1, 0, -1], [1, 2, 5], [1, 0, 0], 0.5);
    // ((10 − 1)·1 + 1·2) · 0.5 = 5.5 ; ((20 − 1) + 2·2) · 0.5 = 11.5
    expect(Array.from(t)).toEqual([5.5, 11.5]);
  });
});

describe('answerLines', () => {
  it('gives each question its first numbers, percentages with a no-break space and no negative shares', async () => {
    const { answerLines } = await import('../../../src/ui/focus/focus-logic.ts');
    const lines = answerLines(
      {
        strongestChannel: { label: 'Fp1' }, varianceShare: 0.153, dipole: { residualVariance: 0.04, region: 'frontal' },
        kurtosis: 23.1, eogCorrelation: { vertical: 0.95, horizontal: 0.02 }, cardiac: { bpm: null },
        erp: { event: 'tone', lockedShare: -0.01, nEpochs: 138 }, stepLocking: { share: 0.006, event: 'step, foot right' },
        oneOverF: { exponent: 2.54 }, alphaPeakHz: null, highFrequencyShare: 0.003,
      },
      (k) => `“${k}”`,
    );
    expect(lines.where).toBe('15\u00a0% of variance, strongest at Fp1 · dipole frontal');
    expect(lines.when).toBe('kurtosis 23.1 · eye channel r 0.95');
    expect(lines.locked).toBe('0\u00a0% locked to “tone” · 1\u00a0% to step, foot right');
    expect(lines.frequencies).toBe('1/f exponent 2.54 · no alpha peak · 0\u00a0% above 20\u00a0Hz');
  });
});
