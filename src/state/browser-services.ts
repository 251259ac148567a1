/**
 * Browser implementation of the workbench services: recording parsing and cleaned export in the recording
 * worker, decomposition and evidence through their bridge clients (loaded on first use), the demo files
 * bundled by Vite, and IndexedDB for autosave.
 */
import { decompositionExtrasOf, parseDecompositionJson, parseMatrixTsv, serializeDecomposition } from '../core/formats/decomposition-file.ts';
import { matchDecompositionToRecording } from '../core/formats/decomposition-match.ts';
import { sha256Hex } from '../core/formats/sha256.ts';
import { readRecordingInWorker, writeCleanedInWorker } from '../bridge/recording-client.ts';

import { demoFiles } from './demo-files.ts';
import { openReviewDb, type ReviewDb } from './review-db.ts';
import { sortDecompositionFiles, sortParticipantFiles } from './participant-files.ts';
import type { WorkbenchServices } from './services.ts';
import { runDecompositionDetailed } from '../bridge/decomposition-client.ts';
import { computeEvidenceInWorker } from '../bridge/evidence-client.ts';
import { LOCKING_MAX_SHUFFLES } from '../core/evidence/time-locking.ts';
import type { LoadedRecording } from '../core/recording.ts';
import { decomposeInputOf, evidenceInputOf } from '../core/recording-input.ts';
import { evidenceChoicesFor } from './evidence-settings.ts';


/** The files each loaded recording came from (File objects are references, not copies). */
const filesOf = new WeakMap<LoadedRecording, readonly File[]>();

let db: Promise<ReviewDb> | null = null;
const reviewDb = () => (db ??= openReviewDb());

const encoder = new TextEncoder();

export const browserServices: WorkbenchServices = {
  async readRecording(files, signal, onProgress) {
    const result = await readRecordingInWorker(files, signal, onProgress);
    if (!result.ok) throw new Error(result.error.message);
    filesOf.set(result.recording, files);
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
    // Same recording + same options + same seed give the same decomposition: reuse one computed earlier.
    const cacheKey = `${recordingSha256}:${options.method}:seed ${options.seed}:hp ${options.highpassHz}`;
    const cached = await reviewDb().then((d) => d.loadDecomposition(cacheKey)).catch(() => null);
    if (cached) {
      const parsed = parseDecompositionJson(cached, 'cached decomposition');
      if (parsed.ok) {
        onProgress(1);
        return { decomposition: { ...parsed.value, recordingSha256 }, sha256: await sha256Hex(encoder.encode(cached)), json: cached };
      }
    }
    const started = performance.now();
    const made = await runDecompositionDetailed(
      decomposeInputOf(recording),
      { method: options.method, seed: options.seed, highpassHz: options.highpassHz > 0 ? options.highpassHz : null },
      signal,
      (p) => {
        // Fraction from the solver's own time estimate: elapsed / (elapsed + left).
        const elapsed = (performance.now() - started) / 1000;
        const f = p.stage === 'done' ? 1 : p.etaSeconds !== null ? elapsed / (elapsed + p.etaSeconds) : p.stage === 'ica' ? 0.1 : 0.03;
        onProgress(Math.min(0.99, f), p.etaSeconds);
      },
    );
    const decomposition = { ...made.decomposition, recordingSha256 };
    // The hash is of the JSON an export of this decomposition would hold, so a saved file matches the review;
    // the run details (rank reason, variance shares, warnings, seed) are written as `winnow decompose` writes them.
    const json = serializeDecomposition(decomposition, decompositionExtrasOf(made, options.seed));
    await reviewDb().then((d) => d.saveDecomposition(cacheKey, json)).catch(() => undefined);
    return { decomposition, sha256: await sha256Hex(encoder.encode(json)), json };
  },

  async computeEvidence(recording, decomposition, signal, onProgress) {
    // The recording's inputs as every CLI command builds them (src/core/recording-input.ts); mains frequency
    // from the paired *_eeg.json, else 50 Hz (the recording summary says which). Sequential test up to 999
    // shuffles (p can reach 1/1000); unlocked components stop after ~tens.
    // The reviewer's mains and lock-column choices (evidence-settings.ts) override the files.
    const chosen = evidenceChoicesFor(recording);
    const { input } = evidenceInputOf(recording, decomposition, {
      permutations: LOCKING_MAX_SHUFFLES,
      ...(chosen.lineHz !== null ? { lineHz: chosen.lineHz } : {}),
      ...(chosen.lockColumn !== null ? { lockColumn: chosen.lockColumn } : {}),
    });
    const result = await computeEvidenceInWorker(
      input,
      signal,
      (f) => onProgress(f),
    );
    return result.components;
  },

  writeCleaned: (req, signal, onProgress) =>
    writeCleanedInWorker({ ...req, files: [...(filesOf.get(req.recording) ?? [])] }, signal, onProgress),

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
