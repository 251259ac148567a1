import { describe, expect, it } from 'vitest';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import { evidenceFor, expectClassVerdicts, perfectDecomposition } from './simulated-classes.ts';

// Simulated 64-channel sessions (2 min, 250 Hz) with a perfect unmixing (pseudo-inverse of the true mixing):
// the evidence and rules alone, over several seeds. classes-ica.test.ts repeats the check after real ICA (32 channels).
describe('suggestions on simulated 64-channel sessions with a perfect unmixing', () => {
  for (const seed of [4, 5]) {
    it(`removes ocular, keeps rhythms and event-locked brain, keeps muscle for ERPs only, finds the loose electrode (seed ${seed})`, () => {
      const s = simulateSession({ seed, channels: 64, minutes: 2 });
      const dec = perfectDecomposition(s);
      const checked = expectClassVerdicts(s, dec, evidenceFor(s, dec));
      expect(checked).toMatchObject({ blink: 1, gaze: 1, rhythm: 3, contact: 1 });
      expect(checked['event-locked']).toBeGreaterThanOrEqual(1);
      expect(checked.muscle).toBeGreaterThanOrEqual(2);
    });
  }
});
