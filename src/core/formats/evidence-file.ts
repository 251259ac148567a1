/**
 * The evidence file, our own JSON format "winnow-evidence/1" (written by `winnow evidence`, read by
 * `winnow batch` and tests). Pure: text in, text out. The evidence itself holds measures only; the
 * suggestions in the file are computed here, at writing time, by `suggestWithRules` for every aim with the
 * threshold table the file records, so each carries the rules that fired.
 *
 * Contents:
 *   format, recording, decomposition   "winnow-evidence/1" and the input file names as given
 *   recordingSha256, decompositionSha256   SHA-256 (hex) of the two input files' bytes, when the writer knew them
 *                                      (the browser reuses a batch run's evidence only when both match)
 *   aim                                the aim whose suggestion is in each component's `suggestion`
 *   lineHz, lineHzSource               mains frequency used and where it came from ("option", "sidecar", "assumed")
 *   epochEvent, epochWindowS           the event type epoched (null when none) and the epoch window, s
 *   thresholds                         the threshold table the suggestions used (review/thresholds.ts)
 *   permutations                       the time-locking test: { maxShuffles, stopAfter, components: [{ index,
 *                                      shuffles (run for the epoched event, null without one), fitR2 }] }
 *   warnings                           strings
 *   components: one object per component, in decomposition order —
 *     index                 1-based component number
 *     varianceShare         share (0–1) of the data's variance carried by the back-projected component
 *     spectrum              { frequencies (Hz), power (µV²/Hz at the strongest channel), powerDb, channel }
 *     oneOverFExponent      χ of P ∝ f^−χ, 2–40 Hz robust log–log fit; oneOverFOffset: log10 P at 1 Hz;
 *                           oneOverFFitR2: R² of the fit outside 7–14 Hz
 *     alphaPeakHz           largest 7–14 Hz local maximum above the 1/f fit, or null; alphaProminence (log10)
 *     highFrequencyShare    BP(20, line−2) / BP(2, line−2); highFrequencySlope: log–log slope above 20 Hz
 *     mainsShare            Σ BP(h·line ± 1 Hz) / BP(1, fmax); linePeakRatio: P(line) / median neighbours
 *     lowFrequencyShare     BP(1, 4) / BP(1, 45)
 *     kurtosis              excess kurtosis of the activation
 *     focality              { share of map energy on one electrode, channel }
 *     frontalGradient, frontalShare, lateralAntisymmetry, stepLikeness   map and time-course ocular evidence
 *     eogCorrelation        { vertical, horizontal (|r|, or null), source, channels }
 *     cardiac               { bpm or null, peak (autocorrelation), beatSharpness (log10), intervalCv }
 *     stepLocking           { share, event, nEpochs } or null
 *     erp                   { event, nEpochs, times (s), mean, lower, upper (µV, 95 % band), itc,
 *                             itcFrequencyHz, lockedShare, timeLockingStrength, permutationP, shuffles } or null
 *     timeLocking           [{ event, column?, value?, nEpochs, lockedShare, strength, p, shuffles }] per event type
 *     dipole                { position (mm, RAS), moment, residualVariance (0–1), atBoundary, region } or null
 *     strongestChannel      { index (0-based, decomposition order), label, weight }
 *     variancePerChannel    per channel (decomposition order), A[c,i]² var(s_i) / var(x_c)
 *     map                   scalp map (unit L2 norm), decomposition channel order
 *     suggestion            { verdict, reason, because, rules } for `aim`
 *     suggestions           { erp, oscillations, conservative }, each { verdict, reason, because, rules };
 *                           rules: [{ measure, value, threshold, direction, source }] (review/suggest.ts FiredRule)
 *   Trial stacks (trials × time) are not written; the workbench computes them.
 *   NaN and infinite numbers are written as null.
 */
import type { ComponentEvidence } from '../evidence/types.ts';
import { LOCKING_MAX_SHUFFLES, LOCKING_STOP_AFTER } from '../evidence/time-locking.ts';
import { suggestWithRules, type FiredRule } from '../review/suggest.ts';
import type { Thresholds } from '../review/thresholds.ts';
import { AIMS, REASON_CODES, VERDICTS, type Aim, type ReasonCode, type Verdict } from '../review/vocabulary.ts';
import { parseFail, parseOk, type ParseResult } from './parse-result.ts';

export const EVIDENCE_FORMAT = 'winnow-evidence/1';

/** The file's settings, as the writer was given them. */
export interface EvidenceFileHeader {
  readonly recording: string;
  readonly decomposition: string;
  /** SHA-256 (hex) of the recording's and the decomposition file's bytes; written when given. */
  readonly recordingSha256?: string | null;
  readonly decompositionSha256?: string | null;
  readonly aim: Aim;
  readonly lineHz: number;
  readonly lineHzSource: string;
  readonly epochEvent: string | null;
  readonly epochWindowS: readonly [number, number];
  readonly thresholds: Thresholds;
  readonly warnings: readonly string[];
  /** Most shuffles per test (default LOCKING_MAX_SHUFFLES). */
  readonly maxShuffles?: number;
}

/** A suggestion as written: verdict, reason, sentences and the rules that fired. */
export interface EvidenceFileSuggestion {
  readonly verdict: Verdict;
  readonly reason: ReasonCode;
  readonly because: readonly string[];
  readonly rules: readonly FiredRule[];
}

/** One component as read back: the file's JSON object, with the fields a reader relies on checked. */
export interface EvidenceFileComponent {
  readonly index: number;
  readonly varianceShare: number | null;
  readonly suggestion: EvidenceFileSuggestion;
  readonly suggestions: Readonly<Record<Aim, EvidenceFileSuggestion>>;
  /** Every other field as written (see the top of this file). */
  readonly [field: string]: unknown;
}

export interface EvidenceFile extends Omit<EvidenceFileHeader, 'maxShuffles' | 'recordingSha256' | 'decompositionSha256'> {
  readonly format: typeof EVIDENCE_FORMAT;
  /** null in files written without them. */
  readonly recordingSha256: string | null;
  readonly decompositionSha256: string | null;
  readonly permutations: {
    readonly maxShuffles: number;
    readonly stopAfter: number;
    readonly components: readonly { readonly index: number; readonly shuffles: number | null; readonly fitR2: number | null }[];
  };
  readonly components: readonly EvidenceFileComponent[];
}

const finite = (v: number) => (Number.isFinite(v) ? v : null);
const list = (a: ArrayLike<number>) => Array.from(a, finite);

function suggestionJson(e: ComponentEvidence, aim: Aim, t: Thresholds): Record<string, unknown> {
  const { suggestion, rules } = suggestWithRules(e, aim, t);
  return {
    verdict: suggestion.verdict,
    reason: suggestion.reason,
    because: [...suggestion.because],
    rules: rules.map((r) => ({ measure: r.measure, value: finite(r.value), threshold: finite(r.threshold), direction: r.direction, source: r.source })),
  };
}

/** The JSON object of one component (names documented at the top of this file). */
export function componentJson(e: ComponentEvidence, aim: Aim, thresholds: Thresholds): Record<string, unknown> {
  const suggestions = Object.fromEntries(AIMS.map((a) => [a, suggestionJson(e, a, thresholds)]));
  return {
    index: e.index,
    varianceShare: finite(e.varianceShare),
    spectrum: { frequencies: list(e.spectrum.frequencies), power: list(e.spectrum.power), powerDb: list(e.spectrum.powerDb), channel: e.strongestChannel.label },
    oneOverFExponent: finite(e.oneOverF.exponent),
    oneOverFOffset: finite(e.oneOverF.offset),
    oneOverFFitR2: finite(e.oneOverF.fitR2 ?? NaN),
    alphaPeakHz: e.alphaPeakHz,
    alphaProminence: finite(e.alphaProminence),
    highFrequencyShare: finite(e.highFrequencyShare),
    highFrequencySlope: finite(e.highFrequencySlope),
    mainsShare: finite(e.mainsShare),
    linePeakRatio: finite(e.linePeakRatio),
    lowFrequencyShare: finite(e.lowFrequencyShare),
    kurtosis: finite(e.kurtosis),
    focality: { share: finite(e.focality.share), channel: e.focality.channel },
    frontalGradient: finite(e.frontalGradient),
    frontalShare: finite(e.frontalShare),
    lateralAntisymmetry: finite(e.lateralAntisymmetry),
    stepLikeness: finite(e.stepLikeness),
    eogCorrelation: {
      vertical: e.eogCorrelation.vertical === null ? null : finite(e.eogCorrelation.vertical),
      horizontal: e.eogCorrelation.horizontal === null ? null : finite(e.eogCorrelation.horizontal),
      source: e.eogCorrelation.source,
      channels: e.eogCorrelation.channels,
    },
    cardiac: { bpm: e.cardiac.bpm, peak: finite(e.cardiac.peak), beatSharpness: finite(e.cardiac.beatSharpness ?? NaN), intervalCv: finite(e.cardiac.intervalCv ?? NaN) },
    stepLocking: e.stepLocking ? { share: finite(e.stepLocking.share), event: e.stepLocking.event, nEpochs: e.stepLocking.nEpochs } : null,
    erp: e.erp
      ? {
          event: e.erp.event,
          nEpochs: e.erp.nEpochs,
          times: list(e.erp.times),
          mean: list(e.erp.mean),
          lower: list(e.erp.band.lower),
          upper: list(e.erp.band.upper),
          itc: finite(e.erp.itc),
          itcFrequencyHz: finite(e.erp.itcFrequencyHz),
          lockedShare: finite(e.erp.lockedShare),
          timeLockingStrength: finite(e.erp.timeLockingStrength),
          permutationP: e.erp.permutationP === undefined ? null : finite(e.erp.permutationP),
          shuffles: e.erp.shuffles ?? null,
        }
      : null,
    timeLocking: (e.timeLocking ?? []).map((t) => ({
      event: t.event,
      ...(t.column !== undefined ? { column: t.column, value: t.value } : {}),
      nEpochs: t.nEpochs,
      lockedShare: finite(t.lockedShare),
      strength: finite(t.strength),
      p: finite(t.p),
      shuffles: t.shuffles,
    })),
    dipole: e.dipole
      ? {
          position: e.dipole.position.map(finite),
          moment: e.dipole.moment.map(finite),
          residualVariance: finite(e.dipole.residualVariance),
          atBoundary: e.dipole.atBoundary,
          region: e.dipole.region,
        }
      : null,
    strongestChannel: { index: e.strongestChannel.index, label: e.strongestChannel.label, weight: finite(e.strongestChannel.weight) },
    variancePerChannel: list(e.variancePerChannel),
    map: list(e.map),
    suggestion: suggestions[aim],
    suggestions,
  };
}

/** The whole file as a JSON value. */
export function evidenceFileJson(header: EvidenceFileHeader, components: readonly ComponentEvidence[]): Record<string, unknown> {
  return {
    format: EVIDENCE_FORMAT,
    recording: header.recording,
    decomposition: header.decomposition,
    ...(header.recordingSha256 ? { recordingSha256: header.recordingSha256 } : {}),
    ...(header.decompositionSha256 ? { decompositionSha256: header.decompositionSha256 } : {}),
    aim: header.aim,
    lineHz: header.lineHz,
    lineHzSource: header.lineHzSource,
    epochEvent: header.epochEvent,
    epochWindowS: [...header.epochWindowS],
    thresholds: header.thresholds,
    permutations: {
      maxShuffles: header.maxShuffles ?? LOCKING_MAX_SHUFFLES,
      stopAfter: LOCKING_STOP_AFTER,
      components: components.map((c) => ({ index: c.index, shuffles: c.erp?.shuffles ?? null, fitR2: finite(c.oneOverF.fitR2 ?? NaN) })),
    },
    warnings: [...header.warnings],
    components: components.map((c) => componentJson(c, header.aim, header.thresholds)),
  };
}

/** The file's text: one line of JSON and a newline. */
export function formatEvidenceJson(header: EvidenceFileHeader, components: readonly ComponentEvidence[]): string {
  return `${JSON.stringify(evidenceFileJson(header, components))}\n`;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

function readSuggestion(v: unknown, where: string): EvidenceFileSuggestion | string {
  if (!isObject(v)) return `${where} is missing`;
  if (!VERDICTS.includes(v.verdict as Verdict)) return `${where}.verdict must be keep, remove or undecided, got ${JSON.stringify(v.verdict)}`;
  if (!REASON_CODES.includes(v.reason as ReasonCode)) return `${where}.reason ${JSON.stringify(v.reason)} is not a reason code`;
  if (!Array.isArray(v.because) || !v.because.every((b) => typeof b === 'string')) return `${where}.because must be a list of sentences`;
  const rules = v.rules === undefined ? [] : v.rules;
  if (!Array.isArray(rules)) return `${where}.rules must be a list`;
  return { verdict: v.verdict as Verdict, reason: v.reason as ReasonCode, because: v.because as string[], rules: rules as FiredRule[] };
}

/**
 * Reads an evidence file. Bad input gives an error naming the file and the fault; files written before the
 * rules and permutations records were added read with empty rules and a permutations record without counts.
 */
export function parseEvidenceJson(text: string, file: string): ParseResult<EvidenceFile> {
  const fail = (message: string) => parseFail<EvidenceFile>({ code: 'bad-value', message: `${file}: ${message}`, file });
  let o: unknown;
  try {
    o = JSON.parse(text);
  } catch (e) {
    return fail(`not JSON (${(e as Error).message})`);
  }
  if (!isObject(o)) return fail('not an evidence file (expected a JSON object)');
  if (o.format !== EVIDENCE_FORMAT) return fail(`format must be "${EVIDENCE_FORMAT}", got ${JSON.stringify(o.format)}`);
  if (!AIMS.includes(o.aim as Aim)) return fail(`aim must be erp, oscillations or conservative, got ${JSON.stringify(o.aim)}`);
  if (!Array.isArray(o.components)) return fail('components must be a list');
  const components: EvidenceFileComponent[] = [];
  for (let k = 0; k < o.components.length; k++) {
    const c: unknown = o.components[k];
    if (!isObject(c)) return fail(`component ${k + 1} is not an object`);
    if (!Number.isInteger(c.index) || (c.index as number) < 1) return fail(`component ${k + 1}: index must be a positive whole number`);
    if (c.varianceShare !== null && typeof c.varianceShare !== 'number') return fail(`component ${c.index}: varianceShare must be a number or null`);
    const suggestions = {} as Record<Aim, EvidenceFileSuggestion>;
    for (const aim of AIMS) {
      const s = readSuggestion(isObject(c.suggestions) ? c.suggestions[aim] : undefined, `component ${c.index}: suggestions.${aim}`);
      if (typeof s === 'string') return fail(s);
      suggestions[aim] = s;
    }
    components.push({ ...c, index: c.index as number, varianceShare: c.varianceShare as number | null, suggestion: suggestions[o.aim as Aim], suggestions });
  }
  const perm = isObject(o.permutations) ? o.permutations : {};
  const warnings: string[] = [];
  if (!isObject(o.permutations)) warnings.push(`${file}: no permutations record (written by an older version)`);
  const window = Array.isArray(o.epochWindowS) && o.epochWindowS.length === 2 ? (o.epochWindowS as [number, number]) : ([NaN, NaN] as [number, number]);
  return parseOk(
    {
      format: EVIDENCE_FORMAT,
      recording: String(o.recording ?? ''),
      decomposition: String(o.decomposition ?? ''),
      recordingSha256: typeof o.recordingSha256 === 'string' ? o.recordingSha256 : null,
      decompositionSha256: typeof o.decompositionSha256 === 'string' ? o.decompositionSha256 : null,
      aim: o.aim as Aim,
      lineHz: typeof o.lineHz === 'number' ? o.lineHz : NaN,
      lineHzSource: String(o.lineHzSource ?? ''),
      epochEvent: typeof o.epochEvent === 'string' ? o.epochEvent : null,
      epochWindowS: window,
      thresholds: (isObject(o.thresholds) ? o.thresholds : {}) as unknown as Thresholds,
      warnings: Array.isArray(o.warnings) ? o.warnings.map(String) : [],
      permutations: {
        maxShuffles: typeof perm.maxShuffles === 'number' ? perm.maxShuffles : NaN,
        stopAfter: typeof perm.stopAfter === 'number' ? perm.stopAfter : NaN,
        components: Array.isArray(perm.components) ? (perm.components as EvidenceFile['permutations']['components']) : [],
      },
      components,
    },
    warnings,
  );
}
