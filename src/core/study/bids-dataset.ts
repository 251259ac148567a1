/**
 * A BIDS dataset seen as a list of relative file paths: which files are EEG recordings, their entities,
 * the sidecars that belong to each, and where Winnow's derivatives go. Pure string work, shared by
 * `winnow batch` (which lists the folder with node) and the browser (which lists a dropped folder).
 *
 * BIDS specification v1.10, "Common principles": file names are `key-value` entities joined by "_",
 * then a suffix and an extension; entity order sub, ses, task, acq, run, … ; EEG data live in
 * `sub-<label>/[ses-<label>/]eeg/`. Sidecars follow the inheritance principle: a metadata file applies to
 * every data file in its folder or below whose entities include all of its own (docs/methods.md §12).
 * Derivatives go under `derivatives/<pipeline>/` with the same folders and a `desc-<label>` entity.
 */

/** Entity keys in the order the specification writes them (appendix "Entity table"). */
export const ENTITY_ORDER = ['sub', 'ses', 'task', 'acq', 'run', 'proc', 'desc'] as const;

export interface BidsName {
  /** Entities in file order, e.g. { sub: '01', task: 'walk' }. */
  readonly entities: Readonly<Record<string, string>>;
  /** The suffix after the last entity, e.g. "eeg", "channels". */
  readonly suffix: string;
  /** Extension with its dot(s), lower case, e.g. ".edf", ".tsv", ".json". */
  readonly extension: string;
}

/** Parses a BIDS file name (no folders); null when it does not follow the entity pattern. */
export function parseBidsName(fileName: string): BidsName | null {
  const base = fileName.split('/').pop() ?? fileName;
  const dot = base.indexOf('.');
  if (dot <= 0) return null;
  const stemAndSuffix = base.slice(0, dot);
  const extension = base.slice(dot).toLowerCase();
  const parts = stemAndSuffix.split('_');
  const suffix = parts.pop() ?? '';
  if (!/^[a-zA-Z0-9]+$/.test(suffix) || suffix.includes('-')) return null;
  const entities: Record<string, string> = {};
  for (const p of parts) {
    const m = /^([a-zA-Z0-9]+)-([a-zA-Z0-9]+)$/.exec(p);
    if (!m) return null;
    entities[m[1]] = m[2];
  }
  return { entities, suffix, extension };
}

/** `sub-01_ses-a_task-walk_run-1` (entities in specification order; unknown keys after, as given). */
export function entityStem(entities: Readonly<Record<string, string>>): string {
  const known = ENTITY_ORDER.filter((k) => entities[k] !== undefined);
  const others = Object.keys(entities).filter((k) => !(ENTITY_ORDER as readonly string[]).includes(k));
  return [...known, ...others].map((k) => `${k}-${entities[k]}`).join('_');
}

/** EEG data extensions BIDS allows that Winnow reads (EDF and BDF; BIDS specification, EEG). */
const RECORDING_EXTENSIONS = new Set(['.edf', '.bdf']);

export interface DatasetRecording {
  /** Relative path from the dataset root, "/"-separated. */
  readonly path: string;
  readonly entities: Readonly<Record<string, string>>;
  /** The recording's entities without the `_eeg` suffix, e.g. "sub-01_task-walk_run-1". */
  readonly stem: string;
  /** Folder of the recording relative to the root, e.g. "sub-01/eeg" or "sub-01/ses-a/eeg". */
  readonly folder: string;
}

const isSkippedFolder = (first: string) => first === 'derivatives' || first === 'sourcedata' || first === 'code' || first.startsWith('.');

/** Every EEG recording of the dataset (sub-<label>/[ses-<label>/]eeg/<stem>_eeg.edf|bdf), sorted by path. */
export function findRecordings(paths: readonly string[]): DatasetRecording[] {
  const out: DatasetRecording[] = [];
  for (const raw of paths) {
    const path = raw.replace(/\\/g, '/').replace(/^\.\//, '');
    const parts = path.split('/');
    if (isSkippedFolder(parts[0])) continue;
    if (!/^sub-[a-zA-Z0-9]+$/.test(parts[0])) continue;
    const folderOk =
      (parts.length === 3 && parts[1] === 'eeg') || (parts.length === 4 && /^ses-[a-zA-Z0-9]+$/.test(parts[1]) && parts[2] === 'eeg');
    if (!folderOk) continue;
    const name = parseBidsName(parts[parts.length - 1]);
    if (!name || name.suffix !== 'eeg' || !RECORDING_EXTENSIONS.has(name.extension)) continue;
    if (name.entities.sub !== parts[0].slice(4)) continue;
    out.push({ path, entities: name.entities, stem: entityStem(name.entities), folder: parts.slice(0, -1).join('/') });
  }
  return out.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
}

/**
 * The sidecar with `suffix` + `extension` (e.g. "channels", ".tsv") that applies to a recording under the
 * inheritance principle: candidates in the recording's folder or any parent folder up to the root, whose
 * entities are all among the recording's; the most specific wins (deepest folder, then most entities).
 */
export function sidecarFor(recording: DatasetRecording, suffix: string, extension: string, paths: readonly string[]): string | null {
  let best: { path: string; depth: number; n: number } | null = null;
  const folderParts = recording.folder.split('/');
  for (const raw of paths) {
    const path = raw.replace(/\\/g, '/').replace(/^\.\//, '');
    const parts = path.split('/');
    const folder = parts.slice(0, -1);
    if (folder.length > folderParts.length || folder.some((f, i) => f !== folderParts[i])) continue;
    const name = parseBidsName(parts[parts.length - 1]);
    if (!name || name.suffix !== suffix || name.extension !== extension) continue;
    const keys = Object.keys(name.entities);
    if (!keys.every((k) => recording.entities[k] === name.entities[k])) continue;
    const cand = { path, depth: folder.length, n: keys.length };
    if (!best || cand.depth > best.depth || (cand.depth === best.depth && cand.n > best.n)) best = cand;
  }
  return best?.path ?? null;
}

/** `sub-01/[ses-a/]eeg/<stem>_desc-<desc>_<suffix><extension>` under a derivative folder. */
export function derivativePath(recording: DatasetRecording, desc: string, suffix: string, extension: string): string {
  return `${recording.folder}/${recording.stem}_desc-${desc}_${suffix}${extension}`;
}

/** BIDS derivative dataset_description.json (specification, "Derived dataset and pipeline description"). */
export function derivativeDescription(name: string, version: string, description: string): string {
  return (
    JSON.stringify(
      {
        Name: name,
        BIDSVersion: '1.10.0',
        DatasetType: 'derivative',
        GeneratedBy: [{ Name: 'winnow', Version: version, Description: description }],
      },
      null,
      2,
    ) + '\n'
  );
}

/** Participant labels given with or without the "sub-" prefix (BIDS Apps convention: without). */
export function normaliseParticipantLabel(label: string): string {
  return label.startsWith('sub-') ? label.slice(4) : label;
}
