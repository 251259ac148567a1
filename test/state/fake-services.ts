/** In-memory workbench services for the store tests: a 2-channel recording and a 3-component decomposition. */
import type { WorkbenchServices, SavedReview } from '../../src/state/services.ts';
import type { LoadedRecording } from '../../src/core/recording.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';
import type { ComponentEvidence } from '../../src/core/evidence/types.ts';
import { syntheticEvidence } from '../ui/plots/synthetic-evidence.ts';

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

/**
 * Measures only (the suggestions come from suggestWithRules): component 1 is a blink (r = 0.95 with the
 * VEOG, frontal map, slow spectrum), components 2 and 3 are brain-like (diffuse map, dipole RV 4 %, 1/f², alpha).
 */
export const evidence: ComponentEvidence[] = [1, 2, 3].map((index) =>
  syntheticEvidence(index, {
    varianceShare: 0.1 * index,
    focality: { share: 0.2, channel: 'Oz' },
    ...(index === 1
      ? {
          eogCorrelation: { vertical: 0.95, horizontal: 0.1, source: 'EOG channels', channels: { vertical: 'VEOG', horizontal: 'HEOG' } },
          frontalGradient: 4, frontalShare: 0.6, lateralAntisymmetry: -0.8, lowFrequencyShare: 0.85, kurtosis: 8, alphaPeakHz: null, alphaProminence: 0,
          dipole: null, erp: null, timeLocking: [],
        }
      : {}),
  }),
);

export function fakeServices(saved = new Map<string, SavedReview>()): WorkbenchServices & { saved: Map<string, SavedReview>; decomposeCalls: number; evidenceCalls: number } {
  const s = {
    saved,
    decomposeCalls: 0,
    readRecording: async () => ({ recording, sha256: 'r'.repeat(64) }),
    readDecomposition: async () => ({ decomposition, sha256: 'd'.repeat(64) }),
    computeDecomposition: async () => {
      s.decomposeCalls++;
      return { decomposition, sha256: 'c'.repeat(64), json: '{}' };
    },
    evidenceCalls: 0,
    computeEvidence: async () => {
      s.evidenceCalls++;
      return evidence;
    },
    writeCleaned: async () => ({ bytes: new Uint8Array(0), warnings: [] }),
    demoInput: async () => ({ recordingFiles: [], decompositionFiles: [] }),
    loadReview: async (key: string) => saved.get(key) ?? null,
    saveReview: async (key: string, review: SavedReview) => void saved.set(key, review),
  };
  return s;
}
