/**
 * How the participants of a simulated study differ (issue 11: artefact mix, alpha frequency, one noisy
 * participant), drawn from the study seed so that `winnow simulate-study` and the browser's demo study make
 * the same participants. Ranges are round numbers of our own: individual alpha peaks 8.5–11.5 Hz (inside the
 * 8–12 Hz adult range, common practice); each artefact class scaled by a factor between the given bounds.
 */
import { streamRng } from './rng.ts';
import type { SimulateOptions } from './simulate.ts';
import type { TrueSourceClass } from './truth.ts';
import { microvolts } from '../units.ts';

export const BASE_NOISE_UV = 0.7;
/** Sensor noise of the noisy participant relative to the others. */
export const NOISY_FACTOR = 4;

const GAIN_RANGES: readonly [TrueSourceClass, number, number][] = [
  ['blink', 0.5, 1.5],
  ['gaze', 0.5, 1.5],
  ['muscle', 0.3, 2],
  ['cardiac', 0.5, 2],
  ['movement', 0.5, 1.5],
];

export interface StudyParticipant {
  readonly label: string;
  readonly seed: number;
  readonly noisy: boolean;
  readonly alphaPeakHz: number;
  readonly classGain: Readonly<Partial<Record<TrueSourceClass, number>>>;
  readonly sensorNoiseUv: number;
}

/** Participant k (0-based) of n in a study with this seed; the last of two or more is the noisy one. */
export function studyParticipant(studySeed: number, k: number, n: number): StudyParticipant {
  const rng = streamRng((studySeed + k) >>> 0, 'study-participant');
  const round = (v: number, step: number) => Math.round(v / step) * step;
  const alphaPeakHz = Number(round(rng.between(8.5, 11.5), 0.1).toFixed(1));
  const classGain: Partial<Record<TrueSourceClass, number>> = {};
  for (const [cls, lo, hi] of GAIN_RANGES) classGain[cls] = Number(rng.between(lo, hi).toFixed(2));
  const noisy = n >= 2 && k === n - 1;
  const width = Math.max(2, String(n).length);
  return {
    label: String(k + 1).padStart(width, '0'),
    seed: (studySeed + k) >>> 0,
    noisy,
    alphaPeakHz,
    classGain,
    sensorNoiseUv: noisy ? BASE_NOISE_UV * NOISY_FACTOR : BASE_NOISE_UV,
  };
}

/** Simulator options of a study participant (the caller adds length, channels, rate and mains). */
export function participantOptions(p: StudyParticipant): Pick<SimulateOptions, 'seed' | 'alphaPeakHz' | 'classGain' | 'sensorNoiseUv'> {
  return { seed: p.seed, alphaPeakHz: p.alphaPeakHz, classGain: p.classGain, sensorNoiseUv: microvolts(p.sensorNoiseUv) };
}

/** participants.tsv columns beyond participant_id, and each participant's values. */
export const PARTICIPANT_COLUMNS = ['seed', 'sensor_noise_uv', 'alpha_peak_hz', ...GAIN_RANGES.map(([c]) => `${c}_gain`)] as const;
export function participantRow(p: StudyParticipant): (string | number)[] {
  return [`sub-${p.label}`, p.seed, p.sensorNoiseUv, p.alphaPeakHz, ...GAIN_RANGES.map(([c]) => p.classGain[c] ?? 1)];
}
