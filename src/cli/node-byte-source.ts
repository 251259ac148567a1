/**
 * ByteSource over a Node file handle: each read is one positioned `FileHandle.read`, so a large recording is
 * read slice by slice and never held whole in memory.
 */
import { open } from 'node:fs/promises';
import type { ByteSource } from '../core/formats/byte-source.ts';

/** Opens `path` for reading; call `close()` when done. Rejects (ENOENT, EISDIR, …) when it cannot be opened. */
export async function openFileByteSource(path: string): Promise<ByteSource & { close(): Promise<void> }> {
  const handle = await open(path, 'r');
  let size: number;
  try {
    const st = await handle.stat();
    if (st.isDirectory()) throw Object.assign(new Error(`EISDIR: illegal operation on a directory, open '${path}'`), { code: 'EISDIR' });
    size = st.size;
  } catch (e) {
    await handle.close();
    throw e;
  }
  return {
    name: path,
    size,
    async read(offset: number, length: number): Promise<Uint8Array> {
      const start = Math.max(0, Math.min(size, Math.floor(offset)));
      const want = Math.max(0, Math.min(size - start, Math.floor(length)));
      const buf = new Uint8Array(want);
      let got = 0;
      while (got < want) {
        const { bytesRead } = await handle.read(buf, got, want - got, start + got);
        if (bytesRead === 0) break;
        got += bytesRead;
      }
      return got === want ? buf : buf.subarray(0, got);
    },
    close: () => handle.close(),
  };
}
