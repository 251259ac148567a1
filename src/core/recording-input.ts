/**
 * The one adapter from a loaded recording (formats/recording-loader.ts, with its sidecars) to the inputs of
 * decomposition, evidence and cleaning. The workbench services, every CLI command and the bench call these,
 * so the same files give the same segments, channel types, positions, events and mains frequency everywhere.
 */
import type { Decomposition } from './decomposition.ts';
import type { EvidenceEvent, EvidenceInput } from './evidence/compute-evidence.ts';
import type { EdfWriteInput } from './formats/edf-writer.ts';
import { mainsFrequency, type MainsFrequency } from './formats/power-line.ts';
import type { DecomposeInput } from './ica/decompose.ts';
import type { LoadedRecording, RecordingEvent, SignalBlock } from './recording.ts';
import { cleanedEdfInput, cleanedRecordingSamples } from './review/clean.ts';
import type { SecondsWindow } from './units.ts';

/**
 * Sample indices (0 < i < nSamples, ascending, once each) where a new segment of the block starts, so that
 * filters never bridge a gap:
 * - a discontinuous file (EDF+D/BDF+D, `sampleTimes` set): every step between consecutive sample times
 *   longer than 1.5 sample periods (the record onsets of the file; docs/methods.md §11);
 * - a continuous file: every event labelled "boundary" (any case) or with source 'boundary', at
 *   round(onset · rate) (common practice for marking where recordings were joined).
 * Event onsets of a discontinuous file count recorded time, gaps included, so they are not sample indices:
 * there the sample times alone decide.
 */
export function segmentBoundaries(signals: SignalBlock, events: readonly RecordingEvent[]): number[] {
  const { sampleTimes, sampleRate: fs, nSamples } = signals;
  const out = new Set<number>();
  if (sampleTimes) {
    for (let i = 1; i < sampleTimes.length; i++) if (sampleTimes[i] - sampleTimes[i - 1] > 1.5 / fs) out.add(i);
  } else {
    for (const e of events) if (e.source === 'boundary' || e.label.toLowerCase() === 'boundary') out.add(Math.round(e.onset * fs));
  }
  return [...out].filter((i) => i > 0 && i < nSamples).sort((a, b) => a - b);
}

/** Type and status of each block channel (channels.tsv applied by the loader; EEG and good when unknown). */
function channelTypes(recording: LoadedRecording): { types: string[]; status: ('good' | 'bad')[] } {
  const info = new Map(recording.channels.map((c) => [c.label, c] as const));
  const labels = recording.signals.labels;
  return { types: labels.map((l) => info.get(l)?.type ?? 'EEG'), status: labels.map((l) => info.get(l)?.status ?? 'good') };
}

/** The decomposition engine's view of a recording: its signal block, channel types and status, segments. */
export function decomposeInputOf(recording: LoadedRecording): DecomposeInput {
  const { labels, data, nSamples, sampleRate } = recording.signals;
  const { types, status } = channelTypes(recording);
  return { data, nChannels: labels.length, nSamples, sampleRate, labels, types, status, boundaries: segmentBoundaries(recording.signals, recording.events) };
}

/** The events evidence epochs on: every event but gap markers, with response times and events.tsv columns. */
export function evidenceEventsOf(recording: LoadedRecording): EvidenceEvent[] {
  return recording.events
    .filter((e) => e.source !== 'boundary')
    .map((e) => ({
      onset: e.onset,
      duration: e.duration,
      label: e.label,
      ...(e.responseTime !== undefined ? { responseTime: e.responseTime } : {}),
      ...(e.columns !== undefined ? { columns: e.columns } : {}),
    }));
}

/** Settings of an evidence run that do not come from the recording. */
export interface EvidenceSettings {
  /** Mains frequency given by the user (CLI --line-frequency); else the recording's *_eeg.json, else 50 Hz. */
  readonly lineHz?: 50 | 60;
  readonly epochEvent?: string;
  readonly window?: SecondsWindow;
  readonly permutations?: number;
  /** events.tsv column whose values are each tested for time-locking (EvidenceInput.lockColumn). */
  readonly lockColumn?: string;
}

/** The evidence input of a recording and a decomposition matched to it, and where the mains frequency came from. */
export function evidenceInputOf(
  recording: LoadedRecording,
  decomposition: Decomposition,
  settings: EvidenceSettings = {},
): { input: EvidenceInput; mains: MainsFrequency } {
  const { labels, data, nSamples, sampleRate } = recording.signals;
  const mains = mainsFrequency(recording.powerLine, settings.lineHz);
  const input: EvidenceInput = {
    data,
    nChannels: labels.length,
    nSamples,
    sampleRate,
    labels,
    positionsUnit: recording.positions ?? null,
    types: channelTypes(recording).types,
    decomposition,
    events: evidenceEventsOf(recording),
    lineHz: mains.hz,
    ...(settings.epochEvent !== undefined ? { epochEvent: settings.epochEvent } : {}),
    ...(settings.window !== undefined ? { window: settings.window } : {}),
    ...(settings.permutations !== undefined ? { permutations: settings.permutations } : {}),
    ...(settings.lockColumn !== undefined ? { lockColumn: settings.lockColumn } : {}),
  };
  return { input, mains };
}

/** What a cleaned copy of a recording is written from. */
export interface CleanedRecordingRequest {
  readonly decomposition: Decomposition;
  /** 1-based component indices to remove. */
  readonly removed: readonly number[];
  /** The channels at other rates than the block (formats/recording-loader.ts readOtherRateBlocks); copied unchanged. */
  readonly otherBlocks: readonly SignalBlock[];
  readonly family: 'EDF' | 'BDF';
  readonly keepIdentity: boolean;
  readonly onProgress?: (fraction: number) => void;
}

/**
 * Writer input for the cleaned recording: the block with the removed components subtracted (review/clean.ts),
 * every other channel unchanged. A channel in neither the block nor `otherBlocks` is left out and named in a
 * warning. Throws a RangeError when the decomposition does not fit the block.
 */
export function cleanedRecordingInput(recording: LoadedRecording, req: CleanedRecordingRequest): { input: EdfWriteInput; warnings: string[] } {
  const cleaned = cleanedRecordingSamples(recording, req.decomposition, req.removed, req.onProgress);
  const blocks: SignalBlock[] = [{ ...recording.signals, data: cleaned }, ...req.otherBlocks];
  const held = (c: { label: string; sampleRate: number }) => blocks.some((b) => b.sampleRate === c.sampleRate && b.labels.includes(c.label));
  const missing = recording.channels.filter((c) => !held(c));
  const warnings =
    missing.length > 0
      ? [`${recording.fileName}: ${missing.map((c) => `${c.label} (${c.sampleRate} Hz)`).join(', ')} not written: the recording file was not at hand to copy them from`]
      : [];
  const info = missing.length > 0 ? { ...recording, channels: recording.channels.filter(held) } : recording;
  const cleanedLabels = new Set(req.removed.length > 0 ? req.decomposition.channels.map((l) => l.toLowerCase()) : []);
  return { input: cleanedEdfInput(info, blocks, cleanedLabels, req.family, req.keepIdentity), warnings };
}
