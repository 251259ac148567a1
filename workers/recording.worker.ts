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
import { cleanedEdfInput, cleanedRecordingSamples } from '../src/core/review/clean.ts';
import { readEdfSignals } from '../src/core/formats/edf.ts';
import type { LoadedRecording, SignalBlock } from '../src/core/recording.ts';
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
  /** The files the recording was read from: channels at other rates than the reviewed block are re-read from them. */
  files?: File[];
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
    const rec = req.recording;
    const cleaned = cleanedRecordingSamples(rec, req.decomposition, req.removed, (f) => onProgress?.(0.7 * f));
    const blocks: SignalBlock[] = [{ ...rec.signals, data: cleaned }];
    // Channels at other rates are not in the reviewed block: copy them from the file, unchanged.
    const inBlock = new Set(rec.signals.labels);
    const others = rec.channels.filter((c) => !inBlock.has(c.label));
    const main = req.files?.find((f) => RECORDING_EXT.test(f.name) && f.name === rec.fileName) ?? req.files?.find((f) => RECORDING_EXT.test(f.name));
    let info = rec as typeof rec;
    if (others.length > 0) {
      if (!main) {
        info = { ...rec, channels: rec.channels.filter((c) => inBlock.has(c.label)) };
      } else {
        const source = blobByteSource(main, main.name);
        const rates = [...new Set(others.map((c) => c.sampleRate))];
        for (const rate of rates) {
          const res = await readEdfSignals(source, rec, { channels: others.filter((c) => c.sampleRate === rate).map((c) => c.label) });
          if (!res.ok) throw new Error(res.error.message);
          blocks.push(res.value);
        }
      }
    }
    onProgress?.(0.8);
    const cleanedLabels = new Set(req.removed.length > 0 ? req.decomposition.channels.map((l) => l.toLowerCase()) : []);
    const input = cleanedEdfInput(info, blocks, cleanedLabels, req.format.startsWith('BDF') ? 'BDF' : 'EDF', req.keepIdentity);
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
