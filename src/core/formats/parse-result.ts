/**
 * Parsers never throw for bad input: they return a ParseResult. A thrown error loses its class and fields
 * when it crosses a worker boundary; a returned object keeps them.
 */
export type ParseErrorCode =
  | 'too-short'
  | 'bad-version'
  | 'bad-number'
  | 'header-size-mismatch'
  | 'no-signals'
  | 'bad-scaling'
  | 'truncated-record'
  | 'record-size-mismatch'
  | 'bad-tal'
  | 'bad-tsv'
  | 'missing-column'
  | 'row-count-mismatch'
  | 'bad-value'
  | 'bad-shape'
  | 'unknown-channel'
  | 'unsupported'
  | 'io';

export interface ParseError {
  readonly code: ParseErrorCode;
  /** Names the file and the fault in the file's own terms, e.g. "header says 12 data records … but the file holds 11". */
  readonly message: string;
  /** The file the fault is in, when known. */
  readonly file?: string;
  /** Where in the file, when known. */
  readonly byteOffset?: number;
  readonly line?: number;
}

export type ParseResult<T> =
  | { readonly ok: true; readonly value: T; readonly warnings: string[] }
  | { readonly ok: false; readonly error: ParseError };

export const parseOk = <T>(value: T, warnings: string[] = []): ParseResult<T> => ({ ok: true, value, warnings });
export const parseFail = <T = never>(error: ParseError): ParseResult<T> => ({ ok: false, error });
