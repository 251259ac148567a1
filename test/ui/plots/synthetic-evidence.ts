/**
 * A small, hand-made ComponentEvidence for UI tests (no computation behind it): a 1/f² spectrum with a
 * 10 Hz bump, four epochs of eight samples, a dipole at 40 mm anterior.
 */
import type { ComponentEvidence } from '../../../src/core/evidence/types.ts';

export function syntheticEvidence(index = 1, patch: Partial<ComponentEvidence> = {}): ComponentEvidence {
  const frequencies = Float64Array.from({ length: 90 }, (_, i) => 1 + i * 0.5);
  const power = Float64Array.from(frequencies, (f) => 100 / (f * f) + 2 * Math.exp(-((f - 10) ** 2) / 2));
  const times = Float64Array.from({ length: 8 }, (_, j) => -0.2 + j * 0.1);
  return {
    index,
    varianceShare: 0.12,
    variancePerChannel: Float64Array.from([0.1, 0.2, 0.3]),
    strongestChannel: { index: 2, label: 'Oz', weight: 1.5 },
    map: Float64Array.from([0.2, -0.4, 0.89]),
    spectrum: { frequencies, power, powerDb: Float64Array.from(power, (p) => 10 * Math.log10(p)), nfft: 512, df: 0.5 },
    oneOverF: { exponent: 2, offset: 2, rangeHz: [2, 40], fitR2: 0.95 },
    alphaPeakHz: 10,
    alphaProminence: 0.3,
    highFrequencyShare: 0.05,
    highFrequencySlope: -2,
    mainsShare: 0.01,
    linePeakRatio: 1.1,
    lowFrequencyShare: 0.4,
    kurtosis: 0.5,
    focality: { share: 0.7, channel: 'Oz' },
    frontalGradient: 0.5,
    frontalShare: 0.05,
    lateralAntisymmetry: 0.1,
    stepLikeness: 0.1,
    eogCorrelation: { vertical: 0.1, horizontal: null, source: 'frontal bipolar', channels: { vertical: 'Fp1+Fp2 vs average', horizontal: null } },
    cardiac: { bpm: null, peak: 0 },
    stepLocking: null,
    erp: {
      event: 'stimulus', nEpochs: 4, times,
      mean: Float64Array.from(times, (t) => (t > 0 ? 2 : 0)),
      band: { lower: Float64Array.from(times, (t) => (t > 0 ? 1 : -1)), upper: Float64Array.from(times, (t) => (t > 0 ? 3 : 1)) },
      itc: 0.4, itcFrequencyHz: 3, timeLockingStrength: 0.2, lockedShare: 0.25, permutationP: 0.01, shuffles: 999,
    },
    timeLocking: [
      { event: 'stimulus', nEpochs: 4, lockedShare: 0.25, strength: 0.2, p: 0.01, shuffles: 999 },
      { event: 'response', nEpochs: 3, lockedShare: 0.02, strength: 0.01, p: 0.4, shuffles: 25 },
    ],
    trialStack: {
      nEpochs: 4, length: 8, times,
      data: Float32Array.from({ length: 32 }, (_, i) => (Math.floor(i / 8) + 1) * ((i % 8) - 2)),
      responseTimes: Float64Array.from([0.5, 0.2, NaN, 0.3]),
    },
    dipole: { position: [0, 40, 50], moment: [0, 0, 1], residualVariance: 0.04, atBoundary: false, region: 'frontal, midline, superficial' },
    ...patch,
  };
}
