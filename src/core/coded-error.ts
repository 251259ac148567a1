/**
 * One error convention across the worker boundary (issue 13). Files are read into ParseResult values
 * (formats/parse-result.ts) and never throw; a fault raised while a worker runs a job is thrown as a
 * `CodedError`, whose `code` says what kind of fault it is. Structured cloning keeps only an Error's
 * message and name, so a worker throws `toWireError(e)` (a plain object, cloned whole) and the bridge
 * client turns it back into a `CodedError` with `fromWireError`: the code, message, name and file survive.
 */
import type { ParseError, ParseErrorCode } from './formats/parse-result.ts';

/**
 * What kind of fault: a parse error's own code (bad input in a file), 'aborted' (the job was cancelled),
 * 'invalid-argument' (a RangeError or TypeError from a core precondition) or 'internal' (anything else).
 */
export type ErrorCode = ParseErrorCode | 'aborted' | 'invalid-argument' | 'internal';

const CODES: ReadonlySet<string> = new Set<ErrorCode>([
  'too-short', 'bad-version', 'bad-number', 'header-size-mismatch', 'no-signals', 'bad-scaling', 'truncated-record',
  'record-size-mismatch', 'bad-tal', 'bad-tsv', 'missing-column', 'row-count-mismatch', 'bad-value', 'bad-shape',
  'unknown-channel', 'unsupported', 'io', 'aborted', 'invalid-argument', 'internal',
]);

/** An error with a kind (`code`) that survives the worker boundary. */
export class CodedError extends Error {
  readonly code: ErrorCode;
  /** The file the fault is in, when known. */
  readonly file?: string;

  constructor(code: ErrorCode, message: string, options: { name?: string; file?: string } = {}) {
    super(message);
    this.code = code;
    this.name = options.name ?? 'CodedError';
    if (options.file !== undefined) this.file = options.file;
  }

  /** The thrown form of a parse error (same code, message and file). */
  static fromParseError(error: ParseError): CodedError {
    return new CodedError(error.code, error.message, { file: error.file });
  }
}

/** The structured-clone form of an error thrown in a worker. */
export interface WireError {
  readonly wireError: 1;
  readonly code: ErrorCode;
  readonly name: string;
  readonly message: string;
  readonly file?: string;
}

export function isWireError(v: unknown): v is WireError {
  if (typeof v !== 'object' || v === null) return false;
  const w = v as Partial<WireError>;
  return w.wireError === 1 && typeof w.code === 'string' && CODES.has(w.code) && typeof w.message === 'string' && typeof w.name === 'string';
}

function codeOf(e: unknown): ErrorCode {
  if (e instanceof CodedError) return e.code;
  const own = typeof e === 'object' && e !== null ? (e as { code?: unknown }).code : undefined;
  if (typeof own === 'string' && CODES.has(own)) return own as ErrorCode;
  if (e instanceof Error && e.name === 'AbortError') return 'aborted';
  if (e instanceof RangeError || e instanceof TypeError) return 'invalid-argument';
  return 'internal';
}

/** Any thrown value as a WireError (an Error's message and name kept; a CodedError's code and file too). */
export function toWireError(e: unknown): WireError {
  if (isWireError(e)) return e;
  const file = e instanceof CodedError ? e.file : undefined;
  const base = {
    wireError: 1 as const,
    code: codeOf(e),
    name: e instanceof Error ? e.name : 'Error',
    message: e instanceof Error ? e.message : String(e),
  };
  return file === undefined ? base : { ...base, file };
}

/** A value caught from a worker call as a CodedError (a WireError's fields restored; anything else coded from its class). */
export function fromWireError(e: unknown): CodedError {
  if (e instanceof CodedError) return e;
  const w = toWireError(e);
  return new CodedError(w.code, w.message, { name: w.name === 'CodedError' ? undefined : w.name, file: w.file });
}

type Api = Record<string, (...args: never[]) => unknown>;

/**
 * The worker side: the same API with every method's throw (or rejection) replaced by its WireError.
 * Workers expose `guardWorkerApi(api)`; the API's type is unchanged.
 */
export function guardWorkerApi<T extends Api>(api: T): T {
  const out: Record<string, unknown> = {};
  for (const [name, fn] of Object.entries(api)) {
    if (typeof fn !== 'function') {
      out[name] = fn;
      continue;
    }
    out[name] = (...args: never[]) => {
      try {
        const r = fn(...args);
        return r instanceof Promise ? r.catch((e: unknown) => Promise.reject(toWireError(e))) : r;
      } catch (e) {
        throw toWireError(e);
      }
    };
  }
  return out as T;
}

/** The bridge side: `remote.call(...).catch(rethrowFromWorker)` rejects with the worker's CodedError. */
export function rethrowFromWorker(e: unknown): never {
  throw fromWireError(e);
}
