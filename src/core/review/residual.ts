/**
 * What the decomposition missed (issue 10 item 5; docs/methods.md §19): after the decisions, measure what is
 * left on the cleaned channels and warn, with figures, when artefact remains there.
 *
 * 1. Ocular: the slow (≈ 0.5–5 Hz) part of each frontal-pole channel that follows the vertical eye reference
 *    (EOG channels, else the frontal bipolar proxy, built from the recording before cleaning: ocular.ts).
 *    For channel c, β = ⟨x_c, v⟩ / ⟨v, v⟩ is the regression weight of the channel on the reference; the share
 *    remaining is β(cleaned) / β(original) — 1 when nothing ocular was removed, ≈ 0 when all of it was.
 * 2. Mains: the share of each cleaned channel's 1 Hz–fmax power within ±1 Hz of the line frequency and its
 *    harmonics (Welch spectrum; the mains share of docs/methods.md §4, on channels instead of components).
 * 3. Heartbeat: the cardiac periodicity measure (cardiac.ts) on each cleaned channel.
 *
 * Thresholds are ours (RESIDUAL_LIMITS, with the reasoning beside each) and named in every warning. Pure.
 */
import { cardiacPeriodicity } from '../evidence/cardiac.ts';
import { eogReferences, FRONTAL_POLE_Y } from '../evidence/ocular.ts';
import { spectrumShares } from '../evidence/spectrum-shape.ts';
import { createWelchPlan, welchFrequencies, welchPsd, welchSegmentLength } from '../signal/welch.ts';
import type { Decomposition } from '../decomposition.ts';
import { mainsFrequency } from '../formats/power-line.ts';
import type { LoadedRecording } from '../recording.ts';
import { cleanedRecordingSamples } from './clean.ts';
import type { Hz } from '../units.ts';

export interface ResidualInput {
  /** Channel-major samples before cleaning, µV, nChannels × nSamples (EOG channels included when recorded). */
  readonly original: Float32Array;
  /** The same layout after removing the components (review/clean.ts); channels outside the decomposition unchanged. */
  readonly cleaned: Float32Array;
  readonly nChannels: number;
  readonly nSamples: number;
  readonly sampleRate: Hz;
  readonly labels: readonly string[];
  /** BIDS channel types per row (EOG/VEOG/HEOG are eye references, never measured as cleaned channels). */
  readonly types?: readonly string[];
  /** Unit direction vectors (RAS) per row, NaN rows unknown; null without positions. */
  readonly positionsUnit: Float64Array | null;
  readonly lineHz: 50 | 60;
  /** Rows that were cleaned (the decomposition's channels); default every non-EOG row. */
  readonly channels?: readonly number[];
}

/**
 * Limits above which a warning is given (ours):
 * - ocularRemaining 0.3: a third of the original eye-following slow signal left on a frontal-pole channel is
 *   a visible blink residue (a 100 µV blink leaves ≥ 30 µV); correct removals leave well under 0.1 in our
 *   simulated tests (test/core/review/residual.test.ts).
 * - ocularFollowing 0.5: the original channel must itself follow the reference (|r| ≥ 0.5 on slow activity),
 *   or there was no ocular signal on it to speak of.
 * - mainsShare 0.05: on 1/f EEG the ±1 Hz line bands hold well under 1 % of 1 Hz–fmax power; 5 % is line noise
 *   that an analysis of the gamma band or of broadband power will see.
 * - cardiacPeak 0.4: the component threshold of the cardiac signature (review/thresholds.ts cardiacPeak).
 */
export const RESIDUAL_LIMITS = { ocularRemaining: 0.3, ocularFollowing: 0.5, mainsShare: 0.05, cardiacPeak: 0.4 } as const;

export interface ResidualMeasures {
  /** Worst frontal-pole channel, or null without an eye reference or frontal sites. */
  readonly ocular: {
    readonly reference: 'EOG channels' | 'frontal bipolar';
    readonly referenceChannels: string;
    readonly channel: string;
    /** β(cleaned) / β(original), 0…1 (clipped). */
    readonly remaining: number;
    /** |r| of the cleaned channel's slow activity with the reference. */
    readonly rCleaned: number;
    /** |r| of the original channel's slow activity with the reference. */
    readonly rOriginal: number;
  } | null;
  readonly mains: {
    readonly lineHz: number;
    readonly medianShare: number;
    readonly worstShare: number;
    readonly worstChannel: string;
    /** Channels at or above RESIDUAL_LIMITS.mainsShare, worst first. */
    readonly channelsAbove: readonly string[];
  } | null;
  /** Strongest periodicity among the cleaned channels, or null when no channel shows a beat. */
  readonly cardiac: { readonly channel: string; readonly bpm: number; readonly peak: number; readonly channelsAbove: readonly string[] } | null;
}

export interface ResidualWarning {
  readonly kind: 'ocular' | 'mains' | 'cardiac';
  /** One sentence with its figures, e.g. "Fp1 keeps 62 % of its eye-following slow signal (…)". */
  readonly text: string;
}

export interface ResidualResult {
  readonly measures: ResidualMeasures;
  readonly warnings: ResidualWarning[];
}

const EOG_TYPES = new Set(['EOG', 'VEOG', 'HEOG']);
const pct = (x: number) => `${Math.round(100 * x)} %`;

/**
 * Slow activity: means over ≈ 0.1 s blocks (a ≈ 5 Hz low-pass) minus their running mean over ≈ 2 s (removes
 * drift below ≈ 0.5 Hz). Returns one value per block.
 */
function slowActivity(x: ArrayLike<number>, offset: number, nSamples: number, fs: number): Float64Array {
  const B = Math.max(1, Math.round(fs / 10));
  const nb = Math.floor(nSamples / B);
  const blocks = new Float64Array(nb);
  for (let b = 0; b < nb; b++) {
    let s = 0;
    for (let j = 0; j < B; j++) s += x[offset + b * B + j];
    blocks[b] = s / B;
  }
  const half = 10; // 2 s window of 0.1 s blocks
  const out = new Float64Array(nb);
  const prefix = new Float64Array(nb + 1);
  for (let b = 0; b < nb; b++) prefix[b + 1] = prefix[b] + blocks[b];
  for (let b = 0; b < nb; b++) {
    const lo = Math.max(0, b - half);
    const hi = Math.min(nb, b + half + 1);
    out[b] = blocks[b] - (prefix[hi] - prefix[lo]) / (hi - lo);
  }
  return out;
}

function dotStats(a: Float64Array, v: Float64Array): { beta: number; r: number } {
  let av = 0;
  let vv = 0;
  let aa = 0;
  for (let i = 0; i < v.length; i++) {
    av += a[i] * v[i];
    vv += v[i] * v[i];
    aa += a[i] * a[i];
  }
  return { beta: vv > 0 ? av / vv : NaN, r: vv > 0 && aa > 0 ? av / Math.sqrt(vv * aa) : NaN };
}

/** Measures what remains on the cleaned channels and the warnings it calls for. */
export function residualArtefacts(input: ResidualInput): ResidualResult {
  const { original, cleaned, nChannels, nSamples, sampleRate: fs, labels, types, positionsUnit, lineHz } = input;
  const isEog = (c: number) => EOG_TYPES.has((types?.[c] ?? '').toUpperCase()) || /EOG/i.test(labels[c] ?? '');
  const rows = (input.channels ?? Array.from({ length: nChannels }, (_, c) => c)).filter((c) => !isEog(c));
  const row = (data: Float32Array, c: number) => data.subarray(c * nSamples, (c + 1) * nSamples);
  const warnings: ResidualWarning[] = [];

  // 1. Ocular
  let ocular: ResidualMeasures['ocular'] = null;
  const eog = eogReferences(original, nChannels, nSamples, labels, types, positionsUnit);
  if (eog.vertical && eog.source !== 'none') {
    const ref = slowActivity(eog.vertical, 0, nSamples, fs);
    const frontal = rows.filter((c) =>
      positionsUnit && Number.isFinite(positionsUnit[3 * c + 1]) ? positionsUnit[3 * c + 1] >= FRONTAL_POLE_Y : /^(fp|af)/i.test(labels[c]),
    );
    for (const c of frontal) {
      const o = dotStats(slowActivity(original, c * nSamples, nSamples, fs), ref);
      if (!(Math.abs(o.r) >= RESIDUAL_LIMITS.ocularFollowing) || !(Math.abs(o.beta) > 0)) continue;
      const k = dotStats(slowActivity(cleaned, c * nSamples, nSamples, fs), ref);
      const remaining = Math.max(0, Math.min(1, k.beta / o.beta));
      if (!ocular || remaining > ocular.remaining)
        ocular = {
          reference: eog.source, referenceChannels: eog.channels.vertical ?? '', channel: labels[c], remaining,
          rCleaned: Math.abs(k.r), rOriginal: Math.abs(o.r),
        };
    }
    if (ocular && ocular.remaining >= RESIDUAL_LIMITS.ocularRemaining)
      warnings.push({
        kind: 'ocular',
        text:
          `${ocular.channel} keeps ${pct(ocular.remaining)} of its slow activity that follows the vertical eye reference ` +
          `(${ocular.referenceChannels || ocular.reference}; r = ${ocular.rCleaned.toFixed(2)} after cleaning, ${ocular.rOriginal.toFixed(2)} before; ` +
          `warning from ${pct(RESIDUAL_LIMITS.ocularRemaining)}, ours): eye artefact remains`,
      });
  }

  // 2. Mains and 3. heartbeat, per cleaned channel
  let mains: ResidualMeasures['mains'] = null;
  let cardiac: ResidualMeasures['cardiac'] = null;
  const nfft = welchSegmentLength(fs, nSamples);
  if (rows.length > 0 && nfft >= 8 && nSamples >= nfft) {
    const plan = createWelchPlan(nfft);
    const freqs = welchFrequencies(plan, fs);
    const fmax = Math.min(fs / 2, 100);
    const psd = new Float64Array(plan.nBins);
    const shares: { channel: string; share: number }[] = [];
    const beats: { channel: string; bpm: number; peak: number }[] = [];
    for (const c of rows) {
      const x = row(cleaned, c);
      welchPsd(plan, x, fs, psd);
      const s = spectrumShares(freqs, psd, lineHz, fmax).mainsShare;
      if (Number.isFinite(s)) shares.push({ channel: labels[c], share: s });
      const beat = cardiacPeriodicity(x, fs);
      if (beat.bpm !== null) beats.push({ channel: labels[c], bpm: beat.bpm, peak: beat.peak });
    }
    if (shares.length > 0 && lineHz < fmax) {
      const sorted = [...shares].sort((a, b) => b.share - a.share);
      const values = sorted.map((s) => s.share).reverse();
      const mid = values.length >> 1;
      const median = values.length % 2 ? values[mid] : 0.5 * (values[mid - 1] + values[mid]);
      mains = {
        lineHz, medianShare: median, worstShare: sorted[0].share, worstChannel: sorted[0].channel,
        channelsAbove: sorted.filter((s) => s.share >= RESIDUAL_LIMITS.mainsShare).map((s) => s.channel),
      };
      if (mains.channelsAbove.length > 0) {
        const list = mains.channelsAbove.length > 6 ? `${mains.channelsAbove.slice(0, 6).join(', ')} and ${mains.channelsAbove.length - 6} more` : mains.channelsAbove.join(', ');
        warnings.push({
          kind: 'mains',
          text:
            `${mains.channelsAbove.length} of ${shares.length} cleaned channels keep ≥ ${pct(RESIDUAL_LIMITS.mainsShare)} of their power at ${lineHz} Hz and its harmonics ` +
            `(worst ${mains.worstChannel}, ${pct(mains.worstShare)}; median ${(100 * median).toFixed(1)} %; ${list}; ours): mains interference remains`,
        });
      }
    }
    if (beats.length > 0) {
      const best = beats.reduce((a, b) => (b.peak > a.peak ? b : a));
      const above = beats.filter((b) => b.peak >= RESIDUAL_LIMITS.cardiacPeak).sort((a, b) => b.peak - a.peak).map((b) => b.channel);
      cardiac = { channel: best.channel, bpm: best.bpm, peak: best.peak, channelsAbove: above };
      if (above.length > 0)
        warnings.push({
          kind: 'cardiac',
          text:
            `${above.length} cleaned channel${above.length === 1 ? '' : 's'} still beat periodically at ${Math.round(best.bpm)} per minute ` +
            `(strongest ${best.channel}, autocorrelation ${best.peak.toFixed(2)}; warning from ${RESIDUAL_LIMITS.cardiacPeak}, ours): heartbeat artefact remains`,
        });
    }
  }
  return { measures: { ocular, mains, cardiac }, warnings };
}

/**
 * The residual check of a review: the recording's main-rate signal block cleaned of `removed` (1-based
 * components; review/clean.ts), measured on the decomposition's channels with the recording's mains frequency
 * (PowerLineFrequency of its *_eeg.json, else 50 Hz) and positions. Throws a RangeError when the decomposition
 * does not fit the recording (the loader already matched them).
 */
export function residualForReview(recording: LoadedRecording, decomposition: Decomposition, removed: readonly number[]): ResidualResult {
  const { labels, data, nSamples, sampleRate } = recording.signals;
  const cleaned = removed.length > 0 ? cleanedRecordingSamples(recording, decomposition, removed) : data;
  const info = new Map(recording.channels.map((c) => [c.label, c] as const));
  const byLabel = new Map(labels.map((l, i) => [l.toLowerCase(), i] as const));
  const channels = decomposition.channels.map((c) => byLabel.get(c.toLowerCase())).filter((r): r is number => r !== undefined);
  return residualArtefacts({
    original: data,
    cleaned,
    nChannels: labels.length,
    nSamples,
    sampleRate,
    labels,
    types: labels.map((l) => info.get(l)?.type ?? 'EEG'),
    positionsUnit: recording.positions ?? null,
    lineHz: mainsFrequency(recording.powerLine).hz,
    channels,
  });
}
