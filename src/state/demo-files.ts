/**
 * The simulated demo participant (demo-data/sub-01/, written by `winnow simulate`), bundled by Vite:
 * recordings as asset URLs fetched from the page's own origin, text sidecars (TSV/JSON) as strings inside
 * the bundle — a data: URL would be refused by the Content-Security-Policy's connect-src 'self'.
 */
import { isRecordingFileName } from '../core/formats/recording-file-name.ts';

const binaryUrls = import.meta.glob('/demo-data/sub-01/**/*.{edf,bdf}', { query: '?url', import: 'default' }) as Record<string, () => Promise<string>>;
const textFiles = import.meta.glob('/demo-data/sub-01/**/*.{tsv,json,csv}', { query: '?raw', import: 'default' }) as Record<string, () => Promise<string>>;

const baseName = (path: string) => path.slice(path.lastIndexOf('/') + 1);

/**
 * The simulator also writes the ground truth beside the recording (the neural-only back-projection and the
 * true sources); those are for checking the method, not part of what a reviewer opens.
 */
const isGroundTruth = (path: string) => /(^|[_/-])(neural|truth)[^/]*$/i.test(baseName(path)) || /\/truth\//i.test(path);

/** Paths of the demo files (for the start screen and tests). */
export const demoFilePaths = (): string[] => [...Object.keys(binaryUrls), ...Object.keys(textFiles)].filter((p) => !isGroundTruth(p)).sort();

/** The demo files as File objects named as on disk (BIDS pairing works on names). */
export async function demoFiles(signal: AbortSignal): Promise<File[]> {
  const out: File[] = [];
  for (const [path, load] of Object.entries(binaryUrls)) {
    if (isGroundTruth(path)) continue;
    const url = await load();
    const res = await fetch(url, { signal });
    if (!res.ok) throw new Error(`${baseName(path)}: HTTP ${res.status}`);
    out.push(new File([await res.blob()], baseName(path)));
  }
  for (const [path, load] of Object.entries(textFiles)) {
    if (isGroundTruth(path)) continue;
    out.push(new File([await load()], baseName(path), { type: 'text/plain' }));
  }
  if (!out.some((f) => isRecordingFileName(f.name))) throw new Error('no demo recording was bundled (run `winnow simulate` into demo-data/sub-01/eeg/)');
  return out;
}
