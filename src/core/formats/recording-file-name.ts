/**
 * Which file names Winnow treats as a recording: `.edf` and `.bdf`, plus `.rec` (an older extension of EDF
 * files, read as EDF: the reader decides EDF or BDF from the header bytes, not the name). Case-insensitive.
 * The one test every part uses (loader, worker, file sorting, demo files).
 */
export const RECORDING_EXTENSIONS = ['.edf', '.bdf', '.rec'] as const;

/** True when `name` (a path or base name) ends in .edf, .bdf or .rec, in any case. */
export function isRecordingFileName(name: string): boolean {
  const lower = name.toLowerCase();
  return RECORDING_EXTENSIONS.some((ext) => lower.endsWith(ext) && lower.length > ext.length);
}

/** The base name without its recording extension ("sub-01_eeg.EDF" → "sub-01_eeg"); other names unchanged. */
export function recordingStem(baseName: string): string {
  return isRecordingFileName(baseName) ? baseName.slice(0, -4) : baseName;
}
