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
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { CliError, parseCommandArgs, type CliIo } from './cli-support.ts';
import { parseDecisionsJson, type DecisionsFile } from '../core/review/decisions-file.ts';
import { agreementByKey, type KeyedAgreement } from '../core/review/kappa.ts';
import { REASON_CODES, VERDICTS } from '../core/review/vocabulary.ts';

const USAGE = 'usage: winnow agree <decisions-A.json> <decisions-B.json>';

/** Help text for `winnow agree --help` (first line: the usage). */
export const usage = `${USAGE}

Compares two reviewers' decisions files for the same recording and decomposition and prints JSON:
Cohen's kappa over the verdicts (keep, remove, undecided), the indices where the verdicts differ, and
kappa over the reasons of the components both reviewers removed. Components are matched by index.
Files for different recordings or decompositions are refused (exit 2).

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

export async function run(args: string[], io: CliIo): Promise<number> {
  const { positionals } = parseCommandArgs('agree', args, {});
  if (positionals.length !== 2) throw new CliError(`winnow agree: give exactly two decisions files (${USAGE})`, 2);
  const [pathA, pathB] = positionals;
  const [a, b] = [await load(pathA), await load(pathB)];
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

  const verdicts = agreementByKey(
    indices.map((i) => ({ key: i, a: verdictOf(mapA, i), b: verdictOf(mapB, i) })),
    VERDICTS,
  );
  const bothRemoved = indices.filter((i) => verdictOf(mapA, i) === 'remove' && verdictOf(mapB, i) === 'remove');
  const reasons = agreementByKey(
    bothRemoved.map((i) => ({ key: i, a: mapA.get(i)?.reason ?? 'none', b: mapB.get(i)?.reason ?? 'none' })),
    [...REASON_CODES, 'none'],
  );

  const out = {
    ...agreementJson(verdicts, 'verdicts'),
    disagreements: verdicts.disagreements,
    reasons: agreementJson(reasons, 'reasons among the components both removed'),
  };
  io.stdout(`${JSON.stringify(out, null, 2)}\n`);
  return 0;
}
