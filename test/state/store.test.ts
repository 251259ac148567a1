import { afterEach, describe, expect, it } from 'vitest';
import { workbenchStore, selectDecidedCount, selectRemovedIndices, selectSuggestion, selectSuggestions, selectUndecidedIndices } from '../../src/state/index.ts';
import { setWorkbenchServices, reviewKey } from '../../src/state/services.ts';
import { decisionsJsonFromState, decisionsTsvFromState } from '../../src/state/exports.ts';
import { fakeServices } from './fake-services.ts';

const edf = () => new File([new Uint8Array(4)], 'sub-01_eeg.edf');
const json = () => new File(['{}'], 'sub-01_decomposition.json');
const st = () => workbenchStore.getState();

afterEach(() => {
  workbenchStore.setState(workbenchStore.getInitialState(), true);
  setWorkbenchServices(null);
});

describe('review slice', () => {
  it('merges a patch into a component decision, undecided with no reason and an empty note by default', () => {
    st().decide(2, { reason: 'muscle' });
    expect(st().decisions[2]).toEqual({ verdict: 'undecided', reason: 'muscle', note: '' });
    st().decide(2, { verdict: 'remove', note: 'bursts at T8' });
    expect(st().decisions[2]).toEqual({ verdict: 'remove', reason: 'muscle', note: 'bursts at T8' });
  });

  it('undoes and redoes each change, and a new change clears the redo stack', () => {
    st().decide(1, { verdict: 'remove' });
    st().decide(1, { reason: 'blink' });
    st().undo();
    expect(st().decisions[1]).toEqual({ verdict: 'remove', reason: null, note: '' });
    st().undo();
    expect(st().decisions[1]).toBeUndefined();
    st().redo();
    expect(st().decisions[1]?.verdict).toBe('remove');
    st().decide(3, { verdict: 'keep' });
    expect(st().future).toHaveLength(0);
    st().redo();
    expect(st().decisions[1]?.reason).toBeNull();
  });

  it('records no history step when a decision does not change', () => {
    st().decide(1, { verdict: 'keep' });
    st().decide(1, { verdict: 'keep' });
    expect(st().past).toHaveLength(1);
  });

  it('ignores decisions for indices that are not 1-based whole numbers', () => {
    st().decide(0, { verdict: 'keep' });
    st().decide(1.5, { verdict: 'keep' });
    expect(st().decisions).toEqual({});
  });

  it('replaces all decisions at once as one undoable step', () => {
    st().decide(1, { verdict: 'keep' });
    st().replaceDecisions({ 2: { verdict: 'remove', reason: 'cardiac', note: '' } }, 'oscillations');
    expect(st().decisions).toEqual({ 2: { verdict: 'remove', reason: 'cardiac', note: '' } });
    expect(st().aim).toBe('oscillations');
    st().undo();
    expect(st().decisions[1]?.verdict).toBe('keep');
  });
});

describe('session slice', () => {
  it('reads recording and decomposition, computes evidence and shows the board with the first component selected', async () => {
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    expect(st().screen).toBe('board');
    expect(st().decomposition?.nComponents).toBe(3);
    expect(st().evidence).toHaveLength(3);
    expect(st().selected).toBe(1);
    expect(st().progress).toBeNull();
    expect(selectUndecidedIndices(st())).toEqual([1, 2, 3]);
  });

  it('stops after reading when asked not to decompose, then computes a decomposition on request', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await st().loadParticipant({ recordingFiles: [edf()], decompose: null });
    expect(st().recording?.fileName).toBe('sub-01_eeg.edf');
    expect(st().decomposition).toBeNull();
    expect(st().screen).toBe('start');
    await st().decomposeCurrent({ method: 'picard', seed: 3, highpassHz: 1 });
    expect(services.decomposeCalls).toBe(1);
    expect(st().screen).toBe('board');
    expect(st().decompositionSha256).toBe('c'.repeat(64));
  });

  it('offers the autosaved review of the same recording and decomposition, and restores it on accept', async () => {
    const saved = new Map([[reviewKey('r'.repeat(64), 'd'.repeat(64)), {
      savedAt: '2026-12-01T12:00:00.000Z', aim: 'oscillations' as const, reviewer: '',
      decisions: { 1: { verdict: 'remove' as const, reason: 'blink' as const, note: 'saved' } },
    }]]);
    setWorkbenchServices(fakeServices(saved));
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    expect(st().resumeOffer?.decidedCount).toBe(1);
    expect(st().decisions).toEqual({});
    st().resume(true);
    expect(st().decisions[1]).toEqual({ verdict: 'remove', reason: 'blink', note: 'saved' });
    expect(st().aim).toBe('oscillations');
    expect(st().resumeOffer).toBeNull();
  });

  it('cancels a load from the progress record and says so', async () => {
    const services = fakeServices();
    services.readRecording = (_files, signal) =>
      new Promise((_, reject) => signal.addEventListener('abort', () => reject(new Error('aborted'))));
    setWorkbenchServices(services);
    const loading = st().loadParticipant({ recordingFiles: [edf()] });
    await new Promise((r) => setTimeout(r, 0));
    expect(st().progress?.task).toBe('Reading the recording');
    st().progress?.cancel?.();
    await loading;
    expect(st().progress).toBeNull();
    expect(st().notice).toEqual({ kind: 'info', text: 'Cancelled.' });
    expect(st().recording).toBeNull();
  });

  it('re-suggests at once when the aim or a threshold changes, without computing the evidence again', async () => {
    const services = fakeServices();
    setWorkbenchServices(services);
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    expect(services.evidenceCalls).toBe(1);
    const erp = selectSuggestions(st());
    expect(selectSuggestions(st())).toBe(erp); // memoised: same inputs, same map
    expect(erp.get(1)!.suggestion).toMatchObject({ verdict: 'remove', reason: 'blink' });
    expect(erp.get(1)!.rules.some((r) => r.measure === 'eogCorrelation.vertical' && r.value === 0.95)).toBe(true);
    st().setAim('oscillations');
    expect(selectSuggestions(st())).not.toBe(erp);
    // a blink EOG threshold above the component's r = 0.95: the EOG rule no longer fires
    st().setThresholds({ eogCorrelation: 0.99 });
    expect(selectSuggestion(1)(st())!.rules.some((r) => r.measure === 'eogCorrelation.vertical')).toBe(false);
    expect(services.evidenceCalls).toBe(1);
    expect(st().evidence).toHaveLength(3);
  });

  it('restores exactly the exported decisions into a fresh session (JSON round trip)', async () => {
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    st().setAim('conservative');
    st().setReviewer('R. One');
    st().decide(1, { verdict: 'remove', reason: 'blink', note: 'line 1\nline 2' });
    st().decide(3, { verdict: 'keep', reason: 'neural' });
    const before = { decisions: st().decisions, aim: st().aim };
    const exported = decisionsJsonFromState(st())!;
    const parsed = JSON.parse(exported);
    // the conservative aim's suggestion, computed from the evidence (a blink goes for every aim)
    expect(parsed.components[0].suggested).toMatchObject({ verdict: 'remove', reason: 'blink' });
    expect(parsed.components[0].suggested.because).toEqual([...selectSuggestion(1)(st())!.suggestion.because]);
    expect(parsed.reviewer).toBe('R. One');

    workbenchStore.setState(workbenchStore.getInitialState(), true);
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    expect(await st().importDecisions(new File([exported], 'sub-01_decisions.json'))).toBe(true);
    expect({ decisions: st().decisions, aim: st().aim }).toEqual(before);
    expect(selectRemovedIndices(st())).toEqual([1]);
    expect(selectDecidedCount(st())).toBe(2);
  });

  it('restores the decisions from the TSV twin too', async () => {
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    st().decide(2, { verdict: 'remove', reason: 'muscle', note: '=SUM(A1)' });
    const tsv = decisionsTsvFromState(st())!;
    const expected = st().decisions;
    st().replaceDecisions({});
    expect(await st().importDecisions(new File([tsv], 'sub-01_decisions.tsv'))).toBe(true);
    expect(st().decisions).toEqual(expected);
  });

  it('refuses a decisions file made for another recording', async () => {
    setWorkbenchServices(fakeServices());
    await st().loadParticipant({ recordingFiles: [edf()], decompositionFiles: [json()] });
    const other = decisionsJsonFromState(st())!.replace('r'.repeat(64), 'f'.repeat(64));
    expect(await st().importDecisions(other)).toBe(false);
    expect(st().notice?.kind).toBe('error');
    expect(st().notice?.text).toMatch(/another recording/);
  });
});

// Autosave and the saved-review history: test/state/review-persistence.test.ts.
