/**
 * `winnow batch <bids_dir> <output_dir> participant|group [--participant-label L ...] [--task T]
 * [--aim A] [--method M] [--seed N] [--force]`: the BIDS Apps argument convention (Gorgolewski et al.
 * 2017, PLoS Comput. Biol. 13:e1005209): a dataset, an output folder and an analysis level.
 *
 * participant: for each recording (sub-<label>/[ses-<label>/]eeg/<stem>_eeg.edf|bdf, filtered by label and task), runs
 *   `winnow decompose` and `winnow evidence` in this process and writes, atomically,
 *   <output_dir>/sub-<l>/[ses-<l>/]eeg/<stem>_desc-winnow_decomposition.json and …_evidence.json, and
 *   <output_dir>/dataset_description.json. A recording whose decomposition already exists for the same
 *   recording hash, method and seed, with its evidence beside it, is skipped (`--force` redoes it). One
 *   progress line per recording on stderr, a JSON summary on stdout. Exit 1 when some recordings fail
 *   (the others are still written), 2 for a bad command line or dataset.
 * group: reads every evidence file under <output_dir> and writes winnow_study.tsv and winnow_study.json:
 *   one row per recording with the suggested removals per aim, the variance share they carry, and the
 *   study's consistency flags (src/core/study/flags.ts) for the chosen aim.
 *
 * One participant per process is the way to spread a study over a cluster: see docs/batch.md (GNU parallel
 * and a SLURM array job).
 */
import { mkdir, readdir, readFile, stat } from 'node:fs/promises';
import { join, relative, sep } from 'node:path';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, memoryIo, numberOption, parseCommandArgs, sha256OfFile, type CliIo } from './cli-support.ts';
import {
  derivativeDescription,
  derivativePath,
  findRecordings,
  normaliseParticipantLabel,
  parseBidsName,
  sidecarFor,
} from '../core/study/bids-dataset.ts';
import { studyFlags, type StudyRecordingSummary } from '../core/study/flags.ts';
import { AIMS, type Aim } from '../core/review/vocabulary.ts';
import { formatTsv } from '../core/formats/bids.ts';

const USAGE =
  'usage: winnow batch <bids_dir> <output_dir> participant|group [--participant-label L ...] [--task T] [--aim erp|oscillations|conservative] [--method picard|infomax] [--seed N] [--force]';

export const usage = `${USAGE}

Runs decomposition and evidence over a BIDS dataset (participant level), or gathers the results into one
study table (group level). Follows the BIDS Apps convention; one participant per process spreads a study
over a cluster (docs/batch.md).

options:
  --participant-label L     participant label, with or without "sub-"; repeatable (default every participant)
  --task T                  only recordings of this task
  --aim A                   aim whose flags the group table reports (default erp)
  --method picard|infomax   ICA method (default picard)
  --seed N                  decomposition seed (default 1)
  --force                   redo recordings whose outputs already exist
  -h, --help                show this help
`;

const VERSION = '0.1.0';

/** Every file under `root`, relative and "/"-separated (hidden folders and derivatives skipped). */
async function listFiles(root: string): Promise<string[]> {
  const out: string[] = [];
  async function walk(dir: string): Promise<void> {
    let entries;
    try {
      entries = await readdir(dir, { withFileTypes: true });
    } catch (e) {
      throw new CliError(`${dir}: cannot list the folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    for (const e of entries) {
      if (e.name.startsWith('.')) continue;
      const p = join(dir, e.name);
      const rel = relative(root, p).split(sep).join('/');
      if (e.isDirectory()) {
        if (rel === 'derivatives' || rel === 'sourcedata' || rel === 'code') continue;
        await walk(p);
      } else out.push(rel);
    }
  }
  await walk(root);
  return out.sort();
}

async function readJson(path: string): Promise<Record<string, unknown> | null> {
  try {
    const v: unknown = JSON.parse(await readFile(path, 'utf8'));
    return v !== null && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}

const exists = (p: string) => stat(p).then(() => true, () => false);

interface BatchOptions {
  readonly bids: string;
  readonly out: string;
  readonly labels: readonly string[] | null;
  readonly task: string | undefined;
  readonly aim: Aim;
  readonly method: 'picard' | 'infomax';
  readonly seed: number;
  readonly force: boolean;
}

/** Runs another winnow command in this process; its stderr lines pass through, prefixed. */
async function runCommand(name: 'decompose' | 'evidence', args: string[], io: CliIo, prefix: string): Promise<void> {
  const { main } = await import('./winnow.ts');
  const mem = memoryIo();
  const code = await main([name, ...args], mem);
  for (const line of mem.err.split('\n')) {
    if (line.trim() === '' || /^\s*(iteration|progress)\b/i.test(line) || line.includes('\r')) continue;
    if (code === 0 && !line.startsWith('warning:')) continue;
    io.stderr(`${prefix}${line}\n`);
  }
  if (code !== 0) {
    const firstError = mem.err.split('\n').find((l) => l.startsWith('error:')) ?? `winnow ${name} exited with ${code}`;
    throw new Error(firstError.replace(/^error:\s*/, ''));
  }
}

async function participantLevel(o: BatchOptions, io: CliIo): Promise<number> {
  const files = await listFiles(o.bids);
  let recordings = findRecordings(files);
  if (o.labels) {
    const wanted = new Set(o.labels);
    const known = new Set(recordings.map((r) => r.entities.sub));
    const unknown = [...wanted].filter((l) => !known.has(l));
    if (unknown.length > 0) throw new CliError(`${o.bids}: no recordings for participant${unknown.length > 1 ? 's' : ''} ${unknown.map((l) => `sub-${l}`).join(', ')}`);
    recordings = recordings.filter((r) => wanted.has(r.entities.sub));
  }
  if (o.task !== undefined) recordings = recordings.filter((r) => r.entities.task === o.task);
  if (recordings.length === 0) throw new CliError(`${o.bids}: no EEG recordings (sub-<label>/[ses-<label>/]eeg/<stem>_eeg.edf or .bdf)${o.task ? ` for task ${o.task}` : ''}`);

  await mkdir(o.out, { recursive: true });
  await writeFileAtomic(
    join(o.out, 'dataset_description.json'),
    derivativeDescription('Winnow decompositions and evidence', VERSION, 'Independent component decompositions and per-component evidence'),
  );
  const done: string[] = [];
  const skipped: string[] = [];
  const failed: { recording: string; error: string }[] = [];
  for (const [i, rec] of recordings.entries()) {
    const prefix = `[${i + 1}/${recordings.length}] ${rec.stem}: `;
    const recordingPath = join(o.bids, ...rec.path.split('/'));
    const decPath = join(o.out, ...derivativePath(rec, 'winnow', 'decomposition', '.json').split('/'));
    const evPath = join(o.out, ...derivativePath(rec, 'winnow', 'evidence', '.json').split('/'));
    try {
      const hash = await sha256OfFile(recordingPath);
      if (!o.force && (await upToDate(decPath, evPath, hash, o))) {
        skipped.push(rec.path);
        io.stderr(`${prefix}skipped (outputs exist for this recording, method and seed; --force redoes it)\n`);
        continue;
      }
      await mkdir(join(o.out, ...rec.folder.split('/')), { recursive: true });
      const side = (suffix: string, ext: string) => {
        const p = sidecarFor(rec, suffix, ext, files);
        return p === null ? null : join(o.bids, ...p.split('/'));
      };
      const channels = side('channels', '.tsv');
      const electrodes = side('electrodes', '.tsv');
      const events = side('events', '.tsv');
      io.stderr(`${prefix}decomposing (${o.method}, seed ${o.seed})\n`);
      await runCommand('decompose', [recordingPath, '--out', decPath, '--method', o.method, '--seed', String(o.seed), ...(channels ? ['--channels-tsv', channels] : [])], io, prefix);
      io.stderr(`${prefix}computing evidence\n`);
      await runCommand('evidence', [recordingPath, decPath, '--out', evPath, ...(electrodes ? ['--positions', electrodes] : []), ...(events ? ['--events', events] : [])], io, prefix);
      done.push(rec.path);
      io.stderr(`${prefix}done\n`);
    } catch (e) {
      const error = e instanceof Error ? e.message : String(e);
      failed.push({ recording: rec.path, error });
      io.stderr(`${prefix}failed: ${error}\n`);
    }
  }
  io.stdout(JSON.stringify({ level: 'participant', recordings: recordings.length, done, skipped, failed }) + '\n');
  if (failed.length > 0) {
    io.stderr(`error: ${failed.length} of ${recordings.length} recordings failed: ${failed.map((f) => f.recording).join(', ')}\n`);
    return 1;
  }
  return 0;
}

/** Outputs exist for the same recording hash, method and seed, and the evidence reads as JSON. */
async function upToDate(decPath: string, evPath: string, recordingSha256: string, o: BatchOptions): Promise<boolean> {
  if (!(await exists(decPath)) || !(await exists(evPath))) return false;
  const dec = await readJson(decPath);
  const ev = await readJson(evPath);
  if (!dec || !ev) return false;
  return dec.recordingSha256 === recordingSha256 && dec.method === o.method && (dec.seed ?? 1) === o.seed && Array.isArray(ev.components);
}

interface GroupRow {
  readonly entities: Readonly<Record<string, string>>;
  readonly file: string;
  readonly components: number;
  readonly removals: Record<Aim, number>;
  readonly removedVariance: Record<Aim, number>;
  readonly reasons: Record<Aim, string[]>;
  readonly undecided: Record<Aim, number>;
}

function readGroupRow(file: string, json: Record<string, unknown>): GroupRow {
  const name = parseBidsName(file.split('/').pop() ?? file);
  if (!name) throw new CliError(`${file}: not a BIDS derivative name`);
  const comps = json.components;
  if (!Array.isArray(comps)) throw new CliError(`${file}: no "components" list`);
  const zero = () => ({ erp: 0, oscillations: 0, conservative: 0 }) as Record<Aim, number>;
  const removals = zero();
  const removedVariance = zero();
  const undecided = zero();
  const reasons = { erp: [], oscillations: [], conservative: [] } as Record<Aim, string[]>;
  for (const [k, c] of comps.entries()) {
    const comp = c as { varianceShare?: unknown; suggestions?: Record<string, { verdict?: unknown; reason?: unknown }> };
    for (const aim of AIMS) {
      const s = comp.suggestions?.[aim];
      if (!s || typeof s.verdict !== 'string') throw new CliError(`${file}: component ${k + 1} has no suggestion for aim ${aim}`);
      if (s.verdict === 'remove') {
        removals[aim]++;
        removedVariance[aim] += typeof comp.varianceShare === 'number' ? comp.varianceShare : 0;
        if (typeof s.reason === 'string') reasons[aim].push(s.reason);
      } else if (s.verdict === 'undecided') undecided[aim]++;
    }
  }
  return { entities: name.entities, file, components: comps.length, removals, removedVariance, reasons, undecided };
}

async function groupLevel(o: BatchOptions, io: CliIo): Promise<number> {
  if (!(await exists(o.out))) throw new CliError(`${o.out}: no such folder (run the participant level first)`);
  const all: string[] = [];
  async function walk(dir: string): Promise<void> {
    for (const e of await readdir(dir, { withFileTypes: true })) {
      const p = join(dir, e.name);
      if (e.isDirectory()) await walk(p);
      else if (e.name.endsWith('_desc-winnow_evidence.json')) all.push(relative(o.out, p).split(sep).join('/'));
    }
  }
  await walk(o.out);
  all.sort();
  if (all.length === 0) throw new CliError(`${o.out}: no *_desc-winnow_evidence.json files (run the participant level first)`);
  const rows: GroupRow[] = [];
  for (const f of all) {
    const json = await readJson(join(o.out, ...f.split('/')));
    if (!json) throw new CliError(`${join(o.out, f)}: not a readable JSON object`);
    rows.push(readGroupRow(f, json));
  }
  const keyOf = (r: GroupRow) => Object.entries(r.entities).filter(([k]) => k !== 'desc').map(([k, v]) => `${k}-${v}`).join(' ');
  const summaries: StudyRecordingSummary[] = rows.map((r) => ({
    key: keyOf(r),
    removed: r.removals[o.aim],
    removedVariance: r.removedVariance[o.aim],
    reasons: r.reasons[o.aim],
    undecided: 0,
    aim: o.aim,
  }));
  const flags = studyFlags(summaries);
  const flagsOf = (key: string) => flags.filter((f) => f.key === key);
  const round = (v: number) => Math.round(v * 1e4) / 1e4;
  const json = {
    format: 'winnow-study/1',
    aim: o.aim,
    recordings: rows.map((r) => ({
      participant_id: `sub-${r.entities.sub}`,
      session: r.entities.ses ?? null,
      task: r.entities.task ?? null,
      run: r.entities.run ?? null,
      evidence: r.file,
      components: r.components,
      suggestedRemovals: r.removals,
      removedVarianceShare: Object.fromEntries(AIMS.map((a) => [a, round(r.removedVariance[a])])),
      reasons: r.reasons,
      flags: flagsOf(keyOf(r)).map((f) => ({ rule: f.rule, why: f.why })),
    })),
  };
  const na = (v: string | undefined) => v ?? 'n/a';
  const tsv = formatTsv(
    ['participant_id', 'session', 'task', 'run', 'components', ...AIMS.map((a) => `removals_${a}`), ...AIMS.map((a) => `removed_variance_${a}`), 'flags'],
    rows.map((r) => [
      `sub-${r.entities.sub}`,
      na(r.entities.ses),
      na(r.entities.task),
      na(r.entities.run),
      r.components,
      ...AIMS.map((a) => r.removals[a]),
      ...AIMS.map((a) => round(r.removedVariance[a])),
      flagsOf(keyOf(r)).map((f) => f.rule).join(',') || 'n/a',
    ]),
  );
  await writeFileAtomic(join(o.out, 'winnow_study.tsv'), tsv);
  await writeFileAtomic(join(o.out, 'winnow_study.json'), JSON.stringify(json, null, 2) + '\n');
  io.stdout(JSON.stringify({ level: 'group', recordings: rows.length, flags: flags.length, files: ['winnow_study.tsv', 'winnow_study.json'] }) + '\n');
  return 0;
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('batch', args, {
    'participant-label': { type: 'string', multiple: true },
    task: { type: 'string' },
    aim: { type: 'string' },
    method: { type: 'string' },
    seed: { type: 'string' },
    force: { type: 'boolean' },
  });
  if (positionals.length !== 3) throw new CliError(`winnow batch: expected <bids_dir> <output_dir> participant|group\n${USAGE}`);
  const [bids, out, level] = positionals;
  if (level !== 'participant' && level !== 'group') throw new CliError(`winnow batch: analysis level must be "participant" or "group", got "${level}"\n${USAGE}`);
  const aim = (values.aim ?? 'erp') as Aim;
  if (!AIMS.includes(aim)) throw new CliError(`winnow batch: --aim must be one of ${AIMS.join(', ')}, got "${values.aim}"`);
  const method = values.method ?? 'picard';
  if (method !== 'picard' && method !== 'infomax') throw new CliError(`winnow batch: --method must be picard or infomax, got "${values.method}"`);
  const seed = numberOption('batch', 'seed', values.seed, 1);
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new CliError(`winnow batch: --seed must be an integer in 0…4294967295, got "${values.seed}"`);
  if (!(await exists(join(bids, 'dataset_description.json'))))
    throw new CliError(`${bids}: not a BIDS dataset (no dataset_description.json at its root)`);
  const labels = values['participant-label']?.map(normaliseParticipantLabel) ?? null;
  const o: BatchOptions = { bids, out, labels, task: values.task, aim, method, seed, force: values.force === true };
  return level === 'participant' ? participantLevel(o, io) : groupLevel(o, io);
}
