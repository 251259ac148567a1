/**
 * The ground truth of a simulated session: the true sources (class, scalp map, dipole, activation) and the
 * exact sensor noise, plus its file form (truth.json with the activations in a little-endian float32
 * side file). Later parts score decompositions and cleaned data against these.
 */
import type { ReasonCode } from '../review/vocabulary.ts';
import type { Hz, Microvolts, Millimetres } from '../units.ts';

/**
 * Classes of true sources: the review's reason codes that name an origin (every code but the judgements
 * 'mixed' and 'unclear'), plus 'noise' for sources no reason code covers.
 */
export type TrueSourceClass = Exclude<ReasonCode, 'mixed' | 'unclear'> | 'noise';

/** A current dipole in head coordinates (RAS, mm) with its moment in nA·m. */
export interface TrueDipole {
  readonly positionMm: [number, number, number];
  readonly momentNAm: [number, number, number];
}

export interface TrueSource {
  readonly id: string;
  readonly class: TrueSourceClass;
  /**
   * Scalp map in µV per unit of activation, in channel order, against the common average of the
   * electrodes (so it sums to 0 over channels). Column `k` of the mixing matrix.
   */
  readonly map: Float64Array;
  /**
   * The single equivalent dipole that produces `map` (after average referencing) for unit activation,
   * or null when the map is not one dipole (sensor-space artifacts, far-field cardiac, dipole pairs).
   */
  readonly dipole: TrueDipole | null;
  /** All dipoles of a multi-dipole source (e.g. the bilateral auditory pair), each per unit activation. */
  readonly dipoles?: readonly TrueDipole[];
  /** Activation time course, length nSamples (unit stated in `activationUnit`). */
  readonly activation: Float32Array;
  /** What one unit of activation means (e.g. "degrees of horizontal gaze", "unit-variance noise"). */
  readonly activationUnit: string;
  /** Times (s) of the source's discrete events when it has any: blink onsets, saccade onsets, pops, R peaks. */
  readonly markersS?: Float64Array;
  readonly description: string;
}

export interface SimulatedEvent {
  /** Seconds from the first sample; always on the sample grid. */
  readonly onset: number;
  readonly duration: number;
  /** The BIDS trial_type: 'tone' | 'step'. */
  readonly label: string;
  /** The other events.tsv columns: condition (tones: standard | rare) and foot (steps: left | right), n/a where it does not apply. */
  readonly columns: { readonly condition: string; readonly foot: string };
}

export interface SimulatedSession {
  readonly seed: number;
  readonly labels: string[];
  /** M × 3 electrode positions, RAS mm, on the head sphere (radius `headRadiusMm`). */
  readonly electrodesMm: Float64Array;
  readonly headRadiusMm: Millimetres;
  readonly sampleRate: Hz;
  readonly nSamples: number;
  readonly lineHz: 50 | 60;
  /**
   * Sensor data, channel-major µV: data[c·n + t] = fround(Σ_k map_k[c]·activation_k[t] + sensorNoise[c·n + t]),
   * the sum taken in float64 in source order, neural sources first.
   */
  readonly data: Float32Array;
  /** Back-projection of the neural sources only, channel-major µV (no sensor noise): what a perfect cleaning keeps. */
  readonly neuralOnly: Float32Array;
  /** The exact sensor (amplifier) noise added to every channel, channel-major µV. */
  readonly sensorNoise: Float32Array;
  /** Standard deviation of the sensor noise. */
  readonly sensorNoiseUv: Microvolts;
  /** Mixing matrix, M × K row-major (mixing[c·K + k] = sources[k].map[c]). */
  readonly mixing: Float64Array;
  readonly events: SimulatedEvent[];
  readonly sources: TrueSource[];
  /** Reference of `data`: the common average of the electrodes for the maps; the noise is per channel. */
  readonly reference: 'average';
}

/** truth.json, the file form of the ground truth (format id "winnow-simulation-truth", version 1). */
export interface TruthFile {
  readonly format: 'winnow-simulation-truth';
  readonly version: 1;
  readonly note: string;
  readonly seed: number;
  readonly sampleRate: number;
  readonly nSamples: number;
  readonly lineHz: number;
  readonly reference: 'average';
  readonly headModel: { readonly kind: string; readonly radiusMm: number; readonly description: string };
  readonly channels: string[];
  readonly sensorNoiseUv: number;
  /**
   * Where the activations lie: one float32 little-endian file, one source after another (each source's
   * `activation.byteOffset`/`byteLength`); `file` is null when they were not written (the demo data).
   */
  readonly activations: { readonly file: string | null; readonly dtype: 'float32-le'; readonly nSamples: number };
  readonly sensorNoise: { readonly file: string; readonly dtype: 'float32-le'; readonly layout: 'channel-major' } | null;
  readonly sources: {
    readonly id: string;
    readonly class: TrueSourceClass;
    readonly description: string;
    readonly activationUnit: string;
    readonly map: number[];
    readonly dipole: TrueDipole | null;
    readonly dipoles?: readonly TrueDipole[];
    readonly activation: { readonly byteOffset: number; readonly byteLength: number; readonly rms: number };
    readonly markersS?: number[];
  }[];
}

/** Little-endian bytes of a Float32Array (copies only on big-endian hosts). */
export function float32LeBytes(values: Float32Array): Uint8Array {
  const little = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
  if (little) return new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  const out = new Uint8Array(values.length * 4);
  const view = new DataView(out.buffer);
  for (let i = 0; i < values.length; i++) view.setFloat32(4 * i, values[i], true);
  return out;
}

const round = (v: number, digits: number) => Number(v.toPrecision(digits));

/**
 * The truth.json object and the activations file for a session. Map values keep 17 significant digits
 * (exact float64 round trip), so data = mixing · activations + noise can be recomputed from the files.
 */
export function truthFiles(
  session: SimulatedSession,
  names: { activations: string | null; sensorNoise: string | null } = { activations: 'activations.f32', sensorNoise: null },
): { truth: TruthFile; activations: Uint8Array } {
  const n = session.nSamples;
  const activations = new Float32Array(session.sources.length * n);
  const sources = session.sources.map((s, k) => {
    activations.set(s.activation, k * n);
    let ss = 0;
    for (let i = 0; i < n; i++) ss += s.activation[i] * s.activation[i];
    return {
      id: s.id,
      class: s.class,
      description: s.description,
      activationUnit: s.activationUnit,
      map: Array.from(s.map),
      dipole: s.dipole,
      ...(s.dipoles ? { dipoles: s.dipoles } : {}),
      activation: { byteOffset: k * n * 4, byteLength: n * 4, rms: round(Math.sqrt(ss / Math.max(1, n)), 6) },
      ...(s.markersS ? { markersS: Array.from(s.markersS, (t) => round(t, 9)) } : {}),
    };
  });
  const truth: TruthFile = {
    format: 'winnow-simulation-truth',
    version: 1,
    note: 'Simulated by Winnow (winnow simulate); no real participant. data = mixing · activations + sensor noise.',
    seed: session.seed,
    sampleRate: session.sampleRate,
    nSamples: n,
    lineHz: session.lineHz,
    reference: session.reference,
    headModel: {
      kind: 'three-shell sphere (neural); homogeneous sphere (ocular, muscle)',
      radiusMm: session.headRadiusMm,
      description:
        'Neural dipoles: three concentric shells (brain/skull/scalp radii 0.87/0.92/1.0 R, conductivity ratio 1:1/80:1, Rush & Driscoll 1969). ' +
        'Ocular and muscle dipoles lie outside the skull, so they use the homogeneous sphere of the same radius. Cardiac: far-field linear gradient. ' +
        'Line noise, loose electrode and cable sway: maps in sensor space. All maps average-referenced.',
    },
    channels: [...session.labels],
    sensorNoiseUv: session.sensorNoiseUv,
    activations: { file: names.activations, dtype: 'float32-le', nSamples: n },
    sensorNoise: names.sensorNoise ? { file: names.sensorNoise, dtype: 'float32-le', layout: 'channel-major' } : null,
    sources,
  };
  return { truth, activations: float32LeBytes(activations) };
}
