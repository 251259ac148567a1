/**
 * Sorts the files a user dropped or picked into the recording (with its BIDS sidecars), a decomposition
 * and a decisions file, by name and extension alone (the parsers judge the content later).
 */
import { isRecordingFileName } from '../core/formats/recording-file-name.ts';

export interface SortedFiles<F extends { readonly name: string }> {
  readonly recordingFiles: F[];
  readonly decompositionFiles: F[];
  readonly decisionsFile: F | null;
  /** Files that are none of the above (shown to the user, not read). */
  readonly ignored: F[];
}

const SIDECAR = /_(channels|electrodes|events)\.tsv$|_(coordsystem|eeg|events|channels|electrodes)\.json$|^(channels|electrodes|events)\.tsv$|^(coordsystem|eeg)\.json$/i;
const DECISIONS = /decisions?[^/]*\.(json|tsv)$/i;
const DECOMPOSITION = /(decomposition|mixing|unmixing|weights|ica)[^/]*\.(json|tsv|csv|txt)$|\.csv$/i;

const baseName = (name: string) => name.slice(Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\')) + 1);

export function sortParticipantFiles<F extends { readonly name: string }>(files: readonly F[]): SortedFiles<F> {
  const recordingFiles: F[] = [];
  const decompositionFiles: F[] = [];
  const ignored: F[] = [];
  let decisionsFile: F | null = null;
  for (const f of files) {
    const name = baseName(f.name);
    if (isRecordingFileName(name) || SIDECAR.test(name)) recordingFiles.push(f);
    else if (DECISIONS.test(name)) decisionsFile ??= f;
    else if (DECOMPOSITION.test(name)) decompositionFiles.push(f);
    else ignored.push(f);
  }
  return { recordingFiles, decompositionFiles, decisionsFile, ignored };
}

/** True when at least one file is a recording (EDF/BDF). */
export const hasRecording = (files: readonly { readonly name: string }[]) => files.some((f) => isRecordingFileName(baseName(f.name)));

/** The decomposition file to read among several, and how: our JSON, or a matrix of the kind its name says. */
export function sortDecompositionFiles<F extends { readonly name: string }>(
  files: readonly F[],
): { file: F; kind: 'json' | 'mixing' | 'unmixing' } | null {
  const json = files.find((f) => /\.json$/i.test(f.name));
  if (json) return { file: json, kind: 'json' };
  const matrix = files.find((f) => /\.(tsv|csv|txt)$/i.test(f.name));
  if (!matrix) return null;
  const name = baseName(matrix.name).toLowerCase();
  // "mixing"/"maps"/"topographies" name scalp maps (columns of A); anything else is read as unmixing weights.
  const kind = /(^|[^n])mixing|maps|topograph/.test(name) && !/unmixing/.test(name) ? 'mixing' : 'unmixing';
  return { file: matrix, kind };
}
