/**
 * `winnow agree <A.json> <B.json>`: agreement between two reviewers' decisions files (docs/methods.md §13) as
 * JSON on stdout. Both files must be for the same recording and the same decomposition (equal
 * `recordingSha256` and `decompositionSha256`), else exit 2 naming the files. Components are matched by
 * their `index`, never by their position in the list; an index present in one file only counts as
 * `undecided` in the other (the decisions-file rule for a component without a decision), with a warning.
 *
 * Output:
 *   components          number of components compared (the union of the indices)
 *   observedAgreement   p_o over the verdicts keep / remove / undecided
 *   expectedAgreement   p_e, chance agreement from each reviewer's verdict shares
 *   kappa               Cohen's κ = (p_o − p_e) / (1 − p_e) (Cohen 1960), or null when undefined
 *   note                present when κ is null: why
 *   disagreements       indices whose verdicts differ, ascending
 *   reasons             the same four fields (and note) over the reasons of the components both reviewers
 *                       removed; a removal without a reason counts as its own category "none"
 *
 * `winnow agree <study-A/> <study-B/>`: every *_decisions.json under each folder, matched by recording and
 * decomposition hashes (never by name): { recordings: [{ recording, other, …the fields above }],
 * pooled: { recordings, components, observedAgreement, expectedAgreement, kappa, reasons },
 * unmatched: { a, b } } — pooled κ over all matched components of all recordings.
 */
import { readdir, readFile, stat } from 'node:fs/promises';
import { basename, join, relative, sep } from 'node:path';
import { CliError, parseCommandArgs, type CliIo } from './cli-support.ts';
import { parseDecisionsJson, type DecisionsFile } from '../core/review/decisions-file.ts';
import { agreementByKey, type KeyedAgreement } from '../core/review/kappa.ts';
import { REASON_CODES, VERDICTS } from '../core/review/vocabulary.ts';

const USAGE = 'usage: winnow agree <decisions-A.json> <decisions-B.json> | winnow agree <study-A/> <study-B/>';

/** Help text for `winnow agree --help` (first line: the usage). */
export const usage = `${USAGE}

Compares two reviewers' decisions files for the same recording and decomposition and prints JSON:
Cohen's kappa over the verdicts (keep, remove, undecided), the indices where the verdicts differ, and
kappa over the reasons of the components both reviewers removed. Components are matched by index.
Files for different recordings or decompositions are refused (exit 2).
Two folders (study exports holding *_decisions.json) give one row per recording, matched by the
recording and decomposition hashes, plus the pooled agreement over every matched component.

options:
  -h, --help                show this help
`;

async function load(path: string): Promise<DecisionsFile> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory, not a decisions file' : (code ?? (e as Error).message);
    throw new CliError(`${path}: cannot read the file (${why})`, 2);
  }
  const res = parseDecisionsJson(text, path);
  if (!res.ok) throw new CliError(res.error.message, 2);
  return res.value;
}

/** JSON fields of one agreement; NaN (nothing to compare) is written as null. */
function agreementJson(a: KeyedAgreement, what: string): Record<string, unknown> {
  const num = (v: number) => (Number.isFinite(v) ? v : null);
  const out: Record<string, unknown> = {
    components: a.n,
    observedAgreement: num(a.observed),
    expectedAgreement: num(a.chance),
    kappa: a.kappa,
  };
  if (a.kappa === null) {
    out.note =
      a.n === 0
        ? `no components to compare ${what}; kappa is undefined`
        : `both reviewers gave every component the same ${what === 'verdicts' ? 'verdict' : 'reason'} ("${a.constantCategory}"), so the expected agreement is 1 and kappa = (p_o − p_e) / (1 − p_e) is undefined (0/0)`;
  }
  return out;
}

interface Compared {
  readonly verdictPairs: { key: number; a: string; b: string }[];
  readonly reasonPairs: { key: number; a: string; b: string }[];
}

/** Pairs of verdicts (every index in either file) and of reasons (indices both removed), matched by index. */
function compare(a: DecisionsFile, b: DecisionsFile, pathA: string, pathB: string, io: CliIo): Compared {
  for (const [key, what] of [['recordingSha256', 'recording'], ['decompositionSha256', 'decomposition']] as const) {
    if (a[key] !== b[key])
      throw new CliError(
        `winnow agree: ${pathA} and ${pathB} are for different ${what}s (${key} ${a[key] || '(empty)'} in ${basename(pathA)}, ${b[key] || '(empty)'} in ${basename(pathB)})`,
        2,
      );
  }
  const byIndex = (f: DecisionsFile) => new Map(f.components.map((c) => [c.index, c]));
  const mapA = byIndex(a);
  const mapB = byIndex(b);
  const indices = [...new Set([...mapA.keys(), ...mapB.keys()])].sort((x, y) => x - y);
  for (const [map, path] of [[mapA, pathA], [mapB, pathB]] as const) {
    const missing = indices.filter((i) => !map.has(i));
    if (missing.length > 0) io.stderr(`warning: ${path}: no entry for component${missing.length === 1 ? '' : 's'} ${missing.join(', ')}; counted as undecided\n`);
  }
  const verdictOf = (map: typeof mapA, i: number) => map.get(i)?.verdict ?? 'undecided';
  const bothRemoved = indices.filter((i) => verdictOf(mapA, i) === 'remove' && verdictOf(mapB, i) === 'remove');
  return {
    verdictPairs: indices.map((i) => ({ key: i, a: verdictOf(mapA, i), b: verdictOf(mapB, i) })),
    reasonPairs: bothRemoved.map((i) => ({ key: i, a: mapA.get(i)?.reason ?? 'none', b: mapB.get(i)?.reason ?? 'none' })),
  };
}

function agreementOf(c: Compared): Record<string, unknown> {
  const verdicts = agreementByKey(c.verdictPairs, VERDICTS);
  const reasons = agreementByKey(c.reasonPairs, [...REASON_CODES, 'none']);
  return {
    ...agreementJson(verdicts, 'verdicts'),
    disagreements: verdicts.disagreements,
    reasons: agreementJson(reasons, 'reasons among the components both removed'),
  };
}

/** Every decisions file (*_decisions.json) under a folder, relative "/"-separated paths, sorted. */
async function decisionsFilesUnder(root: string): Promise<string[]> {
  const out: string[] = [];
  async function walk(dir: string): Promise<void> {
    for (const e of await readdir(dir, { withFileTypes: true })) {
      if (e.name.startsWith('.')) continue;
      const p = join(dir, e.name);
      if (e.isDirectory()) await walk(p);
      else if (e.name.endsWith('_decisions.json')) out.push(relative(root, p).split(sep).join('/'));
    }
  }
  await walk(root);
  return out.sort();
}

const isFolder = (p: string) => stat(p).then((s) => s.isDirectory(), () => false);

/**
 * Two study exports (folders of *_decisions.json, e.g. derivatives/winnow/): recordings are matched by
 * their recording and decomposition hashes, never by file name; one row per recording plus the pooled
 * agreement over every component of every matched recording.
 */
async function compareStudies(dirA: string, dirB: string, io: CliIo): Promise<Record<string, unknown>> {
  const loadAll = async (dir: string) => {
    const files = await decisionsFilesUnder(dir);
    if (files.length === 0) throw new CliError(`${dir}: no *_decisions.json files in the folder`, 2);
    const out: { path: string; file: DecisionsFile }[] = [];
    for (const f of files) out.push({ path: f, file: await load(join(dir, ...f.split('/'))) });
    return out;
  };
  const [a, b] = [await loadAll(dirA), await loadAll(dirB)];
  const keyOf = (f: DecisionsFile) => `${f.recordingSha256}:${f.decompositionSha256}`;
  const bByKey = new Map(b.map((x) => [keyOf(x.file), x]));
  const rows: Record<string, unknown>[] = [];
  const pooled: Compared = { verdictPairs: [], reasonPairs: [] };
  const matched = new Set<string>();
  let offset = 0;
  for (const x of a) {
    const y = bByKey.get(keyOf(x.file));
    if (!y) continue;
    matched.add(keyOf(x.file));
    const c = compare(x.file, y.file, join(dirA, x.path), join(dirB, y.path), io);
    rows.push({ recording: x.path, other: y.path, ...agreementOf(c) });
    // pooled keys: components of different recordings never collide
    for (const p of c.verdictPairs) pooled.verdictPairs.push({ ...p, key: offset + p.key });
    for (const p of c.reasonPairs) pooled.reasonPairs.push({ ...p, key: offset + p.key });
    offset += 1_000_000;
  }
  const onlyA = a.filter((x) => !matched.has(keyOf(x.file))).map((x) => x.path);
  const onlyB = b.filter((x) => !matched.has(keyOf(x.file))).map((x) => x.path);
  for (const [list, dir] of [[onlyA, dirA], [onlyB, dirB]] as const)
    if (list.length > 0) io.stderr(`warning: ${dir}: ${list.length} decisions file${list.length > 1 ? 's' : ''} with no counterpart for the same recording: ${list.join(', ')}\n`);
  if (rows.length === 0) throw new CliError(`winnow agree: ${dirA} and ${dirB} share no recording (matched by recording and decomposition hashes)`, 2);
  const pooledJson = agreementOf(pooled);
  // pooled disagreements are reported per recording; the pooled row keeps only the counts
  delete pooledJson.disagreements;
  return { recordings: rows, pooled: { recordings: rows.length, ...pooledJson }, unmatched: { a: onlyA, b: onlyB } };
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { positionals } = parseCommandArgs('agree', args, {});
  if (positionals.length !== 2) throw new CliError(`winnow agree: give exactly two decisions files or two study folders (${USAGE})`, 2);
  const [pathA, pathB] = positionals;
  const [dirA, dirB] = [await isFolder(pathA), await isFolder(pathB)];
  if (dirA !== dirB) throw new CliError(`winnow agree: give two decisions files or two folders, not one of each (${dirA ? pathA : pathB} is a folder)`, 2);
  const out = dirA ? await compareStudies(pathA, pathB, io) : agreementOf(compare(await load(pathA), await load(pathB), pathA, pathB, io));
  io.stdout(`${JSON.stringify(out, null, 2)}\n`);
  return 0;
}
