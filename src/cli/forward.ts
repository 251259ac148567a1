/**
 * `winnow forward --positions electrodes.tsv --dipole x,y,z,mx,my,mz [--model sphere|three-shell]
 * [--radius MM|fit]`: potentials (µV) of one current dipole at the electrodes, against an infinitely distant
 * reference (not re-referenced), as TSV `name<TAB>potential` (contract of issue 3).
 *
 * Positions are BIDS electrodes.tsv columns name x y z (mm unless a sibling *_coordsystem.json says
 * otherwise), in a frame whose origin is the sphere centre; each electrode is projected radially onto the
 * model sphere. `--radius fit` fits a sphere to the positions and uses its centre and radius (the dipole is
 * then given in the same frame as the electrodes). Dipole position in mm, moment in nA·m.
 */
import { CliError, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { readCliElectrodes, readInputFile } from './recording-files.ts';
import { createHeadModel, dipolePotentials, type HeadModel, type HeadModelKind } from '../core/headmodel/forward.ts';
import { fitSphere } from '../core/headmodel/sphere-fit.ts';

/** Fewest electrodes the head-model commands accept (contract of issue 3). */
export const MIN_ELECTRODES = 8;

export async function readTextFile(path: string): Promise<string> {
  return new TextDecoder('utf-8').decode(await readInputFile(path));
}

export interface LoadedElectrodes {
  names: string[];
  /** M × 3, mm, in the input frame. */
  positionsMm: Float64Array;
}

/** Reads (as the recording loader reads a paired one) and checks a BIDS electrodes.tsv: at least 8 rows, finite coordinates, unique names. */
export async function loadElectrodes(path: string, io: CliIo): Promise<LoadedElectrodes> {
  // mm is the documented default of these commands (usage), so "assumed to be in mm" is not repeated.
  const { names, positionsMm } = await readCliElectrodes(path, io, (w) => /assumed to be in mm/.test(w));
  const seen = new Set<string>();
  for (const [i, name] of names.entries()) {
    if (name === '') throw new CliError(`${path}: line ${i + 2} has an empty name`, 2);
    if (seen.has(name)) throw new CliError(`${path}: electrode "${name}" is listed twice`, 2);
    seen.add(name);
    for (let k = 0; k < 3; k++)
      if (!Number.isFinite(positionsMm[3 * i + k]))
        throw new CliError(`${path}: electrode "${name}" (line ${i + 2}) has no finite ${'xyz'[k]} coordinate`, 2);
    if (positionsMm[3 * i] === 0 && positionsMm[3 * i + 1] === 0 && positionsMm[3 * i + 2] === 0)
      throw new CliError(`${path}: electrode "${name}" (line ${i + 2}) sits at the sphere centre (0, 0, 0)`, 2);
  }
  if (names.length < MIN_ELECTRODES)
    throw new CliError(`${path}: ${names.length} electrode${names.length === 1 ? '' : 's'}; at least ${MIN_ELECTRODES} are needed`, 2);
  return { names, positionsMm };
}

export interface ModelChoice {
  model: HeadModel;
  /** Sphere centre in the input frame, mm ([0, 0, 0] unless `--radius fit`). */
  centre: [number, number, number];
}

/** Builds the head model from --model and --radius (a number in mm, or "fit"). */
export function chooseModel(command: string, modelOpt: string | undefined, radiusOpt: string | undefined, positionsMm: Float64Array): ModelChoice {
  const kind = (modelOpt ?? 'three-shell') as HeadModelKind;
  if (kind !== 'sphere' && kind !== 'three-shell')
    throw new CliError(`winnow ${command}: --model must be "sphere" or "three-shell", got "${modelOpt}"`, 2);
  let centre: [number, number, number] = [0, 0, 0];
  let radiusMm: number;
  if (radiusOpt === 'fit') {
    const fit = fitSphere(positionsMm);
    if (!(fit.radiusMm > 0)) throw new CliError(`winnow ${command}: could not fit a sphere to the electrode positions`, 2);
    centre = fit.centre;
    radiusMm = fit.radiusMm;
  } else {
    radiusMm = numberOption(command, 'radius', radiusOpt, 90);
    if (!(radiusMm > 0)) throw new CliError(`winnow ${command}: --radius must be > 0 mm, got ${radiusOpt}`, 2);
  }
  return { model: createHeadModel({ kind, radiusMm }), centre };
}

/** Electrodes moved into the model frame (origin at the sphere centre). */
export function centred(positionsMm: Float64Array, centre: [number, number, number]): Float64Array {
  const out = positionsMm.slice();
  for (let i = 0; i < out.length; i += 3) {
    out[i] -= centre[0];
    out[i + 1] -= centre[1];
    out[i + 2] -= centre[2];
  }
  return out;
}

/** Shortest decimal that keeps 12 significant digits. */
export function formatNumber(v: number): string {
  return Number.isFinite(v) ? String(Number(v.toPrecision(12))) : 'n/a';
}

/**
 * node:util parseArgs refuses an option value that starts with "-" ("--dipole -30,25,…"); a dipole with a
 * negative x is ordinary, so such values are attached as "--dipole=-30,25,…" first.
 */
export function attachNegativeValues(args: string[], names: readonly string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (names.includes(a.replace(/^--/, '')) && a.startsWith('--') && i + 1 < args.length && /^-[\d.]/.test(args[i + 1])) {
      out.push(`${a}=${args[i + 1]}`);
      i++;
    } else out.push(a);
  }
  return out;
}

/** Help text for `winnow forward --help` (first line: the usage). */
export const usage = `usage: winnow forward --positions electrodes.tsv --dipole x,y,z,mx,my,mz [--model sphere|three-shell] [--radius MM|fit]

Prints the potentials (µV) of one current dipole at the electrodes as TSV \`name<TAB>potential\`, against an
infinitely distant reference.

options:
  --positions FILE          BIDS electrodes.tsv (name x y z, mm); required
  --dipole x,y,z,mx,my,mz   position (mm) and moment (nA·m); required
  --model sphere|three-shell  head model (default three-shell)
  --radius MM|fit           sphere radius in mm (default 90), or fit a sphere to the positions
  -h, --help                show this help
`;

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('forward', attachNegativeValues(args, ['dipole']), {
    positions: { type: 'string' },
    dipole: { type: 'string' },
    model: { type: 'string' },
    radius: { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`winnow forward: unexpected argument "${positionals[0]}"`, 2);
  if (!values.positions) throw new CliError('winnow forward: --positions electrodes.tsv is required', 2);
  if (!values.dipole) throw new CliError('winnow forward: --dipole x,y,z,mx,my,mz is required (mm and nA·m)', 2);
  const parts = values.dipole.split(',').map((s) => s.trim());
  const nums = parts.map((s) => (s === '' ? NaN : Number(s)));
  if (parts.length !== 6 || nums.some((v) => !Number.isFinite(v)))
    throw new CliError(`winnow forward: --dipole needs 6 finite numbers x,y,z,mx,my,mz (mm, nA·m), got "${values.dipole}"`, 2);

  const electrodes = await loadElectrodes(values.positions, io);
  const { model, centre } = chooseModel('forward', values.model, values.radius, electrodes.positionsMm);
  const position = [nums[0] - centre[0], nums[1] - centre[1], nums[2] - centre[2]];
  const moment = nums.slice(3, 6);
  const dist = Math.hypot(position[0], position[1], position[2]);
  if (dist >= model.radiusMm)
    throw new CliError(
      `winnow forward: the dipole lies ${formatNumber(dist)} mm from the sphere centre, outside the ${formatNumber(model.radiusMm)} mm sphere`,
      2,
    );
  if (dist >= model.innerRadiusMm)
    throw new CliError(
      `winnow forward: the dipole lies ${formatNumber(dist)} mm from the centre, outside the brain shell (${formatNumber(model.innerRadiusMm)} mm) of the three-shell model; sources must sit in the brain`,
      2,
    );
  const v = dipolePotentials(model, centred(electrodes.positionsMm, centre), position, moment);
  const lines = ['name\tpotential'];
  electrodes.names.forEach((name, i) => lines.push(`${name}\t${formatNumber(v[i])}`));
  io.stdout(lines.join('\n') + '\n');
  return 0;
}
