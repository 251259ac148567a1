/**
 * Actions that span slices: loading a participant (read → hash → decomposition → evidence → resume offer),
 * the demo, importing a decisions file. Each long step reports progress and can be cancelled; a cancelled
 * or failed load leaves the start screen with a notice.
 */
import type { StateCreator } from 'zustand';
import { decisionsFromFile, parseDecisionsJson, parseDecisionsTsv } from '../core/review/decisions-file.ts';
import { getWorkbenchServices, resumeOfferFrom, reviewKey, type OnFraction } from './services.ts';
import { progressAt } from './task-progress.ts';
import { confirmImport } from './replace-guards.ts';
import { DEFAULT_ROI } from './view-slice.ts';
import type { DecomposeOptions, ParticipantInput, SessionSlice, WorkbenchState } from './types.ts';
import type { Decomposition } from '../core/decomposition.ts';

/** Default decomposition when none is given: extended Infomax, seed 1, 1 Hz high-pass (docs/methods.md §14, common practice). */
// Picard by default in the browser: same maximum-likelihood model as extended Infomax, several times faster here
// (bench/ica.bench.ts), so the researcher waits less; Infomax stays one choice away.
export const DEFAULT_DECOMPOSE = { method: 'picard', seed: 1, highpassHz: 1 } as const;

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

async function readText(file: File | Blob | string): Promise<{ text: string; name: string }> {
  if (typeof file === 'string') return { text: file, name: 'decisions' };
  const name = (file as File).name ?? 'decisions';
  return { text: await file.text(), name };
}

export const createSessionSlice: StateCreator<WorkbenchState, [], [], SessionSlice> = (set, get) => {
  let current: AbortController | null = null;

  /** Runs one step with its own progress record; the cancel button aborts the whole load. */
  async function step<T>(task: string, controller: AbortController, run: (onProgress: OnFraction) => Promise<T>): Promise<T> {
    const started = now();
    const cancel = () => controller.abort();
    set({ progress: progressAt(task, 0, started, started, cancel) });
    let lastMs = 0;
    // Progress calls from a worker are fire-and-forget and may arrive after the step has finished: drop those.
    let done = false;
    const onProgress: OnFraction = (f, eta) => {
      const t = now();
      if (done || controller.signal.aborted) return;
      if (t - lastMs < 50 && f < 1) return; // at most ~20 store updates per second
      lastMs = t;
      set({ progress: progressAt(task, f, started, t, cancel, eta) });
    };
    try {
      return await run(onProgress);
    } finally {
      done = true;
    }
  }

  /** Starts a new cancellable task, cancelling any load still running. */
  function begin(): AbortController {
    current?.abort();
    const controller = new AbortController();
    current = controller;
    set({ notice: null, resumeOffer: null });
    return controller;
  }

  function end(controller: AbortController) {
    if (current === controller) current = null;
  }

  function fail(controller: AbortController, e: unknown) {
    if (current !== controller) return; // superseded by a newer load
    set({
      progress: null,
      notice: controller.signal.aborted ? { kind: 'info', text: 'Cancelled.' } : { kind: 'error', text: (e as Error)?.message ?? String(e) },
    });
  }

  async function decomposeStep(controller: AbortController, options: DecomposeOptions) {
    const { recording, recordingSha256 } = get();
    if (!recording || recordingSha256 === null) throw new Error('No recording is loaded.');
    const services = await getWorkbenchServices();
    return step(`Decomposing (${options.method}, seed ${options.seed}, high-pass ${options.highpassHz} Hz)`, controller, (p) =>
      services.computeDecomposition(recording, recordingSha256, options, controller.signal, p),
    );
  }

  /** Decomposition → evidence → resume offer (or the given decisions file) → board. */
  async function finish(
    controller: AbortController,
    getDecomposition: () => Promise<{ decomposition: Decomposition; sha256: string; json?: string }>,
    decisionsFile: File | null,
    reuseEvidence?: ParticipantInput['reuseEvidence'],
  ) {
    const { signal } = controller;
    const services = await getWorkbenchServices();
    const recording = get().recording;
    const recordingSha256 = get().recordingSha256;
    if (!recording || recordingSha256 === null) throw new Error('No recording is loaded.');
    const made = await getDecomposition();
    signal.throwIfAborted();
    set({ decomposition: made.decomposition, decompositionSha256: made.sha256, decompositionJson: made.json ?? null, evidence: null, decisions: {}, past: [], future: [] });
    // evidence a batch run left for these very files, when the caller offers it; else computed here
    const reused = reuseEvidence
      ? await reuseEvidence({ recording, recordingSha256, decomposition: made.decomposition, decompositionSha256: made.sha256 }).catch(() => null)
      : null;
    signal.throwIfAborted();
    const evidence = reused ?? await step('Computing evidence', controller, (p) =>
      services.computeEvidence(recording, made.decomposition, signal, p),
    );
    signal.throwIfAborted();
    set({ evidence, selected: made.decomposition.nComponents > 0 ? 1 : null });
    const saved = await services.loadReview(reviewKey(recordingSha256, made.sha256)).catch(() => null);
    signal.throwIfAborted();
    set({ progress: null, screen: 'board', resumeOffer: decisionsFile ? null : resumeOfferFrom(saved) });
    if (decisionsFile) await get().importDecisions(decisionsFile);
  }

  return {
    loadParticipant: async (input) => {
      const controller = begin();
      const { signal } = controller;
      try {
        const services = await getWorkbenchServices();
        const { recording, sha256: recordingSha256 } = await step('Reading the recording', controller, (p) =>
          services.readRecording(input.recordingFiles, signal, p),
        );
        signal.throwIfAborted();
        set({
          recording, recordingSha256, decomposition: null, decompositionSha256: null, decompositionJson: null, evidence: null,
          decisions: {}, past: [], future: [], selected: null, roi: DEFAULT_ROI, screen: 'start',
        });
        if (input.decompositionFiles && input.decompositionFiles.length > 0) {
          const files = input.decompositionFiles;
          await finish(controller, () => step('Reading the decomposition', controller, () =>
            services.readDecomposition(files, recording, recordingSha256, signal)), input.decisionsFile ?? null, input.reuseEvidence);
        } else if (input.decompose === null) {
          // Recording only: the start screen lists it and offers to compute or open a decomposition.
          set({ progress: null });
        } else {
          const options = input.decompose ?? DEFAULT_DECOMPOSE;
          await finish(controller, () => decomposeStep(controller, options), input.decisionsFile ?? null);
        }
      } catch (e) {
        fail(controller, e);
      } finally {
        end(controller);
      }
    },

    decomposeCurrent: async (options) => {
      if (!get().recording) return;
      const controller = begin();
      try {
        await finish(controller, () => decomposeStep(controller, options), null);
      } catch (e) {
        fail(controller, e);
      } finally {
        end(controller);
      }
    },

    openDecomposition: async (files) => {
      const { recording, recordingSha256 } = get();
      if (!recording || recordingSha256 === null) return;
      const controller = begin();
      try {
        const services = await getWorkbenchServices();
        await finish(controller, () => step('Reading the decomposition', controller, () =>
          services.readDecomposition(files, recording, recordingSha256, controller.signal)), null);
      } catch (e) {
        fail(controller, e);
      } finally {
        end(controller);
      }
    },

    loadDemo: async () => {
      const services = await getWorkbenchServices();
      const controller = new AbortController();
      let input;
      try {
        set({ notice: null, progress: progressAt('Fetching the demo participant', 0, now(), now(), () => controller.abort()) });
        input = await services.demoInput(controller.signal);
      } catch (e) {
        set({ progress: null, notice: { kind: 'error', text: `Demo participant unavailable: ${(e as Error)?.message ?? String(e)}` } });
        return;
      }
      await get().loadParticipant(input);
    },

    importDecisions: async (file) => {
      const { text, name } = await readText(file);
      const s = get();
      const n = s.decomposition?.nComponents ?? 0;
      const trimmed = text.trimStart();
      if (trimmed.startsWith('{')) {
        const parsed = parseDecisionsJson(text, name);
        if (!parsed.ok) {
          set({ notice: { kind: 'error', text: parsed.error.message } });
          return false;
        }
        const f = parsed.value;
        if (s.recordingSha256 && f.recordingSha256 !== s.recordingSha256) {
          set({ notice: { kind: 'error', text: `${name}: made for another recording (SHA-256 ${f.recordingSha256.slice(0, 12)}…, this one is ${s.recordingSha256.slice(0, 12)}…)` } });
          return false;
        }
        if (s.decompositionSha256 && f.decompositionSha256 !== s.decompositionSha256) {
          set({ notice: { kind: 'error', text: `${name}: made for another decomposition (SHA-256 ${f.decompositionSha256.slice(0, 12)}…, this one is ${s.decompositionSha256.slice(0, 12)}…)` } });
          return false;
        }
        const tooHigh = f.components.find((c) => n > 0 && c.index > n);
        if (tooHigh) {
          set({ notice: { kind: 'error', text: `${name}: component ${tooHigh.index} does not exist (the decomposition has ${n})` } });
          return false;
        }
        if (!(await confirmImport(name, get(), f.components.length, false))) return false;
        get().replaceDecisions(decisionsFromFile(f), f.aim, f.thresholdOverrides ?? {});
        set({ reviewer: f.reviewer, resumeOffer: null, notice: { kind: 'info', text: `Restored ${f.components.length} decisions from ${name}.` } });
        return true;
      }
      const parsed = parseDecisionsTsv(text, name);
      if (!parsed.ok) {
        set({ notice: { kind: 'error', text: parsed.error.message } });
        return false;
      }
      const tooHigh = Object.keys(parsed.value).map(Number).find((i) => n > 0 && i > n);
      if (tooHigh !== undefined) {
        set({ notice: { kind: 'error', text: `${name}: component ${tooHigh} does not exist (the decomposition has ${n})` } });
        return false;
      }
      if (!(await confirmImport(name, get(), Object.keys(parsed.value).length, true))) return false;
      get().replaceDecisions(parsed.value);
      set({ resumeOffer: null, notice: { kind: 'info', text: `Restored decisions from ${name} (TSV carries no hashes; check it belongs to this participant).` } });
      return true;
    },

    resume: (accept) => {
      const offer = get().resumeOffer;
      set({ resumeOffer: null });
      // Undo never reaches back past a resume (it would empty the resumed review).
      if (accept && offer) { get().replaceDecisions(offer.decisions, offer.aim, offer.thresholds); set({ past: [], future: [] }); }
    },

    closeParticipant: () => {
      current?.abort();
      current = null;
      set({
        recording: null, recordingSha256: null, decomposition: null, decompositionSha256: null, decompositionJson: null, evidence: null,
        decisions: {}, past: [], future: [], selected: null, screen: 'start', progress: null, resumeOffer: null, roi: DEFAULT_ROI,
      });
    },
  };
};
