/**
 * Browser implementation of the workbench services: recording parsing and cleaned export in the recording
 * worker, decomposition and evidence through their bridge clients (loaded on first use), the demo files
 * bundled by Vite, and IndexedDB for autosave.
 */
import { parseDecompositionJson, parseMatrixTsv, matchDecompositionToRecording, serializeDecomposition } from '../core/formats/decomposition-file.ts';
import { sha256Hex } from '../core/formats/sha256.ts';
import { readRecordingInWorker, writeCleanedInWorker } from '../bridge/recording-client.ts';

import { demoFiles } from './demo-files.ts';
import { openReviewDb, type ReviewDb } from './review-db.ts';
import { sortDecompositionFiles, sortParticipantFiles } from './participant-files.ts';
import type { WorkbenchServices } from './services.ts';
import type { DecomposeOptions } from './types.ts';
import type { LoadedRecording } from '../core/recording.ts';
import type { Decomposition } from '../core/decomposition.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import type { Aim } from '../core/review/vocabulary.ts';

// Bridges written alongside this file; globbed so the page still builds while one is missing.
const bridges = import.meta.glob('../bridge/{decomposition,evidence}-client.ts');
async function loadBridge(name: 'decomposition' | 'evidence'): Promise<unknown> {
  const load = bridges[`../bridge/${name}-client.ts`];
  if (!load) throw new Error(`The ${name} engine is not available in this build.`);
  return load();
}
interface DecompositionBridge {
  runDecomposition: (recording: LoadedRecording, recordingSha256: string, options: DecomposeOptions, signal: AbortSignal, onProgress: (f: number) => void) => Promise<Decomposition>;
}
interface EvidenceBridge {
  computeEvidenceForRecording: (recording: LoadedRecording, decomposition: Decomposition, aim: Aim, signal: AbortSignal, onProgress: (f: number) => void) => Promise<ComponentEvidence[]>;
}

let db: Promise<ReviewDb> | null = null;
const reviewDb = () => (db ??= openReviewDb());

const encoder = new TextEncoder();

export const browserServices: WorkbenchServices = {
  async readRecording(files, signal, onProgress) {
    const result = await readRecordingInWorker(files, signal, onProgress);
    if (!result.ok) throw new Error(result.error.message);
    return { recording: result.recording, sha256: result.sha256 };
  },

  async readDecomposition(files, recording, _recordingSha256, signal) {
    const pick = sortDecompositionFiles(files);
    if (!pick) throw new Error(`No decomposition among ${files.map((f) => f.name).join(', ')}`);
    const bytes = new Uint8Array(await pick.file.arrayBuffer());
    signal.throwIfAborted();
    const text = new TextDecoder().decode(bytes);
    const parsed = pick.kind === 'json' ? parseDecompositionJson(text, pick.file.name) : parseMatrixTsv(text, pick.file.name, pick.kind);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const matched = matchDecompositionToRecording(parsed.value, recording.signals.labels, pick.file.name);
    if (!matched.ok) throw new Error(matched.error.message);
    return { decomposition: matched.value, sha256: await sha256Hex(bytes) };
  },

  async computeDecomposition(recording, recordingSha256, options, signal, onProgress) {
    const { runDecomposition } = (await loadBridge('decomposition')) as DecompositionBridge;
    const decomposition = await runDecomposition(recording, recordingSha256, options, signal, onProgress);
    // The hash is of the JSON an export of this decomposition would hold, so a saved file matches the review.
    return { decomposition, sha256: await sha256Hex(encoder.encode(serializeDecomposition(decomposition))) };
  },

  async computeEvidence(recording, decomposition, aim, signal, onProgress) {
    const { computeEvidenceForRecording } = (await loadBridge('evidence')) as EvidenceBridge;
    return computeEvidenceForRecording(recording, decomposition, aim, signal, onProgress);
  },

  writeCleaned: (req, signal, onProgress) => writeCleanedInWorker(req, signal, onProgress),

  async demoInput(signal) {
    const files = await demoFiles(signal);
    const sorted = sortParticipantFiles(files);
    return { recordingFiles: sorted.recordingFiles, decompositionFiles: sorted.decompositionFiles, decisionsFile: null };
  },

  async loadReview(key) {
    return (await reviewDb()).load(key);
  },

  async saveReview(key, review) {
    return (await reviewDb()).save(key, review);
  },
};
