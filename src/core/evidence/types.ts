/**
 * Everything Winnow measures about one independent component, with units. Produced by
 * `computeEvidence` (compute-evidence.ts), read by the suggestion rules (review/suggest.ts), the impact
 * estimate (review/impact.ts), the workbench tiles and `winnow evidence`.
 *
 * Measures only (issue 10 item 1): no verdicts. The suggestion for an aim and a threshold table is computed
 * from this evidence by `suggestWithRules` (review/suggest.ts), so changing either never recomputes evidence.
 *
 * Conventions: "activation" = row i of S = W (X − mean), arbitrary units. Spectra, averages and epoch
 * images are given for the component back-projected to its strongest channel (the channel with the
 * largest |A[c, i]|), i.e. activation × A[c, i], in µV; `strongestChannel.weight` is that factor, so
 * activation-unit values are recovered by dividing by it (power: by its square).
 */
export type { Aim, ReasonCode, Suggestion, Verdict } from '../review/vocabulary.ts';
import type { Hz, Lenient } from '../units.ts';

export interface SpectrumEvidence {
  /** Bin frequencies in Hz from 1 Hz to min(Nyquist, 100 Hz) (Welch bins, spacing fs / nfft). */
  readonly frequencies: Float64Array;
  /** One-sided power spectral density, µV²/Hz, at the strongest channel. */
  readonly power: Float64Array;
  /** 10 log10(power), dB re 1 µV²/Hz. */
  readonly powerDb: Float64Array;
  /** Welch segment length (samples, power of two) and the bin spacing in Hz. */
  readonly nfft: number;
  readonly df: Lenient<Hz>;
}

export interface OneOverFFit {
  /** χ in P ∝ f^−χ (dimensionless; positive for falling spectra). NaN when the fit is impossible. */
  readonly exponent: number;
  /** b = log10 P at 1 Hz of the fitted line, log10(µV²/Hz). */
  readonly offset: number;
  /** Fit range. */
  readonly rangeHz: readonly [Lenient<Hz>, Lenient<Hz>];
  /**
   * Quality of the fit: R² of log10 P about the line over the fit range outside 7–14 Hz (spectrum-shape.ts
   * oneOverFFitR2); 1 = perfect, ≤ 0 = the line explains nothing. NaN when it cannot be computed (always set
   * by computeEvidence; optional for hand-built evidence).
   */
  readonly fitR2?: number;
}

export interface EogCorrelation {
  /** Pearson r of the activation with the vertical EOG (or its frontal proxy); sign removed (|r|). */
  readonly vertical: number | null;
  /** Pearson |r| with the horizontal EOG (or the lateral frontal bipolar proxy). */
  readonly horizontal: number | null;
  /** Where the reference signals came from; 'none' when neither could be built. */
  readonly source: 'EOG channels' | 'frontal bipolar' | 'none';
  /** Channels used, e.g. "Fp1+Fp2 vs average" or "F8 − F7". */
  readonly channels: { readonly vertical: string | null; readonly horizontal: string | null };
}

export interface CardiacEvidence {
  /** Beat rate in beats per minute at the autocorrelation peak in 40–150 bpm, or null if no peak. */
  readonly bpm: number | null;
  /** Normalised autocorrelation (−1…1) of the activation's slope energy at that lag; 0 when no peak. */
  readonly peak: number;
  /**
   * log10 of the median slope energy at the beats over the median slope energy of the whole activation
   * (evidence/cardiac.ts cardiacBeats, docs/methods.md §14): a QRS-like beat stands far above the rest. NaN
   * without a beat rate or with fewer than 10 beats; absent in evidence built before it was measured.
   */
  readonly beatSharpness?: number;
  /** Coefficient of variation of the inter-beat intervals (0.5–1.5 beat periods); NaN as beatSharpness. */
  readonly intervalCv?: number;
}

export interface ErpEvidence {
  /** Event type that was epoched and the number of epochs kept. */
  readonly event: string;
  readonly nEpochs: number;
  /** Time of each sample relative to the event, s. */
  readonly times: Float64Array;
  /** Baseline-corrected average, µV at the strongest channel. */
  readonly mean: Float64Array;
  /** 95 % confidence band (mean ± 1.96 SEM), µV. */
  readonly band: { readonly lower: Float64Array; readonly upper: Float64Array };
  /** Inter-trial phase coherence (0…1) at `itcFrequencyHz`, the dominant frequency of the average. */
  readonly itc: number;
  readonly itcFrequencyHz: Lenient<Hz>;
  /**
   * Share (0…1) of the single-trial variance that is phase-locked to the events, minus the same share for
   * shuffled event times (its permutation mean); ≤ 0 means no more locking than chance.
   */
  readonly timeLockingStrength: number;
  /** Phase-locked share before subtracting chance (0…1). */
  readonly lockedShare: number;
  /**
   * Sequential permutation p-value of the locked share against shuffled event times, as computed
   * (time-locking.ts: h / L when stopped early after h exceedances in L shuffles, else (1 + #≥) / (1 + n)).
   */
  readonly permutationP?: number;
  /** Shuffles actually run for `permutationP` (at most the requested number; fewer when stopped early). */
  readonly shuffles?: number;
}

/**
 * The time-locking test for one event type (trial_type), or one value of a chosen events.tsv column within
 * that type (docs/methods.md §5). Every non-step type is tested, not only the epoched one.
 */
export interface TimeLockingTest {
  /** The event type (trial_type value). */
  readonly event: string;
  /** The events.tsv column the events were narrowed by, and its value; absent for the whole type. */
  readonly column?: string;
  readonly value?: string;
  /** Epochs that fitted inside the recording. */
  readonly nEpochs: number;
  /** Phase-locked share of single-trial variance (0…1). */
  readonly lockedShare: number;
  /** lockedShare minus its mean over shuffled event times (≤ 0: no more locking than chance). */
  readonly strength: number;
  /** Sequential permutation p-value, as computed (time-locking.ts); NaN when the test could not run. */
  readonly p: number;
  /** Shuffles actually run. */
  readonly shuffles: number;
}

export interface TrialStack {
  readonly nEpochs: number;
  readonly length: number;
  /** nEpochs × length, row-major, event order, µV at the strongest channel (baseline removed). */
  readonly data: Float32Array;
  readonly times: Float64Array;
  /** Response time (s) per epoch when the events carry one, else null — for sorting. */
  readonly responseTimes: Float64Array | null;
}

export interface DipoleEvidence {
  /** Position in head coordinates (RAS), mm. */
  readonly position: readonly [number, number, number];
  /** Moment (RAS), in the map's units per A·m model (relative scale; direction meaningful). */
  readonly moment: readonly [number, number, number];
  /** Residual variance of the single-dipole fit, 0…1 (docs/methods.md §15). */
  readonly residualVariance: number;
  /** True when the fit stopped at the brain's boundary (an artifact sign). */
  readonly atBoundary: boolean;
  /** Approximate region name (a model estimate, not an anatomical label). */
  readonly region: string;
}

export interface ComponentEvidence {
  /** 1-based component number. */
  readonly index: number;
  /** Share (0…1) of the data's total variance carried by the back-projected component, Σ_c A[c,i]² var(s_i) / Σ_c var(x_c). */
  readonly varianceShare: number;
  /** Per channel (length nChannels): A[c,i]² var(s_i) / var(x_c), 0…1 for a well-decomposed channel. */
  readonly variancePerChannel: Float64Array;
  readonly strongestChannel: { readonly index: number; readonly label: string; readonly weight: number };
  /** Scalp map (column i of the mixing matrix, unit L2 norm, sign as stored). */
  readonly map: Float64Array;
  readonly spectrum: SpectrumEvidence;
  readonly oneOverF: OneOverFFit;
  /** Alpha peak frequency in Hz (7–14 Hz, above the 1/f fit), or null if there is none. */
  readonly alphaPeakHz: Lenient<Hz> | null;
  /** Height of the alpha peak above the 1/f fit, log10 units (0.1 = ×1.26); 0 when none. */
  readonly alphaProminence: number;
  /** BP(20, line−2) / BP(2, line−2) Hz (0…1). */
  readonly highFrequencyShare: number;
  /** Log-log slope of the spectrum over 20–(line−2) Hz (≈ 0 or positive for muscle; negative for brain). */
  readonly highFrequencySlope: number;
  /** Σ_h BP(h·f0 ± 1 Hz) / BP(1, fmax) over harmonics below fmax (0…1). */
  readonly mainsShare: number;
  /** P(f0) over the median of P in f0 ± 5 Hz without ±1 Hz (dimensionless; ≫ 1 for line noise). */
  readonly linePeakRatio: number;
  /** BP(1, 4) / BP(1, 45) Hz (0…1). */
  readonly lowFrequencyShare: number;
  /** Excess kurtosis of the activation, E[(s−μ)⁴]/σ⁴ − 3 (0 for Gaussian). */
  readonly kurtosis: number;
  /** Share (0…1) of the map's energy on its largest electrode, and that electrode. */
  readonly focality: { readonly share: number; readonly channel: string };
  /** Mean |a| over frontal-pole sites ÷ mean |a| elsewhere (docs/methods.md §14); NaN without positions. */
  readonly frontalGradient: number;
  /** Share (0…1) of the map's energy on frontal-pole sites (front 20 % of the head); NaN without positions. */
  readonly frontalShare: number;
  /** −2 Σ a_L a_R / Σ (a_L² + a_R²) over mirror pairs: +1 antisymmetric, −1 symmetric; NaN without pairs. */
  readonly lateralAntisymmetry: number;
  /** 0…1: how much of the activation's large slow jumps persist as level shifts (1 = steps, 0 = returns). */
  readonly stepLikeness: number;
  readonly eogCorrelation: EogCorrelation;
  readonly cardiac: CardiacEvidence;
  /** Phase-locked share of activity around step events (mobile recordings), or null when no step events. */
  readonly stepLocking: { readonly share: number; readonly event: string; readonly nEpochs: number } | null;
  /** The epoched event (EvidenceInput.epochEvent, default the most frequent non-step type): average, ITC, locking. */
  readonly erp: ErpEvidence | null;
  /**
   * Time-locking tested for every non-step event type (and, with EvidenceInput.lockColumn, for each value of
   * that column within each type), in eventTypes order (most frequent first); empty without events. Always
   * set by computeEvidence; optional for hand-built evidence.
   */
  readonly timeLocking?: readonly TimeLockingTest[];
  readonly trialStack: TrialStack | null;
  readonly dipole: DipoleEvidence | null;
}
