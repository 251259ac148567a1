/** In-memory workbench services for the store tests: a 2-channel recording and a 3-component decomposition. */
import type { WorkbenchServices, SavedReview } from '../../src/state/services.ts';
import type { LoadedRecording } from '../../src/core/recording.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';
import type { ComponentEvidence } from '../../src/core/evidence/types.ts';

export const recording = {
  fileName: 'sub-01_eeg.edf', format: 'EDF+C',
  header: { patientId: 'X X X X', recordingId: 'Startdate X X X X', start: '2026-01-01T10:00:00', headerBytes: 768, records: 2, recordDurationSeconds: 1, recordOnsets: new Float64Array([0, 1]) },
  channels: [], durationSeconds: 2, events: [],
  signals: { labels: ['Fz', 'Cz'], sampleRate: 4, nSamples: 8, data: new Float32Array(16) },
  warnings: [],
} as unknown as LoadedRecording;

export const decomposition: Decomposition = {
  channels: ['Fz', 'Cz'], nChannels: 2, nComponents: 3,
  mixing: new Float64Array(6), unmixing: new Float64Array(6), channelMeans: null,
  method: 'imported', rank: 2, iterations: 0, converged: true,
  preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'as recorded', excludedChannels: [] },
  recordingSha256: 'r'.repeat(64),
};

export const evidence = [1, 2, 3].map((index) => ({
  index, varianceShare: 0.1 * index,
  suggestions: {
    erp: { verdict: index === 1 ? 'remove' : 'keep', reason: index === 1 ? 'blink' : 'neural', because: ['fake'] },
    oscillations: { verdict: 'keep', reason: 'neural', because: [] },
    conservative: { verdict: 'keep', reason: 'neural', because: [] },
  },
})) as unknown as ComponentEvidence[];

export function fakeServices(saved = new Map<string, SavedReview>()): WorkbenchServices & { saved: Map<string, SavedReview>; decomposeCalls: number } {
  const s = {
    saved,
    decomposeCalls: 0,
    readRecording: async () => ({ recording, sha256: 'r'.repeat(64) }),
    readDecomposition: async () => ({ decomposition, sha256: 'd'.repeat(64) }),
    computeDecomposition: async () => {
      s.decomposeCalls++;
      return { decomposition, sha256: 'c'.repeat(64), json: '{}' };
    },
    computeEvidence: async () => evidence,
    writeCleaned: async () => ({ bytes: new Uint8Array(0), warnings: [] }),
    demoInput: async () => ({ recordingFiles: [], decompositionFiles: [] }),
    loadReview: async (key: string) => saved.get(key) ?? null,
    saveReview: async (key: string, review: SavedReview) => void saved.set(key, review),
  };
  return s;
}
