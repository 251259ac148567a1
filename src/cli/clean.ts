/**
 * `winnow clean <recording> <decomposition.json> <decisions.json> --out cleaned.edf [--keep-identity]
 * [--ignore-hashes]`: writes the cleaned recording from a decisions file (issue 7). The components marked
 * `remove` are subtracted from the channels of the decomposition (docs/methods.md §7.6, src/core/review/clean.ts);
 * every other channel, every rate, the record layout and the annotations are kept. The output is EDF+ for an
 * EDF input and BDF+ for a BDF input (discontinuous stays discontinuous); identifying header fields become
 * the EDF+ anonymous forms unless --keep-identity. The file is written atomically.
 *
 * The decisions file names the SHA-256 of the recording's and the decomposition file's bytes; a mismatch
 * is an error (exit 2) unless --ignore-hashes.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { CliError, sha256OfFile, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openRecordingSource } from './read.ts';
import { writeFileAtomicChunks } from './atomic-write.ts';
import { readEdfInfo, readEdfSignals } from '../core/formats/edf.ts';
import { parseDecompositionJson, matchDecompositionToRecording } from '../core/formats/decomposition-file.ts';
import { sha256Hex } from '../core/formats/sha256.ts';
import { writeEdfChunks } from '../core/formats/edf-writer.ts';
import { parseDecisionsJson } from '../core/review/decisions-file.ts';
import { cleanSignalRange, cleanedEdfInput, createCleaningPlan } from '../core/review/clean.ts';
import type { SignalBlock } from '../core/recording.ts';

const USAGE = 'usage: winnow clean <recording> <decomposition.json> <decisions.json> --out cleaned.edf [--keep-identity] [--ignore-hashes]';

/** Help text for `winnow clean --help` (first line: the usage). */
export const usage = `${USAGE}

Writes the cleaned recording: the components marked remove in the decisions file are subtracted; EDF in,
EDF+ out (BDF in, BDF+ out). Refuses a decisions file made for another recording or decomposition.

options:
  --out FILE                output recording; required
  --keep-identity           keep the identifying header fields (default: anonymous forms)
  --ignore-hashes           accept a decisions file whose SHA-256 fields do not match
  -h, --help                show this help
`;


async function readInput(path: string): Promise<Uint8Array> {
  try {
    return new Uint8Array(await readFile(path));
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : (e as Error).message}`, 2);
  }
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { positionals, values } = parseCommandArgs('clean', args, {
    out: { type: 'string' },
    'keep-identity': { type: 'boolean' },
    'ignore-hashes': { type: 'boolean' },
  });
  if (positionals.length !== 3) throw new CliError(`winnow clean: give a recording, a decomposition and a decisions file (${USAGE})`);
  const out = values.out;
  if (typeof out !== 'string' || out.trim() === '') throw new CliError(`winnow clean: --out is required (${USAGE})`);
  const [recordingPath, decompositionPath, decisionsPath] = positionals;

  const decompositionBytes = await readInput(decompositionPath);
  const decisionsBytes = await readInput(decisionsPath);
  const decisions = parseDecisionsJson(new TextDecoder().decode(decisionsBytes), basename(decisionsPath));
  if (!decisions.ok) throw new CliError(decisions.error.message);
  const decomposition = parseDecompositionJson(new TextDecoder().decode(decompositionBytes), basename(decompositionPath));
  if (!decomposition.ok) throw new CliError(decomposition.error.message);

  const source = await openRecordingSource(recordingPath);
  try {
    const infoRes = await readEdfInfo(source);
    if (!infoRes.ok) throw new CliError(infoRes.error.message, infoRes.error.code === 'io' ? 1 : 2);
    const info = infoRes.value;

    if (!values['ignore-hashes']) {
      const [recordingSha, decompositionSha] = await Promise.all([sha256OfFile(recordingPath), sha256Hex(decompositionBytes)]);
      const d = decisions.value;
      if (d.recordingSha256 !== recordingSha)
        throw new CliError(`${basename(decisionsPath)}: made for a recording with SHA-256 ${d.recordingSha256}, but ${basename(recordingPath)} has ${recordingSha} (use --ignore-hashes to apply anyway)`);
      if (d.decompositionSha256 !== decompositionSha)
        throw new CliError(`${basename(decisionsPath)}: made for a decomposition with SHA-256 ${d.decompositionSha256}, but ${basename(decompositionPath)} has ${decompositionSha} (use --ignore-hashes to apply anyway)`);
    }

    // Read the channels rate by rate (one SignalBlock per rate), keeping the file's channel order.
    const byRate = new Map<number, string[]>();
    for (const c of info.channels) byRate.set(c.sampleRate, [...(byRate.get(c.sampleRate) ?? []), c.label]);
    const blocks = new Map<number, SignalBlock>();
    for (const [rate, labels] of byRate) {
      const res = await readEdfSignals(source, info, { channels: labels });
      if (!res.ok) throw new CliError(res.error.message, res.error.code === 'io' ? 1 : 2);
      blocks.set(rate, res.value);
    }

    // The decomposition's channels must all sit in one rate group; that block is cleaned.
    const k = decomposition.value.nComponents;
    const removed = decisions.value.components.filter((c) => c.verdict === 'remove').map((c) => c.index);
    const tooHigh = removed.find((i) => i > k);
    if (tooHigh !== undefined) throw new CliError(`${basename(decisionsPath)}: component ${tooHigh} does not exist (${basename(decompositionPath)} has ${k})`);
    let cleanedRate: number | null = null;
    for (const [rate, block] of blocks) {
      const matched = matchDecompositionToRecording(decomposition.value, block.labels, basename(decompositionPath));
      if (!matched.ok) continue;
      const made = createCleaningPlan(matched.value, block.labels, removed);
      if (!made.ok) throw new CliError(`${basename(decompositionPath)}: ${made.message}`);
      const cleaned = new Float32Array(block.data.length);
      cleanSignalRange(made.plan, block.data, block.nSamples, cleaned);
      blocks.set(rate, { ...block, data: cleaned });
      cleanedRate = rate;
      break;
    }
    if (cleanedRate === null) {
      const matched = matchDecompositionToRecording(decomposition.value, info.channels.map((c) => c.label), basename(decompositionPath));
      throw new CliError(matched.ok
        ? `${basename(decompositionPath)}: its channels span several sampling rates of ${basename(recordingPath)}; a decomposition must use channels of one rate`
        : matched.error.message);
    }

    const cleanedLabels = new Set(removed.length > 0 ? decomposition.value.channels.map((l) => l.toLowerCase()) : []);
    const input = cleanedEdfInput(info, [...blocks.values()], cleanedLabels, info.format.startsWith('BDF') ? 'BDF' : 'EDF', values['keep-identity'] === true);
    await writeFileAtomicChunks(out, writeEdfChunks(input));
    io.stdout(
      `wrote ${out}: ${info.channels.length} channels, ${removed.length} of ${k} components removed` +
        `${removed.length ? ` (${removed.join(', ')})` : ''}, identifying fields ${input.keepIdentity ? 'kept' : 'blanked'}\n`,
    );
    return 0;
  } finally {
    await source.close();
  }
}
