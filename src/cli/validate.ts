/**
 * `winnow validate [--scenarios N] [--seed S] [--out report.json] [--channels 19,32,64,128] [--max-minutes M]`:
 * the validation harness of issue 10 item 6 (src/core/validate). Simulates N recordings of the validation
 * family with seeds S, S+1, …, decomposes each (Picard, the decompose command's core path), computes the
 * evidence and the suggestions for every aim, scores them against the true sources, prints per aim a
 * confusion table and the remove figures, and writes the whole report as JSON (atomically).
 *
 * Seeds 1–999 are the tuning seeds, seeds ≥ 1001 the held-out ones; the default (S = 1001) reports held-out
 * figures. Progress goes to stderr.
 */
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { MONTAGE_SIZES, type MontageSize } from '../core/simulate/family/montages.ts';
import type { FamilyLimits } from '../core/simulate/family/params.ts';
import { REASON_CODES, AIMS } from '../core/review/vocabulary.ts';
import { TRUE_CLASSES, type PooledScore } from '../core/validate/score.ts';
import { buildReport, validateScenario, type ScenarioReport, type ValidationReport } from '../core/validate/validate.ts';

const USAGE = 'usage: winnow validate [--scenarios N] [--seed S] [--out report.json] [--channels 19,32,64,128] [--max-minutes M] [--min-minutes M]';

/** Help text for `winnow validate --help` (first line: the usage). */
export const usage = `${USAGE}

Simulates N recordings of the validation family (montages of 19–128 electrodes, seated or walking, 50 or
60 Hz mains, cardiac field, loose, noisy and bridged electrodes, sweat, jaw, temple and neck muscle,
interpolated channels with average reference, 3–30 minutes), decomposes each with Picard, suggests a
verdict for every component under every aim, and scores the suggestions against the true sources: per aim
a confusion table (true class × suggested reason), remove precision and recall, false muscle, removals
beyond the true artefacts, residual artefact ratio and neural variance kept. Seeds 1–999 were used to tune
the thresholds; seeds from 1001 on are held out. Simulated data only: the figures say how the rules do on
our simulations, not on a given real recording.

options:
  --scenarios N             number of recordings (default 6)
  --seed S                  first seed; recordings use S, S+1, … (default 1001, held out)
  --out FILE.json           write the full report here (atomically)
  --channels LIST           montages to draw from, comma-separated among 19,32,64,128 (default all)
  --min-minutes M           shortest recording drawn (default 3)
  --max-minutes M           longest recording drawn (default 30)
  -h, --help                show this help
`;

export interface ValidateArgs {
  readonly scenarios: number;
  readonly seed: number;
  readonly out: string | null;
  readonly limits: FamilyLimits;
}

export function parseValidateArgs(args: string[]): ValidateArgs {
  const { values, positionals } = parseCommandArgs('validate', args, {
    scenarios: { type: 'string' },
    seed: { type: 'string' },
    out: { type: 'string' },
    channels: { type: 'string' },
    'min-minutes': { type: 'string' },
    'max-minutes': { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`winnow validate: unexpected argument "${positionals[0]}"\n${USAGE}`);
  const scenarios = numberOption('validate', 'scenarios', values.scenarios, 6);
  if (!Number.isInteger(scenarios) || scenarios < 1 || scenarios > 10000) throw new CliError(`winnow validate: --scenarios must be an integer in 1…10000, got "${values.scenarios}"`);
  const seed = numberOption('validate', 'seed', values.seed, 1001);
  if (!Number.isInteger(seed) || seed < 0 || seed + scenarios - 1 > 0xffffffff) throw new CliError(`winnow validate: --seed must be an integer in 0…4294967295, got "${values.seed}"`);
  let channels: MontageSize[] | undefined;
  if (values.channels !== undefined) {
    const list = values.channels.split(',').map((s) => Number(s.trim()));
    if (list.length === 0 || list.some((c) => !MONTAGE_SIZES.includes(c as MontageSize)))
      throw new CliError(`winnow validate: --channels must list montages among ${MONTAGE_SIZES.join(',')}, got "${values.channels}"`);
    channels = list as MontageSize[];
  }
  const minMinutes = numberOption('validate', 'min-minutes', values['min-minutes'], 3);
  const maxMinutes = numberOption('validate', 'max-minutes', values['max-minutes'], 30);
  if (!(minMinutes >= 0.5) || !(maxMinutes >= minMinutes) || maxMinutes > 240)
    throw new CliError(`winnow validate: need 0.5 ≤ --min-minutes ≤ --max-minutes ≤ 240, got ${values['min-minutes'] ?? 3} and ${values['max-minutes'] ?? 30}`);
  return { scenarios, seed, out: values.out ?? null, limits: { ...(channels ? { channels } : {}), minMinutes, maxMinutes } };
}

const pct = (v: number) => (Number.isFinite(v) ? `${(100 * v).toFixed(1)} %` : 'n/a');
const pad = (s: string, w: number) => s.padStart(w);

/** The readable summary: per-class rates, then per aim the confusion table and the remove figures. */
export function formatSummary(p: PooledScore, title: string): string {
  const lines: string[] = [`${title} (${p.recordings} recordings)`, ''];
  lines.push('class      sources  found  found+right reason (every aim)  right | found  held with a look-alike');
  for (const [cls, c] of Object.entries(p.classes)) {
    if (c.n === 0) continue;
    lines.push(
      `${cls.padEnd(10)} ${pad(String(c.n), 7)}  ${pad(pct(c.foundRate), 7)}  ${pad(pct(c.foundAndRightRate), 30)}  ${pad(pct(c.rightGivenFoundRate), 12)}  ${pad(String(c.heldWithLookAlike ?? 0), 22)}`,
    );
  }
  for (const aim of AIMS) {
    const a = p.aims[aim];
    lines.push('', `aim ${aim}: remove precision ${pct(a.removePrecision)}, recall ${pct(a.removeRecall)}, false muscle ${a.falseMuscleTotal} (most in one recording ${a.falseMuscleMaxPerRecording}), neural removed ${a.neuralRemovedTotal}`);
    lines.push(`  removals beyond the true artefacts: most ${a.removalsBeyondTrueMax}, recordings over +2: ${a.recordingsOverTruePlus2}; residual artefact ratio ${a.residualArtefactRatioMean.toFixed(3)}, neural variance kept ${pct(a.neuralVarianceKeptMean)}`);
    const byClass = Object.entries(a.residualByClassMean ?? {});
    if (byClass.length) lines.push(`  left in the cleaned data, by class: ${byClass.map(([c, v]) => `${c} ${pct(v ?? NaN)}`).join(', ')}`);
    const w = 8;
    lines.push(`  ${'true \\ reason'.padEnd(13)}${REASON_CODES.map((r) => pad(r.slice(0, w - 1), w)).join('')}`);
    for (const cls of TRUE_CLASSES) {
      const row = a.confusion[cls];
      if (!row || Object.values(row).every((v) => v === 0)) continue;
      lines.push(`  ${cls.padEnd(13)}${REASON_CODES.map((r) => pad(String(row[r]), w)).join('')}`);
    }
  }
  return `${lines.join('\n')}\n`;
}

export function formatTargets(report: ValidationReport): string {
  const lines = ['', `targets (issue 10 item 7, on ${report.heldOutSummary ? 'held-out' : 'all'} seeds):`];
  for (const t of report.targets) {
    const v = t.target.includes('found') ? pct(t.value) : String(t.value);
    lines.push(`  ${t.met ? 'met    ' : 'NOT MET'}  ${t.target}: ${v} (goal ${t.goal})`);
  }
  return `${lines.join('\n')}\n`;
}

const reportJson = (report: ValidationReport) => `${JSON.stringify(report, (_k, v) => (v instanceof Float64Array || v instanceof Float32Array ? Array.from(v) : v), 1)}\n`;

export async function run(args: string[], io: CliIo): Promise<number> {
  const a = parseValidateArgs(args);
  const t0 = performance.now();
  const scenarios: ScenarioReport[] = [];
  for (let k = 0; k < a.scenarios; k++) {
    const seed = a.seed + k;
    const r = validateScenario(seed, { limits: a.limits, onStage: (s, stage) => io.stderr(`validate: seed ${s} ${stage}\n`) });
    const osc = r.score.aims.oscillations;
    io.stderr(
      `validate: seed ${seed} (${r.role}) ${r.params.channels} ch, ${r.params.minutes} min, ${r.params.rate} Hz: ${r.nComponents} components, ` +
        `oscillations removes ${osc.removed} for ${osc.trueArtefacts} true artefacts, ${r.seconds.total.toFixed(1)} s\n`,
    );
    scenarios.push(r);
    // The report so far, rewritten after every recording, so a long run stopped early keeps what it measured.
    if (a.out && k + 1 < a.scenarios) await writeFileAtomic(a.out, reportJson(buildReport(scenarios, a.limits, (performance.now() - t0) / 1000)));
  }
  const report = buildReport(scenarios, a.limits, (performance.now() - t0) / 1000);
  io.stdout(formatSummary(report.summary, `all seeds ${report.seeds.used[0]}–${report.seeds.used[report.seeds.used.length - 1]}`));
  if (report.heldOutSummary && report.seeds.roles.tuning.length > 0) io.stdout(`\n${formatSummary(report.heldOutSummary, 'held-out seeds only')}`);
  io.stdout(formatTargets(report));
  io.stdout(`\nseeds used: ${report.seeds.used.join(', ')} (tuning seeds ${report.seeds.tuning}, held out ${report.seeds.heldOut}); ${report.seconds.toFixed(0)} s\n`);
  if (a.out) await writeFileAtomic(a.out, reportJson(report));
  return 0;
}
