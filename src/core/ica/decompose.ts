/**
 * Decomposes a recording into independent components: the whole pipeline of issue 5 on the decomposition's
 * own copy of the data (the review keeps showing the original samples).
 *   1. keep good EEG channels (channels.tsv status 'bad' and non-EEG types such as EOG/EMG/ECG/MISC are left out;
 *      they stay available to the evidence as recorded);
 *   2. zero-phase FIR high-pass (default 1 Hz) and optional low-pass, each segment separately (fir.ts);
 *   3. float64 covariance, rank by relative tolerance and sharp gap, PCA whitening to the rank (whitening.ts);
 *   4. extended Infomax (infomax.ts) or Picard-O with the extended density (picard.ts, with its subsampled warm
 *      start and optionally a helper thread) on the whitened data;
 *   5. total unmixing W = W_ica W_white (components × channels), mixing A = E_k diag(λ)^(1/2) W_ica⁻¹
 *      (= pinv(W) at full rank; docs/methods.md §6), ordered by variance accounted for and sign-normalised (order.ts).
 * `channelMeans` are the means of the unfiltered channels, so activations of the original data are W (X − means).
 */
import type { Decomposition } from '../decomposition.ts';
import { pseudoInverse } from '../linalg/eigen.ts';
import { matrixMultiply, matrixTranspose } from '../linalg/dense.ts';
import { applyWhitening, covariance, pcaWhitening } from '../linalg/whitening.ts';
import { applyZeroPhase, cascadeFir, designHighpassFir, designLowpassFir, type FirDesign } from '../signal/fir.ts';
import { extendedInfomax } from './infomax.ts';
import { picardWarmStarted } from './picard.ts';
import type { IcaThreads } from './pass-threads.ts';
import { orderComponents } from './order.ts';
import { activeKernels } from '../kernels/kernels.ts';
import { createIcaProgressModel } from './progress-model.ts';
import { cancellationError, type IcaMonitor, type IcaResult } from './ica-types.ts';

export interface DecomposeInput {
  /** Channel-major samples, µV: channel c at data[c·nSamples, (c+1)·nSamples). Not modified unless DecomposeOptions.consumeInput. */
  readonly data: Float32Array;
  readonly nChannels: number;
  readonly nSamples: number;
  readonly sampleRate: number;
  readonly labels: readonly string[];
  /** BIDS channel types; channels whose type is not EEG are left out. Omitted: all are EEG. */
  readonly types?: readonly string[];
  readonly status?: readonly ('good' | 'bad')[];
  /** Sample indices where segments start (EDF+D discontinuities, boundary events); filters never bridge them. */
  readonly boundaries?: readonly number[];
}

export interface DecomposeProgress {
  /** Iterations done (passes for Infomax, L-BFGS steps for Picard); 0 before the ICA starts. */
  readonly iteration: number;
  /** The solver's convergence measure (see each solver); NaN before the first iteration. */
  readonly convergence: number;
  /** Estimated seconds left, or null when no estimate is possible yet. */
  readonly etaSeconds: number | null;
  /** 'filter' | 'whiten' | 'ica' | 'order' | 'done'. */
  readonly stage: string;
  /**
   * Fraction of the whole run done, in [0, 1], never decreasing: stages take fixed shares (filter and whitening
   * 10 %, ICA 87 %, ordering 3 %); inside the ICA the convergence model of progress-model.ts.
   */
  readonly fraction: number;
}

const WHITEN_START = 0.05;
const ICA_START = 0.1;
const ICA_END = 0.97;

export interface DecomposeOptions {
  readonly method: 'infomax' | 'picard';
  /** Seed of all randomness (default 1). */
  readonly seed?: number;
  /** High-pass cutoff in Hz (−6 dB); default 1; null = none. */
  readonly highpassHz?: number | null;
  /** Low-pass cutoff in Hz (−6 dB); default none. */
  readonly lowpassHz?: number | null;
  /** Maximum iterations (default 512 for Infomax passes, 500 for Picard). */
  readonly maxIter?: number;
  /** Fewer components than the rank (a warning states what that discards). */
  readonly nComponents?: number;
  readonly onProgress?: (p: DecomposeProgress) => void;
  /** Checked between tiles of work; when it becomes true the run throws an Error named 'AbortError'. */
  readonly signal?: { readonly aborted: boolean };
  /** Minimum milliseconds between progress reports (default 250; stage changes are always reported). */
  readonly progressIntervalMs?: number;
  /**
   * Picard's warm start: first stage on every n-th sample (picard.ts picardWarmStarted). Default 1 (none): on a
   * simulated 32-channel, 10-minute recording the stride-4 warm start took 130 iterations where a plain run takes
   * 59, as the full data's optimum differs from the subsample's by its sampling error (docs/methods.md §7.7).
   */
  readonly warmStartStride?: number;
  /** A helper thread for Picard's data passes (pass-threads.ts); omitted: one thread. */
  readonly threads?: IcaThreads;
  /**
   * The caller gives up `input.data`: the run filters and whitens it in place as its working copy instead of
   * copying it (the CLI, which reads the samples for this run only), so a run holds one float32 copy of the
   * data in all. With `threads` the data must lie in a SharedArrayBuffer, else it is copied as usual.
   * Results are the same either way. Default false (input.data is not modified).
   */
  readonly consumeInput?: boolean;
}

export interface DecomposeResult {
  readonly decomposition: Decomposition;
  readonly rankReason: string;
  readonly warnings: string[];
  /** Per component: variance accounted for / total channel variance (preprocessed data). */
  readonly varianceShare: Float64Array;
  /** Per component: +1 super-Gaussian, −1 sub-Gaussian density at the end of the run. */
  readonly densitySigns: Int8Array;
  /** Left-out channels with the reason. */
  readonly excluded: readonly { readonly label: string; readonly reason: string }[];
  /** Descending eigenvalues of the channel covariance (µV²), for the rank display. */
  readonly eigenvalues: Float64Array;
  /** Solver iterations (Picard: both warm-start stages; Infomax: passes); also in decomposition.iterations. */
  readonly iterations: number;
  /**
   * Picard: max |antisymmetric relative gradient| at the end (its stopping measure, docs/methods.md §7.7);
   * null for Infomax, which stops on a weight change instead.
   */
  readonly finalGradientNorm: number | null;
  /** Which kernels ran the per-sample loops ('wasm-simd' or 'js', src/core/kernels). */
  readonly kernels: string;
}

/** Detects an average reference: the all-ones vector is in the null space of C (relative residual < 1e-6). */
function looksAverageReferenced(C: Float64Array, n: number): boolean {
  if (n < 2) return false;
  let cn = 0;
  let res = 0;
  for (let i = 0; i < n; i++) {
    let r = 0;
    for (let j = 0; j < n; j++) {
      r += C[i * n + j];
      cn += C[i * n + j] ** 2;
    }
    res += r * r;
  }
  return cn > 0 && Math.sqrt(res / n) < 1e-6 * Math.sqrt(cn);
}

/** Runs the decomposition. Throws RangeError for unusable input (no EEG channels, bad cutoffs, non-finite data). */
export function decomposeRecording(input: DecomposeInput, opts: DecomposeOptions): DecomposeResult {
  const { data, nChannels, nSamples, sampleRate, labels } = input;
  const warnings: string[] = [];
  const interval = opts.progressIntervalMs ?? 250;
  let lastReport = -Infinity;
  let stage = 'filter';
  let iteration = 0;
  let convergence = NaN;
  let etaSeconds: number | null = null;
  let fraction = 0;
  const report = (force: boolean) => {
    if (!opts.onProgress) return;
    const now = performance.now();
    if (!force && now - lastReport < interval) return;
    lastReport = now;
    opts.onProgress({ iteration, convergence, etaSeconds, stage, fraction });
  };
  const checkAbort = () => {
    if (opts.signal?.aborted) throw cancellationError();
  };

  // 1. channel selection
  const used: number[] = [];
  const excluded: { label: string; reason: string }[] = [];
  for (let c = 0; c < nChannels; c++) {
    const type = input.types?.[c]?.toUpperCase();
    if (input.status?.[c] === 'bad') excluded.push({ label: labels[c], reason: 'marked bad' });
    else if (type !== undefined && type !== 'EEG') excluded.push({ label: labels[c], reason: `type ${type}` });
    else used.push(c);
  }
  const n = used.length;
  if (n === 0) throw new RangeError('no good EEG channels left to decompose');
  // The decomposition's one working copy (shared with the helper thread when there is one): filtered in place,
  // then whitened in place (Z takes its first k rows), so the run holds the input plus one float32 copy; with
  // consumeInput the input itself is the working copy (its used channels moved to the front, in order).
  const inPlace = opts.consumeInput === true && (!opts.threads || data.buffer instanceof SharedArrayBuffer);
  let X: Float32Array | null = inPlace
    ? data.subarray(0, n * nSamples)
    : opts.threads
      ? opts.threads.allocate(n * nSamples)
      : new Float32Array(n * nSamples);
  const channelMeans = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const src = data.subarray(used[i] * nSamples, (used[i] + 1) * nSamples);
    let s = 0;
    for (let t = 0; t < nSamples; t++) s += src[t];
    channelMeans[i] = nSamples > 0 ? s / nSamples : 0;
    // In place, used[i] ≥ i and ascending: channel used[i] moves to row i before any later source is touched.
    if (!inPlace) X.set(src, i * nSamples);
    else if (used[i] !== i) data.copyWithin(i * nSamples, used[i] * nSamples, (used[i] + 1) * nSamples);
  }

  // 2. filters
  const hp = opts.highpassHz === undefined ? 1 : opts.highpassHz;
  const lp = opts.lowpassHz ?? null;
  let design: FirDesign | null = null;
  if (hp !== null) design = designHighpassFir(hp, sampleRate);
  if (lp !== null) {
    const l = designLowpassFir(lp, sampleRate);
    design = design ? cascadeFir(design, l) : l;
  }
  report(true);
  if (design) {
    if (design.numTaps > nSamples) warnings.push(`the filter (${design.numTaps} taps) is longer than the recording (${nSamples} samples); edges dominate`);
    applyZeroPhase(X, n, nSamples, design, input.boundaries, () => {
      checkAbort();
      report(false);
    });
  }
  checkAbort();

  // 3. covariance, rank, whitening
  stage = 'whiten';
  fraction = Math.max(fraction, WHITEN_START);
  report(true);
  const pollWork = () => {
    checkAbort();
    report(false);
  };
  const cv = covariance(X, n, nSamples, undefined, pollWork);
  for (let i = 0; i < n * n; i++)
    if (!Number.isFinite(cv.covariance[i])) throw new RangeError('the data contain non-finite samples (NaN or infinity)');
  const pw = pcaWhitening(cv.covariance, n, { nComponents: opts.nComponents });
  warnings.push(...pw.warnings);
  const k = pw.k;
  if (k === 0) throw new RangeError(`the channel data have rank 0 (${pw.rankReason})`);
  if (nSamples < 20 * k * k)
    warnings.push(`${nSamples} samples for ${k} components is fewer than the common rule of thumb of 20·k² = ${20 * k * k}; components may be unreliable`);
  // In place: each chunk of samples is read for all channels before its whitened rows are written (whitening.ts).
  const Z = applyWhitening(pw.whitening, k, n, cv.means, X, nSamples, X.subarray(0, k * nSamples), pollWork);
  X = null;
  checkAbort();

  // 4. ICA
  stage = 'ica';
  fraction = Math.max(fraction, ICA_START);
  report(true);
  const t0 = performance.now();
  const maxIter = opts.maxIter ?? (opts.method === 'picard' ? 500 : 512);
  const progressModel = createIcaProgressModel(maxIter);
  const monitor: IcaMonitor = {
    iteration(it, conv, tol) {
      iteration = it;
      convergence = conv;
      progressModel.update(it, conv, tol, (performance.now() - t0) / 1000);
      fraction = Math.max(fraction, ICA_START + (ICA_END - ICA_START) * progressModel.fraction);
      etaSeconds = progressModel.etaSeconds;
      checkAbort();
      report(false);
    },
    poll() {
      report(false);
      return opts.signal?.aborted === true;
    },
  };
  const seed = opts.seed ?? 1;
  let ica: IcaResult;
  if (opts.method === 'picard') ica = picardWarmStarted(Z, k, nSamples, { maxIter, seed, monitor, threads: opts.threads, stride: opts.warmStartStride ?? 1 });
  else ica = extendedInfomax(Z, k, nSamples, { maxIter, seed, monitor });
  warnings.push(...ica.warnings);

  // 5. total unmixing, mixing, order, polarity
  stage = 'order';
  fraction = Math.max(fraction, ICA_END);
  report(true);
  const Wtot = matrixMultiply(ica.W, pw.whitening, k, k, n);
  const Winv = opts.method === 'picard' ? matrixTranspose(ica.W, k, k) : pseudoInverse(ica.W, k, k);
  const A = matrixMultiply(pw.dewhitening, Winv, n, k, k);
  const ordered = orderComponents(A, Wtot, n, k, cv.covariance);
  const densitySigns = new Int8Array(k);
  for (let j = 0; j < k; j++) densitySigns[j] = ica.signs[ordered.order[j]];

  const reference = looksAverageReferenced(cv.covariance, n) ? 'average (detected: channels sum to zero)' : 'as recorded';
  const decomposition: Decomposition = {
    channels: used.map((c) => labels[c]),
    nChannels: n,
    nComponents: k,
    mixing: ordered.mixing,
    unmixing: ordered.unmixing,
    channelMeans,
    method: opts.method,
    rank: pw.rank,
    iterations: ica.iterations,
    converged: ica.converged,
    preprocessing: {
      filter: design ? design.description : 'none',
      highpassHz: hp,
      lowpassHz: lp,
      reference,
      excludedChannels: excluded.map((e) => e.label),
    },
    recordingSha256: '',
    seed,
  };
  stage = 'done';
  etaSeconds = 0;
  fraction = 1;
  report(true);
  return {
    decomposition,
    rankReason: pw.rankReason,
    warnings,
    varianceShare: ordered.varianceShare,
    densitySigns,
    excluded,
    eigenvalues: pw.values,
    iterations: ica.iterations,
    finalGradientNorm: opts.method === 'picard' ? ica.convergence : null,
    kernels: activeKernels().name,
  };
}
