/**
 * The validation harness (issue 10 item 6): for each seed, simulate a family recording
 * (simulate/family), decompose it with the same core path `winnow decompose` uses (ica/decompose.ts,
 * Picard), compute the evidence (evidence/compute-evidence.ts, no aim), suggest for each aim
 * (review/suggest.ts suggestWithRules) and score the suggestions against the true sources (score.ts).
 *
 * Seeds 1–999 are tuning seeds: thresholds in review/thresholds.ts were adjusted looking at them only.
 * Seeds ≥ 1001 are held out: they are for reporting, never for tuning (docs/suggestion-rules.md).
 */
import { computeEvidence } from '../evidence/compute-evidence.ts';
import { decomposeRecording } from '../ica/decompose.ts';
import { suggestWithRules, type SuggestionInput } from '../review/suggest.ts';
import { resolveThresholds, type Thresholds } from '../review/thresholds.ts';
import { AIMS, type Aim } from '../review/vocabulary.ts';
import type { FamilyLimits, FamilyParams } from '../simulate/family/params.ts';
import { simulateFamilyScenario } from '../simulate/family/simulate-family.ts';
import { checkTargets, poolScores, scoreScenario, type ComponentSuggestion, type PooledScore, type ScenarioScore, type TargetCheck } from './score.ts';

/** The tuning seeds (inclusive range) and the first held-out seed. */
export const TUNING_SEEDS: readonly [number, number] = [1, 999];
export const FIRST_HELD_OUT_SEED = 1001;

export type SeedRole = 'tuning' | 'held-out' | 'other';
export function seedRole(seed: number): SeedRole {
  if (seed >= TUNING_SEEDS[0] && seed <= TUNING_SEEDS[1]) return 'tuning';
  if (seed >= FIRST_HELD_OUT_SEED) return 'held-out';
  return 'other';
}

export interface ValidateOptions {
  readonly limits?: FamilyLimits;
  readonly thresholds?: Partial<Thresholds>;
  /** Picard iteration cap (default the decomposition's own, 500). */
  readonly maxIter?: number;
  readonly onStage?: (seed: number, stage: string) => void;
  /** Wall clock in ms (injected so the core stays host-free; default performance.now). */
  readonly now?: () => number;
}

export interface ScenarioReport {
  readonly seed: number;
  readonly role: SeedRole;
  readonly params: FamilyParams;
  readonly dropped: string[];
  readonly rank: number;
  readonly expectedRank: number;
  readonly nComponents: number;
  readonly converged: boolean;
  readonly iterations: number;
  readonly seconds: { readonly simulate: number; readonly decompose: number; readonly evidence: number; readonly total: number };
  readonly score: ScenarioScore;
}

/** Runs one scenario end to end. */
export function validateScenario(seed: number, opts: ValidateOptions = {}): ScenarioReport {
  const now = opts.now ?? (() => performance.now());
  const t0 = now();
  opts.onStage?.(seed, 'simulate');
  const session = simulateFamilyScenario(seed, opts.limits);
  const t1 = now();
  opts.onStage?.(seed, 'decompose');
  const { data, labels, nSamples, sampleRate } = session;
  const dec = decomposeRecording(
    { data, nChannels: labels.length, nSamples, sampleRate, labels },
    { method: 'picard', seed, ...(opts.maxIter ? { maxIter: opts.maxIter } : {}) },
  ).decomposition;
  const t2 = now();
  opts.onStage?.(seed, 'evidence');
  const evidence = computeEvidence({
    data,
    nChannels: labels.length,
    nSamples,
    sampleRate,
    labels,
    positionsUnit: session.positionsUnit,
    decomposition: dec,
    events: session.events,
    lineHz: session.lineHz,
    headRadiusMm: session.headRadiusMm,
  });
  const thresholds = resolveThresholds(opts.thresholds);
  const suggestions = evidence.components.map((e) => {
    const out = {} as Record<Aim, ComponentSuggestion>;
    for (const aim of AIMS) {
      const s = suggestWithRules(e as SuggestionInput, aim, thresholds);
      out[aim] = { verdict: s.suggestion.verdict, reason: s.suggestion.reason, rules: s.rules };
    }
    return out;
  });
  const t3 = now();
  const score = scoreScenario(session, dec, suggestions, evidence.components.map((e) => e.varianceShare));
  const t4 = now();
  return {
    seed,
    role: seedRole(seed),
    params: session.params,
    dropped: session.dropped,
    rank: dec.rank,
    expectedRank: session.expectedRank,
    nComponents: dec.nComponents,
    converged: dec.converged,
    iterations: dec.iterations,
    seconds: { simulate: (t1 - t0) / 1000, decompose: (t2 - t1) / 1000, evidence: (t3 - t2) / 1000, total: (t4 - t0) / 1000 },
    score,
  };
}

export interface ValidationReport {
  readonly format: 'winnow-validation-report';
  readonly version: 1;
  readonly note: string;
  readonly seeds: {
    readonly used: number[];
    readonly tuning: string;
    readonly heldOut: string;
    readonly roles: Record<SeedRole, number[]>;
  };
  readonly limits: FamilyLimits;
  readonly summary: PooledScore;
  /** Pooled over held-out seeds only (the figures to report), or null when none were run. */
  readonly heldOutSummary: PooledScore | null;
  readonly targets: TargetCheck[];
  readonly scenarios: ScenarioReport[];
  readonly seconds: number;
}

/** Pools scenario reports into the report object. */
export function buildReport(scenarios: readonly ScenarioReport[], limits: FamilyLimits, seconds: number): ValidationReport {
  const roles: Record<SeedRole, number[]> = { tuning: [], 'held-out': [], other: [] };
  for (const s of scenarios) roles[s.role].push(s.seed);
  const summary = poolScores(scenarios.map((s) => s.score));
  const held = scenarios.filter((s) => s.role === 'held-out');
  const heldOutSummary = held.length ? poolScores(held.map((s) => s.score)) : null;
  return {
    format: 'winnow-validation-report',
    version: 1,
    note:
      'Simulated recordings only (Winnow validation family); suggestions are starting points and the decision is the reviewer\'s. ' +
      `Thresholds were tuned on seeds ${TUNING_SEEDS[0]}–${TUNING_SEEDS[1]} only; seeds ≥ ${FIRST_HELD_OUT_SEED} are held out.`,
    seeds: {
      used: scenarios.map((s) => s.seed),
      tuning: `${TUNING_SEEDS[0]}–${TUNING_SEEDS[1]}`,
      heldOut: `≥ ${FIRST_HELD_OUT_SEED}`,
      roles,
    },
    limits,
    summary,
    heldOutSummary,
    targets: checkTargets(heldOutSummary ?? summary),
    scenarios: [...scenarios],
    seconds,
  };
}
