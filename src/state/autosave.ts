/**
 * Autosave: every change of decisions, aim or reviewer is written through at once — first synchronously to
 * the journal (review-journal.ts, survives a reload that comes a millisecond later), then to the review
 * store (IndexedDB) — as a snapshot of this stretch of work. A note being typed is written per keystroke
 * batch as a draft (`noteDraft`) before the note field commits it to the review.
 *
 * Stretches of work ("segments") keep the history useful and make sure no action destroys a review:
 * - a participant arriving starts a new segment (nothing is written until the reviewer changes something);
 * - changes made while a saved review is offered go into their own segment, so the offered review is never
 *   overwritten before the reviewer answers;
 * - a change that replaces several decisions at once (resume, restore, import, undo of one of those) closes
 *   the segment and opens a new one, so what was there before stays saved.
 * Writes are coalesced per snapshot and done in order; a failed write is retried, and the problem is
 * reported in words (storage full: export offered). Returns the handle that stops autosaving.
 */
import type { StoreApi } from 'zustand/vanilla';
import { reviewKey } from './services.ts';
import type { ReviewDecision, ResumeOffer, WorkbenchState } from './types.ts';
import { ReviewStorageError } from './review-db.ts';
import type { ReviewJournal } from './review-journal.ts';
import type { ReviewSnapshot, SnapshotOrigin } from './review-snapshot.ts';
import type { SaveProblem } from './persistence.ts';

export interface SnapshotSink {
  saveSnapshot(snapshot: ReviewSnapshot): Promise<void>;
}

export interface AutosaveOptions {
  /** Written synchronously before each store write (default: none). */
  readonly journal?: ReviewJournal | null;
  /** A saving problem (null once saving works again). */
  readonly onProblem?: (problem: SaveProblem | null) => void;
  /** Milliseconds before a failed write is tried again. */
  readonly retryMs?: number;
  /** Clock (tests). */
  readonly now?: () => Date;
}

export interface AutosaveHandle {
  stop(): void;
  /** Resolves when every write started so far has finished or failed (tests, and before unload). */
  flush(): Promise<void>;
  /** The text of a note being typed for component `index`, written before the field commits it. */
  noteDraft(index: number, text: string): void;
  /** The id of the snapshot being written (null before the first change of a participant). */
  currentSnapshotId(): string | null;
}

interface Segment {
  readonly id: string;
  readonly key: string;
  readonly startedAt: string;
  origin: SnapshotOrigin;
  seq: number;
  /** Decisions this segment began from that are already saved elsewhere (resume, restore): no write until they change. */
  baseline: Record<number, ReviewDecision> | null;
}

const sameDecision = (a: ReviewDecision | undefined, b: ReviewDecision | undefined) =>
  (a?.verdict ?? 'undecided') === (b?.verdict ?? 'undecided') && (a?.reason ?? null) === (b?.reason ?? null) && (a?.note ?? '') === (b?.note ?? '');

/** Indices whose decision differs between two maps. */
function changedIndices(a: Record<number, ReviewDecision>, b: Record<number, ReviewDecision>): number {
  let n = 0;
  for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) if (!sameDecision(a[Number(k)], b[Number(k)])) n++;
  return n;
}

let segmentCounter = 0;
const newSegmentId = (now: Date) => `${now.getTime().toString(36)}-${Math.random().toString(36).slice(2, 8)}-${++segmentCounter}`;

/** The problem to show for a failed write. */
export function problemOf(e: unknown, journalHeld: boolean): SaveProblem {
  const held = journalHeld ? ' A copy is kept in this browser\'s local storage meanwhile.' : '';
  if (e instanceof ReviewStorageError && e.kind === 'full') {
    return { kind: 'full', text: `The browser's storage for Winnow is full, so the review cannot be saved here any more.${held} Export the decisions now to keep them, then free space (site data) in the browser.` };
  }
  if ((e as { name?: string } | null)?.name === 'QuotaExceededError') return problemOf(new ReviewStorageError('full', 'full', e), journalHeld);
  if (e instanceof ReviewStorageError && e.kind === 'interrupted') {
    return { kind: 'interrupted', text: `Saving the review was interrupted by the browser; Winnow is trying again.${held}` };
  }
  return { kind: 'unavailable', text: `The review could not be saved in this browser (${(e as Error)?.message ?? String(e)}).${held} Export the decisions to keep them.` };
}

export function startAutosave(
  store: StoreApi<WorkbenchState>,
  sink: () => Promise<SnapshotSink>,
  options: AutosaveOptions = {},
): AutosaveHandle {
  const journal = options.journal ?? null;
  const onProblem = options.onProblem ?? (() => {});
  const retryMs = options.retryMs ?? 1000;
  const clock = options.now ?? (() => new Date());

  let seg: Segment | null = null;
  /** The offer answered by the last change (a resume sets decisions to it next). */
  let answered: ResumeOffer | null = null;
  const drafts = new Map<number, string>();
  let problem = false;
  let stopped = false;

  const queued = new Map<string, ReviewSnapshot>();
  let inFlight: Promise<void> | null = null;
  let retryTimer: ReturnType<typeof setTimeout> | null = null;
  let journalHeld = true;

  function newSegment(key: string, origin: SnapshotOrigin, baseline: Record<number, ReviewDecision> | null = null): Segment {
    const now = clock();
    drafts.clear();
    return { id: newSegmentId(now), key, startedAt: now.toISOString(), origin, seq: 0, baseline };
  }

  async function pump(): Promise<void> {
    while (queued.size > 0 && !stopped) {
      const [id, snap] = queued.entries().next().value as [string, ReviewSnapshot];
      queued.delete(id);
      try {
        await (await sink()).saveSnapshot(snap);
        if (problem) {
          problem = false;
          onProblem(null);
        }
      } catch (e) {
        problem = true;
        onProblem(problemOf(e, journalHeld));
        if (!queued.has(id)) {
          // Try the same write again later (a newer write of it, if any, supersedes this one).
          if (retryTimer) clearTimeout(retryTimer);
          retryTimer = setTimeout(() => {
            retryTimer = null;
            if (!queued.has(id)) enqueue(snap);
          }, retryMs);
        }
        break;
      }
    }
    inFlight = null;
    if (queued.size > 0 && !stopped && !problem) inFlight = pump();
  }

  function enqueue(snap: ReviewSnapshot) {
    if (stopped) return;
    queued.set(snap.id, snap);
    if (!inFlight) inFlight = pump();
  }

  function write(s: WorkbenchState) {
    if (!seg) return;
    seg.seq++;
    let decisions = s.decisions;
    if (drafts.size > 0) {
      decisions = { ...decisions };
      for (const [i, note] of drafts) decisions[i] = { ...(decisions[i] ?? { verdict: 'undecided', reason: null, note: '' }), note };
    }
    const snap: ReviewSnapshot = {
      id: `${seg.key}#${seg.id}`, key: seg.key, startedAt: seg.startedAt, savedAt: clock().toISOString(), seq: seg.seq,
      aim: s.aim, thresholds: s.thresholds, reviewer: s.reviewer, decisions,
      recordingName: s.recording?.fileName ?? null, nComponents: s.decomposition?.nComponents ?? null, origin: seg.origin,
    };
    journalHeld = journal ? journal.write(snap) : false;
    enqueue(snap);
  }

  const unsubscribe = store.subscribe((s, prev) => {
    if (s.recordingSha256 === null || s.decompositionSha256 === null) {
      seg = null;
      return;
    }
    const key = reviewKey(s.recordingSha256, s.decompositionSha256);
    if (!seg || seg.key !== key) {
      // A new participant arriving resets decisions to {}: nothing worth writing yet.
      seg = newSegment(key, 'review');
      answered = null;
      return;
    }
    if (prev.resumeOffer !== null && s.resumeOffer === null) answered = prev.resumeOffer;
    for (const [i, note] of drafts) if ((s.decisions[i]?.note ?? '') === note) drafts.delete(i);
    if (s.decisions === prev.decisions && s.aim === prev.aim && s.reviewer === prev.reviewer && s.thresholds === prev.thresholds) return;

    if (s.decisions !== prev.decisions && changedIndices(prev.decisions, s.decisions) > 1) {
      // Several decisions replaced at once: what was there stays in its own snapshot; a new one begins.
      const resumed = answered !== null && changedIndices(answered.decisions, s.decisions) === 0;
      answered = null;
      seg = newSegment(key, resumed ? 'resumed' : 'imported', resumed ? s.decisions : null);
      if (resumed) return;
    } else if (answered !== null && s.decisions !== prev.decisions && changedIndices(answered.decisions, s.decisions) === 0) {
      // Resuming a review that differs from the board by one decision: still a resume.
      answered = null;
      seg = newSegment(key, 'resumed', s.decisions);
      return;
    }
    if (s.decisions !== prev.decisions) answered = null;
    if (seg.baseline !== null && changedIndices(seg.baseline, s.decisions) === 0 && s.reviewer === prev.reviewer && s.aim === prev.aim && s.thresholds === prev.thresholds) return;
    seg.baseline = null;
    if (seg.seq === 0 && s.resumeOffer !== null) seg.origin = 'while-offered';
    write(s);
  });

  return {
    stop: () => {
      stopped = true;
      if (retryTimer) clearTimeout(retryTimer);
      unsubscribe();
    },
    flush: async () => {
      while (inFlight) await inFlight;
    },
    noteDraft: (index, text) => {
      const s = store.getState();
      if (!seg || !Number.isInteger(index) || index < 1) return;
      if ((s.decisions[index]?.note ?? '') === text && !drafts.has(index)) return;
      if (drafts.get(index) === text) return;
      drafts.set(index, text);
      seg.baseline = null;
      if (seg.seq === 0 && s.resumeOffer !== null) seg.origin = 'while-offered';
      write(s);
    },
    currentSnapshotId: () => (seg && seg.seq > 0 ? `${seg.key}#${seg.id}` : null),
  };
}
