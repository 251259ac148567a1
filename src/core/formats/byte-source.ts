/**
 * Random-access bytes of one file. The same parser code reads a browser File/Blob (in a worker or on the
 * main thread), an in-memory Uint8Array or a Node file handle (src/cli/node-byte-source.ts) through it, so a
 * 500 MB recording is read in slices (a batch of data records at a time), never as one string or buffer.
 */
export interface ByteSource {
  /** File name as shown to the user (used as the first word of every error message). */
  readonly name: string;
  /** Size in bytes. */
  readonly size: number;
  /**
   * Reads `length` bytes starting at `offset`. Near the end of the file fewer bytes come back (possibly 0);
   * callers compare the returned length with what they asked for.
   */
  read(offset: number, length: number): Promise<Uint8Array>;
}

/** A ByteSource over bytes already in memory; `read` returns views (subarrays), not copies. */
export function bytesByteSource(bytes: Uint8Array, name: string): ByteSource {
  return {
    name,
    size: bytes.length,
    read(offset, length) {
      const start = Math.max(0, Math.min(bytes.length, Math.floor(offset)));
      const end = Math.max(start, Math.min(bytes.length, start + Math.max(0, Math.floor(length))));
      return Promise.resolve(bytes.subarray(start, end));
    },
  };
}

/**
 * A ByteSource over a Blob or File (browser main thread and workers alike): each read is
 * `blob.slice(offset, offset + length).arrayBuffer()`, so only the slice is held in memory.
 */
export function blobByteSource(blob: Blob, name?: string): ByteSource {
  const fileName = name ?? ((blob as Blob & { name?: unknown }).name as string | undefined) ?? 'recording';
  return {
    name: typeof fileName === 'string' ? fileName : 'recording',
    size: blob.size,
    async read(offset, length) {
      const start = Math.max(0, Math.min(blob.size, Math.floor(offset)));
      const end = Math.max(start, Math.min(blob.size, start + Math.max(0, Math.floor(length))));
      return new Uint8Array(await blob.slice(start, end).arrayBuffer());
    },
  };
}

/** Base name of a path or file name ("a/b/sub-01_eeg.edf" → "sub-01_eeg.edf"). */
export function byteSourceBaseName(name: string): string {
  const i = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'));
  return i >= 0 ? name.slice(i + 1) : name;
}
