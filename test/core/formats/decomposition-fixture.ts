/** The small decomposition the decomposition-file and decomposition-match tests share. */
import type { Decomposition } from '../../../src/core/decomposition.ts';

// A 3-channel, 2-component decomposition with W A = I (A has orthonormal columns, W = Aᵀ).
export const s = Math.SQRT1_2;
export const base: Decomposition = {
  channels: ['Fz', 'Cz', 'Pz'],
  nChannels: 3,
  nComponents: 2,
  mixing: Float64Array.from([s, 0, s, 0, 0, 1]),
  unmixing: Float64Array.from([s, s, 0, 0, 0, 1]),
  channelMeans: Float64Array.from([1.5, -2.25, 0.1]),
  method: 'picard',
  rank: 3,
  iterations: 17,
  converged: true,
  preprocessing: { filter: 'high-pass 1 Hz', highpassHz: 1, lowpassHz: null, reference: 'as recorded', excludedChannels: ['HEOG'] },
  recordingSha256: 'ab'.repeat(32),
};
