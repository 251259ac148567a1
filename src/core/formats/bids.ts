/**
 * BIDS sidecar files [BIDS specification v1.11, docs/methods.md §12; Pernet et al. 2019 (EEG-BIDS)]:
 * TSV reading and writing, *_channels.tsv, *_electrodes.tsv (+ *_coordsystem.json units), *_events.tsv and
 * the PowerLineFrequency of *_eeg.json.
 *
 * TSV rules: tab separators; the first line holds the column names (no blanks, no duplicates); UTF-8;
 * 'n/a' for missing values; strings containing tabs are double-quoted.
 */
import { parseFail, parseOk, type ParseResult } from './parse-result.ts';
import type { ChannelType, RecordingEvent } from '../recording.ts';
import { seconds } from '../units.ts';

/** Splits one TSV line into cells; a cell wrapped in double quotes may hold tabs ("" is a quote). */
function splitTsvLine(line: string): string[] | null {
  if (!line.includes('"')) return line.split('\t');
  const cells: string[] = [];
  let i = 0;
  for (;;) {
    if (line[i] === '"') {
      let cell = '';
      i++;
      for (;;) {
        if (i >= line.length) return null;
        if (line[i] === '"') {
          if (line[i + 1] === '"') {
            cell += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        cell += line[i++];
      }
      if (i < line.length && line[i] !== '\t') return null;
      cells.push(cell);
    } else {
      const j = line.indexOf('\t', i);
      cells.push(j < 0 ? line.slice(i) : line.slice(i, j));
      i = j < 0 ? line.length : j;
    }
    if (i >= line.length) return cells;
    i++; // past the tab
    if (i === line.length) {
      cells.push('');
      return cells;
    }
  }
}

/**
 * Parses a BIDS TSV file. Cells are returned as written ('n/a' stays 'n/a'). A trailing empty line is
 * allowed; any other row whose cell count differs from the header is an error naming the line.
 */
export function parseTsv(text: string, fileName: string): ParseResult<{ columns: string[]; rows: string[][] }> {
  const fail = (message: string, line?: number) =>
    parseFail<{ columns: string[]; rows: string[][] }>({ code: 'bad-tsv', message: `${fileName}: ${message}`, file: fileName, line });
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split('\n').map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
  while (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length === 0) return fail('file is empty; the first line must name the columns', 1);
  const columns = splitTsvLine(lines[0]);
  if (!columns) return fail('unbalanced double quote in the header line', 1);
  const seen = new Set<string>();
  for (const [i, c] of columns.entries()) {
    if (c.trim() === '') return fail(`column ${i + 1} of the header line has no name`, 1);
    if (seen.has(c)) return fail(`column "${c}" appears twice in the header line`, 1);
    seen.add(c);
  }
  const rows: string[][] = [];
  for (let i = 1; i < lines.length; i++) {
    const cells = splitTsvLine(lines[i]);
    if (!cells) return fail(`line ${i + 1} has an unbalanced double quote`, i + 1);
    if (cells.length !== columns.length)
      return fail(`line ${i + 1} has ${cells.length} cells but the header names ${columns.length} columns`, i + 1);
    rows.push(cells);
  }
  return parseOk({ columns, rows });
}

function requireColumns(
  columns: string[],
  required: readonly string[],
  fileName: string,
): ParseResult<Record<string, number>> {
  const idx: Record<string, number> = {};
  const missing = required.filter((c) => !columns.includes(c));
  if (missing.length > 0)
    return parseFail({
      code: 'missing-column',
      message: `${fileName}: missing required column${missing.length > 1 ? 's' : ''} ${missing.map((m) => `"${m}"`).join(', ')} (has ${columns.join(', ')})`,
      file: fileName,
      line: 1,
    });
  columns.forEach((c, i) => (idx[c] = i));
  return parseOk(idx);
}

const CHANNEL_TYPES: readonly ChannelType[] = [
  'EEG', 'EOG', 'HEOG', 'VEOG', 'ECG', 'EMG', 'MISC', 'TRIG', 'REF', 'RESP', 'AUDIO', 'EYEGAZE', 'GSR', 'PPG', 'PUPIL', 'SYSCLOCK', 'TEMP',
];

export interface ChannelsTsvRow {
  name: string;
  type: ChannelType;
  units: string;
  status: 'good' | 'bad';
  /** The optional `reference` column (absent, empty or "n/a": undefined). */
  reference?: string;
}

/** *_channels.tsv: required name, type, units; optional status (good / bad / n/a → good). */
export function parseChannelsTsv(text: string, fileName: string): ParseResult<ChannelsTsvRow[]> {
  const tsv = parseTsv(text, fileName);
  if (!tsv.ok) return tsv;
  const cols = requireColumns(tsv.value.columns, ['name', 'type', 'units'], fileName);
  if (!cols.ok) return cols;
  const c = cols.value;
  const warnings: string[] = [];
  const out: ChannelsTsvRow[] = [];
  for (const [r, row] of tsv.value.rows.entries()) {
    const line = r + 2;
    const name = row[c.name].trim();
    if (name === '' || name === 'n/a')
      return parseFail({ code: 'bad-value', message: `${fileName}: line ${line} has no channel name`, file: fileName, line });
    let type = row[c.type].trim();
    const upper = type.toUpperCase() as ChannelType;
    if (!CHANNEL_TYPES.includes(upper)) {
      warnings.push(`${fileName}: line ${line} type "${type}" is not a BIDS channel type; treated as MISC`);
      type = 'MISC';
    } else {
      if (type !== upper) warnings.push(`${fileName}: line ${line} type "${type}" should be upper case ("${upper}")`);
      type = upper;
    }
    let status: 'good' | 'bad' = 'good';
    if (c.status !== undefined) {
      const s = row[c.status].trim().toLowerCase();
      if (s === 'bad') status = 'bad';
      else if (s !== 'good' && s !== 'n/a' && s !== '')
        warnings.push(`${fileName}: line ${line} status "${row[c.status]}" is not good, bad or n/a; treated as good`);
    }
    const reference = c.reference !== undefined ? row[c.reference].trim() : '';
    out.push({ name, type: type as ChannelType, units: row[c.units].trim(), status, ...(reference !== '' && reference !== 'n/a' ? { reference } : {}) });
  }
  return parseOk(out, warnings);
}

const UNIT_TO_MM: Record<'m' | 'mm' | 'cm', number> = { m: 1000, mm: 1, cm: 10 };

/**
 * *_electrodes.tsv: required name, x, y, z. Units come from the coordinate-system JSON's
 * `EEGCoordinateUnits` (m, mm, cm); without that JSON (or with 'n/a') mm is assumed and a warning says so.
 * Positions are returned in millimetres; 'n/a' coordinates become NaN.
 */
export function parseElectrodesTsv(
  text: string,
  fileName: string,
  coordsystemJson?: string,
): ParseResult<{ names: string[]; positionsMm: Float64Array; units: 'm' | 'mm' | 'cm'; assumedUnits: boolean }> {
  const tsv = parseTsv(text, fileName);
  if (!tsv.ok) return tsv;
  const cols = requireColumns(tsv.value.columns, ['name', 'x', 'y', 'z'], fileName);
  if (!cols.ok) return cols;
  const c = cols.value;
  const warnings: string[] = [];
  let units: 'm' | 'mm' | 'cm' = 'mm';
  let assumedUnits = true;
  if (coordsystemJson === undefined) {
    warnings.push(`${fileName}: no coordinate-system JSON; electrode coordinates assumed to be in mm`);
  } else {
    let json: unknown;
    try {
      json = JSON.parse(coordsystemJson);
    } catch (e) {
      return parseFail({ code: 'bad-value', message: `${fileName}: its coordinate-system JSON is not valid JSON (${(e as Error).message})`, file: fileName });
    }
    const u = json && typeof json === 'object' ? (json as Record<string, unknown>).EEGCoordinateUnits : undefined;
    if (u === 'm' || u === 'mm' || u === 'cm') {
      units = u;
      assumedUnits = false;
    } else
      warnings.push(`${fileName}: coordinate-system JSON gives EEGCoordinateUnits ${JSON.stringify(u ?? null)}; coordinates assumed to be in mm`);
  }
  const f = UNIT_TO_MM[units];
  const rows = tsv.value.rows;
  const names: string[] = [];
  const positionsMm = new Float64Array(rows.length * 3);
  for (const [r, row] of rows.entries()) {
    names.push(row[c.name].trim());
    for (const [k, col] of (['x', 'y', 'z'] as const).entries()) {
      const t = row[c[col]].trim();
      if (t === 'n/a') {
        positionsMm[3 * r + k] = NaN;
        continue;
      }
      const v = Number(t);
      if (t === '' || !Number.isFinite(v))
        return parseFail({ code: 'bad-number', message: `${fileName}: line ${r + 2} ${col} is "${t}", not a number`, file: fileName, line: r + 2 });
      positionsMm[3 * r + k] = v * f;
    }
  }
  return parseOk({ names, positionsMm, units, assumedUnits }, warnings);
}

/**
 * *_events.tsv: required onset (s; 'n/a' rows are skipped with a warning) and duration (s; 'n/a' → 0);
 * optional trial_type (the label; falls back to a 'value' column, else empty) and response_time (s).
 */
export function parseEventsTsv(text: string, fileName: string): ParseResult<RecordingEvent[]> {
  const tsv = parseTsv(text, fileName);
  if (!tsv.ok) return tsv;
  const cols = requireColumns(tsv.value.columns, ['onset', 'duration'], fileName);
  if (!cols.ok) return cols;
  const c = cols.value;
  const warnings: string[] = [];
  const out: RecordingEvent[] = [];
  /** A number, 'na' for n/a, or null when the cell is not a number. */
  const num = (t: string): number | null | 'na' => {
    const s = t.trim();
    if (s === 'n/a') return 'na';
    const v = Number(s);
    return s === '' || !Number.isFinite(v) ? null : v;
  };
  let skipped = 0;
  for (const [r, row] of tsv.value.rows.entries()) {
    const line = r + 2;
    const onset = num(row[c.onset]);
    if (onset === null)
      return parseFail({ code: 'bad-number', message: `${fileName}: line ${line} onset is "${row[c.onset]}", not a number`, file: fileName, line });
    if (onset === 'na') {
      skipped++;
      continue;
    }
    const duration = num(row[c.duration]);
    if (duration === null || (typeof duration === 'number' && duration < 0))
      return parseFail({ code: 'bad-number', message: `${fileName}: line ${line} duration is "${row[c.duration]}", not a number ≥ 0`, file: fileName, line });
    const labelCol = c.trial_type ?? c.value;
    const rawLabel = labelCol === undefined ? '' : row[labelCol].trim();
    const ev: { -readonly [K in keyof RecordingEvent]: RecordingEvent[K] } = {
      onset: seconds(onset),
      duration: seconds(duration === 'na' ? 0 : duration),
      label: rawLabel === 'n/a' ? '' : rawLabel,
      source: 'events-tsv',
    };
    const extra: Record<string, string> = {};
    for (const [name, idx] of Object.entries(c)) {
      if (name === 'onset' || name === 'duration' || name === 'sample' || idx === labelCol || name === 'response_time') continue;
      extra[name] = (row[idx] ?? '').trim();
    }
    if (Object.keys(extra).length > 0) ev.columns = extra;
    if (c.response_time !== undefined) {
      const rt = num(row[c.response_time]);
      if (rt === null)
        return parseFail({ code: 'bad-number', message: `${fileName}: line ${line} response_time is "${row[c.response_time]}", not a number`, file: fileName, line });
      if (rt !== 'na') ev.responseTime = seconds(rt);
    }
    out.push(ev);
  }
  if (skipped > 0) warnings.push(`${fileName}: ${skipped} row${skipped > 1 ? 's' : ''} with onset n/a skipped`);
  return parseOk(out, warnings);
}

/**
 * The fields Winnow reads from a *_eeg.json recording sidecar. BIDS specification v1.11, EEG section
 * ("Sidecar JSON"): PowerLineFrequency is REQUIRED, the mains frequency in Hz (50 or 60) at the place of
 * recording, or "n/a" when unknown.
 */
export interface EegSidecar {
  /** Hz; null when the field is absent or "n/a". */
  readonly powerLineFrequency: number | null;
  /** EEGReference (REQUIRED by BIDS); null when absent, empty or not text. */
  readonly reference?: string | null;
}

/**
 * Parses a *_eeg.json. Fails (code 'bad-value') when the text is not a JSON object; a PowerLineFrequency
 * that is missing, "n/a", or not a positive number gives null (with a warning for anything other than "n/a").
 */
export function parseEegJson(text: string, fileName: string): ParseResult<EegSidecar> {
  let json: unknown;
  try {
    json = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    return parseFail({ code: 'bad-value', message: `${fileName}: not valid JSON (${(e as Error).message})`, file: fileName });
  }
  if (!json || typeof json !== 'object' || Array.isArray(json))
    return parseFail({ code: 'bad-value', message: `${fileName}: not a JSON object`, file: fileName });
  const v = (json as Record<string, unknown>).PowerLineFrequency;
  const warnings: string[] = [];
  let powerLineFrequency: number | null = null;
  if (v === undefined) warnings.push(`${fileName}: no PowerLineFrequency (REQUIRED by BIDS)`);
  else if (v === 'n/a') powerLineFrequency = null;
  else if (typeof v === 'number' && Number.isFinite(v) && v > 0) powerLineFrequency = v;
  else warnings.push(`${fileName}: PowerLineFrequency is ${JSON.stringify(v)}, not a frequency in Hz or "n/a"`);
  const ref = (json as Record<string, unknown>).EEGReference;
  const reference = typeof ref === 'string' && ref.trim() !== '' && ref.trim() !== 'n/a' ? ref.trim() : null;
  return parseOk({ powerLineFrequency, reference }, warnings);
}

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Writes a TSV file (header line, rows, '\n' line ends, trailing newline). Cells with a tab, newline or
 * double quote are double-quoted. Spreadsheet formula injection is neutralised: a cell starting with
 * = + - @ gets a leading apostrophe unless it is a plain number (OWASP "CSV injection", common practice).
 */
export function formatTsv(columns: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  const cell = (v: string | number): string => {
    let s = typeof v === 'number' ? (Number.isNaN(v) ? 'n/a' : String(v)) : v;
    if (/^[=+\-@]/.test(s) && !PLAIN_NUMBER.test(s)) s = `'${s}`;
    if (/[\t\n\r"]/.test(s)) s = `"${s.replace(/"/g, '""')}"`;
    return s;
  };
  let out = columns.map(cell).join('\t') + '\n';
  for (const row of rows) out += row.map(cell).join('\t') + '\n';
  return out;
}
