/**
 * Atomic file writes: the data go to a temporary file in the same directory, are flushed to disk (fsync),
 * and the temporary file is then renamed over the target. A reader never sees a half-written file, and a
 * crash leaves the old file in place (rename within one directory is atomic on POSIX file systems).
 */
import { open, rename, unlink } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

/** Writes `data` (bytes, or text as UTF-8) to `path` atomically. */
export async function writeFileAtomic(path: string, data: Uint8Array | string): Promise<void> {
  await writeFileAtomicChunks(path, [typeof data === 'string' ? new TextEncoder().encode(data) : data]);
}

/** Writes the chunks in order to `path` atomically (for large outputs produced piece by piece). */
export async function writeFileAtomicChunks(
  path: string,
  chunks: Iterable<Uint8Array> | AsyncIterable<Uint8Array>,
): Promise<void> {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 8)}.tmp`);
  const handle = await open(tmp, 'wx');
  let done = false;
  try {
    for await (const chunk of chunks) {
      let off = 0;
      while (off < chunk.length) {
        const { bytesWritten } = await handle.write(chunk, off, chunk.length - off);
        off += bytesWritten;
      }
    }
    await handle.sync();
    await handle.close();
    await rename(tmp, path);
    done = true;
  } finally {
    if (!done) {
      await handle.close().catch(() => undefined);
      await unlink(tmp).catch(() => undefined);
    }
  }
}
