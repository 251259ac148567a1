/**
 * `winnow dipole --positions electrodes.tsv --map map.tsv [--model sphere|three-shell] [--radius MM|fit]`:
 * fits one equivalent current dipole to a scalp map and prints JSON (contract of issue 3):
 *
 *     { "position": [x, y, z] (mm), "moment": [mx, my, mz] (nA·m for a map in µV),
 *       "residualVariance": fraction, ...extra fields }
 *
 * map.tsv has columns `name value`; every name must be an electrode of electrodes.tsv (exact match, or a
 * unique case-insensitive one); electrodes without a value are left out of the fit. The map's reference does
 * not matter: the average reference is applied to model and map alike. The position is an approximate model
 * estimate, not an anatomical location.
 */
import { CliError, parseCommandArgs, type CliIo } from './cli-support.ts';
import { centred, chooseModel, formatNumber, loadElectrodes, MIN_ELECTRODES, readTextFile } from './forward.ts';
import { parseTsv } from '../core/formats/bids.ts';
import { fitDipole } from '../core/headmodel/dipole-fit.ts';
import { approximateRegion } from '../core/headmodel/region.ts';

interface MapEntry {
  name: string;
  value: number;
}

function readMap(text: string, path: string): MapEntry[] {
  const tsv = parseTsv(text, path);
  if (!tsv.ok) throw new CliError(tsv.error.message, 2);
  const { columns, rows } = tsv.value;
  const nameCol = columns.indexOf('name');
  const valueCol = columns.indexOf('value');
  if (nameCol < 0 || valueCol < 0)
    throw new CliError(`${path}: needs columns "name" and "value" (has ${columns.join(', ')})`, 2);
  return rows.map((row, i) => {
    const name = row[nameCol].trim();
    const cell = row[valueCol].trim();
    const value = cell === '' || cell === 'n/a' ? NaN : Number(cell);
    if (!Number.isFinite(value)) throw new CliError(`${path}: line ${i + 2} value for "${name}" is "${cell}", not a finite number`, 2);
    return { name, value };
  });
}

/** Help text for `winnow dipole --help` (first line: the usage). */
export const usage = `usage: winnow dipole --positions electrodes.tsv --map map.tsv [--model sphere|three-shell] [--radius MM|fit]

Fits one equivalent current dipole to a scalp map and prints JSON (position mm, moment nA·m, residual variance).

options:
  --positions FILE          BIDS electrodes.tsv (name x y z, mm); required
  --map FILE                TSV with columns name, value; required
  --model sphere|three-shell  head model (default three-shell)
  --radius MM|fit           sphere radius in mm (default 90), or fit a sphere to the positions
  -h, --help                show this help
`;

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('dipole', args, {
    positions: { type: 'string' },
    map: { type: 'string' },
    model: { type: 'string' },
    radius: { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`winnow dipole: unexpected argument "${positionals[0]}"`, 2);
  if (!values.positions) throw new CliError('winnow dipole: --positions electrodes.tsv is required', 2);
  if (!values.map) throw new CliError('winnow dipole: --map map.tsv is required', 2);

  const electrodes = await loadElectrodes(values.positions, io);
  const entries = readMap(await readTextFile(values.map), values.map);

  const exact = new Map(electrodes.names.map((n, i) => [n, i]));
  const folded = new Map<string, number[]>();
  electrodes.names.forEach((n, i) => folded.set(n.toLowerCase(), [...(folded.get(n.toLowerCase()) ?? []), i]));
  const used = new Set<number>();
  const index: number[] = [];
  for (const { name } of entries) {
    let i = exact.get(name);
    if (i === undefined) {
      const candidates = folded.get(name.toLowerCase()) ?? [];
      if (candidates.length === 1) i = candidates[0];
    }
    if (i === undefined) throw new CliError(`${values.map}: electrode "${name}" is not in ${values.positions}`, 2);
    if (used.has(i)) throw new CliError(`${values.map}: electrode "${electrodes.names[i]}" has more than one value`, 2);
    used.add(i);
    index.push(i);
  }
  if (index.length < MIN_ELECTRODES)
    throw new CliError(`${values.map}: ${index.length} electrode value${index.length === 1 ? '' : 's'}; at least ${MIN_ELECTRODES} are needed`, 2);

  const { model, centre } = chooseModel('dipole', values.model, values.radius, electrodes.positionsMm);
  const all = centred(electrodes.positionsMm, centre);
  const positions = new Float64Array(3 * index.length);
  const map = new Float64Array(index.length);
  index.forEach((i, k) => {
    positions.set(all.subarray(3 * i, 3 * i + 3), 3 * k);
    map[k] = entries[k].value;
  });
  const fit = fitDipole(model, positions, map);
  if (!Number.isFinite(fit.residualVariance))
    throw new CliError(`${values.map}: the map is flat after average referencing; there is nothing to fit`, 2);
  const region = approximateRegion(fit.position, model.radiusMm);
  const round = (v: number) => Number(formatNumber(v));
  const out = {
    position: fit.position.map((v, k) => round(v + centre[k])),
    moment: fit.moment.map(round),
    residualVariance: round(fit.residualVariance),
    atBoundary: fit.atBoundary,
    iterations: fit.iterations,
    model: model.kind,
    radiusMm: round(model.radiusMm),
    centreMm: centre.map(round),
    electrodes: index.length,
    units: { position: 'mm', moment: 'nA·m per µV of map', residualVariance: 'fraction of the average-referenced map' },
    region: { label: region.label, caution: region.caution },
  };
  io.stdout(JSON.stringify(out, null, 2) + '\n');
  return 0;
}
