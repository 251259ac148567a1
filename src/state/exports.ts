/**
 * Exports built from the store's state: the decisions file (JSON/TSV), the methods paragraph, and the
 * cleaned recording (computed off the main thread, with progress and cancel). Module-level functions that
 * read `getState()` and report through `setState`.
 */
import { buildDecisionsFile, formatDecisionsJson, formatDecisionsTsv, type DecisionsFile } from '../core/review/decisions-file.ts';
import { methodsText } from '../core/review/methods-text.ts';
import { resolveThresholds } from '../core/review/thresholds.ts';
import { workbenchStore } from './store.ts';
import { getWorkbenchServices } from './services.ts';
import { progressAt } from './task-progress.ts';
import { selectRemovedIndices, selectSuggestions } from './selectors.ts';
import { residualFromState } from './residual-check.ts';
import type { WorkbenchState } from './types.ts';
import { version } from '../../package.json';

/** Name and version written into every export. */
export const SOFTWARE = `winnow ${version}`;

/** Base name for export files: the recording's name without extension and without a trailing "_eeg". */
export function exportStem(s: Pick<WorkbenchState, 'recording'>): string {
  const name = s.recording?.fileName ?? 'recording';
  const base = name.slice(Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\')) + 1).replace(/\.[^.]+$/, '');
  return base.replace(/_eeg$/i, '') || 'recording';
}

/** The decisions file for the current review (null before a decomposition is loaded). */
export function decisionsFileFromState(s: WorkbenchState, createdAt = new Date().toISOString()): DecisionsFile | null {
  if (!s.decomposition || s.recordingSha256 === null || s.decompositionSha256 === null) return null;
  const suggestions = selectSuggestions(s);
  return buildDecisionsFile({
    aim: s.aim,
    reviewer: s.reviewer,
    createdAt,
    software: SOFTWARE,
    recordingSha256: s.recordingSha256,
    decompositionSha256: s.decompositionSha256,
    nComponents: s.decomposition.nComponents,
    decisions: s.decisions,
    suggestions: (i) => suggestions.get(i)?.suggestion ?? null,
    thresholds: s.thresholds,
  });
}

export function decisionsJsonFromState(s: WorkbenchState): string | null {
  const f = decisionsFileFromState(s);
  return f ? formatDecisionsJson(f) : null;
}

export function decisionsTsvFromState(s: WorkbenchState): string | null {
  const f = decisionsFileFromState(s);
  return f ? formatDecisionsTsv(f) : null;
}

/**
 * The methods paragraph, with what the decomposition missed (review/residual.ts): `residualWarnings` when the
 * caller measured it, else the check of the current decisions (residual-check.ts).
 */
export function methodsTextFromState(s: WorkbenchState, residualWarnings?: readonly string[]): string | null {
  if (!s.decomposition || !s.recording) return null;
  const residual = residualWarnings ?? residualFromState(s)?.warnings.map((w) => w.text);
  const byIndex = new Map((s.evidence ?? []).map((e) => [e.index, e] as const));
  const suggestions = selectSuggestions(s);
  return methodsText({
    software: SOFTWARE,
    recordingFileName: s.recording.fileName,
    recordingSha256: s.recordingSha256 ?? 'unknown',
    decomposition: s.decomposition,
    recordingReference: s.recording.reference ?? null,
    aim: s.aim,
    decisions: s.decisions,
    varianceShare: (i) => byIndex.get(i)?.varianceShare ?? null,
    thresholds: resolveThresholds(s.thresholds),
    ...(s.evidence ? { firedRules: (i: number) => suggestions.get(i)?.rules ?? null } : {}),
    ...(residual ? { residualWarnings: residual } : {}),
  });
}

/**
 * Computes the cleaned recording in a worker with progress and cancel; resolves to the file bytes, or null
 * when cancelled or failed (a notice says which).
 */
export async function exportCleanedRecording(format: 'EDF+C' | 'BDF+C', keepIdentity: boolean): Promise<Uint8Array | null> {
  const store = workbenchStore;
  const s = store.getState();
  if (!s.recording || !s.decomposition) return null;
  const controller = new AbortController();
  const cancel = () => controller.abort();
  const started = performance.now();
  const task = `Writing the cleaned recording (${format.slice(0, 3)})`;
  store.setState({ progress: progressAt(task, 0, started, started, cancel) });
  // Worker progress calls are fire-and-forget; once the bytes are here, late ones are dropped.
  let done = false;
  try {
    const services = await getWorkbenchServices();
    const { bytes, warnings } = await services.writeCleaned(
      { recording: s.recording, decomposition: s.decomposition, removed: selectRemovedIndices(s), format, keepIdentity },
      controller.signal,
      (f) => { if (!done && !controller.signal.aborted) store.setState({ progress: progressAt(task, f, started, performance.now(), cancel) }); },
    );
    done = true;
    store.setState({ progress: null, ...(warnings.length > 0 ? { notice: { kind: 'info' as const, text: warnings.join(' ') } } : {}) });
    return bytes;
  } catch (e) {
    done = true;
    store.setState({
      progress: null,
      notice: controller.signal.aborted ? { kind: 'info', text: 'Export cancelled.' } : { kind: 'error', text: `Export failed: ${(e as Error)?.message ?? String(e)}` },
    });
    return null;
  }
}
