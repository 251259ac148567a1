/**
 * Saves `blob` under `fileName` through a same-origin blob: URL (nothing leaves the machine). The URL is
 * revoked `revokeAfterMs` milliseconds later, once the browser has taken the download.
 */
export function saveBlob(blob: Blob, fileName: string, revokeAfterMs = 10_000): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), revokeAfterMs);
}

/** Saves bytes or text as a file of MIME `type` (see `saveBlob`). */
export function downloadBlob(data: BlobPart, fileName: string, type: string): void {
  saveBlob(new Blob([data], { type }), fileName);
}
