/**
 * Decomposition files: Winnow's own JSON ("winnow-decomposition/1") and plain TSV/CSV matrices brought from
 * elsewhere. Parsers never throw for bad input; they return a ParseResult whose message names the file and
 * the fault in the file's own terms.
 *
 * JSON layout (all matrices as arrays of rows; numbers written by JSON.stringify round-trip float64 exactly):
 *   { "format": "winnow-decomposition/1",
 *     "channels": ["Fp1", …],                      labels used, n
 *     "mixing":   [[…k values…], …n rows],         rows = channels, columns = components (scalp maps)
 *     "unmixing": [[…n values…], …k rows],         components × channels
 *     "channelMeans": [n values] | null,           means removed before unmixing
 *     "method": "infomax" | "picard" | "imported", "rank", "iterations", "converged",
 *     "preprocessing": { "filter", "highpassHz", "lowpassHz", "reference", "excludedChannels" },
 *     "recordingSha256": "…" }
 * Either matrix may be omitted on import; the other is then computed by pseudo-inverse.
 *
 * TSV/CSV matrices: the header names the channels, one row per component. For kind 'unmixing' a row is the
 * component's unmixing weights; for kind 'mixing' a row is the component's scalp map (a column of the mixing
 * matrix). A first column headed "component" (or left blank) holds row names and is skipped. Tab-separated
 * when the header has a tab, else comma-separated.
 *
 * Matching a decomposition to a recording's channels is decomposition-match.ts.
 */
import type { Decomposition, DecompositionMethod, DecompositionPreprocessing } from '../decomposition.ts';
import { pseudoInverse } from '../linalg/eigen.ts';
import { parseFail, parseOk, type ParseErrorCode, type ParseResult } from './parse-result.ts';

export const DECOMPOSITION_FORMAT = 'winnow-decomposition/1';

function rows(M: Float64Array, r: number, c: number): number[][] {
  return Array.from({ length: r }, (_, i) => Array.from(M.subarray(i * c, (i + 1) * c)));
}

/**
 * Optional run details written beside the contract fields (readers ignore them). Workbench and CLI both
 * write them from the engine's result (`decompositionExtrasOf`), so a file says the same wherever it was made.
 */
export interface DecompositionExtras {
  readonly rankReason?: string;
  /** Per component: variance accounted for / total channel variance. */
  readonly varianceShare?: ArrayLike<number>;
  readonly warnings?: readonly string[];
  readonly seed?: number;
  /** Picard's final max |antisymmetric relative gradient| (null for Infomax); iterations are in the contract fields. */
  readonly finalGradientNorm?: number | null;
}

/** The run details of a decomposition engine result (src/core/ica/decompose.ts) and the seed it ran with. */
export function decompositionExtrasOf(
  result: { readonly rankReason: string; readonly varianceShare: ArrayLike<number>; readonly warnings: readonly string[]; readonly finalGradientNorm?: number | null },
  seed: number,
): DecompositionExtras {
  return { rankReason: result.rankReason, varianceShare: result.varianceShare, warnings: result.warnings, seed, ...(result.finalGradientNorm !== undefined ? { finalGradientNorm: result.finalGradientNorm } : {}) };
}

/** Our JSON for a decomposition (pretty-printed with one matrix row per line). */
export function serializeDecomposition(d: Decomposition, extras: DecompositionExtras = {}): string {
  const body = {
    format: DECOMPOSITION_FORMAT,
    channels: d.channels,
    nComponents: d.nComponents,
    method: d.method,
    rank: d.rank,
    iterations: d.iterations,
    converged: d.converged,
    preprocessing: d.preprocessing,
    recordingSha256: d.recordingSha256,
    ...(extras.seed !== undefined ? { seed: extras.seed } : d.seed !== undefined ? { seed: d.seed } : {}),
    ...(extras.rankReason !== undefined ? { rankReason: extras.rankReason } : {}),
    ...(extras.varianceShare !== undefined ? { varianceShare: Array.from(extras.varianceShare) } : {}),
    ...(extras.warnings !== undefined ? { warnings: extras.warnings } : {}),
    ...(extras.finalGradientNorm !== undefined ? { finalGradientNorm: extras.finalGradientNorm } : {}),
    channelMeans: d.channelMeans ? Array.from(d.channelMeans) : null,
    mixing: rows(d.mixing, d.nChannels, d.nComponents),
    unmixing: rows(d.unmixing, d.nComponents, d.nChannels),
  };
  // One row per line keeps big files readable without the size of full indentation.
  return JSON.stringify(body, (key, value) => value, 1).replace(/\[\n\s+(-?[\d.e+-]+(,\n\s+-?[\d.e+-]+)*)\n\s+\]/g, (_, inner: string) =>
    `[${inner.replace(/\n\s+/g, ' ')}]`,
  ) + '\n';
}

type Fail = { code: ParseErrorCode; message: string };

function matrixFrom(value: unknown, name: string, nRows: number, nCols: number | null): { M: Float64Array; cols: number } | Fail {
  if (!Array.isArray(value)) return { code: 'bad-shape', message: `"${name}" must be an array of rows` };
  if (value.length !== nRows) return { code: 'bad-shape', message: `"${name}" has ${value.length} rows, expected ${nRows}` };
  let cols = nCols;
  for (let i = 0; i < nRows; i++) {
    const row = value[i];
    if (!Array.isArray(row)) return { code: 'bad-shape', message: `"${name}" row ${i + 1} is not an array` };
    if (cols === null) cols = row.length;
    if (row.length !== cols) return { code: 'bad-shape', message: `"${name}" row ${i + 1} has ${row.length} values, expected ${cols}` };
  }
  const c = cols ?? 0;
  const M = new Float64Array(nRows * c);
  for (let i = 0; i < nRows; i++)
    for (let j = 0; j < c; j++) {
      const v = (value[i] as unknown[])[j];
      if (typeof v !== 'number' || !Number.isFinite(v))
        return { code: 'bad-value', message: `"${name}" row ${i + 1}, column ${j + 1} is ${JSON.stringify(v)}, not a finite number` };
      M[i * c + j] = v;
    }
  return { M, cols: c };
}

const isFail = (x: unknown): x is Fail => typeof x === 'object' && x !== null && 'code' in x && 'message' in x;

const IMPORTED_PREPROCESSING: DecompositionPreprocessing = {
  filter: 'unknown (imported)',
  highpassHz: null,
  lowpassHz: null,
  reference: 'unknown (imported)',
  excludedChannels: [],
};

/** Max |W A − I| as a consistency figure of an imported pair. */
function inverseMismatch(W: Float64Array, A: Float64Array, n: number, k: number): number {
  let worst = 0;
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let c = 0; c < n; c++) s += W[i * n + c] * A[c * k + j];
      worst = Math.max(worst, Math.abs(s - (i === j ? 1 : 0)));
    }
  return worst;
}

/** Parses our decomposition JSON (either matrix may be missing; the other is then its pseudo-inverse). */
export function parseDecompositionJson(text: string, fileName: string): ParseResult<Decomposition> {
  const fail = (f: Fail) => parseFail<Decomposition>({ code: f.code, message: `${fileName}: ${f.message}`, file: fileName });
  let obj: unknown;
  try {
    obj = JSON.parse(text);
  } catch (e) {
    return fail({ code: 'bad-value', message: `not valid JSON (${(e as Error).message})` });
  }
  if (typeof obj !== 'object' || obj === null || Array.isArray(obj)) return fail({ code: 'bad-shape', message: 'expected a JSON object' });
  const o = obj as Record<string, unknown>;
  const warnings: string[] = [];
  if (typeof o.format === 'string') {
    if (!o.format.startsWith('winnow-decomposition/')) return fail({ code: 'unsupported', message: `"format" is "${o.format}", expected "${DECOMPOSITION_FORMAT}"` });
    if (o.format !== DECOMPOSITION_FORMAT) return fail({ code: 'unsupported', message: `format version "${o.format}" is newer than this program reads (${DECOMPOSITION_FORMAT})` });
  } else warnings.push(`${fileName}: no "format" field; read as ${DECOMPOSITION_FORMAT}`);
  if (!Array.isArray(o.channels) || o.channels.length === 0 || !o.channels.every((c) => typeof c === 'string'))
    return fail({ code: 'missing-column', message: '"channels" must be a non-empty array of channel labels' });
  const channels = (o.channels as string[]).map((c) => c.trim());
  const n = channels.length;
  const dup = channels.find((c, i) => channels.indexOf(c) !== i);
  if (dup !== undefined) return fail({ code: 'bad-value', message: `channel "${dup}" is listed twice in "channels"` });
  if (o.mixing === undefined && o.unmixing === undefined) return fail({ code: 'missing-column', message: 'neither "mixing" nor "unmixing" is present' });

  let A: Float64Array | null = null;
  let W: Float64Array | null = null;
  let k = -1;
  if (o.mixing !== undefined) {
    const m = matrixFrom(o.mixing, 'mixing', n, null);
    if (isFail(m)) return fail(m);
    A = m.M;
    k = m.cols;
  }
  if (o.unmixing !== undefined) {
    if (!Array.isArray(o.unmixing)) return fail({ code: 'bad-shape', message: '"unmixing" must be an array of rows' });
    if (k >= 0 && o.unmixing.length !== k)
      return fail({ code: 'bad-shape', message: `"unmixing" has ${o.unmixing.length} rows but "mixing" has ${k} columns (components)` });
    const m = matrixFrom(o.unmixing, 'unmixing', o.unmixing.length, n);
    if (isFail(m)) return fail(m);
    W = m.M;
    k = o.unmixing.length;
  }
  if (k < 1) return fail({ code: 'bad-shape', message: 'the decomposition has no components' });
  if (typeof o.nComponents === 'number' && o.nComponents !== k)
    return fail({ code: 'bad-shape', message: `"nComponents" says ${o.nComponents} but the matrices hold ${k}` });
  if (A && W) {
    const mis = inverseMismatch(W, A, n, k);
    if (mis > 1e-6) warnings.push(`${fileName}: unmixing × mixing differs from the identity by up to ${mis.toExponential(2)}`);
  }
  if (!A) A = pseudoInverse(W!, k, n);
  if (!W) W = pseudoInverse(A, n, k);

  let channelMeans: Float64Array | null = null;
  if (o.channelMeans !== undefined && o.channelMeans !== null) {
    const m = matrixFrom([o.channelMeans], 'channelMeans', 1, n);
    if (isFail(m)) return fail({ code: m.code, message: m.message.replace('row 1, ', '') });
    channelMeans = m.M;
  }
  const methods: DecompositionMethod[] = ['infomax', 'picard', 'imported'];
  const method = methods.includes(o.method as DecompositionMethod) ? (o.method as DecompositionMethod) : 'imported';
  const p = (typeof o.preprocessing === 'object' && o.preprocessing !== null ? o.preprocessing : {}) as Record<string, unknown>;
  const numOrNull = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  const preprocessing: DecompositionPreprocessing = {
    filter: typeof p.filter === 'string' ? p.filter : IMPORTED_PREPROCESSING.filter,
    highpassHz: numOrNull(p.highpassHz),
    lowpassHz: numOrNull(p.lowpassHz),
    reference: typeof p.reference === 'string' ? p.reference : IMPORTED_PREPROCESSING.reference,
    excludedChannels: Array.isArray(p.excludedChannels) ? p.excludedChannels.filter((c): c is string => typeof c === 'string') : [],
  };
  return parseOk(
    {
      channels,
      nChannels: n,
      nComponents: k,
      mixing: A,
      unmixing: W,
      channelMeans,
      method,
      rank: typeof o.rank === 'number' && Number.isInteger(o.rank) ? o.rank : k,
      iterations: typeof o.iterations === 'number' ? o.iterations : 0,
      converged: typeof o.converged === 'boolean' ? o.converged : true,
      preprocessing,
      recordingSha256: typeof o.recordingSha256 === 'string' ? o.recordingSha256 : '',
      ...(typeof o.seed === 'number' && Number.isFinite(o.seed) ? { seed: o.seed } : {}),
    },
    warnings,
  );
}

/**
 * Parses a TSV/CSV matrix whose header names the channels (one row per component; see the module comment)
 * as the mixing or the unmixing matrix; the other is computed by pseudo-inverse.
 */
export function parseMatrixTsv(text: string, fileName: string, kind: 'mixing' | 'unmixing'): ParseResult<Decomposition> {
  const fail = (code: ParseErrorCode, message: string, line?: number) =>
    parseFail<Decomposition>({ code, message: `${fileName}: ${message}`, file: fileName, line });
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split('\n').map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
  if (lines.length === 0) return fail('bad-tsv', 'file is empty; the first line must name the channels', 1);
  const sep = lines[0].includes('\t') ? '\t' : ',';
  const unquote = (s: string) => {
    const t = s.trim();
    return t.length >= 2 && t.startsWith('"') && t.endsWith('"') ? t.slice(1, -1).replace(/""/g, '"') : t;
  };
  const header = lines[0].split(sep).map(unquote);
  const skipFirst = header[0] === '' || /^(component|components|ic)$/i.test(header[0]);
  const channels = skipFirst ? header.slice(1) : header;
  const n = channels.length;
  if (n === 0) return fail('bad-tsv', 'the header names no channels', 1);
  const empty = channels.findIndex((c) => c === '');
  if (empty >= 0) return fail('bad-tsv', `header column ${empty + 1 + (skipFirst ? 1 : 0)} has no channel name`, 1);
  if (channels.every((c) => Number.isFinite(Number(c))))
    return fail('missing-column', 'the first line holds numbers; it must name the channels', 1);
  const dup = channels.find((c, i) => channels.indexOf(c) !== i);
  if (dup !== undefined) return fail('bad-tsv', `channel "${dup}" is named twice in the header`, 1);
  const k = lines.length - 1;
  if (k === 0) return fail('row-count-mismatch', 'the header is followed by no component rows', 2);
  const M = new Float64Array(k * n);
  for (let r = 0; r < k; r++) {
    const cells = lines[r + 1].split(sep);
    const vals = skipFirst ? cells.slice(1) : cells;
    if (vals.length !== n) return fail('bad-shape', `line ${r + 2} has ${vals.length} values for ${n} channels`, r + 2);
    for (let c = 0; c < n; c++) {
      const s = unquote(vals[c]);
      const v = s === '' ? NaN : Number(s);
      if (!Number.isFinite(v)) return fail('bad-value', `line ${r + 2}, channel "${channels[c]}": "${s}" is not a finite number`, r + 2);
      M[r * n + c] = v;
    }
  }
  if (k > n) return fail('bad-shape', `${k} components for ${n} channels: a decomposition cannot have more components than channels`);
  let A: Float64Array;
  let W: Float64Array;
  if (kind === 'unmixing') {
    W = M;
    A = pseudoInverse(W, k, n);
  } else {
    A = new Float64Array(n * k);
    for (let r = 0; r < k; r++) for (let c = 0; c < n; c++) A[c * k + r] = M[r * n + c];
    W = pseudoInverse(A, n, k);
  }
  return parseOk({
    channels,
    nChannels: n,
    nComponents: k,
    mixing: A,
    unmixing: W,
    channelMeans: null,
    method: 'imported',
    rank: k,
    iterations: 0,
    converged: true,
    preprocessing: IMPORTED_PREPROCESSING,
    recordingSha256: '',
  });
}
