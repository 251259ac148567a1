/**
 * The workbench store's shape: one bound store made of slices (zustand slices pattern). Each slice's
 * creator is typed against the whole `WorkbenchState` and returns only its own part.
 */
import type { LoadedRecording } from '../core/recording.ts';
import type { Decomposition } from '../core/decomposition.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import type { Thresholds } from '../core/review/thresholds.ts';
import type { Aim, ReasonCode, Verdict } from '../core/review/vocabulary.ts';
import type { ReviewDecision } from '../core/review/decisions-file.ts';

export type { ReviewDecision } from '../core/review/decisions-file.ts';
/** Alias used by the UI: one reviewer decision (verdict, reason, free-text note). */
export type Decision = ReviewDecision;

export type Screen = 'start' | 'board' | 'focus' | 'preview' | 'study';

/** Region of interest for the preview's before/after comparison. */
export interface Roi {
  /** Channel labels averaged for the ERP / band power; empty = the default ROI chosen by the preview. */
  readonly channels: readonly string[];
  /** ERP window in seconds relative to the event (e.g. [0.1, 0.4]). */
  readonly windowS: readonly [number, number];
  /** Band for the oscillations aim, in Hz (e.g. [8, 13]). */
  readonly bandHz: readonly [number, number];
  /** Event label the epochs are locked to; null = the most frequent event label. */
  readonly epochEvent: string | null;
}

/** A long task in flight (reading, decomposing, evidence, cleaned export). */
export interface Progress {
  readonly task: string;
  /** 0…1. */
  readonly fraction: number;
  readonly etaSeconds: number | null;
  readonly cancel?: () => void;
}

/** What the user gave the start screen. Files are browser File objects (names kept for BIDS pairing). */
export interface ParticipantInput {
  /** The recording and its BIDS sidecars (channels.tsv, electrodes.tsv, events.tsv, …). */
  readonly recordingFiles: readonly File[];
  /** Our decomposition JSON, or a TSV/CSV matrix (mixing or unmixing). */
  readonly decompositionFiles?: readonly File[];
  /** A decisions file to resume from. */
  readonly decisionsFile?: File | null;
  /** Compute a decomposition when none is given (default true). */
  readonly decompose?: DecomposeOptions | null;
  /**
   * Evidence already computed for these files (a batch run's, issue 11), tried before computing it: resolves
   * to that evidence when it belongs to the loaded recording and decomposition, else null (evidence computed).
   */
  readonly reuseEvidence?: (loaded: ReuseEvidenceInput) => Promise<ComponentEvidence[] | null>;
}

/** What a `reuseEvidence` check is given: the loaded recording and decomposition and their hashes. */
export interface ReuseEvidenceInput {
  readonly recording: LoadedRecording;
  readonly recordingSha256: string;
  readonly decomposition: Decomposition;
  readonly decompositionSha256: string;
}

export interface DecomposeOptions {
  readonly method: 'infomax' | 'picard';
  readonly seed: number;
  readonly highpassHz: number;
}

/** A saved review found in IndexedDB for this recording + decomposition. */
export interface ResumeOffer {
  readonly savedAt: string;
  readonly aim: Aim;
  /** Threshold overrides saved with the review (absent: the defaults). */
  readonly thresholds?: Partial<Thresholds>;
  readonly decisions: Record<number, ReviewDecision>;
  readonly decidedCount: number;
}

/** A message for the user (a failed load, an import that did not match). Shown as plain text. */
export interface Notice {
  readonly kind: 'error' | 'info';
  readonly text: string;
}

export interface RecordingSlice {
  recording: LoadedRecording | null;
  recordingSha256: string | null;
  decompositionSha256: string | null;
  decomposition: Decomposition | null;
  /** The exact JSON text whose SHA-256 is decompositionSha256, when the decomposition was computed here (for saving it). */
  decompositionJson: string | null;
  /** One entry per component, 1-based `index` (evidence engineer's type). */
  evidence: ComponentEvidence[] | null;
  /** Sets (or clears) the loaded participant; used by the loading flow and tests. */
  setLoaded: (patch: Partial<Pick<RecordingSlice, 'recording' | 'recordingSha256' | 'decompositionSha256' | 'decomposition' | 'decompositionJson' | 'evidence'>>) => void;
}

export interface ReviewSlice {
  aim: Aim;
  /** Threshold overrides for the suggestions (empty: the defaults of review/thresholds.ts); re-suggests without recomputing evidence. */
  thresholds: Partial<Thresholds>;
  setThresholds: (thresholds: Partial<Thresholds>) => void;
  /** Key = 1-based component index. A component without an entry is undecided. */
  decisions: Record<number, ReviewDecision>;
  /** Reviewer name written into exports (empty when not given). */
  reviewer: string;
  /** Undo/redo stacks of whole decision maps (each map is immutable, so this costs one pointer per step). */
  past: Record<number, ReviewDecision>[];
  future: Record<number, ReviewDecision>[];
  /** Merges `patch` into component `index`'s decision (missing fields: undecided / null / ''). */
  decide: (index: number, patch: Partial<ReviewDecision>) => void;
  setAim: (aim: Aim) => void;
  setReviewer: (name: string) => void;
  /** Replaces every decision at once (import, resume); undoable. The aim and threshold overrides, when given, change with them. */
  replaceDecisions: (decisions: Record<number, ReviewDecision>, aim?: Aim, thresholds?: Partial<Thresholds>) => void;
  undo: () => void;
  redo: () => void;
}

/** Board order: component number, variance share, impact on the aim, or suggestion (remove first). */
export type BoardSort = 'index' | 'variance' | 'impact' | 'suggestion';
export const BOARD_SORTS: readonly BoardSort[] = ['index', 'variance', 'impact', 'suggestion'];

/** Board filter: by current verdict and/or by reason (the decision's reason, else the suggested one). */
export interface BoardFilter {
  readonly verdict: Verdict | 'all';
  readonly reason: ReasonCode | 'all';
}

export interface ViewSlice {
  selected: number | null;
  boardSort: BoardSort;
  boardFilter: BoardFilter;
  setBoardSort: (sort: BoardSort) => void;
  setBoardFilter: (patch: Partial<BoardFilter>) => void;
  screen: Screen;
  roi: Roi;
  progress: Progress | null;
  notice: Notice | null;
  resumeOffer: ResumeOffer | null;
  select: (index: number | null) => void;
  setScreen: (screen: Screen) => void;
  setRoi: (patch: Partial<Roi>) => void;
  setProgress: (progress: Progress | null) => void;
  setNotice: (notice: Notice | null) => void;
  setResumeOffer: (offer: ResumeOffer | null) => void;
}

export interface SessionSlice {
  /** Reads the recording (worker), hashes it, reads or computes the decomposition, computes evidence. */
  loadParticipant: (input: ParticipantInput) => Promise<void>;
  /** Computes a decomposition of the loaded recording, then evidence, then shows the board. */
  decomposeCurrent: (options: DecomposeOptions) => Promise<void>;
  /** Reads a decomposition file for the loaded recording, then evidence, then shows the board. */
  openDecomposition: (files: readonly File[]) => Promise<void>;
  /** Opens the simulated demo participant shipped with the app. */
  loadDemo: () => Promise<void>;
  /** Restores aim and decisions from a decisions file (JSON or TSV); returns false (with a notice) on a mismatch. */
  importDecisions: (file: File | Blob | string) => Promise<boolean>;
  /** Accepts or declines the autosaved review offered on reopen. */
  resume: (accept: boolean) => void;
  /** Back to the start screen, dropping the participant. */
  closeParticipant: () => void;
}

export type WorkbenchState = RecordingSlice & ReviewSlice & ViewSlice & SessionSlice;
