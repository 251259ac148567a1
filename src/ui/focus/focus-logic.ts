/**
 * Plain functions behind the focus view: navigation between components, which sensor channels to show
 * beside a component's time course, and the component's own activation over a window.
 */
import { windowActivations } from '../../core/review/preview-projection.ts';

/** The 1-based index `step` away from `current`, kept within 1…n; null when there are no components. */
export function neighbourIndex(current: number | null, n: number, step: number): number | null {
  if (n <= 0) return null;
  const from = current ?? 1;
  return Math.min(n, Math.max(1, from + step));
}

/**
 * Decomposition channels sorted by |A[c, i]| (largest first), the first `count` of them: the sensors where
 * component i (0-based) shows most. Channels missing from the recording (rows[c] < 0) are skipped.
 */
export function strongestChannels(mixing: Float64Array, n: number, k: number, i: number, count: number, rows?: ArrayLike<number>): number[] {
  const idx: number[] = [];
  for (let c = 0; c < n; c++) if (!rows || rows[c] >= 0) idx.push(c);
  idx.sort((a, b) => Math.abs(mixing[b * k + i]) - Math.abs(mixing[a * k + i]) || a - b);
  return idx.slice(0, Math.max(0, count));
}

/**
 * Activation of component i (0-based) over a channel-major window (n × L), back-projected to channel c:
 * A[c, i] · s_i(t), in µV — the same convention as the evidence (spectra, trial stack at the strongest
 * channel), so it shares the sensor traces' unit.
 */
export function backProjectedActivation(
  unmixing: Float64Array,
  mixing: Float64Array,
  n: number,
  k: number,
  i: number,
  c: number,
  window: Float32Array,
  length: number,
  channelMeans: Float64Array | null,
): Float64Array {
  const s = windowActivations({ unmixing: unmixing.subarray(i * n, (i + 1) * n), nComponents: 1, nChannels: n, window, length, channelMeans });
  const a = mixing[c * k + i];
  for (let t = 0; t < length; t++) s[t] *= a;
  return s;
}

/** Column i (0-based) of the n × k mixing matrix: the component's scalp map. */
export function mixingColumn(mixing: Float64Array, n: number, k: number, i: number): Float64Array {
  const out = new Float64Array(n);
  for (let c = 0; c < n; c++) out[c] = mixing[c * k + i];
  return out;
}

// ---------------------------------------------------------------------------------------------------------
// The reviewer's four questions: which evidence rows and fired rules answer each.

/** The questions the focus view is organised around, in reading order. */
export type QuestionId = 'where' | 'when' | 'locked' | 'frequencies';

export interface Question {
  readonly id: QuestionId;
  /** The question as the reviewer asks it. */
  readonly title: string;
  /** Short name for narrow places. */
  readonly short: string;
  /** evidence-rows.ts row keys that answer it. */
  readonly rowKeys: readonly string[];
  /** Prefixes of FiredRule.measure (suggest.ts) that belong to it. */
  readonly measures: readonly string[];
}

export const QUESTIONS: readonly Question[] = [
  {
    id: 'where', title: 'Where does it come from?', short: 'where',
    rowKeys: ['variance', 'strongest', 'frontal', 'frontalShare', 'antisym', 'focality', 'rv', 'depth', 'region'],
    measures: ['varianceShare', 'focality', 'frontalGradient', 'frontalShare', 'lateralAntisymmetry', 'dipole'],
  },
  {
    id: 'when', title: 'When does it happen?', short: 'when',
    rowKeys: ['kurtosis', 'steps', 'eogV', 'eogH', 'cardiac'],
    measures: ['kurtosis', 'stepLikeness', 'eogCorrelation', 'cardiac'],
  },
  {
    id: 'locked', title: 'Is it locked to the task?', short: 'locked',
    rowKeys: ['locking', 'itc', 'movement'],
    measures: ['erp', 'stepLocking', 'timeLocking'],
  },
  {
    id: 'frequencies', title: 'Which frequencies?', short: 'frequencies',
    rowKeys: ['exponent', 'fitR2', 'alpha', 'alphaProminence', 'hf', 'hfSlope', 'line', 'linePeak', 'lf'],
    measures: ['oneOverF', 'alphaProminence', 'highFrequencyShare', 'highFrequencySlope', 'lowFrequencyShare', 'mainsShare', 'linePeakRatio'],
  },
];

const measureMatches = (measure: string, prefix: string) => measure === prefix || measure.startsWith(`${prefix}.`);

/** The question a fired rule's measure belongs to, or null when none claims it. */
export function questionOfMeasure(measure: string): QuestionId | null {
  return QUESTIONS.find((q) => q.measures.some((p) => measureMatches(measure, p)))?.id ?? null;
}

/** The question an evidence row belongs to, or null when none claims it ("locking:…" rows: one per event type tested). */
export function questionOfRow(key: string): QuestionId | null {
  const base = key.split(':')[0];
  return QUESTIONS.find((q) => q.rowKeys.includes(base))?.id ?? null;
}

/** Items split by question (in QUESTIONS order), with the ones no question claims under `other`. */
export function byQuestion<T>(items: readonly T[], questionOf: (item: T) => QuestionId | null): { readonly [K in QuestionId | 'other']: T[] } {
  const out: { [K in QuestionId | 'other']: T[] } = { where: [], when: [], locked: [], frequencies: [], other: [] };
  for (const it of items) out[questionOf(it) ?? 'other'].push(it);
  return out;
}

/** The next question in `step` direction, wrapping around (arrow keys in the question list). */
export function stepQuestion(current: QuestionId, step: number): QuestionId {
  const i = QUESTIONS.findIndex((q) => q.id === current);
  const n = QUESTIONS.length;
  return QUESTIONS[(((i + step) % n) + n) % n].id;
}

/** A fired rule in words: "0.91 ≥ 0.6 (common practice)"; shares written as percentages. */
export function firedRuleText(rule: { value: number; threshold: number; direction: string; source: string }, percent: boolean): string {
  const f = (v: number) => (percent ? `${trimZero((v * 100).toFixed(0))}\u00a0%` : trimZero(v.toPrecision(3)));
  return `${f(rule.value)} ${rule.direction} ${f(rule.threshold)} (${rule.source})`;
}

/** Drops a trailing ".0…" and never writes a negative zero. */
export function trimZero(s: string): string {
  const t = s.includes('.') && !s.includes('e') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
  return /^-0(\.0*)?$/.test(t) ? t.slice(1) : t;
}

/** Measures that are shares (0…1) and read best as percentages. */
export const SHARE_MEASURES = /share|Share|focality|residualVariance|timeLockingStrength|lockedShare/;

// ---------------------------------------------------------------------------------------------------------
// Event-locked views computed on demand for any event selection (the evidence holds one epoched type).

/**
 * The back-projected activation of one component at channel c over the whole recording, µV: A[c,i] ·
 * Σ_d W[i,d] (x_d(t) − m_d), read straight from the channel-major samples (`rows[d]` = data row of
 * decomposition channel d, −1 when missing: that channel contributes nothing). The same convention as
 * backProjectedActivation and the evidence's trial stack.
 */
export function componentTrace(
  data: Float32Array,
  nSamples: number,
  rows: ArrayLike<number>,
  unmixingRow: ArrayLike<number>,
  channelMeans: ArrayLike<number> | null,
  weight: number,
): Float64Array {
  const out = new Float64Array(nSamples);
  let offset = 0;
  for (let d = 0; d < rows.length; d++) {
    const r = rows[d];
    const w = unmixingRow[d];
    if (r < 0 || w === 0) continue;
    offset += w * (channelMeans ? channelMeans[d] : 0);
    const base = r * nSamples;
    for (let t = 0; t < nSamples; t++) out[t] += w * data[base + t];
  }
  for (let t = 0; t < nSamples; t++) out[t] = (out[t] - offset) * weight;
  return out;
}

/** The fields of the evidence the short answers read. */
export interface AnswerInput {
  readonly strongestChannel: { readonly label: string };
  readonly varianceShare: number;
  readonly dipole: { readonly residualVariance: number; readonly region: string } | null;
  readonly kurtosis: number;
  readonly eogCorrelation: { readonly vertical: number | null; readonly horizontal: number | null };
  readonly cardiac: { readonly bpm: number | null };
  readonly erp: { readonly event: string; readonly lockedShare: number; readonly nEpochs: number } | null;
  readonly stepLocking: { readonly share: number; readonly event: string } | null;
  readonly oneOverF: { readonly exponent: number };
  readonly alphaPeakHz: number | null;
  readonly highFrequencyShare: number;
}

const pctText = (v: number) => (Number.isFinite(v) ? `${trimZero((Math.max(0, v) * 100).toFixed(0))}\u00a0%` : 'n/a');
const numText = (v: number | null, d = 2) => (v === null || !Number.isFinite(v) ? 'n/a' : trimZero(v.toFixed(d)));

/** One line per question, for the question list: the numbers a reviewer looks at first. */
export function answerLines(e: AnswerInput, describeEvent: (key: string) => string = (k) => k): Record<QuestionId, string> {
  const eog = Math.max(e.eogCorrelation.vertical ?? -1, e.eogCorrelation.horizontal ?? -1);
  const when = [`kurtosis ${numText(e.kurtosis, 1)}`];
  if (eog >= 0) when.push(`eye channel r ${numText(eog)}`);
  if (e.cardiac.bpm !== null) when.push(`${numText(e.cardiac.bpm, 0)} beats/min`);
  const locked: string[] = [];
  if (e.erp) locked.push(`${pctText(e.erp.lockedShare)} locked to ${describeEvent(e.erp.event)}`);
  if (e.stepLocking) locked.push(`${pctText(e.stepLocking.share)} to ${e.stepLocking.event}`);
  return {
    where: [`${pctText(e.varianceShare)} of variance, strongest at ${e.strongestChannel.label}`, e.dipole ? `dipole ${e.dipole.region}` : 'no dipole'].join(' · '),
    when: when.join(' · '),
    locked: locked.length ? locked.join(' · ') : 'no task events to lock to',
    frequencies: [`1/f exponent ${numText(e.oneOverF.exponent)}`, e.alphaPeakHz === null ? 'no alpha peak' : `alpha ${numText(e.alphaPeakHz, 1)}\u00a0Hz`, `${pctText(e.highFrequencyShare)} above 20\u00a0Hz`].join(' · '),
  };
}
