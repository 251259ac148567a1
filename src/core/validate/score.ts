/**
 * Scores the suggestions on one simulated recording of the validation family against its true sources
 * (issue 10 items 6–7), and pools the scores of many recordings.
 *
 * - **Found**: a source is found when the assignment (match.ts) gives it a component whose map has |r| > 0.9
 *   with its true map (the level) and that component holds it: no other true source carries more of
 *   the component's variance.
 * - **True class of a component**: the activation of component i is a_i = Σ_k (w_i·m_k) s_k + w_i·L·noise
 *   (W the unmixing, m_k the true maps, L the bridge/interpolation/reference operator of the simulation), so
 *   the share of its variance that each source carries is (w_i·m_k)² var(s_k) / var(a_i), the sources being
 *   independent (var of the 1 Hz high-passed activations, as the decomposition saw them). The class with the
 *   largest share names the component (sensor noise: 'noise'); that share is its purity. This labels the
 *   components no single source explains, e.g. a mixture of Gaussian background generators is neural.
 * - **Residual artefact ratio** and **neural variance kept**: the cleaning projector of review/clean.ts applied
 *   to the true maps, Σ_k ‖(I − P) m_k‖² var(s_k) over artefact (or neural) sources, divided by the same sum
 *   without cleaning. The same ratio per artefact class (residualByClass) says how much of, e.g., the blinks is
 *   left in the cleaned data whether or not the decomposition gave them a component of their own.
 * - **Held with a look-alike**: a source that is not found but whose variance the decomposition put mostly into
 *   a component found for another source whose true map is nearly the same (|r| > 0.9 between the true maps),
 *   e.g. vertical gaze inside the blink component. No spatial unmixing can split two sources whose maps are
 *   that close at a low signal-to-noise ratio; the count is reported beside the strict found rate, never in it.
 */
import type { Decomposition } from '../decomposition.ts';
import { cleanSignals, createCleaningPlan } from '../review/clean.ts';
import type { FiredRule } from '../review/suggest.ts';
import { AIMS, REASON_CODES, type Aim, type ReasonCode, type Verdict } from '../review/vocabulary.ts';
import type { FamilySession } from '../simulate/family/simulate-family.ts';
import type { TrueSourceClass } from '../simulate/truth.ts';
import { mapCorrelation, matchSourcesToComponents } from './match.ts';

/** |r| above which a source counts as found (issue 10 item 7). */
export const FOUND_R = 0.9;

export const TRUE_CLASSES: readonly TrueSourceClass[] = ['blink', 'gaze', 'muscle', 'cardiac', 'contact', 'mains', 'movement', 'neural', 'noise'];
export const ARTEFACT_CLASSES: readonly TrueSourceClass[] = ['blink', 'gaze', 'muscle', 'cardiac', 'contact', 'mains', 'movement'];
export const isArtefact = (c: TrueSourceClass) => c !== 'neural' && c !== 'noise';

export interface ComponentSuggestion {
  readonly verdict: Verdict;
  readonly reason: ReasonCode;
  readonly rules?: readonly FiredRule[];
}

export interface ScoredComponent {
  /** 1-based. */
  readonly index: number;
  readonly varianceShare: number;
  readonly trueClass: TrueSourceClass;
  /** Share of the component's variance carried by its true class (0…1). */
  readonly purity: number;
  /** Source assigned by map matching, and the |r|, or null. */
  readonly source: string | null;
  readonly r: number;
  readonly suggestions: Record<Aim, { verdict: Verdict; reason: ReasonCode }>;
}

export interface ScoredSource {
  readonly id: string;
  readonly class: TrueSourceClass;
  readonly kind: string;
  readonly expected: boolean;
  /** 1-based component, or null. */
  readonly component: number | null;
  readonly r: number;
  readonly found: boolean;
  /** The matched component's suggestion per aim (null when not found). */
  readonly suggestions: Record<Aim, { verdict: Verdict; reason: ReasonCode }> | null;
  /**
   * When not found: the id of the found source whose component holds most of this source's variance and
   * whose true map has |r| > FOUND_R with this one (see the header), else null.
   */
  readonly heldWith: string | null;
}

export interface AimScore {
  /** Confusion table: true class (rows) × suggested reason (columns), over components. */
  readonly confusion: Record<string, Record<string, number>>;
  readonly removed: number;
  readonly removedArtefact: number;
  readonly artefactComponents: number;
  readonly removePrecision: number;
  readonly removeRecall: number;
  /** Components suggested `muscle` whose true class is not muscle. */
  readonly falseMuscle: number;
  /** Components whose true class is neural suggested `remove`. */
  readonly neuralRemoved: number;
  /** True artefact sources of the recording that a decomposition can hold (expectedComponent). */
  readonly trueArtefacts: number;
  /** removed − trueArtefacts. */
  readonly beyondTrue: number;
  readonly residualArtefactRatio: number;
  /** The residual ratio for the expected sources of each artefact class present (absent classes left out). */
  readonly residualByClass: Partial<Record<TrueSourceClass, number>>;
  readonly neuralVarianceKept: number;
}

export interface ScenarioScore {
  readonly components: ScoredComponent[];
  readonly sources: ScoredSource[];
  readonly aims: Record<Aim, AimScore>;
}

/** Per component, the variance each true source (and the sensor noise) contributes, by class. */
function componentComposition(session: FamilySession, dec: Decomposition): { trueClass: TrueSourceClass; purity: number; topSource: string | null }[] {
  const m = dec.nChannels;
  const rowOf = dec.channels.map((l) => session.labels.indexOf(l));
  const out: { trueClass: TrueSourceClass; purity: number; topSource: string | null }[] = [];
  for (let i = 0; i < dec.nComponents; i++) {
    const w = dec.unmixing.subarray(i * m, (i + 1) * m);
    const byClass = new Map<TrueSourceClass, number>();
    let topSource: string | null = null;
    let topV = -1;
    for (const s of session.sources) {
      let g = 0;
      for (let d = 0; d < m; d++) g += w[d] * s.map[rowOf[d]];
      const v = g * g * s.highPassedVariance;
      byClass.set(s.class, (byClass.get(s.class) ?? 0) + v);
      if (v > topV) [topSource, topV] = [s.id, v];
    }
    // Sensor noise: white, σ² per pre-operator channel; a_i's noise part is Σ_j (Σ_c w_c L_cj) n_j.
    const v = new Float64Array(session.labels.length);
    for (let d = 0; d < m; d++) for (const [j, l] of session.operator[rowOf[d]]) v[j] += w[d] * l;
    let vv = 0;
    for (let j = 0; j < v.length; j++) vv += v[j] * v[j];
    byClass.set('noise', (byClass.get('noise') ?? 0) + vv * session.sensorNoiseUv ** 2);
    let total = 0;
    let best: TrueSourceClass = 'noise';
    let bestV = -1;
    for (const [c, val] of byClass) {
      total += val;
      if (val > bestV) [best, bestV] = [c, val];
    }
    out.push({ trueClass: best, purity: total > 0 ? bestV / total : 0, topSource });
  }
  return out;
}

/** Σ_k ‖(I − P) m_k‖² var_k over the sources selected, and the same without cleaning, via clean.ts. */
function keptEnergy(session: FamilySession, dec: Decomposition, removed: readonly number[], select: (c: TrueSourceClass, expected: boolean) => boolean): number {
  const chosen = session.sources.filter((s) => select(s.class, s.expectedComponent));
  if (chosen.length === 0) return NaN;
  const M = session.labels.length;
  const K = chosen.length;
  const block = new Float32Array(M * K);
  chosen.forEach((s, k) => {
    for (let c = 0; c < M; c++) block[c * K + k] = s.map[c];
  });
  const plan = createCleaningPlan({ ...dec, channelMeans: null }, session.labels, removed);
  if (!plan.ok) throw new RangeError(`validate: ${plan.message}`);
  const cleaned = cleanSignals(plan.plan, block, K);
  let before = 0;
  let after = 0;
  chosen.forEach((s, k) => {
    let e0 = 0;
    let e1 = 0;
    for (let c = 0; c < M; c++) {
      e0 += block[c * K + k] ** 2;
      e1 += cleaned[c * K + k] ** 2;
    }
    before += e0 * s.highPassedVariance;
    after += e1 * s.highPassedVariance;
  });
  return before > 0 ? after / before : NaN;
}

/** Per source, the component (0-based) whose activation carries most of its variance: argmax_i (w_i·m_k)². */
function holdingComponents(session: FamilySession, dec: Decomposition): number[] {
  const m = dec.nChannels;
  const rowOf = dec.channels.map((l) => session.labels.indexOf(l));
  return session.sources.map((s) => {
    let best = -1;
    let bestV = -1;
    for (let i = 0; i < dec.nComponents; i++) {
      let g = 0;
      for (let d = 0; d < m; d++) g += dec.unmixing[i * m + d] * s.map[rowOf[d]];
      if (g * g > bestV) [best, bestV] = [i, g * g];
    }
    return best;
  });
}

const emptyConfusion = (): Record<string, Record<string, number>> =>
  Object.fromEntries(TRUE_CLASSES.map((c) => [c, Object.fromEntries(REASON_CODES.map((r) => [r, 0]))]));

/** Scores one recording: `suggestions[i][aim]` is component i's (0-based) suggestion, `varianceShares[i]` its share. */
export function scoreScenario(
  session: FamilySession,
  dec: Decomposition,
  suggestions: readonly Record<Aim, ComponentSuggestion>[],
  varianceShares: readonly number[],
): ScenarioScore {
  const matches = matchSourcesToComponents(
    session.sources.map((s) => dec.channels.map((l) => s.map[session.labels.indexOf(l)])),
    dec.mixing,
    dec.nChannels,
    dec.nComponents,
  );
  const composition = componentComposition(session, dec);
  const sourceOfComponent = new Map<number, { id: string; r: number }>();
  matches.forEach((mt, s) => {
    if (mt.component >= 0) sourceOfComponent.set(mt.component, { id: session.sources[s].id, r: mt.r });
  });
  const plain = (s: ComponentSuggestion) => ({ verdict: s.verdict, reason: s.reason });
  const components: ScoredComponent[] = composition.map((c, i) => ({
    index: i + 1,
    varianceShare: varianceShares[i],
    trueClass: c.trueClass,
    purity: c.purity,
    source: sourceOfComponent.get(i)?.id ?? null,
    r: sourceOfComponent.get(i)?.r ?? 0,
    suggestions: Object.fromEntries(AIMS.map((a) => [a, plain(suggestions[i][a])])) as Record<Aim, { verdict: Verdict; reason: ReasonCode }>,
  }));
  const foundIds = new Set<string>();
  const foundOf = session.sources.map((s, k) => {
    const mt = matches[k];
    const f = mt.component >= 0 && mt.r > FOUND_R && composition[mt.component].topSource === s.id;
    if (f) foundIds.add(s.id);
    return f;
  });
  const holder = holdingComponents(session, dec);
  const sources: ScoredSource[] = session.sources.map((s, k) => {
    const mt = matches[k];
    // Found: the maps agree (|r| > 0.9) and the component holds the source (no other source carries more of
    // its variance) — a broad map can match a component that holds little of it. Sensor noise is left out of
    // this test: a bad electrode's component always holds that electrode's own noise too.
    const found = foundOf[k];
    let heldWith: string | null = null;
    if (!found) {
      const owner = sourceOfComponent.get(holder[k]);
      const o = owner ? session.sources.find((x) => x.id === owner.id) : undefined;
      if (o && o !== s && foundIds.has(o.id) && Math.abs(mapCorrelation(o.map, s.map)) > FOUND_R) heldWith = o.id;
    }
    return {
      id: s.id,
      class: s.class,
      kind: s.kind,
      expected: s.expectedComponent,
      component: mt.component >= 0 ? mt.component + 1 : null,
      r: mt.r,
      found,
      suggestions: found ? components[mt.component].suggestions : null,
      heldWith,
    };
  });
  const trueArtefacts = session.sources.filter((s) => isArtefact(s.class) && s.expectedComponent).length;
  const aims = Object.fromEntries(
    AIMS.map((aim) => {
      const confusion = emptyConfusion();
      let removed = 0;
      let removedArtefact = 0;
      let artefactComponents = 0;
      let falseMuscle = 0;
      let neuralRemoved = 0;
      const removedIdx: number[] = [];
      components.forEach((c) => {
        const s = c.suggestions[aim];
        confusion[c.trueClass][s.reason]++;
        const art = isArtefact(c.trueClass);
        if (art) artefactComponents++;
        if (s.verdict === 'remove') {
          removed++;
          removedIdx.push(c.index);
          if (art) removedArtefact++;
          if (c.trueClass === 'neural') neuralRemoved++;
        }
        if (s.reason === 'muscle' && c.trueClass !== 'muscle') falseMuscle++;
      });
      const score: AimScore = {
        confusion,
        removed,
        removedArtefact,
        artefactComponents,
        removePrecision: removed > 0 ? removedArtefact / removed : NaN,
        removeRecall: artefactComponents > 0 ? removedArtefact / artefactComponents : NaN,
        falseMuscle,
        neuralRemoved,
        trueArtefacts,
        beyondTrue: removed - trueArtefacts,
        residualArtefactRatio: keptEnergy(session, dec, removedIdx, (c) => isArtefact(c)),
        residualByClass: Object.fromEntries(
          ARTEFACT_CLASSES.filter((cls) => session.sources.some((x) => x.class === cls && x.expectedComponent)).map((cls) => [
            cls,
            keptEnergy(session, dec, removedIdx, (c, expected) => c === cls && expected),
          ]),
        ),
        neuralVarianceKept: keptEnergy(session, dec, removedIdx, (c) => c === 'neural'),
      };
      return [aim, score];
    }),
  ) as Record<Aim, AimScore>;
  return { components, sources, aims };
}

export interface ClassRate {
  /** Expected sources of the class over the recordings. */
  readonly n: number;
  readonly found: number;
  /** Found and given the right reason under every aim. */
  readonly foundAndRight: number;
  /** The same, per aim. */
  readonly foundAndRightByAim: Record<Aim, number>;
  readonly foundRate: number;
  readonly foundAndRightRate: number;
  /** Right reason among the found (how the rules do when the decomposition did its part). */
  readonly rightGivenFoundRate: number;
  /** Not found but held in a look-alike source's found component (ScoredSource.heldWith); not in `found`. */
  readonly heldWithLookAlike: number;
}

export interface PooledAim {
  readonly confusion: Record<string, Record<string, number>>;
  readonly removePrecision: number;
  readonly removeRecall: number;
  readonly falseMuscleTotal: number;
  readonly falseMuscleMaxPerRecording: number;
  readonly neuralRemovedTotal: number;
  readonly removalsBeyondTrueMax: number;
  /** Recordings whose removals exceed the true artefacts by more than 2. */
  readonly recordingsOverTruePlus2: number;
  readonly residualArtefactRatioMean: number;
  /** Mean over the recordings holding the class of its residual ratio (AimScore.residualByClass). */
  readonly residualByClassMean: Partial<Record<TrueSourceClass, number>>;
  readonly neuralVarianceKeptMean: number;
}

export interface PooledScore {
  readonly recordings: number;
  readonly classes: Record<string, ClassRate>;
  readonly aims: Record<Aim, PooledAim>;
}

const mean = (xs: number[]) => {
  const f = xs.filter(Number.isFinite);
  return f.length ? f.reduce((a, b) => a + b, 0) / f.length : NaN;
};

/** Pools the scores of several recordings. */
export function poolScores(scores: readonly ScenarioScore[]): PooledScore {
  const classes: Record<string, ClassRate> = {};
  for (const cls of ARTEFACT_CLASSES) {
    let n = 0;
    let found = 0;
    let right = 0;
    let held = 0;
    const byAim = { erp: 0, oscillations: 0, conservative: 0 } as Record<Aim, number>;
    for (const sc of scores)
      for (const s of sc.sources) {
        if (s.class !== cls || !s.expected) continue;
        n++;
        if (!s.found && s.heldWith) held++;
        if (!s.found || !s.suggestions) continue;
        found++;
        let all = true;
        for (const aim of AIMS) {
          if (s.suggestions[aim].reason === cls) byAim[aim]++;
          else all = false;
        }
        if (all) right++;
      }
    classes[cls] = {
      n,
      found,
      foundAndRight: right,
      foundAndRightByAim: byAim,
      foundRate: n ? found / n : NaN,
      foundAndRightRate: n ? right / n : NaN,
      rightGivenFoundRate: found ? right / found : NaN,
      heldWithLookAlike: held,
    };
  }
  const aims = Object.fromEntries(
    AIMS.map((aim) => {
      const confusion = emptyConfusion();
      let removed = 0;
      let removedArt = 0;
      let artComps = 0;
      for (const sc of scores) {
        const a = sc.aims[aim];
        for (const r of Object.keys(a.confusion)) for (const c of Object.keys(a.confusion[r])) confusion[r][c] += a.confusion[r][c];
        removed += a.removed;
        removedArt += a.removedArtefact;
        artComps += a.artefactComponents;
      }
      const per = scores.map((s) => s.aims[aim]);
      const pooled: PooledAim = {
        confusion,
        removePrecision: removed ? removedArt / removed : NaN,
        removeRecall: artComps ? removedArt / artComps : NaN,
        falseMuscleTotal: per.reduce((s, a) => s + a.falseMuscle, 0),
        falseMuscleMaxPerRecording: Math.max(0, ...per.map((a) => a.falseMuscle)),
        neuralRemovedTotal: per.reduce((s, a) => s + a.neuralRemoved, 0),
        removalsBeyondTrueMax: Math.max(-Infinity, ...per.map((a) => a.beyondTrue)),
        recordingsOverTruePlus2: per.filter((a) => a.beyondTrue > 2).length,
        residualArtefactRatioMean: mean(per.map((a) => a.residualArtefactRatio)),
        residualByClassMean: Object.fromEntries(
          ARTEFACT_CLASSES.filter((cls) => per.some((a) => a.residualByClass?.[cls] !== undefined)).map((cls) => [
            cls,
            mean(per.flatMap((a) => (a.residualByClass?.[cls] === undefined ? [] : [a.residualByClass[cls]!]))),
          ]),
        ),
        neuralVarianceKeptMean: mean(per.map((a) => a.neuralVarianceKept)),
      };
      return [aim, pooled];
    }),
  ) as Record<Aim, PooledAim>;
  return { recordings: scores.length, classes, aims };
}

export interface TargetCheck {
  readonly target: string;
  readonly value: number;
  readonly goal: string;
  readonly met: boolean;
}

/** The issue 10 item 7 targets against a pooled score. */
export function checkTargets(p: PooledScore): TargetCheck[] {
  const out: TargetCheck[] = [];
  for (const [cls, goal] of [['blink', 0.95], ['gaze', 0.95], ['contact', 0.95], ['mains', 0.95], ['muscle', 0.9], ['cardiac', 0.9]] as const) {
    const c = p.classes[cls];
    if (!c || c.n === 0) continue;
    out.push({ target: `${cls} found (|r| > ${FOUND_R}) and right reason, every aim`, value: c.foundAndRightRate, goal: `≥ ${goal * 100} %`, met: c.foundAndRightRate >= goal });
  }
  const neural = AIMS.reduce((s, a) => s + p.aims[a].neuralRemovedTotal, 0);
  out.push({ target: 'neural components suggested remove, any aim', value: neural, goal: '0', met: neural === 0 });
  const fm = Math.max(...AIMS.map((a) => p.aims[a].falseMuscleMaxPerRecording));
  out.push({ target: 'false muscle per recording (most, any aim)', value: fm, goal: '≤ 1', met: fm <= 1 });
  const over = p.aims.oscillations.recordingsOverTruePlus2;
  out.push({ target: 'recordings where oscillations-aim removals exceed true artefacts + 2', value: over, goal: '0', met: over === 0 });
  return out;
}
