/**
 * Shared checks of the issue-6 class expectations on simulated sessions (src/core/simulate), used by the
 * classes-*.test.ts files. Components are matched to true sources by the absolute correlation of their scalp
 * maps; the expectations (common practice, issue 6):
 * - every blink and eye-movement component: remove, for every aim;
 * - the alpha, mu and event-locked neural components: keep, for every aim;
 * - muscle that is not time-locked: keep under erp, remove under oscillations;
 * - the loose electrode: found (reason "electrode") and removed.
 */
import { expect } from 'vitest';
import { pseudoInverse, Matrix } from 'ml-matrix';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { computeEvidence, type EvidenceResult } from '../../../src/core/evidence/compute-evidence.ts';
import { lockedShare } from '../../../src/core/evidence/time-locking.ts';
import { AIMS } from '../../../src/core/review/vocabulary.ts';
import { suggestAllAims } from '../../../src/core/review/suggest.ts';
import { extractEpochs } from '../../../src/core/signal/epochs.ts';
import type { SimulatedSession, TrueSource } from '../../../src/core/simulate/truth.ts';

/** The decomposition a perfect ICA would return: the true mixing and its pseudo-inverse. */
export function perfectDecomposition(s: SimulatedSession): Decomposition {
  const m = s.labels.length;
  const k = s.sources.length;
  const A = new Matrix(m, k);
  for (let c = 0; c < m; c++) for (let j = 0; j < k; j++) A.set(c, j, s.mixing[c * k + j]);
  return {
    channels: s.labels,
    nChannels: m,
    nComponents: k,
    mixing: Float64Array.from(s.mixing),
    unmixing: Float64Array.from(pseudoInverse(A).to1DArray()),
    channelMeans: null,
    method: 'imported',
    rank: k,
    iterations: 0,
    converged: true,
    preprocessing: { filter: 'none', highpassHz: null, lowpassHz: null, reference: 'average', excludedChannels: [] },
    recordingSha256: '',
  };
}

export function evidenceFor(s: SimulatedSession, decomposition: Decomposition): EvidenceResult {
  return computeEvidence({
    data: s.data,
    nChannels: s.labels.length,
    nSamples: s.nSamples,
    sampleRate: s.sampleRate,
    labels: s.labels,
    positionsUnit: Float64Array.from(s.electrodesMm, (v) => v / s.headRadiusMm),
    decomposition,
    events: s.events,
    lineHz: s.lineHz,
    permutations: 19,
  });
}

function correlation(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let ab = 0;
  let aa = 0;
  let bb = 0;
  for (let i = 0; i < a.length; i++) {
    ab += a[i] * b[i];
    aa += a[i] * a[i];
    bb += b[i] * b[i];
  }
  return ab / Math.sqrt(aa * bb);
}

/** The component whose map correlates best (in absolute value) with the source's map, and that |r|. */
export function matchSource(src: TrueSource, dec: Decomposition): { component: number; r: number } {
  let best = 0;
  let bestR = -1;
  const col = new Float64Array(dec.nChannels);
  for (let i = 0; i < dec.nComponents; i++) {
    for (let c = 0; c < dec.nChannels; c++) col[c] = dec.mixing[c * dec.nComponents + i];
    const r = Math.abs(correlation(col, src.map));
    if (r > bestR) [best, bestR] = [i, r];
  }
  return { component: best, r: bestR };
}

/** True for neural sources whose true activation is phase-locked to the tones (locked share > 0.1). */
function eventLockedNeural(s: SimulatedSession, src: TrueSource): boolean {
  if (src.class !== 'neural') return false;
  const onsets = s.events.filter((e) => e.label.startsWith('tone')).map((e) => e.onset);
  const ep = extractEpochs(src.activation, s.sampleRate, onsets, -0.2, 0.8, null);
  return lockedShare(src.activation, ep.eventSamples, ep.firstOffset, ep.length) > 0.1;
}

/**
 * Checks the class expectations for every source that the decomposition recovered (|map r| ≥ minR);
 * returns how many sources were checked per class so callers can assert the checks ran.
 */
export function expectClassVerdicts(s: SimulatedSession, dec: Decomposition, result: EvidenceResult, minR = 0.9): Record<string, number> {
  const checked: Record<string, number> = {};
  const count = (k: string) => (checked[k] = (checked[k] ?? 0) + 1);
  for (const src of s.sources) {
    const { component, r } = matchSource(src, dec);
    if (r < minR) continue;
    const e = result.components[component];
    // Suggestions are computed from the evidence (issue 10 item 1), here with the default thresholds.
    const suggestions = suggestAllAims(e);
    const where = `seed ${s.seed}, ${s.labels.length} ch, source ${src.id} → component ${component + 1} (map r = ${r.toFixed(2)})`;
    const say = (aim: string) => `${where}, ${aim}: ${JSON.stringify(suggestions[aim as 'erp'])}`;
    if (src.class === 'blink' || src.class === 'gaze') {
      for (const aim of AIMS) expect(suggestions[aim].verdict, say(aim)).toBe('remove');
      for (const aim of AIMS) expect(['blink', 'gaze'], say(aim)).toContain(suggestions[aim].reason);
      count(src.class);
    } else if (src.class === 'neural' && (/^(alpha|mu)-/.test(src.id) || eventLockedNeural(s, src))) {
      for (const aim of AIMS) expect(suggestions[aim].verdict, say(aim)).toBe('keep');
      count(/^(alpha|mu)-/.test(src.id) ? 'rhythm' : 'event-locked');
    } else if (src.class === 'muscle') {
      if (e.erp && e.erp.permutationP !== undefined && e.erp.permutationP <= 0.05 && e.erp.timeLockingStrength >= 0.02) continue; // time-locked
      // A map concentrated on one electrode with a flat rest reads as a poor contact whatever its spectrum (issue 10
      // item 2; docs/suggestion-rules.md): such a muscle source is removed as contact for every aim.
      if (e.focality.share >= 0.6 && suggestions.erp.reason === 'contact') {
        for (const aim of AIMS) expect(suggestions[aim], say(aim)).toMatchObject({ verdict: 'remove', reason: 'contact' });
        count('muscle');
        continue;
      }
      expect(suggestions.erp.verdict, say('erp')).toBe('keep');
      expect(suggestions.oscillations.verdict, say('oscillations')).toBe('remove');
      expect(suggestions.oscillations.reason, say('oscillations')).toBe('muscle');
      count('muscle');
    } else if (src.class === 'contact') {
      for (const aim of AIMS) expect(suggestions[aim], say(aim)).toMatchObject({ verdict: 'remove', reason: 'contact' });
      count('contact');
    }
  }
  return checked;
}
