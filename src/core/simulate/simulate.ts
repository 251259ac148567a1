/**
 * `simulateSession`: a mobile EEG session with known sources — a participant walks laps along a corridor
 * wearing a 32- or 64-channel cap while counting rare high tones among frequent low ones. The sensor data
 * are an exact linear mixture of the true sources plus small independent sensor noise:
 *
 *     data[c, t] = fround( Σ_k map_k[c] · activation_k[t]  +  noise[c, t] )        (float64 sum, source order)
 *
 * with 21 sources with spatially fixed maps (fewer than the 31 dimensions left after average referencing
 * a 32-channel map), so ICA can in principle recover each non-Gaussian one. Deterministic per seed: every
 * random draw comes from a named xoshiro128** stream (rng.ts).
 */
import type { TrueSourceClass } from './truth.ts';
import { standardPositions } from '../headmodel/montage-1020.ts';
import { streamRng } from './rng.ts';
import { createScenario } from './scenario.ts';
import { buildSources, simulatorHeadModels } from './sources.ts';
import type { SimulatedEvent, SimulatedSession, TrueSource } from './truth.ts';
import { hz, microvolts, millimetres, type Hz, type Microvolts } from '../units.ts';

/** A mirror-symmetric 32-channel 10-20 superset (every left site has its right partner). */
export const LABELS_32: readonly string[] = [
  'Fp1', 'Fp2', 'AF3', 'AF4', 'F7', 'F3', 'Fz', 'F4', 'F8', 'FC5', 'FC1', 'FC2', 'FC6', 'T7', 'C3', 'Cz',
  'C4', 'T8', 'CP5', 'CP1', 'CP2', 'CP6', 'P7', 'P3', 'Pz', 'P4', 'P8', 'PO3', 'PO4', 'O1', 'Oz', 'O2',
];

/**
 * A mirror-symmetric 64-channel 10-10 set: the 61 sites of rows Fp…O without FCz (a common place for the
 * recording reference) plus AF5/AF6 and PO5/PO6.
 */
export const LABELS_64: readonly string[] = [
  'Fp1', 'Fpz', 'Fp2', 'AF7', 'AF5', 'AF3', 'AFz', 'AF4', 'AF6', 'AF8',
  'F7', 'F5', 'F3', 'F1', 'Fz', 'F2', 'F4', 'F6', 'F8',
  'FT7', 'FC5', 'FC3', 'FC1', 'FC2', 'FC4', 'FC6', 'FT8',
  'T7', 'C5', 'C3', 'C1', 'Cz', 'C2', 'C4', 'C6', 'T8',
  'TP7', 'CP5', 'CP3', 'CP1', 'CPz', 'CP2', 'CP4', 'CP6', 'TP8',
  'P7', 'P5', 'P3', 'P1', 'Pz', 'P2', 'P4', 'P6', 'P8',
  'PO7', 'PO5', 'PO3', 'POz', 'PO4', 'PO6', 'PO8', 'O1', 'Oz', 'O2',
];

export interface SimulateOptions {
  /** Session seed (any integer; truncated to uint32). Default 1. */
  seed?: number;
  /** 32 (default) or 64 channels. */
  channels?: 32 | 64;
  /** Duration in minutes (default 3). */
  minutes?: number;
  /** Sampling rate (default 250 Hz). */
  rate?: Hz;
  /** Mains frequency, Hz (default 50). */
  lineHz?: 50 | 60;
  /** Sensor (amplifier) noise standard deviation (default 0.7 µV). */
  sensorNoiseUv?: Microvolts;
  /** Individual alpha peak frequency, Hz (default 9.5; common practice: 8–12 Hz in adults). */
  alphaPeakHz?: number;
  /**
   * Amplitude factor per source class (default 1 for every class): a participant who blinks less, a tenser
   * jaw, a weaker heartbeat field. The truth files carry the scaled maps.
   */
  classGain?: Partial<Record<TrueSourceClass, number>>;
}

/** Head radius of the simulation, mm (a typical adult head; docs/methods.md §8.1 gives 85–95 mm). */
export const HEAD_RADIUS_MM = millimetres(90);

/** Electrode positions (M × 3, mm on the 90 mm sphere) and unit directions for the given labels. */
export function electrodePositions(labels: readonly string[], radiusMm = HEAD_RADIUS_MM): { mm: Float64Array; directions: Float64Array } {
  const table = standardPositions();
  const directions = new Float64Array(labels.length * 3);
  labels.forEach((l, c) => {
    const p = table.get(l);
    if (!p) throw new RangeError(`simulate: no standard position for electrode "${l}"`);
    directions.set(p, 3 * c);
  });
  const mm = Float64Array.from(directions, (v) => v * radiusMm);
  return { mm, directions };
}

/**
 * Simulates one session. Throws RangeError for options outside the simulator's contract (rate ≤ 0 or
 * < 2.5 × the line frequency, minutes ≤ 0, channels not 32/64).
 */
export function simulateSession(opts: SimulateOptions = {}): SimulatedSession {
  const seed = Math.trunc(opts.seed ?? 1) >>> 0;
  const channels = opts.channels ?? 32;
  const minutes = opts.minutes ?? 3;
  const fs = opts.rate ?? hz(250);
  const lineHz = opts.lineHz ?? 50;
  const noiseUv = opts.sensorNoiseUv ?? microvolts(0.7);
  if (channels !== 32 && channels !== 64) throw new RangeError(`simulateSession: channels must be 32 or 64, got ${channels}`);
  if (!(minutes > 0) || !Number.isFinite(minutes)) throw new RangeError(`simulateSession: minutes must be > 0, got ${minutes}`);
  if (!(fs > 0) || !Number.isFinite(fs)) throw new RangeError(`simulateSession: rate must be > 0 Hz, got ${fs}`);
  if (lineHz !== 50 && lineHz !== 60) throw new RangeError(`simulateSession: lineHz must be 50 or 60, got ${lineHz}`);
  if (fs < 2.5 * lineHz) throw new RangeError(`simulateSession: rate must be at least 2.5 × the line frequency (${2.5 * lineHz} Hz), got ${fs}`);
  if (!(noiseUv >= 0)) throw new RangeError(`simulateSession: sensorNoiseUv must be ≥ 0, got ${noiseUv}`);

  const labels = [...(channels === 64 ? LABELS_64 : LABELS_32)];
  const m = labels.length;
  const n = Math.round(minutes * 60 * fs);
  const durationS = n / fs;
  const { mm: electrodesMm, directions } = electrodePositions(labels);
  const { brain, sphere } = simulatorHeadModels(HEAD_RADIUS_MM);
  const scenario = createScenario(seed, durationS, fs);

  const alphaPeakHz = opts.alphaPeakHz ?? 9.5;
  if (!(alphaPeakHz >= 4 && alphaPeakHz <= 16)) throw new RangeError(`simulateSession: alphaPeakHz must be in 4…16 Hz, got ${alphaPeakHz}`);
  for (const [cls, g] of Object.entries(opts.classGain ?? {}))
    if (!(typeof g === 'number' && g >= 0 && Number.isFinite(g))) throw new RangeError(`simulateSession: classGain.${cls} must be a finite number ≥ 0, got ${g}`);
  const built = buildSources({ seed, fs, n, lineHz, scenario, labels, electrodesMm, directions, brain, sphere, alphaPeakHz });
  const gainOf = (cls: TrueSourceClass) => opts.classGain?.[cls] ?? 1;
  const sources: TrueSource[] = built.map((b) => {
    const g = gainOf(b.class);
    return { ...b, map: g === 1 ? b.map : b.map.map((v) => v * g), activation: Float32Array.from(b.activation) };
  });
  const k = sources.length;

  const mixing = new Float64Array(m * k);
  sources.forEach((s, j) => {
    for (let c = 0; c < m; c++) mixing[c * k + j] = s.map[c];
  });

  const noiseRng = streamRng(seed, 'sensor-noise');
  const sensorNoise = new Float32Array(m * n);
  noiseRng.fillNormal(sensorNoise, noiseUv);

  const data = new Float32Array(m * n);
  const neuralOnly = new Float32Array(m * n);
  const row = new Float64Array(n);
  const nNeural = sources.findIndex((s) => s.class !== 'neural');
  const neuralCount = nNeural < 0 ? k : nNeural;
  for (let c = 0; c < m; c++) {
    row.fill(0);
    for (let j = 0; j < k; j++) {
      const a = mixing[c * k + j];
      const act = sources[j].activation;
      for (let t = 0; t < n; t++) row[t] += a * act[t];
      if (j === neuralCount - 1) neuralOnly.set(row, c * n); // rounds each value to float32
    }
    const off = c * n;
    for (let t = 0; t < n; t++) data[off + t] = row[t] + sensorNoise[off + t];
  }

  const events: SimulatedEvent[] = [
    ...scenario.tones.map((t) => ({ onset: t.timeS, duration: 0, label: 'tone', columns: { condition: t.rare ? 'rare' : 'standard', foot: 'n/a' } })),
    ...scenario.steps.map((s) => ({ onset: s.timeS, duration: 0, label: 'step', columns: { condition: 'n/a', foot: s.foot } })),
  ]
    .filter((e) => e.onset >= 0 && e.onset < durationS)
    .sort((a, b) => a.onset - b.onset || a.label.localeCompare(b.label));

  return {
    seed,
    labels,
    electrodesMm,
    headRadiusMm: HEAD_RADIUS_MM,
    sampleRate: fs,
    nSamples: n,
    lineHz,
    data,
    neuralOnly,
    sensorNoise,
    sensorNoiseUv: noiseUv,
    mixing,
    events,
    sources,
    reference: 'average',
  };
}
