/**
 * The true sources of the walking-oddball session: where each one sits (dipole or sensor-space map), how
 * strong it is on the scalp, and its activation time course. Geometry is fixed (it does not depend on the
 * seed) so that checks on maps hold for every seed; activations come from per-source Rng streams.
 *
 * Head models (src/core/headmodel/forward.ts):
 * - neural dipoles: three concentric shells (brain/skull/scalp, Rush & Driscoll 1969), all at |p| ≤ 62 mm,
 *   well inside the 78.3 mm brain shell;
 * - ocular and muscle dipoles: the homogeneous sphere of the same radius and conductivity. The eyes and the
 *   jaw/neck muscles lie outside the skull, so their currents reach the electrodes without crossing it; a
 *   sphere with no skull layer is the closer of the two simple models (our approximation; a realistic head
 *   would put them outside the sphere altogether);
 * - cardiac: a uniform far field (potential linear in electrode position), the leading term of a distant
 *   dipole's potential across the head (common practice: "smooth broad gradient", docs/methods.md §14);
 * - line noise, the loose electrode and cable sway: maps written directly in sensor space.
 *
 * Every map is average-referenced (mean over channels removed) and scaled so its largest |value| is the
 * source's `peakUv` per unit activation; a dipole's moment is scaled by the same factor, so `dipole`
 * reproduces the map exactly through the forward model and the average reference.
 */
import { createHeadModel, dipolePotentials, type HeadModel } from '../headmodel/forward.ts';
import { fnv1a32, streamRng, type Rng } from './rng.ts';
import type { Scenario } from './scenario.ts';
import type { TrueDipole, TrueSourceClass } from './truth.ts';
import {
  addKernel,
  bandGain,
  blinkKernel,
  burstyOscillation,
  gaussianBump,
  heartbeatKernel,
  ornsteinUhlenbeck,
  powerLawGain,
  rampStep,
  shapedNoise,
} from './waveforms.ts';

type Vec3 = [number, number, number];

/** Everything a source needs to build its map and activation. */
export interface SourceContext {
  readonly seed: number;
  readonly fs: number;
  readonly n: number;
  readonly lineHz: 50 | 60;
  readonly scenario: Scenario;
  readonly labels: readonly string[];
  /** M × 3 electrode positions, mm. */
  readonly electrodesMm: Float64Array;
  /** M × 3 unit direction of each electrode. */
  readonly directions: Float64Array;
  readonly brain: HeadModel;
  readonly sphere: HeadModel;
  /** Individual alpha peak, Hz (default 9.5; its harmonic at twice the peak). */
  readonly alphaPeakHz?: number;
}

/** A source before scaling: its raw (infinite-reference) map and activation. */
export interface BuiltSource {
  readonly id: string;
  readonly class: TrueSourceClass;
  readonly description: string;
  readonly activationUnit: string;
  readonly map: Float64Array;
  readonly dipole: TrueDipole | null;
  readonly dipoles?: readonly TrueDipole[];
  readonly activation: Float64Array;
  readonly markersS?: Float64Array;
}

interface DipoleSpec {
  readonly positionMm: Vec3;
  /** Orientation (normalised here). */
  readonly direction: Vec3;
}

const unitVec = (v: Vec3): Vec3 => {
  const l = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / l, v[1] / l, v[2] / l];
};

/** Removes the mean over channels (average reference, H = I − 11ᵀ/M; docs/methods.md §8.1). */
export function averageReference(map: Float64Array): Float64Array {
  let mean = 0;
  for (let i = 0; i < map.length; i++) mean += map[i];
  mean /= Math.max(1, map.length);
  const out = new Float64Array(map.length);
  for (let i = 0; i < map.length; i++) out[i] = map[i] - mean;
  return out;
}

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

/**
 * Average-referenced map of a set of dipoles sharing one activation, scaled to `peakUv` at its largest
 * channel, with the dipoles' moments scaled alike (nA·m per unit activation).
 */
function dipoleMap(model: HeadModel, ctx: SourceContext, specs: readonly DipoleSpec[], peakUv: number): { map: Float64Array; dipoles: TrueDipole[] } {
  const raw = new Float64Array(ctx.labels.length);
  const dirs = specs.map((s) => unitVec(s.direction));
  specs.forEach((s, i) => {
    // 1 nA·m along the direction; linear in the moment, so scaling below is exact.
    const v = dipolePotentials(model, ctx.electrodesMm, s.positionMm, dirs[i]);
    for (let c = 0; c < raw.length; c++) raw[c] += v[c];
  });
  const ref = averageReference(raw);
  const k = peakUv / maxAbs(ref);
  for (let c = 0; c < ref.length; c++) ref[c] *= k;
  return {
    map: ref,
    dipoles: specs.map((s, i) => ({
      positionMm: [...s.positionMm] as Vec3,
      momentNAm: [dirs[i][0] * k, dirs[i][1] * k, dirs[i][2] * k] as Vec3,
    })),
  };
}

/** Average-referenced sensor-space map from per-channel weights, scaled to `peakUv`. */
function sensorMap(ctx: SourceContext, weights: (label: string, c: number) => number, peakUv: number): Float64Array {
  const raw = new Float64Array(ctx.labels.length);
  ctx.labels.forEach((l, c) => (raw[c] = weights(l, c)));
  const ref = averageReference(raw);
  const k = peakUv / maxAbs(ref);
  for (let c = 0; c < ref.length; c++) ref[c] *= k;
  return ref;
}

/** A deterministic per-label number in [0, 1) (FNV-1a of the label), for fixed sensor-space gains. */
function labelHash01(label: string): number {
  return fnv1a32(label) / 4294967296;
}

/** Raised-cosine-edged box of duration durS with 40 ms edges, peak 1, for muscle-burst envelopes. */
function burstWindow(tS: number, durS: number): number {
  const edge = Math.min(0.04, durS / 2);
  if (tS < 0 || tS >= durS) return 0;
  if (tS < edge) return 0.5 - 0.5 * Math.cos((Math.PI * tS) / edge);
  if (tS > durS - edge) return 0.5 - 0.5 * Math.cos((Math.PI * (durS - tS)) / edge);
  return 1;
}

function rng(ctx: SourceContext, id: string): Rng {
  return streamRng(ctx.seed, `source/${id}`);
}

/**
 * Broadband noise gated by bursts plus a small tonic level. The carrier is flat from 15 Hz to 100 Hz
 * (capped at 0.4 fs) with 8/15 Hz raised-cosine skirts, so the spectrum is flat above 20 Hz even after the
 * burst envelope smears the lower edge (surface EMG is broadband from ~15–20 Hz up; common practice).
 */
function muscleActivation(ctx: SourceContext, id: string, bursts: Scenario['jawLeftBursts'], tonic: number): Float64Array {
  const r = rng(ctx, id);
  const hi = Math.min(100, 0.4 * ctx.fs);
  const noise = shapedNoise(r, ctx.n, ctx.fs, bandGain(15, hi, 8, Math.min(15, 0.5 * ctx.fs - hi)));
  const env = new Float64Array(ctx.n).fill(tonic);
  for (const b of bursts) addKernel(env, { fs: ctx.fs, onsetS: b.timeS, amplitude: b.amplitude, startS: 0, endS: b.durS, kernel: (t) => burstWindow(t, b.durS) });
  for (let i = 0; i < ctx.n; i++) noise[i] *= env[i];
  return noise;
}

/** Builds every true source, neural sources first (the order of the mixing sum). */
export function buildSources(ctx: SourceContext): BuiltSource[] {
  const alphaHz = ctx.alphaPeakHz ?? 9.5;
  const { fs, n, scenario } = ctx;
  const out: BuiltSource[] = [];
  const neural = (
    id: string,
    description: string,
    spec: DipoleSpec,
    peakUv: number,
    activation: Float64Array,
    activationUnit: string,
  ) => {
    const { map, dipoles } = dipoleMap(ctx.brain, ctx, [spec], peakUv);
    out.push({ id, class: 'neural', description, activationUnit, map, dipole: dipoles[0], activation });
  };

  // --- Neural rhythms -------------------------------------------------------------------------------
  neural(
    'alpha-posterior',
    `Posterior alpha: waxing and waning bursts at an individual peak of ${alphaHz} Hz with a second harmonic at ${2 * alphaHz} Hz; parieto-occipital dipole.`,
    { positionMm: [0, -58, 12], direction: [0, -0.45, 0.9] },
    5,
    burstyOscillation(rng(ctx, 'alpha-posterior'), n, fs, {
      freqHz: alphaHz, freqJitterHz: 0.15, envelopeTauS: 0.5, envelopeLogSd: 0.75, harmonicRatio: 0.25, harmonicPhaseRad: 0.6,
    }),
    'relative amplitude (mean envelope 1)',
  );
  neural(
    'mu-left',
    'Left central mu rhythm (10.5 Hz with a 21 Hz component), hand area of the left sensorimotor cortex.',
    { positionMm: [-38, -12, 50], direction: [-0.3, 0.55, 0.78] },
    4,
    burstyOscillation(rng(ctx, 'mu-left'), n, fs, {
      freqHz: 10.5, freqJitterHz: 0.15, envelopeTauS: 0.4, envelopeLogSd: 0.7, harmonicRatio: 0.35, harmonicPhaseRad: 1.2,
    }),
    'relative amplitude (mean envelope 1)',
  );
  neural(
    'mu-right',
    'Right central mu rhythm (11 Hz with a 22 Hz component), hand area of the right sensorimotor cortex.',
    { positionMm: [38, -12, 50], direction: [0.3, 0.55, 0.78] },
    4,
    burstyOscillation(rng(ctx, 'mu-right'), n, fs, {
      freqHz: 11, freqJitterHz: 0.15, envelopeTauS: 0.4, envelopeLogSd: 0.7, harmonicRatio: 0.35, harmonicPhaseRad: 1.2,
    }),
    'relative amplitude (mean envelope 1)',
  );
  neural(
    'theta-frontal',
    'Frontal midline theta bursts at 6 Hz (anterior cingulate / medial frontal dipole).',
    { positionMm: [0, 30, 38], direction: [0, 0.3, 0.95] },
    3,
    burstyOscillation(rng(ctx, 'theta-frontal'), n, fs, {
      freqHz: 6, freqJitterHz: 0.2, envelopeTauS: 0.6, envelopeLogSd: 0.7, harmonicRatio: 0, harmonicPhaseRad: 0,
    }),
    'relative amplitude (mean envelope 1)',
  );

  // --- Event-related responses ----------------------------------------------------------------------
  {
    const r = rng(ctx, 'p3-parietal');
    const act = new Float64Array(n);
    for (const tone of scenario.tones) {
      if (!tone.rare) continue;
      // Latency 300–400 ms (P3b to counted rare tones; common practice), width σ = 70 ms.
      const lat = Math.min(0.4, Math.max(0.3, 0.35 + 0.025 * r.normal()));
      const amp = r.between(0.7, 1.3);
      addKernel(act, { fs, onsetS: tone.timeS + lat, amplitude: amp, startS: -0.3, endS: 0.3, kernel: (t) => gaussianBump(t, 0.07) });
    }
    neural(
      'p3-parietal',
      'P3-like positive response 300–400 ms after each rare tone (trial-to-trial latency and amplitude jitter); parietal midline dipole.',
      { positionMm: [0, -35, 45], direction: [0, -0.2, 0.98] },
      8,
      act,
      'response amplitude (single-trial peak ≈ 1)',
    );
  }
  {
    const r = rng(ctx, 'auditory');
    const act = new Float64Array(n);
    for (const tone of scenario.tones) {
      const amp = r.between(0.7, 1.3) * (tone.rare ? 1.2 : 1);
      // N1 at ~100 ms and P2 at ~190 ms after every tone (common practice; widths from memory).
      addKernel(act, { fs, onsetS: tone.timeS, amplitude: amp, startS: 0, endS: 0.35, kernel: (t) => -gaussianBump(t - 0.1, 0.018) + 0.55 * gaussianBump(t - 0.19, 0.03) });
    }
    const { map, dipoles } = dipoleMap(
      ctx.brain,
      ctx,
      [
        { positionMm: [-48, -12, 8], direction: [0.25, 0.2, 0.95] },
        { positionMm: [48, -12, 8], direction: [-0.25, 0.2, 0.95] },
      ],
      5,
    );
    out.push({
      id: 'auditory',
      class: 'neural',
      description:
        'Auditory response to every tone (N1 ~100 ms, P2 ~190 ms): two superior temporal dipoles (left and right) sharing one activation; negative at the vertex at 100 ms.',
      activationUnit: 'response amplitude (single-trial N1 ≈ −1)',
      map,
      dipole: null,
      dipoles,
      activation: act,
    });
  }

  // --- 1/f background, folded into six dipoles --------------------------------------------------------
  const background: [string, string, Vec3, Vec3, number][] = [
    ['bg-frontal-left', 'left frontal', [-30, 35, 35], [0.3, 0.5, 0.8], 1.6],
    ['bg-frontal-right', 'right frontal', [30, 35, 35], [-0.4, 0.3, 0.87], 1.8],
    ['bg-temporal-left', 'left temporal', [-50, -10, 5], [-0.8, 0.1, 0.6], 1.5],
    ['bg-temporal-right', 'right temporal', [50, -15, 0], [0.8, -0.2, 0.55], 1.7],
    ['bg-parietal-left', 'left parietal', [-25, -45, 40], [-0.2, -0.5, 0.84], 1.9],
    ['bg-parietal-right', 'right parietal', [25, -40, 45], [0.35, 0.3, 0.89], 1.4],
  ];
  for (const [id, where, pos, dir, chi] of background) {
    neural(
      id,
      `1/f background activity (${where}): Gaussian noise with power ∝ 1/f^${chi} above a 1 Hz knee, one of six dipoles standing in for the many background generators.`,
      { positionMm: pos, direction: dir },
      4,
      shapedNoise(rng(ctx, id), n, fs, powerLawGain(chi, 1)),
      'unit-variance noise',
    );
  }

  // --- Ocular ---------------------------------------------------------------------------------------
  // Both eyes lumped into one equivalent dipole midway between them, 72 mm forward and 22 mm below the
  // electrode ring's centre plane (the two eyes' fields differ little at ≥ 60 mm; our approximation).
  const eyes: Vec3 = [0, 72, -22];
  {
    const act = new Float64Array(n);
    for (const b of scenario.blinks) addKernel(act, { fs, onsetS: b.timeS, amplitude: b.amplitude, startS: 0, endS: b.riseS + b.fallS, kernel: (t) => blinkKernel(t, b.riseS, b.fallS) });
    const { map, dipoles } = dipoleMap(ctx.sphere, ctx, [{ positionMm: eyes, direction: [0, 0.6, 0.8] }], 100);
    out.push({
      id: 'blink',
      class: 'blink',
      description: 'Eye blinks (~0.25–0.4 s, ~16 per minute, more often 0.3–0.7 s after tones), strongest at the most frontal sites.',
      activationUnit: 'blink amplitude (typical peak ≈ 1)',
      map,
      dipole: dipoles[0],
      activation: act,
      markersS: Float64Array.from(scenario.blinks, (b) => b.timeS),
    });
  }
  {
    const act = new Float64Array(n);
    let gaze = 0;
    let i = 0;
    const sacc = scenario.saccades;
    for (let k = 0; k < sacc.length; k++) {
      const s = sacc[k];
      const i0 = Math.min(n, Math.max(0, Math.ceil(s.timeS * fs)));
      for (; i < i0; i++) act[i] = gaze; // fixation before this saccade
      const end = k + 1 < sacc.length ? Math.min(n, Math.ceil(sacc[k + 1].timeS * fs)) : n;
      for (; i < end; i++) act[i] = gaze + (s.targetDeg - gaze) * rampStep(i / fs - s.timeS, s.durS);
      gaze = s.targetDeg;
    }
    for (; i < n; i++) act[i] = gaze;
    const { map, dipoles } = dipoleMap(ctx.sphere, ctx, [{ positionMm: eyes, direction: [1, 0, 0] }], 3);
    out.push({
      id: 'eye-horizontal',
      class: 'gaze',
      description:
        'Horizontal eye movements: step-like gaze shifts (saccades of 21 ms + 2.2 ms/°) between fixations, larger towards the turn at each lap end; left–right antisymmetric frontal map (corneo-retinal dipole rotating about the vertical axis).',
      activationUnit: 'degrees of horizontal gaze (+ = right)',
      map,
      dipole: dipoles[0],
      activation: act,
      markersS: Float64Array.from(scenario.saccades, (s) => s.timeS),
    });
  }

  // --- Muscle ---------------------------------------------------------------------------------------
  const muscle = (id: string, description: string, spec: DipoleSpec, bursts: Scenario['jawLeftBursts'], tonic: number) => {
    const { map, dipoles } = dipoleMap(ctx.sphere, ctx, [spec], 25);
    out.push({
      id,
      class: 'muscle',
      description,
      activationUnit: 'burst-gated broadband noise (unit-variance carrier)',
      map,
      dipole: dipoles[0],
      activation: muscleActivation(ctx, id, bursts, tonic),
      markersS: Float64Array.from(bursts, (b) => b.timeS),
    });
  };
  muscle(
    'muscle-temporal-left',
    'Left temporalis/masseter (jaw clenching): 15–100 Hz broadband bursts of 0.3–1.2 s, shallow source at the lower left edge of the cap.',
    { positionMm: [-80, 5, 22], direction: [0, 0.25, 0.97] },
    scenario.jawLeftBursts,
    0.08,
  );
  muscle(
    'muscle-temporal-right',
    'Right temporalis/masseter (jaw clenching): 15–100 Hz broadband bursts, shallow source at the lower right edge of the cap.',
    { positionMm: [80, 0, 18], direction: [0, -0.3, 0.95] },
    scenario.jawRightBursts,
    0.08,
  );
  muscle(
    'muscle-neck',
    'Neck muscles: short 15–100 Hz bursts 20–60 ms after about half of the heel strikes and through each turn, shallow source below the occipital electrodes.',
    { positionMm: [-10, -80, 5], direction: [0, 0.2, 1] },
    scenario.neckBursts,
    0.05,
  );

  // --- Cardiac --------------------------------------------------------------------------------------
  {
    const act = new Float64Array(n);
    for (const r of scenario.heartbeats) addKernel(act, { fs, onsetS: r, amplitude: 1, startS: -0.3, endS: 0.5, kernel: heartbeatKernel });
    // Heart below, left and in front of the head: a uniform field along this direction.
    const d = unitVec([-0.5, 0.35, -0.8]);
    const map = sensorMap(ctx, (_l, c) => ctx.directions[3 * c] * d[0] + ctx.directions[3 * c + 1] * d[1] + ctx.directions[3 * c + 2] * d[2], 5);
    out.push({
      id: 'cardiac',
      class: 'cardiac',
      description: 'Heartbeat (QRS-like waveform, ~75 bpm with respiratory sinus arrhythmia) as a weak far field: a smooth left–right/front–back gradient.',
      activationUnit: 'ECG-like amplitude (R peak ≈ 1)',
      map,
      dipole: null,
      activation: act,
      markersS: Float64Array.from(scenario.heartbeats),
    });
  }

  // --- Line noise -----------------------------------------------------------------------------------
  {
    const r = rng(ctx, 'line-noise');
    const slow = ornsteinUhlenbeck(r, n, fs, 5);
    const phase = r.between(0, 2 * Math.PI);
    const phase3 = r.between(0, 2 * Math.PI);
    const f0 = ctx.lineHz;
    const third = 3 * f0 < fs / 2 ? 0.08 : 0;
    const act = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const t = i / fs;
      act[i] = (1 + 0.1 * slow[i]) * Math.cos(2 * Math.PI * f0 * t + phase) + third * Math.cos(2 * Math.PI * 3 * f0 * t + phase3);
    }
    const w: Record<string, number> = { T8: 1, FC6: 0.5, C4: 0.3 };
    out.push({
      id: 'mains',
      class: 'mains',
      description: `Mains interference at ${f0} Hz (slowly varying amplitude${third ? `, weak 3rd harmonic at ${3 * f0} Hz` : ''}) picked up by three poorly shielded leads (T8, FC6, C4).`,
      activationUnit: 'relative amplitude of the mains sinusoid',
      map: sensorMap(ctx, (l) => w[l] ?? 0, 6),
      dipole: null,
      activation: act,
    });
  }

  // --- Loose electrode ------------------------------------------------------------------------------
  {
    const r = rng(ctx, 'electrode');
    const drift = ornsteinUhlenbeck(r, n, fs, 10);
    const act = new Float64Array(n);
    for (let i = 0; i < n; i++) act[i] = 0.8 * drift[i];
    for (const p of scenario.pops) addKernel(act, { fs, onsetS: p.timeS, amplitude: p.height, startS: 0, endS: 8 * p.tauS, kernel: (t) => Math.exp(-t / p.tauS) });
    out.push({
      id: 'electrode-P7',
      class: 'contact',
      description: 'Loose electrode at P7: slow drifts of the contact potential and sudden pops that recover over 0.3–1.5 s.',
      activationUnit: 'electrode offset (pops 1.5–4)',
      map: sensorMap(ctx, (l) => (l === 'P7' ? 1 : 0), 20),
      dipole: null,
      activation: act,
      markersS: Float64Array.from(scenario.pops, (p) => p.timeS),
    });
  }

  // --- Cable sway -----------------------------------------------------------------------------------
  {
    const r = rng(ctx, 'motion');
    const act = new Float64Array(n);
    for (const st of scenario.steps) {
      const sign = st.foot === 'left' ? 1 : -1;
      const amp = sign * r.between(0.7, 1.3) * (st.turning ? 1.5 : 1);
      // Damped 2.5 Hz sway of the lead bundle after each heel strike (τ = 0.2 s; our round numbers).
      addKernel(act, { fs, onsetS: st.timeS, amplitude: amp, startS: 0, endS: 1, kernel: (t) => Math.exp(-t / 0.2) * Math.sin(2 * Math.PI * 2.5 * t) });
    }
    // The posterior lead bundle: electrodes with y < −0.75 (unit sphere), gains 0.6–1 fixed per label.
    const map = sensorMap(ctx, (l, c) => (ctx.directions[3 * c + 1] < -0.75 ? 0.6 + 0.4 * labelHash01(l) : 0), 15);
    out.push({
      id: 'motion-cable',
      class: 'movement',
      description: 'Cable sway: a damped ~2.5 Hz swing of the posterior lead bundle after each heel strike (~1.8 steps/s), opposite sign for left and right steps.',
      activationUnit: 'sway amplitude',
      map,
      dipole: null,
      activation: act,
      markersS: Float64Array.from(scenario.steps, (s) => s.timeS),
    });
  }

  return out;
}

/** Head models used by the simulator (radius 90 mm, σ = 0.33 S/m). */
export function simulatorHeadModels(radiusMm: number): { brain: HeadModel; sphere: HeadModel } {
  return {
    brain: createHeadModel({ kind: 'three-shell', radiusMm }),
    sphere: createHeadModel({ kind: 'sphere', radiusMm }),
  };
}
