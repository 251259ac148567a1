/**
 * Recording worker (wiring only): parses a recording with its sidecars off the main thread, hashes the
 * recording file, moves the samples into a SharedArrayBuffer (when the page is cross-origin isolated) so the
 * page and every other worker read one copy, and writes cleaned recordings.
 */
import { expose, transfer } from 'comlink';
import { blobByteSource } from '../src/core/formats/byte-source.ts';
import { loadRecording } from '../src/core/formats/recording-loader.ts';
import { sha256Hex } from '../src/core/formats/sha256.ts';
import { writeEdfChunks } from '../src/core/formats/edf-writer.ts';
import { buildCleanedEdfInput, cleanedRecordingSamples } from '../src/core/review/clean.ts';
import type { LoadedRecording } from '../src/core/recording.ts';
import type { Decomposition } from '../src/core/decomposition.ts';
import type { ParseError } from '../src/core/formats/parse-result.ts';

const RECORDING_EXT = /\.(edf|bdf|rec)$/i;

/** Copies a Float32Array into shared memory when allowed (one copy for page and workers). */
function toShared(data: Float32Array): Float32Array {
  if (typeof SharedArrayBuffer === 'undefined' || !(globalThis as { crossOriginIsolated?: boolean }).crossOriginIsolated) return data;
  if (data.buffer instanceof SharedArrayBuffer) return data;
  const shared = new Float32Array(new SharedArrayBuffer(data.length * 4));
  shared.set(data);
  return shared;
}

export type LoadResult =
  | { ok: true; recording: LoadedRecording; sha256: string; warnings: string[] }
  | { ok: false; error: ParseError };

export interface CleanedExportRequest {
  recording: LoadedRecording;
  decomposition: Decomposition;
  /** 1-based indices to remove. */
  removed: number[];
  format: 'EDF+C' | 'BDF+C';
  keepIdentity: boolean;
}

const api = {
  async load(files: File[], onProgress?: (fraction: number) => void): Promise<LoadResult> {
    const main = files.find((f) => RECORDING_EXT.test(f.name));
    onProgress?.(0.05);
    const parsed = await loadRecording(files.map((f) => blobByteSource(f, f.name)));
    if (!parsed.ok) return { ok: false, error: parsed.error };
    onProgress?.(0.8);
    const sha256 = main ? await sha256Hex(new Uint8Array(await main.arrayBuffer())) : '';
    onProgress?.(1);
    const rec = parsed.value;
    const recording: LoadedRecording = { ...rec, signals: { ...rec.signals, data: toShared(rec.signals.data) } };
    return { ok: true, recording, sha256, warnings: parsed.warnings };
  },

  /** The cleaned recording as EDF+/BDF+ bytes (transferred, not copied). */
  async writeCleaned(req: CleanedExportRequest, onProgress?: (fraction: number) => void): Promise<Uint8Array> {
    const cleaned = cleanedRecordingSamples(req.recording, req.decomposition, req.removed, (f) => onProgress?.(0.8 * f));
    const input = buildCleanedEdfInput(req.recording, cleaned, req.format, req.keepIdentity);
    const parts: Uint8Array[] = [];
    let total = 0;
    for (const part of writeEdfChunks(input)) {
      parts.push(part);
      total += part.length;
    }
    const out = new Uint8Array(total);
    let o = 0;
    for (const p of parts) {
      out.set(p, o);
      o += p.length;
    }
    onProgress?.(1);
    return transfer(out, [out.buffer]);
  },
};

export type RecordingWorkerApi = typeof api;
expose(api);
