/**
 * All evidence for the components of one decomposition (issue 6). Activations are computed a block of
 * components at a time (multiplyChannelMajor), so memory stays at blockSize × nSamples × 8 bytes however
 * long the recording; every per-component number is then taken from that block and the block is dropped.
 *
 * Order of work per block: activations → moments and variance shares → Welch spectrum and its shape →
 * ocular, focality, cardiac → epochs (ERP, trial stack, time-locking per event type, step-locking) → dipole.
 * `timings` reports the wall time of each stage in ms (activations, spectra, epochs, dipoles, other).
 *
 * Measures only (issue 10 item 1): no aim and no threshold table enter here; verdicts come from
 * `suggestWithRules(evidence, aim, thresholds)` (review/suggest.ts), computed by whoever shows them.
 */
import type { Decomposition } from '../decomposition.ts';
import { createHeadModel } from '../headmodel/forward.ts';
import { createDipoleFitter } from '../headmodel/dipole-fit.ts';
import { approximateRegion } from '../headmodel/region.ts';
import { roundHalfAway } from '../signal/epochs.ts';
import { createWelchPlan, welchFrequencies, welchPsd, welchSegmentLength, type WelchPlan } from '../signal/welch.ts';
import { millimetres, secondsWindow, type Hz, type Lenient, type Millimetres, type Seconds, type SecondsWindow } from '../units.ts';
import { channelMoments, computeActivations, signalMoments } from './activations.ts';
import { cardiacBeats, cardiacPeriodicity } from './cardiac.ts';
import { mapFocality } from './focality.ts';
import { STEP_EVENT_PATTERN, stepLocking } from './motion.ts';
import { eogReferences, mapGeometry, mirrorPairs, stepLikeness } from './ocular.ts';
import { findAlphaPeak, fitOneOverF, spectrumShares } from './spectrum-shape.ts';
import { eventLocked, LOCKING_MAX_SHUFFLES, LOCKING_STOP_AFTER, lockingPermutationTest } from './time-locking.ts';
import { defaultEventType, eventTypes, isStepType, parseSelectionKey, selectEvents, splitEvents } from './event-selection.ts';
import type { ComponentEvidence, DipoleEvidence, TrialStack, ErpEvidence, TimeLockingTest } from './types.ts';

export interface EvidenceEvent {
  /** Seconds from the first sample. */
  readonly onset: Lenient<Seconds>;
  readonly duration: Lenient<Seconds>;
  readonly label: string;
  readonly responseTime?: Lenient<Seconds>;
  /** The other events.tsv columns of this event (RecordingEvent.columns). */
  readonly columns?: Readonly<Record<string, string>>;
}

/** A dipole fit of one scalp map (the map in decomposition channel order); null when impossible. */
export type DipoleFitFn = (map: Float64Array) => DipoleEvidence | null;

export interface EvidenceInput {
  /** Channel-major samples, µV, nChannels × nSamples. May hold more channels than the decomposition (e.g. EOG). */
  readonly data: Float32Array;
  readonly nChannels: number;
  readonly nSamples: number;
  readonly sampleRate: Lenient<Hz>;
  /** Label of each data channel; decomposition channels are found by label. */
  readonly labels: readonly string[];
  /** Unit direction vectors (RAS) per data channel, nChannels × 3, NaN rows unknown; null = none known. */
  readonly positionsUnit?: Float64Array | null;
  /** BIDS channel type per data channel (EOG/VEOG/HEOG are used as eye references). */
  readonly types?: readonly string[];
  readonly decomposition: Decomposition;
  readonly events?: readonly EvidenceEvent[];
  /** Event type (trial_type) to epoch, or an event-selection.ts selectionKey; default: the most frequent non-step type. */
  readonly epochEvent?: string;
  /** Epoch window in s relative to the event (default −0.2 … 0.8 s). */
  readonly window?: SecondsWindow;
  /** Power-line frequency (default 50 Hz). */
  readonly lineHz?: 50 | 60;
  /**
   * An events.tsv column (EvidenceEvent.columns, e.g. "condition"): time-locking is then also tested for each
   * of its values within each event type (ComponentEvidence.timeLocking).
   */
  readonly lockColumn?: string;
  /** 0-based [start, end) range of components to compute (default all); indices stay global. */
  readonly componentRange?: readonly [number, number];
  /**
   * Most shuffles per time-locking permutation test (default LOCKING_MAX_SHUFFLES = 999, so p can reach
   * 1/1000). Sequential (Besag & Clifford 1991, time-locking.ts): a test stops once LOCKING_STOP_AFTER (10)
   * shuffles reach the observed share, so unlocked components cost a few tens of shuffles.
   */
  readonly permutations?: number;
  /** Override the dipole fit (tests, or a fitter shared across calls); null disables fitting. */
  readonly dipoleFit?: DipoleFitFn | null;
  /** Head radius in mm used to place unit positions for the dipole fit (default 90). */
  readonly headRadiusMm?: Lenient<Millimetres>;
  readonly onProgress?: (fraction: number, stage: string) => void;
}

export interface EvidenceResult {
  readonly components: ComponentEvidence[];
  /** Wall time per stage, ms: activations, spectra, shape, ocular, epochs, dipoles, other, total. */
  readonly timings: Record<string, number>;
  /** The event type (or selection key) that was epoched, or null. */
  readonly epochEvent: string | null;
  readonly warnings: string[];
}

/** Default epoch window (issue 6): −0.2 … 0.8 s. */
export const DEFAULT_EPOCH_WINDOW_S: SecondsWindow = secondsWindow(-0.2, 0.8);

/** The event type epoched by default: the most frequent non-step trial_type (event-selection.ts). */
export function defaultEpochEvent(events: readonly EvidenceEvent[]): string | null {
  return defaultEventType(events);
}

/**
 * The default dipole fit: three-shell head model (forward.ts defaults), electrodes = unit positions × head
 * radius; channels without a position are left out. Null when fewer than 8 electrodes have positions.
 */
export function createDefaultDipoleFit(positionsUnit: Float64Array, headRadiusMm: Lenient<Millimetres> = millimetres(90)): DipoleFitFn | null {
  const n = positionsUnit.length / 3;
  const usable: number[] = [];
  for (let c = 0; c < n; c++) if ([0, 1, 2].every((k) => Number.isFinite(positionsUnit[3 * c + k]))) usable.push(c);
  if (usable.length < 8) return null;
  const electrodes = new Float64Array(usable.length * 3);
  usable.forEach((c, i) => {
    for (let k = 0; k < 3; k++) electrodes[3 * i + k] = positionsUnit[3 * c + k] * headRadiusMm;
  });
  // The fast (equivalent-dipole) three-shell approximation without the exact-series polish: ~10× cheaper
  // per map and well within what an approximate region needs; the CLI's dipole command gives the exact fit.
  const fitter = createDipoleFitter(createHeadModel({ radiusMm: headRadiusMm, fast: true }), electrodes, { refine: false });
  const sub = new Float64Array(usable.length);
  return (map) => {
    usable.forEach((c, i) => (sub[i] = map[c]));
    const fit = fitter.fit(sub);
    if (!Number.isFinite(fit.residualVariance)) return null;
    return {
      position: fit.position,
      moment: fit.moment,
      residualVariance: fit.residualVariance,
      atBoundary: fit.atBoundary,
      region: approximateRegion(fit.position, headRadiusMm).label,
    };
  };
}

function unitCentred(x: Float64Array): Float64Array | null {
  let m = 0;
  for (let i = 0; i < x.length; i++) m += x[i];
  m /= x.length;
  let ss = 0;
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    out[i] = x[i] - m;
    ss += out[i] * out[i];
  }
  if (!(ss > 0)) return null;
  const k = 1 / Math.sqrt(ss);
  for (let i = 0; i < x.length; i++) out[i] *= k;
  return out;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/** One event set to test for time-locking: a type, or one value of the lock column within it. */
interface LockingTarget {
  readonly event: string;
  readonly column?: string;
  readonly value?: string;
  readonly onsets: number[];
}

/** Every non-step event type (most frequent first), each followed by its lockColumn values when given. */
function lockingTargets(events: readonly EvidenceEvent[], lockColumn: string | undefined): LockingTarget[] {
  const out: LockingTarget[] = [];
  for (const t of eventTypes(events)) {
    if (isStepType(t.type) || t.type === 'boundary') continue;
    out.push({ event: t.type, onsets: selectEvents(events, { type: t.type }).map((e) => e.onset) });
    if (lockColumn)
      for (const g of splitEvents(events, { type: t.type }, lockColumn))
        out.push({ event: t.type, column: lockColumn, value: g.value, onsets: g.events.map((e) => e.onset) });
  }
  return out;
}

/**
 * The sequential locking test of `x` around `onsetsS` (epoch rule of docs/methods.md §5, the same ~125 Hz
 * grid as eventLocked), without the average or ITC; null when fewer than 2 epochs fit.
 */
function lockingAt(
  x: Float64Array,
  fs: number,
  target: LockingTarget,
  win: readonly [number, number],
  nPermutations: number,
  seed: number,
): TimeLockingTest | null {
  const o0 = roundHalfAway(win[0] * fs);
  const o1 = roundHalfAway(win[1] * fs);
  const length = o1 - o0 + 1;
  const samples: number[] = [];
  for (const onset of target.onsets) {
    if (!Number.isFinite(onset)) continue;
    const e = roundHalfAway(onset * fs);
    if (e + o0 >= 0 && e + o1 <= x.length - 1) samples.push(e);
  }
  if (samples.length < 2 || length < 2) return null;
  const stride = Math.max(1, Math.floor(fs / 125));
  const test = lockingPermutationTest(x, samples, o0, length, nPermutations, seed, LOCKING_STOP_AFTER, stride);
  return {
    event: target.event,
    ...(target.column !== undefined ? { column: target.column, value: target.value } : {}),
    nEpochs: samples.length,
    lockedShare: test.observed,
    strength: test.observed - test.chance,
    p: test.p,
    shuffles: test.permutations,
  };
}

/** Computes the evidence (measures only) for every component (or `componentRange`). */
export function computeEvidence(input: EvidenceInput): EvidenceResult {
  const t0 = performance.now();
  const timings: Record<string, number> = { activations: 0, spectra: 0, shape: 0, ocular: 0, epochs: 0, dipoles: 0, other: 0, total: 0 };
  const warnings: string[] = [];
  const tick = (stage: string, since: number) => {
    const now = performance.now();
    timings[stage] += now - since;
    return now;
  };
  const { data, nChannels, nSamples, sampleRate: fs, labels, decomposition: dec } = input;
  const lineHz = input.lineHz ?? 50;
  const nComp = dec.nComponents;
  const nDec = dec.nChannels;
  const [cStart, cEnd] = input.componentRange ?? [0, nComp];

  // Decomposition channel d ↔ data row rowOf[d]; the unmixing is widened to all data rows with zeros so
  // that extra channels (EOG) need no copy of the data.
  const rowOf: number[] = [];
  const byLabel = new Map(labels.map((l, i) => [l, i]));
  for (const name of dec.channels) {
    const r = byLabel.get(name);
    if (r === undefined) break;
    rowOf.push(r);
  }
  if (rowOf.length !== nDec) {
    if (nChannels !== nDec) throw new RangeError(`computeEvidence: decomposition channels not found in the data labels (${dec.channels.find((c) => !byLabel.has(c))})`);
    rowOf.length = 0;
    for (let d = 0; d < nDec; d++) rowOf.push(d);
    warnings.push('decomposition channel names differ from the data labels; channels matched by position');
  }
  const wide: Decomposition = (() => {
    const identity = nChannels === nDec && rowOf.every((r, d) => r === d);
    if (identity) return dec;
    const unmixing = new Float64Array(nComp * nChannels);
    const means = dec.channelMeans ? new Float64Array(nChannels) : null;
    for (let i = 0; i < nComp; i++) for (let d = 0; d < nDec; d++) unmixing[i * nChannels + rowOf[d]] = dec.unmixing[i * nDec + d];
    if (means && dec.channelMeans) for (let d = 0; d < nDec; d++) means[rowOf[d]] = dec.channelMeans[d];
    return { ...dec, nChannels, unmixing, channelMeans: means };
  })();

  // Channel statistics and positions in decomposition order.
  const { variances } = channelMoments(data, nChannels, nSamples);
  let totalVariance = 0;
  for (let d = 0; d < nDec; d++) totalVariance += variances[rowOf[d]];
  const allPositions = input.positionsUnit ?? null;
  let decPositions: Float64Array | null = null;
  if (allPositions) {
    decPositions = new Float64Array(nDec * 3);
    for (let d = 0; d < nDec; d++) for (let k = 0; k < 3; k++) decPositions[3 * d + k] = allPositions[3 * rowOf[d] + k];
    if (!decPositions.some(Number.isFinite)) decPositions = null;
  }
  if (!decPositions) warnings.push('no electrode positions: map geometry, frontal EOG proxy and dipoles are unavailable');
  const pairs = mirrorPairs(decPositions, nDec);
  const eog = eogReferences(data, nChannels, nSamples, labels, input.types, allPositions);
  // Centred, unit-norm references: then Pearson r = Σ act · ref / ‖act − mean‖ in one pass per component.
  const eogV = eog.vertical ? unitCentred(eog.vertical) : null;
  const eogH = eog.horizontal ? unitCentred(eog.horizontal) : null;
  let tNow = tick('other', t0);

  // Spectra
  const nfft = welchSegmentLength(fs, nSamples);
  const plan: WelchPlan = createWelchPlan(nfft);
  const freqs = welchFrequencies(plan, fs);
  const fmax = Math.min(fs / 2, 100);
  let kLo = 0;
  while (kLo < freqs.length && freqs[kLo] < 1 - 1e-9) kLo++;
  let kHi = freqs.length - 1;
  while (kHi > 0 && freqs[kHi] > fmax + 1e-9) kHi--;
  const psd = new Float64Array(plan.nBins);
  const lineExclude: [number, number][] = [];
  for (let h = 1; h * lineHz <= 40 + 2; h++) lineExclude.push([h * lineHz - 2, h * lineHz + 2]);

  // Events
  const events = input.events ?? [];
  const epochName = input.epochEvent ?? defaultEpochEvent(events);
  const epochEvents = epochName ? selectEvents(events, parseSelectionKey(epochName)) : [];
  if (epochName && epochEvents.length === 0) warnings.push(`no events labelled "${epochName}"`);
  const epochOnsets = epochEvents.map((e) => e.onset);
  const responseTimes = epochEvents.some((e) => e.responseTime !== undefined) ? epochEvents.map((e) => e.responseTime ?? NaN) : null;
  const stepEvents = events.filter((e) => STEP_EVENT_PATTERN.test(e.label)).sort((a, b) => a.onset - b.onset);
  const win = input.window ?? DEFAULT_EPOCH_WINDOW_S;
  const nPermutations = input.permutations ?? LOCKING_MAX_SHUFFLES;
  const targets = lockingTargets(events, input.lockColumn);

  // Dipoles
  let dipoleFit: DipoleFitFn | null = null;
  if (input.dipoleFit !== undefined) dipoleFit = input.dipoleFit;
  else if (decPositions) {
    try {
      dipoleFit = createDefaultDipoleFit(decPositions, input.headRadiusMm ?? 90);
    } catch (e) {
      warnings.push(`dipole fitting unavailable: ${(e as Error).message}`);
    }
  }
  tNow = tick('dipoles', tNow);

  const components: ComponentEvidence[] = [];
  const blockSize = Math.max(1, Math.min(16, Math.floor(32e6 / (8 * Math.max(1, nSamples)))));
  const block = new Float64Array(blockSize * nSamples);
  const scaled = new Float64Array(nSamples);
  const total = Math.max(1, cEnd - cStart);
  for (let b0 = cStart; b0 < cEnd; b0 += blockSize) {
    const b1 = Math.min(cEnd, b0 + blockSize);
    tNow = performance.now();
    computeActivations(wide, data, nSamples, b0, b1, block);
    tNow = tick('activations', tNow);
    for (let i = b0; i < b1; i++) {
      const act = block.subarray((i - b0) * nSamples, (i - b0 + 1) * nSamples);
      const moments = signalMoments(act);
      // Map, strongest channel, variance shares
      const column = new Float64Array(nDec);
      let norm = 0;
      let strongest = 0;
      for (let d = 0; d < nDec; d++) {
        const a = dec.mixing[d * nComp + i];
        column[d] = a;
        norm += a * a;
        if (Math.abs(a) > Math.abs(column[strongest])) strongest = d;
      }
      const weight = column[strongest];
      const perChannel = new Float64Array(nDec);
      let explained = 0;
      for (let d = 0; d < nDec; d++) {
        const v = column[d] * column[d] * moments.variance;
        explained += v;
        perChannel[d] = variances[rowOf[d]] > 0 ? v / variances[rowOf[d]] : NaN;
      }
      const map = column.map((a) => (norm > 0 ? a / Math.sqrt(norm) : a));
      for (let t = 0; t < nSamples; t++) scaled[t] = act[t] * weight;
      tNow = tick('other', tNow);

      // Spectrum at the strongest channel, µV²/Hz
      welchPsd(plan, act, fs, psd);
      const w2 = weight * weight;
      const power = new Float64Array(kHi - kLo + 1);
      const powerDb = new Float64Array(kHi - kLo + 1);
      for (let k = kLo; k <= kHi; k++) {
        power[k - kLo] = psd[k] * w2;
        powerDb[k - kLo] = 10 * Math.log10(power[k - kLo]);
      }
      const frequencies = freqs.slice(kLo, kHi + 1);
      tNow = tick('spectra', tNow);
      const oneOverF = fitOneOverF(frequencies, power, { rangeHz: [2, 40], excludeHz: lineExclude });
      // Every true local maximum is reported with its prominence; whether it is prominent enough is the
      // suggestion's threshold (thresholds.alphaProminence), not the evidence's.
      const alpha = findAlphaPeak(frequencies, power, oneOverF, [7, 14], 0);
      const shares = spectrumShares(frequencies, power, lineHz, fmax);
      tNow = tick('shape', tNow);

      // Ocular, focality, cardiac
      const geometry = mapGeometry(column, decPositions, pairs);
      const actNorm = Math.sqrt(moments.variance * nSamples);
      const rV = eogV ? Math.abs(dot(act, eogV) / actNorm) : null;
      const rH = eogH ? Math.abs(dot(act, eogH) / actNorm) : null;
      const steps = stepLikeness(act, fs);
      const focal = mapFocality(column);
      const cardiac = cardiacPeriodicity(act, fs);
      const beats = cardiacBeats(act, fs, cardiac.bpm);
      tNow = tick('ocular', tNow);

      // Event-locked
      let erp: ErpEvidence | null = null;
      let trialStack: TrialStack | null = null;
      if (epochName && epochOnsets.length >= 2) {
        const locked = eventLocked(scaled, fs, epochOnsets, win, nPermutations, 1 + i);
        if (locked) {
          erp = {
            event: epochName,
            nEpochs: locked.epochs.nEpochs,
            times: locked.epochs.times,
            mean: locked.mean,
            band: { lower: locked.lower, upper: locked.upper },
            itc: locked.itc,
            itcFrequencyHz: locked.itcFrequencyHz,
            timeLockingStrength: locked.test.observed - locked.test.chance,
            lockedShare: locked.test.observed,
            permutationP: locked.test.p,
            shuffles: locked.test.permutations,
          };
          trialStack = {
            nEpochs: locked.epochs.nEpochs,
            length: locked.epochs.length,
            data: Float32Array.from(locked.epochs.epochs),
            times: locked.epochs.times,
            responseTimes: responseTimes ? Float64Array.from(locked.epochs.kept, (k) => responseTimes[k]) : null,
          };
        }
      }
      // Every event type (and lock-column value): the share is a ratio, so the activation scale does not matter.
      const timeLocking: TimeLockingTest[] = [];
      for (const target of targets) {
        if (erp && target.column === undefined && target.event === epochName) {
          // The epoched type was tested above (same events, window, seed and grid): not run twice.
          const { nEpochs, lockedShare, timeLockingStrength, permutationP, shuffles } = erp;
          timeLocking.push({ event: target.event, nEpochs, lockedShare, strength: timeLockingStrength, p: permutationP ?? NaN, shuffles: shuffles ?? 0 });
          continue;
        }
        const test = lockingAt(act, fs, target, win, nPermutations, 1 + i);
        if (test) timeLocking.push(test);
      }
      const step = stepEvents.length ? stepLocking(act, fs, stepEvents) : null;
      tNow = tick('epochs', tNow);

      const dipole = dipoleFit ? dipoleFit(column) : null;
      tNow = tick('dipoles', tNow);

      components.push({
        index: i + 1,
        varianceShare: totalVariance > 0 ? explained / totalVariance : NaN,
        variancePerChannel: perChannel,
        strongestChannel: { index: strongest, label: dec.channels[strongest], weight },
        map,
        spectrum: { frequencies, power, powerDb, nfft, df: fs / nfft },
        oneOverF: { exponent: oneOverF.exponent, offset: oneOverF.offset, rangeHz: [2, 40], fitR2: alpha.fitR2 },
        alphaPeakHz: alpha.frequencyHz,
        alphaProminence: alpha.prominence,
        highFrequencyShare: shares.highFrequencyShare,
        highFrequencySlope: shares.highFrequencySlope,
        mainsShare: shares.mainsShare,
        linePeakRatio: shares.linePeakRatio,
        lowFrequencyShare: shares.lowFrequencyShare,
        kurtosis: moments.kurtosis,
        focality: { share: focal.share, channel: dec.channels[focal.channelIndex] ?? '' },
        frontalGradient: geometry.frontalGradient,
        frontalShare: geometry.frontalShare,
        lateralAntisymmetry: geometry.lateralAntisymmetry,
        stepLikeness: steps,
        eogCorrelation: { vertical: rV, horizontal: rH, source: eog.source, channels: eog.channels },
        cardiac: { bpm: cardiac.bpm, peak: cardiac.peak, beatSharpness: beats.sharpness, intervalCv: beats.intervalCv },
        stepLocking: step,
        erp,
        timeLocking,
        trialStack,
        dipole,
      });
      tNow = tick('other', tNow);
      input.onProgress?.((i + 1 - cStart) / total, 'components');
    }
  }
  timings.total = performance.now() - t0;
  return { components, timings, epochEvent: epochName, warnings };
}
