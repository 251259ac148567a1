/**
 * What the session actions need from the outside world (workers, files, IndexedDB), behind one interface
 * so the store's tests run in node with fakes. The browser implementation lives in browser-services.ts and
 * is loaded on first use.
 */
import type { LoadedRecording } from '../core/recording.ts';
import type { Decomposition } from '../core/decomposition.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import type { Aim } from '../core/review/vocabulary.ts';
import type { DecomposeOptions, ParticipantInput, ResumeOffer } from './types.ts';
import type { ReviewDecision } from '../core/review/decisions-file.ts';
import type { Thresholds } from '../core/review/thresholds.ts';

/** Reports progress of one step as a fraction 0…1, optionally with the engine's own estimate of seconds left. */
export type OnFraction = (fraction: number, etaSeconds?: number | null) => void;

export interface SavedReview {
  readonly savedAt: string;
  readonly aim: Aim;
  /** Suggestion threshold overrides saved with the review (absent: the defaults). */
  readonly thresholds?: Partial<Thresholds>;
  readonly reviewer: string;
  readonly decisions: Record<number, ReviewDecision>;
}

export interface WorkbenchServices {
  /** Parses the recording (and sidecars) off the main thread; `sha256` is of the recording file's bytes. */
  readRecording(files: readonly File[], signal: AbortSignal, onProgress: OnFraction): Promise<{ recording: LoadedRecording; sha256: string }>;
  /** Reads our decomposition JSON or a TSV/CSV matrix and matches it to the recording. */
  readDecomposition(files: readonly File[], recording: LoadedRecording, recordingSha256: string, signal: AbortSignal): Promise<{ decomposition: Decomposition; sha256: string }>;
  /** Computes a decomposition in a worker; `sha256` is of its JSON serialisation (what an export would store). */
  computeDecomposition(recording: LoadedRecording, recordingSha256: string, options: DecomposeOptions, signal: AbortSignal, onProgress: OnFraction): Promise<{ decomposition: Decomposition; sha256: string; json: string }>;
  /** Per-component evidence (1-based index), measures only: suggestions come from selectSuggestions for any aim. */
  computeEvidence(recording: LoadedRecording, decomposition: Decomposition, signal: AbortSignal, onProgress: OnFraction): Promise<ComponentEvidence[]>;
  /**
   * The cleaned recording as EDF+/BDF+ bytes, computed off the main thread; `warnings` name channels that
   * could not be copied (channels at other rates when the recording file is no longer at hand).
   */
  writeCleaned(
    req: { recording: LoadedRecording; decomposition: Decomposition; removed: number[]; format: 'EDF+C' | 'BDF+C'; keepIdentity: boolean },
    signal: AbortSignal,
    onProgress: OnFraction,
  ): Promise<{ bytes: Uint8Array; warnings: readonly string[] }>;
  /** The demo participant's files (recording, sidecars, decomposition when shipped). */
  demoInput(signal: AbortSignal): Promise<ParticipantInput>;
  /** Autosave store (IndexedDB in the browser). Key = recording hash + decomposition hash. */
  loadReview(key: string): Promise<SavedReview | null>;
  saveReview(key: string, review: SavedReview): Promise<void>;
}

let services: WorkbenchServices | null = null;
let loading: Promise<WorkbenchServices> | null = null;

/** Replaces the services (tests, or a host that supplies its own). */
export function setWorkbenchServices(next: WorkbenchServices | null): void {
  services = next;
  loading = null;
}

/** The services in use; the browser ones are imported on first call. */
export async function getWorkbenchServices(): Promise<WorkbenchServices> {
  if (services) return services;
  loading ??= import('./browser-services.ts').then((m) => {
    services ??= m.browserServices;
    return services;
  });
  return loading;
}

/** The autosave key of a review: both SHA-256 digests joined by a colon. */
export const reviewKey = (recordingSha256: string, decompositionSha256: string) => `${recordingSha256}:${decompositionSha256}`;

/** The resume offer for a saved review, or null when it holds no decisions. */
export function resumeOfferFrom(saved: SavedReview | null): ResumeOffer | null {
  if (!saved) return null;
  const n = Object.values(saved.decisions).filter((d) => d.verdict !== 'undecided' || d.reason !== null || d.note !== '').length;
  if (n === 0) return null;
  return { savedAt: saved.savedAt, aim: saved.aim, ...(saved.thresholds ? { thresholds: saved.thresholds } : {}), decisions: saved.decisions, decidedCount: Object.values(saved.decisions).filter((d) => d.verdict !== 'undecided').length };
}
