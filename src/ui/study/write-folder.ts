/**
 * Writes the study export into the dataset folder the reviewer picks, through the File System Access API
 * (WICG specification; Chromium-based browsers). Each file goes through a FileSystemWritableFileStream,
 * which writes to a temporary file and replaces the target only on close() — an atomic write, so a crash
 * never leaves half a decisions file. Browsers without the API use the zip download instead.
 */
import type { ExportedFile } from '../../core/study/study-export.ts';

interface DirHandle {
  getDirectoryHandle(name: string, o?: { create?: boolean }): Promise<DirHandle>;
  getFileHandle(name: string, o?: { create?: boolean }): Promise<{ createWritable(): Promise<{ write(data: string): Promise<void>; close(): Promise<void> }> }>;
}

export async function writeIntoDatasetFolder(files: readonly ExportedFile[]): Promise<number> {
  const picker = (window as unknown as { showDirectoryPicker: (o: { mode: 'readwrite' }) => Promise<DirHandle> }).showDirectoryPicker;
  const root = await picker({ mode: 'readwrite' });
  let n = 0;
  for (const f of files) {
    const parts = f.path.split('/');
    let dir = root;
    for (const p of parts.slice(0, -1)) dir = await dir.getDirectoryHandle(p, { create: true });
    const handle = await dir.getFileHandle(parts[parts.length - 1], { create: true });
    const w = await handle.createWritable();
    await w.write(f.text);
    await w.close();
    n++;
  }
  return n;
}
