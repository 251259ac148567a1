import { beforeAll, describe, expect, it } from 'vitest';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import type { EvidenceResult } from '../../../src/core/evidence/compute-evidence.ts';
import { decomposeRecording } from '../../../src/core/ica/decompose.ts';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import type { SimulatedSession } from '../../../src/core/simulate/truth.ts';
import { evidenceFor, expectClassVerdicts } from './simulated-classes.ts';

// The whole chain on one simulated 32-channel session (2 min, 250 Hz): extended Infomax (seeded), then
// evidence and suggestions. Only sources the decomposition recovered (|map r| ≥ 0.85) are checked; the
// perfect-unmixing tests (classes-32/64) cover more seeds and 64 channels. Decomposed once, in beforeAll.
describe('suggestions after extended Infomax on a simulated 32-channel session', () => {
  let s: SimulatedSession;
  let dec: Decomposition;
  let result: EvidenceResult;
  beforeAll(() => {
    s = simulateSession({ seed: 1, channels: 32, minutes: 2 });
    dec = decomposeRecording({ data: s.data, nChannels: s.labels.length, nSamples: s.nSamples, sampleRate: s.sampleRate, labels: s.labels }, { method: 'infomax', seed: 1 }).decomposition;
    result = evidenceFor(s, dec);
  }, 240_000);

  it('removes blink and eye movement, keeps alpha, mu and event-locked brain, keeps muscle for ERPs only, finds the loose electrode', () => {
    const checked = expectClassVerdicts(s, dec, result, 0.85);
    expect(checked).toMatchObject({ blink: 1, gaze: 1, contact: 1 });
    expect(checked.rhythm).toBeGreaterThanOrEqual(2);
    expect(checked['event-locked']).toBeGreaterThanOrEqual(1);
    expect(checked.muscle).toBeGreaterThanOrEqual(2);
  });
});
