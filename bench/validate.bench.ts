/**
 * Validation bench (issue 10 item 6): the full held-out run of the validation harness — recordings of the
 * validation family from seed 1001 on, every montage (19–128 electrodes) and 3–30 minutes — simulated,
 * decomposed (Picard), suggested and scored (src/core/validate). Reports the wall time and, in the note,
 * the figures of the issue 10 item 7 targets. Heavy: minutes per recording on two cores. Set
 * WINNOW_VALIDATE_SCENARIOS to change the number of recordings (default 12).
 */
import { buildReport, FIRST_HELD_OUT_SEED, validateScenario } from '../src/core/validate/validate.ts';
import type { BenchRow } from './bench-types.ts';

export async function bench(): Promise<BenchRow[]> {
  const n = Number(process.env.WINNOW_VALIDATE_SCENARIOS ?? 12);
  const t0 = performance.now();
  const scenarios = [];
  for (let k = 0; k < n; k++) {
    const seed = FIRST_HELD_OUT_SEED + k;
    process.stderr.write(`bench: validate seed ${seed} …\n`);
    scenarios.push(validateScenario(seed));
  }
  const ms = performance.now() - t0;
  const report = buildReport(scenarios, {}, ms / 1000);
  const note = report.targets.map((t) => `${t.met ? 'met' : 'NOT met'}: ${t.target} ${t.target.includes('found') ? `${(100 * t.value).toFixed(0)} %` : t.value}`).join('; ');
  return [{ area: 'validate', case: `${n} held-out family recordings (seeds ${FIRST_HELD_OUT_SEED}…)`, oursMs: ms, referenceMs: null, reference: 'none (quality figures in the note)', note }];
}
