/**
 * The decisions file: format "winnow-decisions/2", JSON with the aim, reviewer, creation time, software, the
 * SHA-256 of the recording's and the decomposition file's bytes, and one entry per component (1-based index,
 * verdict, reason, note, and the suggestion shown at the time). A TSV twin with columns
 * `index verdict reason note` is written for spreadsheets.
 *
 * Required when reading: `format`, `aim`, `recordingSha256`, `decompositionSha256`, `components` (each with
 * `index` and `verdict`). Optional, with a warning when absent: `reviewer`, `createdAt`, `software`; per
 * component `reason`, `note`, `suggested` are optional without a warning; `thresholdOverrides` (the
 * suggestion thresholds that differ from the defaults, name → number) is written only when some do. `winnow-decisions/1` files still
 * load: their reason codes are mapped to today's words (LEGACY_REASON_CODES).
 *
 * Parsing never throws: bad input gives a ParseResult error naming the file and the fault.
 */
import { parseFail, parseOk, type ParseResult } from '../formats/parse-result.ts';
import { formatTsv, parseTsv } from '../formats/bids.ts';
import { readThresholdOverrides, thresholdOverridesOf } from './threshold-changes.ts';
import type { Thresholds } from './thresholds.ts';
import { AIMS, LEGACY_REASON_CODES, REASON_CODES, VERDICTS, type Aim, type ReasonCode, type Suggestion, type Verdict } from './vocabulary.ts';

export const DECISIONS_FORMAT = 'winnow-decisions/2';
/** Earlier major versions this reader still loads (reason codes mapped). */
export const LEGACY_DECISIONS_FORMATS: readonly string[] = ['winnow-decisions/1'];

/** One reviewer decision. A component without a decision is `undecided` with no reason and an empty note. */
export interface ReviewDecision {
  readonly verdict: Verdict;
  readonly reason: ReasonCode | null;
  readonly note: string;
}

export const UNDECIDED: ReviewDecision = Object.freeze({ verdict: 'undecided', reason: null, note: '' });

export interface DecisionsFileComponent {
  readonly index: number;
  readonly verdict: Verdict;
  readonly reason: ReasonCode | null;
  readonly note: string;
  readonly suggested: { readonly verdict: Verdict; readonly reason: ReasonCode; readonly because: readonly string[] } | null;
}

export interface DecisionsFile {
  readonly format: typeof DECISIONS_FORMAT;
  readonly aim: Aim;
  readonly reviewer: string;
  /** ISO 8601 with zone (UTC "Z"). */
  readonly createdAt: string;
  /** e.g. "winnow 0.1.0". */
  readonly software: string;
  readonly recordingSha256: string;
  readonly decompositionSha256: string;
  /** Suggestion thresholds that differ from the defaults (review/thresholds.ts); absent when none does. */
  readonly thresholdOverrides?: Partial<Record<keyof Thresholds, number>>;
  readonly components: readonly DecisionsFileComponent[];
}

/** What `buildDecisionsFile` needs: the file's header fields as written, plus the review state. */
export interface DecisionsFileInput
  extends Pick<DecisionsFile, 'aim' | 'reviewer' | 'createdAt' | 'software' | 'recordingSha256' | 'decompositionSha256'> {
  /** Number of components in the decomposition; every one gets an entry (undecided when absent). */
  readonly nComponents: number;
  readonly decisions: Readonly<Record<number, ReviewDecision>>;
  /** Suggestion per 1-based index (undefined/null when none was computed). */
  readonly suggestions?: (index: number) => Suggestion | null | undefined;
  /** The threshold overrides the suggestions were made with (only those differing from the defaults are written). */
  readonly thresholds?: Partial<Thresholds>;
}

/** Builds the decisions file object: one component entry per index 1…nComponents, in order. */
export function buildDecisionsFile(input: DecisionsFileInput): DecisionsFile {
  const components: DecisionsFileComponent[] = [];
  for (let index = 1; index <= input.nComponents; index++) {
    const d = input.decisions[index] ?? UNDECIDED;
    const s = input.suggestions?.(index) ?? null;
    components.push({
      index,
      verdict: d.verdict,
      reason: d.reason,
      note: d.note,
      suggested: s ? { verdict: s.verdict, reason: s.reason, because: [...s.because] } : null,
    });
  }
  const overrides = thresholdOverridesOf(input.thresholds);
  return {
    format: DECISIONS_FORMAT,
    aim: input.aim,
    reviewer: input.reviewer,
    createdAt: input.createdAt,
    software: input.software,
    recordingSha256: input.recordingSha256,
    decompositionSha256: input.decompositionSha256,
    ...(overrides ? { thresholdOverrides: overrides } : {}),
    components,
  };
}

/** JSON text of a decisions file (two-space indent, trailing newline). */
export function formatDecisionsJson(file: DecisionsFile): string {
  return `${JSON.stringify(file, null, 2)}\n`;
}

/** The decisions map a file describes; undecided entries without reason or note are left out. */
export function decisionsFromFile(file: Pick<DecisionsFile, 'components'>): Record<number, ReviewDecision> {
  const out: Record<number, ReviewDecision> = {};
  for (const c of file.components) {
    if (c.verdict === 'undecided' && c.reason === null && c.note === '') continue;
    out[c.index] = { verdict: c.verdict, reason: c.reason, note: c.note };
  }
  return out;
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isVerdict = (v: unknown): v is Verdict => typeof v === 'string' && (VERDICTS as readonly string[]).includes(v);
const isReason = (v: unknown): v is ReasonCode => typeof v === 'string' && (REASON_CODES as readonly string[]).includes(v);
/** Today's reason code for `v`, mapping the codes of version 1 files; undefined when `v` is no reason code. */
const reasonOf = (v: unknown, legacy: boolean): ReasonCode | undefined =>
  isReason(v) ? v : legacy && typeof v === 'string' ? LEGACY_REASON_CODES[v] : undefined;
const isAim = (v: unknown): v is Aim => typeof v === 'string' && (AIMS as readonly string[]).includes(v);

/** Parses and validates decisions-file JSON; every fault names the file and the field. */
export function parseDecisionsJson(text: string, fileName: string): ParseResult<DecisionsFile> {
  const fail = (message: string) => parseFail<DecisionsFile>({ code: 'bad-value', message: `${fileName}: ${message}`, file: fileName });
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    return fail(`not valid JSON (${(e as Error).message})`);
  }
  if (!isRecord(raw)) return fail('expected a JSON object');
  const legacy = typeof raw.format === 'string' && LEGACY_DECISIONS_FORMATS.includes(raw.format);
  if (raw.format !== DECISIONS_FORMAT && !legacy)
    return fail(`"format" must be "${DECISIONS_FORMAT}" (or an earlier ${LEGACY_DECISIONS_FORMATS.join(', ')}), got ${JSON.stringify(raw.format)}`);
  if (!isAim(raw.aim)) return fail(`"aim" must be one of ${AIMS.join(', ')}, got ${JSON.stringify(raw.aim)}`);
  for (const key of ['recordingSha256', 'decompositionSha256'] as const) {
    if (typeof raw[key] !== 'string') return fail(`"${key}" must be a string`);
  }
  const warnings: string[] = [];
  const optionalText = (key: 'reviewer' | 'createdAt' | 'software'): string | ParseResult<DecisionsFile> => {
    if (raw[key] === undefined || raw[key] === null) {
      warnings.push(`${fileName}: no "${key}" field; read as empty`);
      return '';
    }
    return typeof raw[key] === 'string' ? raw[key] : fail(`"${key}" must be a string`);
  };
  const reviewer = optionalText('reviewer');
  if (typeof reviewer !== 'string') return reviewer;
  const createdAt = optionalText('createdAt');
  if (typeof createdAt !== 'string') return createdAt;
  const software = optionalText('software');
  if (typeof software !== 'string') return software;
  if (!Array.isArray(raw.components)) return fail('"components" must be an array');
  const components: DecisionsFileComponent[] = [];
  const seen = new Set<number>();
  for (let i = 0; i < raw.components.length; i++) {
    const c: unknown = raw.components[i];
    const where = `components[${i}]`;
    if (!isRecord(c)) return fail(`${where} must be an object`);
    if (typeof c.index !== 'number' || !Number.isInteger(c.index) || c.index < 1) return fail(`${where}.index must be a whole number ≥ 1`);
    if (seen.has(c.index)) return fail(`${where}.index ${c.index} appears twice`);
    seen.add(c.index);
    if (!isVerdict(c.verdict)) return fail(`${where}.verdict must be keep, remove or undecided, got ${JSON.stringify(c.verdict)}`);
    const reason = c.reason === null || c.reason === undefined ? null : reasonOf(c.reason, legacy);
    if (reason === undefined) return fail(`${where}.reason ${JSON.stringify(c.reason)} is not a reason code (${REASON_CODES.join(', ')})`);
    if (c.note !== undefined && typeof c.note !== 'string') return fail(`${where}.note must be text`);
    let suggested: DecisionsFileComponent['suggested'] = null;
    if (c.suggested !== null && c.suggested !== undefined) {
      const s = c.suggested;
      const sReason = isRecord(s) ? reasonOf(s.reason, legacy) : undefined;
      if (!isRecord(s) || !isVerdict(s.verdict) || sReason === undefined || !Array.isArray(s.because) || !s.because.every((b) => typeof b === 'string')) {
        return fail(`${where}.suggested must be {verdict, reason, because: [text]}`);
      }
      suggested = { verdict: s.verdict, reason: sReason, because: s.because as string[] };
    }
    components.push({ index: c.index, verdict: c.verdict, reason, note: (c.note as string | undefined) ?? '', suggested });
  }
  const thresholds = readThresholdOverrides(raw.thresholdOverrides);
  if (thresholds.rejected.length > 0) return fail(`"thresholdOverrides" must map threshold names to numbers; not read: ${thresholds.rejected.join(', ')}`);
  const thresholdOverrides = thresholdOverridesOf(thresholds.overrides);
  return parseOk({
    format: DECISIONS_FORMAT,
    aim: raw.aim,
    reviewer,
    createdAt,
    software,
    recordingSha256: raw.recordingSha256 as string,
    decompositionSha256: raw.decompositionSha256 as string,
    ...(thresholdOverrides ? { thresholdOverrides } : {}),
    components,
  }, warnings);
}

/**
 * The TSV twin: columns `index verdict reason note`, one row per component, reason "n/a" when none (BIDS
 * convention). Backslashes, line breaks and tabs inside notes are written as two characters (backslash + "\\", "n", "t") so every
 * row stays on one line; spreadsheet formulas are neutralised by formatTsv (leading apostrophe).
 */
export function formatDecisionsTsv(file: Pick<DecisionsFile, 'components'>): string {
  const escape = (note: string) => note.replace(/\\/g, '\\\\').replace(/\r\n?|\n/g, '\\n').replace(/\t/g, '\\t');
  return formatTsv(
    ['index', 'verdict', 'reason', 'note'],
    file.components.map((c) => [c.index, c.verdict, c.reason ?? 'n/a', escape(c.note)]),
  );
}

/**
 * Parses the TSV twin (columns `index verdict reason note`, any order, extra columns ignored). A cell that
 * was formula-neutralised on export (a leading apostrophe before = + - @) gets the apostrophe back off.
 * Undecided rows without reason and note are left out of the map.
 */
export function parseDecisionsTsv(text: string, fileName: string): ParseResult<Record<number, ReviewDecision>> {
  const table = parseTsv(text, fileName);
  if (!table.ok) return table;
  const { columns, rows } = table.value;
  const fail = (message: string, line: number) =>
    parseFail<Record<number, ReviewDecision>>({ code: 'bad-tsv', message: `${fileName}: ${message}`, file: fileName, line });
  for (const name of ['index', 'verdict', 'reason', 'note']) {
    if (!columns.includes(name))
      return parseFail({ code: 'missing-column', message: `${fileName}: header has no "${name}" column (found ${columns.join(', ')})`, file: fileName, line: 1 });
  }
  const unneutralise = (cell: string) => (/^'[=+\-@]/.test(cell) ? cell.slice(1) : cell);
  const out: Record<number, ReviewDecision> = {};
  for (let i = 0; i < rows.length; i++) {
    const line = i + 2;
    const get = (name: string) => unneutralise(rows[i][columns.indexOf(name)] ?? '');
    const index = Number(get('index'));
    if (!Number.isInteger(index) || index < 1) return fail(`line ${line}: index "${get('index')}" is not a whole number ≥ 1`, line);
    if (index in out) return fail(`line ${line}: component ${index} appears twice`, line);
    const verdict = get('verdict');
    if (!isVerdict(verdict)) return fail(`line ${line}: verdict "${verdict}" must be keep, remove or undecided`, line);
    const reasonText = get('reason');
    const reason = reasonText === '' || reasonText === 'n/a' ? null : reasonOf(reasonText, true);
    if (reason === undefined) return fail(`line ${line}: reason "${reasonText}" is not a reason code (${REASON_CODES.join(', ')})`, line);
    const note = get('note').replace(/\\([nt\\])/g, (_, c: string) => (c === 'n' ? '\n' : c === 't' ? '\t' : '\\'));
    if (verdict === 'undecided' && reason === null && note === '') continue;
    out[index] = { verdict, reason, note };
  }
  return parseOk(out);
}
