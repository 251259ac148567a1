/**
 * The study: a BIDS dataset opened as a folder (or the simulated demo study), one row per recording,
 * moving into any participant's review and back (issue 11). A store of its own beside the workbench
 * store: the workbench holds the one participant under review; this holds the study around it.
 *
 * What each recording's review looked like when the reviewer last left it (its decisions file and the
 * components' variance shares) is kept in localStorage under the dataset's name, written through at once,
 * so the overview survives a reload; the participant's own review autosaves as always (keyed by the
 * recording's and decomposition's hashes). Recordings are read only when opened — never all at once.
 *
 * A batch run's outputs under derivatives/winnow/ are picked up when a participant is opened: its
 * decomposition, and its evidence when that file is evidence of the very recording and decomposition loaded
 * (core/study/batch-evidence.ts: format version and both SHA-256 hashes match); a file that does not match is
 * ignored with a notice naming it and why, and the evidence is computed as usual.
 */
import { createStore } from 'zustand/vanilla';
import { findRecordings, parseBidsName, sidecarFor, type DatasetRecording } from '../core/study/bids-dataset.ts';
import { studyRows, type StudyRow } from '../core/study/study-overview.ts';
import { studyExportFiles, type ExportedFile } from '../core/study/study-export.ts';
import { zipStore } from '../core/study/zip.ts';
import { parseDecisionsJson, type DecisionsFile, type ReviewDecision } from '../core/review/decisions-file.ts';
import { buildAdjudicatedFile, disagreements, type Disagreement } from '../core/review/adjudication.ts';
import { agreementByKey, type KeyedAgreement } from '../core/review/kappa.ts';
import { REASON_CODES, VERDICTS } from '../core/review/vocabulary.ts';
import { readEdfLayout } from '../core/formats/edf-header.ts';
import { parseEvidenceJson } from '../core/formats/evidence-file.ts';
import { matchBatchEvidence } from '../core/study/batch-evidence.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import type { ReuseEvidenceInput } from './types.ts';
import { blobByteSource } from '../core/formats/byte-source.ts';
import { workbenchStore } from './store.ts';
import { decisionsFileFromState, SOFTWARE } from './exports.ts';
import { version } from '../../package.json';

/** A file of the dataset with its path relative to the dataset root ("/"-separated). */
export interface DatasetFile {
  readonly path: string;
  readonly file: File;
}

export interface RecordingReview {
  readonly decisions: DecisionsFile;
  /** Variance share per component (index − 1), when evidence was computed. */
  readonly varianceShares: readonly number[] | null;
}

export interface RecordingHeader {
  readonly channels: number | null;
  readonly seconds: number | null;
  /** The header's fault, when it cannot be read (the recording stays listed). */
  readonly error: string | null;
}

export interface SecondReviewer {
  readonly name: string;
  /** Decisions of the second reviewer, by recording path. */
  readonly byPath: Readonly<Record<string, DecisionsFile>>;
  /** Imported files that match no recording of the study (name: why). */
  readonly unmatched: readonly string[];
}

export interface RecordingAgreement {
  readonly path: string;
  readonly verdicts: KeyedAgreement;
  readonly reasons: KeyedAgreement;
  readonly disagreements: readonly Disagreement[];
}

/** Evidence loaded from a batch run's file instead of computed (shown in the recording summary). */
export interface BatchEvidence {
  /** The recording (path in the dataset) it was loaded for. */
  readonly path: string;
  /** The evidence file, relative to the dataset root. */
  readonly file: string;
  /** When the batch run wrote it (the file's modification time), "2026-12-02 21:30 UTC". */
  readonly date: string;
  /** The evidence handed to the workbench (the summary names the batch run only while it is still this one). */
  readonly evidence: readonly ComponentEvidence[];
}

export interface StudyState {
  /** Dataset name (dataset_description.json Name, else the folder's name); null when no study is open. */
  name: string | null;
  files: readonly DatasetFile[];
  recordings: readonly DatasetRecording[];
  /** The recording under review (path), or null on the overview. */
  current: string | null;
  reviews: Readonly<Record<string, RecordingReview>>;
  /** Header facts per recording path, read lazily one file at a time after the study opens (headers only). */
  headers: Readonly<Record<string, RecordingHeader>>;
  second: SecondReviewer | null;
  /** Adjudicated decisions by recording path and component index. */
  adjudicated: Readonly<Record<string, Readonly<Record<number, ReviewDecision>>>>;
  message: string | null;
  /** Evidence of the current recording loaded from a batch run's file, or null. */
  batchEvidence: BatchEvidence | null;
  /** Why a batch run's evidence file of the current recording was ignored (it names the file), or null. */
  batchEvidenceNotice: { readonly path: string; readonly text: string } | null;

  openFolder: (files: readonly File[]) => Promise<void>;
  /** Opens files already placed in the dataset (paths relative to its root). */
  openDataset: (files: readonly DatasetFile[], root: string) => Promise<void>;
  openDemoStudy: () => Promise<void>;
  openRecording: (path: string, component?: number) => Promise<void>;
  /** Stores the workbench's current review under the current recording and shows the overview. */
  backToStudy: () => void;
  importSecondReviewer: (files: readonly File[]) => Promise<void>;
  adjudicate: (path: string, index: number, decision: ReviewDecision) => void;
  closeStudy: () => void;
}

const STORAGE_PREFIX = 'winnow-study:';

function storageKey(name: string): string {
  return `${STORAGE_PREFIX}${name}`;
}

function loadSaved(name: string): { reviews: Record<string, RecordingReview>; adjudicated: Record<string, Record<number, ReviewDecision>> } {
  try {
    const raw = globalThis.localStorage?.getItem(storageKey(name));
    if (!raw) return { reviews: {}, adjudicated: {} };
    const v = JSON.parse(raw) as { reviews?: Record<string, RecordingReview>; adjudicated?: Record<string, Record<number, ReviewDecision>> };
    const reviews: Record<string, RecordingReview> = {};
    for (const [path, r] of Object.entries(v.reviews ?? {})) {
      const parsed = parseDecisionsJson(JSON.stringify(r.decisions), path);
      if (parsed.ok) reviews[path] = { decisions: parsed.value, varianceShares: Array.isArray(r.varianceShares) ? r.varianceShares : null };
    }
    return { reviews, adjudicated: v.adjudicated ?? {} };
  } catch {
    return { reviews: {}, adjudicated: {} };
  }
}

function save(s: Pick<StudyState, 'name' | 'reviews' | 'adjudicated'>): string | null {
  if (!s.name) return null;
  try {
    globalThis.localStorage?.setItem(storageKey(s.name), JSON.stringify({ reviews: s.reviews, adjudicated: s.adjudicated }));
    return null;
  } catch (e) {
    return `The study overview could not be saved in this browser (${(e as Error)?.name ?? 'storage error'}); export the study to keep it.`;
  }
}

/** Strips the dropped/picked folder's own name from webkitRelativePath ("ds/sub-01/…" → "sub-01/…"). */
export function datasetFiles(files: readonly File[]): { root: string; files: DatasetFile[] } {
  const rel = files.map((f) => ((f as File & { webkitRelativePath?: string }).webkitRelativePath || f.name).replace(/\\/g, '/'));
  const firsts = new Set(rel.map((p) => (p.includes('/') ? p.split('/')[0] : '')));
  const strip = firsts.size === 1 && !firsts.has('') && !rel.some((p) => p.split('/')[0] === p) ? [...firsts][0] : '';
  return {
    root: strip,
    files: files.map((file, i) => ({ path: strip ? rel[i].slice(strip.length + 1) : rel[i], file })),
  };
}

async function datasetName(files: readonly DatasetFile[], fallback: string): Promise<string> {
  const desc = files.find((f) => f.path === 'dataset_description.json');
  if (desc) {
    try {
      const v = JSON.parse(await desc.file.text()) as { Name?: unknown };
      if (typeof v.Name === 'string' && v.Name.trim()) return v.Name.trim();
    } catch {
      // unreadable description: the folder's name
    }
  }
  return fallback || 'study';
}

/** Decisions files a previous export left under derivatives/winnow/, matched to recordings by entities. */
async function derivativeDecisions(files: readonly DatasetFile[], recordings: readonly DatasetRecording[]): Promise<Record<string, RecordingReview>> {
  const out: Record<string, RecordingReview> = {};
  for (const rec of recordings) {
    const want = `derivatives/winnow/${rec.folder}/${rec.stem}_desc-winnow_decisions.json`;
    const f = files.find((x) => x.path === want);
    if (!f) continue;
    const parsed = parseDecisionsJson(await f.file.text(), f.path);
    if (parsed.ok) out[rec.path] = { decisions: parsed.value, varianceShares: null };
  }
  return out;
}

/** A file time as "2026-12-02 21:30 UTC". */
const utcMinute = (ms: number) => `${new Date(ms).toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/**
 * Reads a batch run's evidence file and checks it against the loaded recording and decomposition
 * (core/study/batch-evidence.ts): the evidence and its date when it matches, else a notice naming the file
 * and why it was not used.
 */
export async function readBatchEvidence(
  file: Blob & { lastModified?: number },
  path: string,
  loaded: ReuseEvidenceInput,
): Promise<{ ok: true; evidence: ComponentEvidence[]; date: string } | { ok: false; notice: string }> {
  const ignored = (why: string) => ({ ok: false as const, notice: `${path} was not used (${why}); the evidence is computed here instead.` });
  let text: string;
  try {
    text = await file.text();
  } catch (e) {
    return ignored(`it could not be read: ${(e as Error)?.message ?? String(e)}`);
  }
  const parsed = parseEvidenceJson(text, path);
  if (!parsed.ok) return ignored(parsed.error.message.startsWith(`${path}: `) ? parsed.error.message.slice(path.length + 2) : parsed.error.message);
  const matched = matchBatchEvidence(parsed.value, {
    recordingSha256: loaded.recordingSha256,
    decompositionSha256: loaded.decompositionSha256,
    nComponents: loaded.decomposition.nComponents,
    channels: loaded.decomposition.channels,
    sampleRate: loaded.recording.signals.sampleRate,
  });
  if (!matched.ok) return ignored(matched.why);
  return { ok: true, evidence: matched.evidence, date: utcMinute(file.lastModified ?? Date.now()) };
}

export const studyStore = createStore<StudyState>()((set, get) => ({
  name: null,
  files: [],
  recordings: [],
  current: null,
  reviews: {},
  headers: {},
  second: null,
  adjudicated: {},
  message: null,
  batchEvidence: null,
  batchEvidenceNotice: null,

  openFolder: async (picked) => {
    const { root, files } = datasetFiles(picked);
    await get().openDataset(files, root);
  },

  openDataset: async (files, root) => {
    const recordings = findRecordings(files.map((f) => f.path));
    if (recordings.length === 0) {
      set({ message: `${root || 'The folder'}: no EEG recordings found (BIDS: sub-<label>/[ses-<label>/]eeg/*_eeg.edf or .bdf)` });
      return;
    }
    const name = await datasetName(files, root);
    const saved = loadSaved(name);
    const fromDerivatives = await derivativeDecisions(files, recordings);
    set({ name, files, recordings, current: null, reviews: { ...fromDerivatives, ...saved.reviews }, headers: {}, adjudicated: saved.adjudicated, second: null, message: null });
    workbenchStore.getState().setScreen('study');
    // headers only, one recording at a time, never all recordings' samples
    const byPath = new Map(files.map((f) => [f.path, f.file]));
    for (const rec of recordings) {
      if (get().name !== name) return;
      const file = byPath.get(rec.path);
      if (!file) continue;
      const res = await readEdfLayout(blobByteSource(file, rec.path));
      const header: RecordingHeader = res.ok
        ? {
            channels: res.value.channels.filter((c) => c.unit === 'uV').length,
            seconds: res.value.layout.records * res.value.layout.recordDurationSeconds,
            error: null,
          }
        : { channels: null, seconds: null, error: res.error.message };
      set((s) => ({ headers: { ...s.headers, [rec.path]: header } }));
    }
  },

  openDemoStudy: async () => {
    set({ message: 'Simulating the demo study…' });
    const { demoStudyFiles } = await import('./demo-study.ts');
    const files = await demoStudyFiles();
    await get().openDataset(files, 'demo-study');
  },

  openRecording: async (path, component) => {
    const s = get();
    const rec = s.recordings.find((r) => r.path === path);
    if (!rec) return;
    if (s.current !== null && s.current !== path) get().backToStudy();
    const paths = s.files.map((f) => f.path);
    const byPath = new Map(s.files.map((f) => [f.path, f.file]));
    const recordingFiles: File[] = [byPath.get(rec.path) as File];
    for (const [suffix, ext] of [['channels', '.tsv'], ['electrodes', '.tsv'], ['coordsystem', '.json'], ['events', '.tsv'], ['events', '.json'], ['eeg', '.json']] as const) {
      const p = sidecarFor(rec, suffix, ext, paths.filter((x) => !x.startsWith('derivatives/')));
      const f = p ? byPath.get(p) : undefined;
      // the workbench pairs sidecars by name: give each the recording's own stem so pairing is unambiguous
      if (f) recordingFiles.push(new File([f], `${rec.stem}_${suffix}${ext}`, { type: f.type }));
    }
    const decompositionPath = `derivatives/winnow/${rec.folder}/${rec.stem}_desc-winnow_decomposition.json`;
    const decomposition = byPath.get(decompositionPath);
    const evidencePath = `derivatives/winnow/${rec.folder}/${rec.stem}_desc-winnow_evidence.json`;
    const evidenceFile = decomposition ? byPath.get(evidencePath) : undefined;
    const reuseEvidence = evidenceFile
      ? async (loaded: ReuseEvidenceInput) => {
          const r = await readBatchEvidence(evidenceFile, evidencePath, loaded);
          if (get().current !== path) return null; // another recording was opened meanwhile
          if (!r.ok) {
            set({ batchEvidenceNotice: { path, text: r.notice } });
            workbenchStore.getState().setNotice({ kind: 'info', text: r.notice });
            return null;
          }
          set({ batchEvidence: { path, file: evidencePath, date: r.date, evidence: r.evidence } });
          return r.evidence;
        }
      : undefined;
    const review = s.reviews[path];
    const decisionsFile = review ? new File([JSON.stringify(review.decisions)], `${rec.stem}_desc-winnow_decisions.json`, { type: 'application/json' }) : null;
    set({ current: path, message: null, batchEvidence: null, batchEvidenceNotice: null });
    await workbenchStore.getState().loadParticipant({
      recordingFiles,
      decompositionFiles: decomposition ? [decomposition] : undefined,
      decisionsFile,
      ...(reuseEvidence ? { reuseEvidence } : {}),
    });
    if (component !== undefined) {
      workbenchStore.getState().select(component);
      workbenchStore.getState().setScreen('focus');
    }
  },

  backToStudy: () => {
    const s = get();
    const w = workbenchStore.getState();
    if (s.current !== null) {
      const decisions = decisionsFileFromState(w);
      if (decisions) {
        const varianceShares = w.evidence ? w.evidence.map((e) => e.varianceShare) : null;
        const reviews = { ...s.reviews, [s.current]: { decisions, varianceShares } };
        const failed = save({ name: s.name, reviews, adjudicated: s.adjudicated });
        set({ reviews, message: failed });
      }
    }
    set({ current: null });
    w.setScreen('study');
  },

  importSecondReviewer: async (picked) => {
    const s = get();
    const byPath: Record<string, DecisionsFile> = {};
    const unmatched: string[] = [];
    for (const f of picked) {
      const rel = ((f as File & { webkitRelativePath?: string }).webkitRelativePath || f.name).replace(/\\/g, '/');
      if (!/_decisions\.json$/i.test(rel)) continue;
      const parsed = parseDecisionsJson(await f.text(), f.name);
      if (!parsed.ok) {
        unmatched.push(`${f.name}: ${parsed.error.message}`);
        continue;
      }
      // match by the recording hash when this study knows it, else by the BIDS entities of the file name
      const byHash = Object.entries(s.reviews).find(([, r]) => r.decisions.recordingSha256 === parsed.value.recordingSha256)?.[0];
      const name = parseBidsName(rel.split('/').pop() ?? rel);
      const stem = name ? Object.entries(name.entities).filter(([k]) => k !== 'desc').map(([k, v]) => `${k}-${v}`).join('_') : '';
      const byName = s.recordings.find((r) => r.stem === stem)?.path;
      const path = byHash ?? byName;
      if (!path) unmatched.push(`${f.name}: matches no recording of this study`);
      else byPath[path] = parsed.value;
    }
    const n = Object.keys(byPath).length;
    set({
      second: { name: n > 0 ? Object.values(byPath)[0].reviewer || 'second reviewer' : 'second reviewer', byPath, unmatched },
      message: n === 0 ? 'No decisions file of the second reviewer matched a recording of this study.' : null,
    });
  },

  adjudicate: (path, index, decision) => {
    const s = get();
    const adjudicated = { ...s.adjudicated, [path]: { ...(s.adjudicated[path] ?? {}), [index]: decision } };
    set({ adjudicated, message: save({ name: s.name, reviews: s.reviews, adjudicated }) });
  },

  closeStudy: () => {
    set({ name: null, files: [], recordings: [], current: null, reviews: {}, headers: {}, second: null, adjudicated: {}, message: null, batchEvidence: null, batchEvidenceNotice: null });
    workbenchStore.getState().setScreen('start');
  },
}));

/** A readable key of a recording for tables and flags: "sub-01 ses-a task-walk run-1". */
export const recordingKey = (r: DatasetRecording) => r.stem.replace(/_/g, ' ');

/** The overview rows: every recording, reviewed or not, with flags against the study. */
export function selectStudyRows(s: Pick<StudyState, 'recordings' | 'reviews'>): (StudyRow & { path: string })[] {
  const rows = studyRows(
    s.recordings.map((r) => {
      const review = s.reviews[r.path];
      return {
        key: recordingKey(r),
        components: review ? review.decisions.components.length : null,
        decisions: review?.decisions ?? null,
        varianceShare: review?.varianceShares ? (i: number) => review.varianceShares?.[i - 1] ?? null : undefined,
      };
    }),
  );
  return rows.map((row, i) => ({ ...row, path: s.recordings[i].path }));
}

/** Agreement with the second reviewer per recording (both reviewed, same recording and decomposition), and pooled. */
export function selectAgreement(s: Pick<StudyState, 'reviews' | 'second'>): { perRecording: RecordingAgreement[]; pooled: { verdicts: KeyedAgreement<string>; reasons: KeyedAgreement<string> } | null; problems: string[] } {
  const perRecording: RecordingAgreement[] = [];
  const problems: string[] = [];
  const pooledV: { key: string; a: string; b: string }[] = [];
  const pooledR: { key: string; a: string; b: string }[] = [];
  for (const [path, other] of Object.entries(s.second?.byPath ?? {})) {
    const mine = s.reviews[path]?.decisions;
    if (!mine) {
      problems.push(`${path}: not reviewed here yet`);
      continue;
    }
    if (mine.recordingSha256 !== other.recordingSha256 || mine.decompositionSha256 !== other.decompositionSha256) {
      problems.push(`${path}: the second reviewer's file is for another ${mine.recordingSha256 !== other.recordingSha256 ? 'recording' : 'decomposition'} (hashes differ)`);
      continue;
    }
    const indices = [...new Set([...mine.components.map((c) => c.index), ...other.components.map((c) => c.index)])].sort((a, b) => a - b);
    const v = (f: DecisionsFile, i: number) => f.components.find((c) => c.index === i)?.verdict ?? 'undecided';
    const r = (f: DecisionsFile, i: number) => f.components.find((c) => c.index === i)?.reason ?? 'none';
    const vp = indices.map((i) => ({ key: i, a: v(mine, i), b: v(other, i) }));
    const rp = indices.filter((i) => v(mine, i) === 'remove' && v(other, i) === 'remove').map((i) => ({ key: i, a: r(mine, i), b: r(other, i) }));
    perRecording.push({
      path,
      verdicts: agreementByKey(vp, VERDICTS),
      reasons: agreementByKey(rp, [...REASON_CODES, 'none']),
      disagreements: disagreements(mine, other),
    });
    for (const p of vp) pooledV.push({ ...p, key: `${path}#${p.key}` });
    for (const p of rp) pooledR.push({ ...p, key: `${path}#${p.key}` });
  }
  const pooled = perRecording.length > 0 ? { verdicts: agreementByKey(pooledV, VERDICTS), reasons: agreementByKey(pooledR, [...REASON_CODES, 'none']) } : null;
  return { perRecording, pooled, problems };
}

/** Every file of the study export: decisions per reviewed recording, adjudicated files where a second reviewer was compared. */
export function studyExport(s: Pick<StudyState, 'recordings' | 'reviews' | 'second' | 'adjudicated' | 'reviews'>, reviewer: string, now = new Date().toISOString()): ExportedFile[] {
  const entries = s.recordings.filter((r) => s.reviews[r.path]).map((r) => ({ recording: r, decisions: s.reviews[r.path].decisions }));
  const files = studyExportFiles(entries, version);
  for (const r of s.recordings) {
    const mine = s.reviews[r.path]?.decisions;
    const other = s.second?.byPath[r.path];
    if (!mine || !other || mine.recordingSha256 !== other.recordingSha256 || mine.decompositionSha256 !== other.decompositionSha256) continue;
    const adj = buildAdjudicatedFile(mine, other, s.adjudicated[r.path] ?? {}, { reviewer, createdAt: now, software: SOFTWARE });
    files.push({ path: `derivatives/winnow/${r.folder}/${r.stem}_desc-adjudicated_decisions.json`, text: `${JSON.stringify(adj, null, 2)}\n` });
  }
  return files;
}

/** The study export as one zip (paths relative to the dataset root). */
export function studyZip(files: readonly ExportedFile[]): Uint8Array {
  return zipStore(files.map((f) => ({ path: f.path, data: f.text })));
}
