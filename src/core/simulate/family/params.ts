/**
 * The parameters of one scenario of the validation family (issue 10 item 6), drawn from its seed: montage,
 * seated or walking, mains frequency, which artefacts are present, sensor-noise level, rank loss, duration
 * and sampling rate. Every draw comes from a named stream of the seed (rng.ts), so a scenario is a pure
 * function of (seed, limits). The probabilities are ours: round numbers that make every artefact common
 * across a few dozen scenarios without putting all of them in every recording.
 */
import { streamRng, type Rng } from '../rng.ts';
import { MONTAGE_SIZES, type MontageSize } from './montages.ts';

export interface FamilyParams {
  readonly seed: number;
  readonly channels: MontageSize;
  readonly walking: boolean;
  readonly lineHz: 50 | 60;
  readonly minutes: number;
  readonly rate: 250 | 500;
  /** Standard deviation of the per-channel sensor noise, µV. */
  readonly sensorNoiseUv: number;
  readonly cardiac: boolean;
  /** Label of the loose electrode (drifts and pops), or null. */
  readonly looseElectrode: string | null;
  /** Label of the noisy electrode (broadband noise on one contact), or null. */
  readonly noisyElectrode: string | null;
  /** Two neighbouring electrodes joined by a salt/gel bridge, or null. */
  readonly bridgedPair: readonly [string, string] | null;
  readonly sweat: boolean;
  readonly jawClench: boolean;
  readonly templeMuscles: boolean;
  readonly neckMuscle: boolean;
  readonly verticalGaze: boolean;
  /** Channels replaced by interpolation from their neighbours (rank loss), possibly empty. */
  readonly interpolated: readonly string[];
  /** Whether the data were re-referenced to the common average after interpolation (one more rank lost). */
  readonly averageReference: boolean;
}

export interface FamilyLimits {
  /** Montages to draw from (default all four). */
  readonly channels?: readonly MontageSize[];
  /** Duration range in minutes (default 3–30, log-uniform). */
  readonly minMinutes?: number;
  readonly maxMinutes?: number;
  /** Sampling rates to draw from (default 250 and 500 Hz). */
  readonly rates?: readonly (250 | 500)[];
  /** Largest channels × samples (memory budget; default 2.4e7 ≈ 96 MB of float32). */
  readonly maxValues?: number;
}

const pick = <T>(r: Rng, xs: readonly T[]): T => xs[Math.min(xs.length - 1, Math.floor(r.uniform() * xs.length))];

/**
 * Draws the scenario of `seed`. `labels` and `neighbours` are the montage's (the bridged pair and the
 * interpolated channels are chosen among neighbours so they look like real faults).
 */
export function drawFamilyParams(
  seed: number,
  montageOf: (size: MontageSize) => { labels: readonly string[]; neighbours: (label: string) => string[] },
  limits: FamilyLimits = {},
): FamilyParams {
  const s = Math.trunc(seed) >>> 0;
  const r = streamRng(s, 'family/params');
  const channels = pick(r, limits.channels && limits.channels.length ? limits.channels : MONTAGE_SIZES);
  const walking = r.uniform() < 0.4;
  const lineHz: 50 | 60 = r.uniform() < 0.5 ? 50 : 60;
  const drawn: 250 | 500 = r.uniform() < 0.7 ? 250 : 500;
  const rate: 250 | 500 = limits.rates && limits.rates.length && !limits.rates.includes(drawn) ? limits.rates[0] : drawn;
  const lo = Math.max(0.5, limits.minMinutes ?? 3);
  const hi = Math.max(lo, limits.maxMinutes ?? 30);
  let minutes = lo * Math.pow(hi / lo, r.uniform());
  const maxValues = limits.maxValues ?? 2.4e7;
  minutes = Math.min(minutes, maxValues / (channels * rate * 60));
  minutes = Math.round(minutes * 10) / 10;
  const sensorNoiseUv = Math.round(100 * (0.5 + 2 * r.uniform())) / 100;

  const { labels, neighbours } = montageOf(channels);
  const f = streamRng(s, 'family/faults');
  const used = new Set<string>();
  const free = () => labels.filter((l) => !used.has(l));
  const take = (l: string) => (used.add(l), l);
  const looseElectrode = f.uniform() < 0.6 ? take(pick(f, free())) : null;
  const noisyElectrode = f.uniform() < 0.4 ? take(pick(f, free())) : null;
  let bridgedPair: [string, string] | null = null;
  if (f.uniform() < 0.3) {
    const a = pick(f, free());
    const nb = neighbours(a).filter((l) => !used.has(l));
    if (nb.length) bridgedPair = [take(a), take(pick(f, nb))];
  }
  const interpolated: string[] = [];
  const nInterp = f.uniform() < 0.35 ? 1 + Math.floor(f.uniform() * (channels >= 64 ? 4 : 2)) : 0;
  for (let i = 0; i < nInterp; i++) interpolated.push(take(pick(f, free())));
  const averageReference = nInterp > 0 || f.uniform() < 0.3;

  const a = streamRng(s, 'family/artefacts');
  return {
    seed: s,
    channels,
    walking,
    lineHz,
    minutes,
    rate,
    sensorNoiseUv,
    cardiac: a.uniform() < 0.7,
    looseElectrode,
    noisyElectrode,
    bridgedPair,
    sweat: a.uniform() < 0.3,
    jawClench: a.uniform() < 0.5,
    templeMuscles: a.uniform() < 0.6,
    neckMuscle: walking || a.uniform() < 0.4,
    verticalGaze: a.uniform() < 0.5,
    interpolated,
    averageReference,
  };
}
