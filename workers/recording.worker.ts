/**
 * Recording worker (wiring only): parses a recording with its sidecars off the main thread (the loader every
 * CLI command uses, src/core/formats/recording-loader.ts), hashes the recording file, moves the samples into a
 * SharedArrayBuffer (when the page is cross-origin isolated) so the page and every other worker read one
 * copy, and writes cleaned recordings (src/core/recording-input.ts, src/core/formats/edf-writer.ts).
 */
import { expose, transfer } from 'comlink';
import { CodedError, guardWorkerApi } from '../src/core/coded-error.ts';
import { blobByteSource } from '../src/core/formats/byte-source.ts';
import { loadRecording, readOtherRateBlocks } from '../src/core/formats/recording-loader.ts';
import { isRecordingFileName } from '../src/core/formats/recording-file-name.ts';
import { sha256Hex } from '../src/core/formats/sha256.ts';
import { writeEdf } from '../src/core/formats/edf-writer.ts';
import { cleanedRecordingInput } from '../src/core/recording-input.ts';
import type { LoadedRecording, SignalBlock } from '../src/core/recording.ts';
import type { Decomposition } from '../src/core/decomposition.ts';
import type { ParseError } from '../src/core/formats/parse-result.ts';

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
  /** The files the recording was read from: channels at other rates than the reviewed block are re-read from them. */
  files?: File[];
}

const api = {
  async load(files: File[], onProgress?: (fraction: number) => void): Promise<LoadResult> {
    onProgress?.(0.05);
    const parsed = await loadRecording(files.map((f) => blobByteSource(f, f.name)));
    if (!parsed.ok) return { ok: false, error: parsed.error };
    onProgress?.(0.8);
    // The hash is of the file the loader chose (the first recording file is not always it).
    const main = files.find((f) => f.name === parsed.value.fileName) ?? files.find((f) => isRecordingFileName(f.name));
    const sha256 = main ? await sha256Hex(new Uint8Array(await main.arrayBuffer())) : '';
    onProgress?.(1);
    const rec = parsed.value;
    const recording: LoadedRecording = { ...rec, signals: { ...rec.signals, data: toShared(rec.signals.data) } };
    return { ok: true, recording, sha256, warnings: parsed.warnings };
  },

  /**
   * The cleaned recording as EDF+/BDF+ bytes (transferred, not copied). Channels at other rates than the
   * reviewed block are copied from the recording file; without the file they are left out and a warning says so.
   */
  async writeCleaned(req: CleanedExportRequest, onProgress?: (fraction: number) => void): Promise<{ bytes: Uint8Array; warnings: string[] }> {
    const rec = req.recording;
    const main = req.files?.find((f) => f.name === rec.fileName) ?? req.files?.find((f) => isRecordingFileName(f.name));
    let otherBlocks: SignalBlock[] = [];
    if (main && rec.channels.length > rec.signals.labels.length) {
      const res = await readOtherRateBlocks(blobByteSource(main, main.name), rec);
      if (!res.ok) throw CodedError.fromParseError(res.error);
      otherBlocks = res.value;
    }
    const { input, warnings } = cleanedRecordingInput(rec, {
      decomposition: req.decomposition,
      removed: req.removed,
      otherBlocks,
      family: req.format.startsWith('BDF') ? 'BDF' : 'EDF',
      keepIdentity: req.keepIdentity,
      onProgress: (f) => onProgress?.(0.7 * f),
    });
    onProgress?.(0.8);
    const bytes = writeEdf(input);
    onProgress?.(1);
    return transfer({ bytes, warnings }, [bytes.buffer]);
  },
};

export type RecordingWorkerApi = typeof api;
// Faults cross as WireErrors (code kept); the bridge client rethrows them as CodedError.
expose(guardWorkerApi(api));
