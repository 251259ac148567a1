import { describe, expect, it } from 'vitest';
import { methodsText } from '../../../src/core/review/methods-text.ts';
import { defaultThresholds } from '../../../src/core/review/thresholds.ts';

const base = {
  software: 'winnow 0.1.0',
  recordingFileName: 'sub-01_task-oddball_eeg.edf',
  recordingSha256: 'c'.repeat(64),
  decomposition: {
    method: 'infomax' as const, nComponents: 4, nChannels: 4, rank: 4, converged: true, iterations: 212,
    preprocessing: { filter: 'windowed-sinc FIR, zero phase', highpassHz: 1, lowpassHz: null, reference: 'average', excludedChannels: [] },
  },
  thresholds: defaultThresholds,
};

describe('methodsText', () => {
  it('names every removed component with its reason, the aim, and the variance removed', () => {
    const text = methodsText({
      ...base, aim: 'erp',
      decisions: { 1: { verdict: 'remove', reason: 'blink', note: '' }, 2: { verdict: 'keep', reason: 'neural', note: '' }, 4: { verdict: 'remove', reason: 'muscle', note: '' } },
      varianceShare: (i) => [0, 0.3, 0.2, 0.1, 0.05][i],
    });
    expect(text).toContain('2 of 4 components were removed — 1 (blink), 4 (muscle)');
    // 0.30 + 0.05 = 35.0 % (hand sum)
    expect(text).toContain('together 35.0 %');
    expect(text).toContain('event-related potential');
    expect(text).toContain('1 was kept and 1 left undecided was kept as well');
    expect(text).toContain('high-pass filtering at 1 Hz');
    expect(text).toContain(`|r| with the EOG ≥ ${defaultThresholds.eogCorrelation}`);
    expect(text.endsWith('\n')).toBe(true);
    expect(text).not.toMatch(/[<>]/);
  });

  it('says so when nothing was removed', () => {
    const text = methodsText({ ...base, aim: 'conservative', decisions: {} });
    expect(text).toContain('No component was removed.');
    expect(text).toContain('conservative review');
  });

  it('states the rules that held for each removed component, exactly as the suggestion read them', () => {
    const text = methodsText({
      ...base, aim: 'erp',
      decisions: { 1: { verdict: 'remove', reason: 'blink', note: '' }, 2: { verdict: 'keep', reason: null, note: '' } },
      firedRules: (i) => (i === 1 ? [{ measure: 'eogCorrelation.vertical', value: 0.934, threshold: 0.7, direction: '≥', source: 'common practice' }] : null),
    });
    expect(text).toContain('The suggestion rules that held for the removed components were — 1: eogCorrelation.vertical 0.934 ≥ 0.7 (common practice).');
  });

  it('reports what the decomposition missed, or that nothing remained', () => {
    const warned = methodsText({ ...base, aim: 'erp', decisions: {}, residualWarnings: ['Fp1 keeps 62 % of its slow activity that follows the vertical eye reference'] });
    expect(warned).toContain('After cleaning, artefact remained that no removed component held: Fp1 keeps 62 %');
    expect(methodsText({ ...base, aim: 'erp', decisions: {}, residualWarnings: [] })).toContain('no remaining ocular, mains or heartbeat artefact was found');
    expect(methodsText({ ...base, aim: 'erp', decisions: {} })).not.toContain('After cleaning');
  });
});
