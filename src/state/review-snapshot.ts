/**
 * One saved snapshot of a review: what a participant's review looked like at the end of one stretch of
 * work (a page session, the changes made while a saved review was offered, a restore, an import). Each
 * participant (key = recording hash + decomposition hash) keeps the newest SNAPSHOT_LIMIT of them, so no
 * single action can destroy a review for good. Records read back from storage are checked field by field:
 * a damaged record is skipped (and reported), a damaged decision inside a good record is dropped (and
 * reported), the rest is kept.
 */
import { AIMS, REASON_CODES, VERDICTS, type Aim } from '../core/review/vocabulary.ts';
import type { ReviewDecision } from '../core/review/decisions-file.ts';
import type { Thresholds } from '../core/review/thresholds.ts';
import { readThresholdOverrides } from '../core/review/threshold-changes.ts';

/** Snapshots kept per participant (newest first); older ones are dropped. */
export const SNAPSHOT_LIMIT = 20;

/** How a snapshot began. */
export type SnapshotOrigin = 'review' | 'while-offered' | 'resumed' | 'restored' | 'imported';

export const ORIGIN_LABELS: Record<SnapshotOrigin, string> = {
  review: 'review',
  'while-offered': 'decided while a saved review was offered',
  resumed: 'resumed review',
  restored: 'restored from history',
  imported: 'imported decisions file',
};

export interface ReviewSnapshot {
  /** `${key}#${segment}`. */
  readonly id: string;
  /** recordingSha256:decompositionSha256. */
  readonly key: string;
  readonly startedAt: string;
  readonly savedAt: string;
  /** Write counter within the snapshot: a write never replaces a newer one (journal replay, retries). */
  readonly seq: number;
  readonly aim: Aim;
  /** Suggestion threshold overrides (absent in snapshots saved before they could be changed: the defaults). */
  readonly thresholds?: Partial<Thresholds>;
  readonly reviewer: string;
  readonly decisions: Record<number, ReviewDecision>;
  readonly recordingName: string | null;
  readonly nComponents: number | null;
  readonly origin: SnapshotOrigin;
}

/** A stored record that could not be read back whole. */
export interface LostPart {
  readonly id: string;
  /** Plain words for the user: what was lost. */
  readonly what: string;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Components decided (verdict keep or remove). */
export const decidedCount = (decisions: Record<number, ReviewDecision>): number =>
  Object.values(decisions).filter((d) => d.verdict !== 'undecided').length;

/** True when the decisions hold anything the reviewer did (a verdict, a reason or a note). */
export const hasWork = (decisions: Record<number, ReviewDecision>): boolean =>
  Object.values(decisions).some((d) => d.verdict !== 'undecided' || d.reason !== null || d.note !== '');

function readDecision(v: unknown): ReviewDecision | null {
  if (!isObject(v)) return null;
  const { verdict, reason, note } = v;
  if (typeof verdict !== 'string' || !(VERDICTS as readonly string[]).includes(verdict)) return null;
  if (reason !== null && (typeof reason !== 'string' || !(REASON_CODES as readonly string[]).includes(reason))) return null;
  if (typeof note !== 'string') return null;
  return { verdict: verdict as ReviewDecision['verdict'], reason: reason as ReviewDecision['reason'], note };
}

const when = (iso: unknown) => (typeof iso === 'string' ? ` saved ${iso}` : '');

/**
 * Reads a stored record back: the snapshot (null when the record is beyond repair) and what was lost.
 * `fallbackId` names the record when its own id is unreadable.
 */
export function readSnapshot(raw: unknown, fallbackId: string): { snapshot: ReviewSnapshot | null; lost: LostPart[] } {
  if (!isObject(raw)) return { snapshot: null, lost: [{ id: fallbackId, what: 'a saved snapshot that is not a record at all' }] };
  const id = typeof raw.id === 'string' ? raw.id : fallbackId;
  const key = typeof raw.key === 'string' && /^[^#]+:[^#]+$/.test(raw.key) ? raw.key : null;
  const savedAt = typeof raw.savedAt === 'string' ? raw.savedAt : null;
  if (key === null || savedAt === null || !isObject(raw.decisions)) {
    return { snapshot: null, lost: [{ id, what: `a saved snapshot${when(raw.savedAt)} whose participant, time or decisions cannot be read` }] };
  }
  const lost: LostPart[] = [];
  const decisions: Record<number, ReviewDecision> = {};
  const bad: string[] = [];
  for (const [k, v] of Object.entries(raw.decisions)) {
    const index = Number(k);
    const d = readDecision(v);
    if (!Number.isInteger(index) || index < 1 || d === null) bad.push(k);
    else decisions[index] = d;
  }
  if (bad.length > 0) {
    lost.push({ id, what: `the decision${bad.length === 1 ? '' : 's'} for component${bad.length === 1 ? '' : 's'} ${bad.join(', ')} in the snapshot${when(savedAt)}` });
  }
  const aim = typeof raw.aim === 'string' && (AIMS as readonly string[]).includes(raw.aim) ? (raw.aim as Aim) : 'erp';
  if (aim !== raw.aim) lost.push({ id, what: `the aim of the snapshot${when(savedAt)} (set to erp)` });
  const thresholds = readThresholdOverrides(raw.thresholds);
  if (thresholds.rejected.length > 0) lost.push({ id, what: `the threshold${thresholds.rejected.length === 1 ? '' : 's'} ${thresholds.rejected.join(', ')} of the snapshot${when(savedAt)} (set to the default)` });
  const origin = typeof raw.origin === 'string' && raw.origin in ORIGIN_LABELS ? (raw.origin as SnapshotOrigin) : 'review';
  return {
    snapshot: {
      id, key, savedAt, decisions, aim, origin, thresholds: thresholds.overrides,
      startedAt: typeof raw.startedAt === 'string' ? raw.startedAt : savedAt,
      seq: typeof raw.seq === 'number' && Number.isFinite(raw.seq) ? raw.seq : 0,
      reviewer: typeof raw.reviewer === 'string' ? raw.reviewer : '',
      recordingName: typeof raw.recordingName === 'string' ? raw.recordingName : null,
      nComponents: typeof raw.nComponents === 'number' && Number.isInteger(raw.nComponents) ? raw.nComponents : null,
    },
    lost,
  };
}

/** Newest first (ISO times sort as text). */
export const newestFirst = (a: ReviewSnapshot, b: ReviewSnapshot) => (a.savedAt < b.savedAt ? 1 : a.savedAt > b.savedAt ? -1 : b.seq - a.seq);

/** One line per lost part, for a notice. */
export function describeLost(lost: readonly LostPart[]): string {
  if (lost.length === 0) return '';
  const parts = lost.slice(0, 4).map((l) => l.what);
  const more = lost.length > 4 ? `, and ${lost.length - 4} more` : '';
  return `Some saved review data in this browser was damaged and could not be read: ${parts.join('; ')}${more}. Everything else was recovered.`;
}
