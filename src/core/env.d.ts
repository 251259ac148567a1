/**
 * The host globals src/core uses, and only those. Core is type-checked with plain ES2022 and no DOM or
 * node types (tsconfig.core.json); every host it runs in (browser page, worker, node ≥ 20) provides these.
 * Only the members core calls are declared, so a new use of a host API fails the type check here first.
 */
export {};

declare global {
  /** Web Crypto input bytes. */
  type BufferSource = ArrayBufferView | ArrayBuffer;

  interface TextDecoderOptions {
    fatal?: boolean;
    ignoreBOM?: boolean;
  }
  interface TextDecoder {
    decode(input?: ArrayBufferView | ArrayBuffer, options?: { stream?: boolean }): string;
  }
  var TextDecoder: { new (label?: string, options?: TextDecoderOptions): TextDecoder };

  interface TextEncoder {
    encode(input?: string): Uint8Array<ArrayBuffer>;
  }
  var TextEncoder: { new (): TextEncoder };

  /** High-resolution clock, milliseconds. */
  var performance: { now(): number };

  var crypto: { readonly subtle: { digest(algorithm: string, data: BufferSource): Promise<ArrayBuffer> } };

  /** A Blob or File: core reads slices of it. */
  interface Blob {
    readonly size: number;
    slice(start?: number, end?: number): Blob;
    arrayBuffer(): Promise<ArrayBuffer>;
  }
}
