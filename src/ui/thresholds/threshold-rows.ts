/**
 * The thresholds panel's logic (pure): one row per threshold of core/review/thresholds.ts with its meaning,
 * current value, default, source ("common practice" or "ours") and the docs/methods.md section that
 * describes it; validation of a typed value; setting and resetting overrides. An override equal to the
 * default is dropped, so the overrides hold exactly the thresholds that differ from the defaults.
 */
import { defaultThresholds, thresholdSources, type ThresholdSource, type Thresholds } from '../../core/review/thresholds.ts';

export type ThresholdKey = keyof Thresholds;

/** Every threshold, in the order of `defaultThresholds`. */
export const THRESHOLD_KEYS: readonly ThresholdKey[] = Object.keys(defaultThresholds) as ThresholdKey[];

interface ThresholdMeta {
  /** What the number means, in a few words. */
  readonly label: string;
  /** docs/methods.md section. */
  readonly section: string;
  /** Allowed range (inclusive). */
  readonly min: number;
  readonly max: number;
  /** Input step. */
  readonly step: number;
}

const share = (label: string, section = '14'): ThresholdMeta => ({ label, section, min: 0, max: 1, step: 0.01 });

export const THRESHOLD_META: Record<ThresholdKey, ThresholdMeta> = {
  eogCorrelation: share('|r| with EOG (or frontal proxy) for an ocular component'),
  blinkFrontalGradient: { label: 'Frontal-pole weight ratio for a blink map', section: '14', min: 0, max: 100, step: 0.1 },
  ocularLowFrequencyShare: share('Power share 1–4 Hz of 1–45 Hz for an ocular spectrum', '4'),
  ocularProxyLowFrequencyShare: share('Power share 1–4 Hz needed with the frontal proxy only', '4'),
  gazeAntisymmetry: { label: 'Frontal left–right antisymmetry for gaze', section: '14', min: -1, max: 1, step: 0.05 },
  gazeStepLikeness: share('Step-likeness supporting a gaze shift'),
  blinkKurtosis: { label: 'Excess kurtosis supporting a blink', section: '14', min: -3, max: 1000, step: 0.5 },
  muscleHighFrequencyShare: share('Power share above 20 Hz for a muscle-like spectrum', '4'),
  muscleHighFrequencyShareStrong: share('Power share above 20 Hz for unmistakable muscle', '4'),
  muscleSlope: { label: 'Log–log slope above 20 Hz counted as flat or rising', section: '14', min: -10, max: 10, step: 0.1 },
  mainsShare: share('Power share at the line frequency and harmonics for mains', '4'),
  electrodeFocality: share('Map energy share on one electrode for a contact'),
  cardiacPeak: share('Autocorrelation peak at the beat lag for cardiac'),
  cardiacIntervalCv: share('Inter-beat interval variation at or below which the beats are a heartbeat', '14'),
  movementStepLocking: share('Step-locked share for movement'),
  timeLockingStrength: share('Time-locked share above chance', '5'),
  timeLockingP: { label: 'Permutation p at or below which locking counts', section: '5', min: 0, max: 1, step: 0.001 },
  dipoleResidualVariance: share('Dipole residual variance counted as dipolar', '15'),
  neuralExponentMin: { label: 'Lowest brain-like 1/f exponent', section: '2', min: -2, max: 10, step: 0.1 },
  neuralExponentMax: { label: 'Highest brain-like 1/f exponent', section: '2', min: -2, max: 10, step: 0.1 },
  alphaProminence: { label: 'Alpha peak height above the 1/f fit (log10)', section: '3', min: 0, max: 5, step: 0.05 },
  muscleFocality: share('Map energy share on one electrode supporting muscle'),
  muscleRimFocality: share('Share on a rim electrode supporting muscle'),
  muscleDipoleDepthMm: { label: 'Dipole distance from centre (mm) counted as shallow', section: '15', min: 0, max: 200, step: 1 },
  noiseVarianceShare: share('Variance share at or below which a flat diffuse component is noise'),
  muscleKurtosis: { label: 'Excess kurtosis at or below which a flat activation is Gaussian', section: '14', min: -3, max: 1000, step: 0.1 },
  muscleNoiseVarianceShare: share('Variance share at or below which a Gaussian flat component is noise'),
  electrodeRestStructure: share('Structured rest of a focal map for one bad contact'),
  electrodeRestStructureMuscle: share('Structured rest below which a focal map is a contact unless muscle'),
  muscleAlphaVeto: { label: 'Alpha prominence (log10) that keeps a muscle reading weak', section: '3', min: 0, max: 5, step: 0.05 },
  verticalGazeMaxKurtosis: { label: 'Excess kurtosis below which vertical steps are gaze, not blinks', section: '14', min: -3, max: 1000, step: 0.5 },
};

export interface ThresholdRow {
  readonly key: ThresholdKey;
  readonly label: string;
  readonly value: number;
  readonly defaultValue: number;
  /** True when the value differs from the default. */
  readonly changed: boolean;
  readonly source: ThresholdSource;
  /** docs/methods.md section, e.g. "14". */
  readonly section: string;
  readonly min: number;
  readonly max: number;
  readonly step: number;
}

/** One row per threshold with the override applied (non-finite overrides ignored, as resolveThresholds does). */
export function thresholdRows(overrides: Partial<Thresholds>): ThresholdRow[] {
  return THRESHOLD_KEYS.map((key) => {
    const o = overrides[key];
    const value = typeof o === 'number' && Number.isFinite(o) ? o : defaultThresholds[key];
    const m = THRESHOLD_META[key];
    return { key, label: m.label, value, defaultValue: defaultThresholds[key], changed: value !== defaultThresholds[key], source: thresholdSources[key], section: m.section, min: m.min, max: m.max, step: m.step };
  });
}

export type ParsedThreshold = { readonly ok: true; readonly value: number } | { readonly ok: false; readonly error: string };

/**
 * A typed value checked: a finite number within the threshold's range, and for the 1/f exponent range the
 * lower end below the upper one (the other end taken from `overrides`).
 */
export function parseThreshold(key: ThresholdKey, text: string, overrides: Partial<Thresholds> = {}): ParsedThreshold {
  const t = text.trim().replace(',', '.');
  if (t === '') return { ok: false, error: 'enter a number' };
  const value = Number(t);
  if (!Number.isFinite(value)) return { ok: false, error: `"${text}" is not a number` };
  const m = THRESHOLD_META[key];
  if (value < m.min || value > m.max) return { ok: false, error: `must be between ${m.min} and ${m.max}` };
  const current = (k: ThresholdKey) => overrides[k] ?? defaultThresholds[k];
  if (key === 'neuralExponentMin' && value >= current('neuralExponentMax')) return { ok: false, error: `must be below the highest exponent (${current('neuralExponentMax')})` };
  if (key === 'neuralExponentMax' && value <= current('neuralExponentMin')) return { ok: false, error: `must be above the lowest exponent (${current('neuralExponentMin')})` };
  return { ok: true, value };
}

/** The overrides with `key` set to `value`; a value equal to the default removes the override. New object. */
export function withThreshold(overrides: Partial<Thresholds>, key: ThresholdKey, value: number): Partial<Thresholds> {
  const next: Record<string, number> = { ...(overrides as Record<string, number>) };
  if (value === defaultThresholds[key]) delete next[key];
  else next[key] = value;
  return next as Partial<Thresholds>;
}

/** The overrides without `key` (back to its default). New object. */
export function withoutThreshold(overrides: Partial<Thresholds>, key: ThresholdKey): Partial<Thresholds> {
  const next: Record<string, number> = { ...(overrides as Record<string, number>) };
  delete next[key];
  return next as Partial<Thresholds>;
}

/** Number of thresholds that differ from the defaults. */
export const changedCount = (overrides: Partial<Thresholds>): number => thresholdRows(overrides).filter((r) => r.changed).length;
