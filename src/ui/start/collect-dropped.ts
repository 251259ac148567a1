/**
 * Collects File objects from a drop: plain files, and whole folders through the entries API
 * (webkitGetAsEntry), walking sub-folders. Files from folders keep their relative path in `name`-order.
 */
export async function filesFromDataTransfer(dt: DataTransfer): Promise<File[]> {
  const entries: FileSystemEntry[] = [];
  const loose: File[] = [];
  for (const item of Array.from(dt.items ?? [])) {
    if (item.kind !== 'file') continue;
    const entry = typeof item.webkitGetAsEntry === 'function' ? item.webkitGetAsEntry() : null;
    if (entry) entries.push(entry);
    else {
      const f = item.getAsFile();
      if (f) loose.push(f);
    }
  }
  if (entries.length === 0) return loose.length > 0 ? loose : Array.from(dt.files ?? []);
  const out: File[] = [...loose];
  const walk = async (entry: FileSystemEntry): Promise<void> => {
    if (entry.isFile) {
      const file = await new Promise<File>((resolve, reject) => (entry as FileSystemFileEntry).file(resolve, reject));
      // keep the folder path, as a folder picker gives it (webkitRelativePath), so a dropped BIDS dataset opens as a study
      const rel = entry.fullPath.replace(/^\//, '');
      if (rel.includes('/') && !file.webkitRelativePath) Object.defineProperty(file, 'webkitRelativePath', { value: rel });
      out.push(file);
    } else if (entry.isDirectory) {
      const reader = (entry as FileSystemDirectoryEntry).createReader();
      for (;;) {
        const batch = await new Promise<FileSystemEntry[]>((resolve, reject) => reader.readEntries(resolve, reject));
        if (batch.length === 0) break;
        for (const e of batch) await walk(e);
      }
    }
  };
  try {
    for (const e of entries) await walk(e);
  } catch {
    return Array.from(dt.files ?? []);
  }
  return out;
}
