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
import { basename } from 'node:path';
import { CliError, sha256OfFile, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openCliRecording, orFail, readInputFile } from './recording-files.ts';
import { writeFileAtomicChunks } from './atomic-write.ts';
import { parseDecompositionJson } from '../core/formats/decomposition-file.ts';
import { matchDecompositionToRecording } from '../core/formats/decomposition-match.ts';
import { readOtherRateBlocks, readRecordingSignals } from '../core/formats/recording-loader.ts';
import { sha256Hex } from '../core/formats/sha256.ts';
import { writeEdfChunks } from '../core/formats/edf-writer.ts';
import { parseDecisionsJson } from '../core/review/decisions-file.ts';
import { cleanedRecordingInput } from '../core/recording-input.ts';

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

  const decompositionBytes = await readInputFile(decompositionPath);
  const decisionsBytes = await readInputFile(decisionsPath);
  const decisions = parseDecisionsJson(new TextDecoder().decode(decisionsBytes), basename(decisionsPath));
  if (!decisions.ok) throw new CliError(decisions.error.message);
  const decomposition = parseDecompositionJson(new TextDecoder().decode(decompositionBytes), basename(decompositionPath));
  if (!decomposition.ok) throw new CliError(decomposition.error.message);

  const { opened, close } = await openCliRecording(recordingPath);
  try {
    const info = opened.info;

    if (!values['ignore-hashes']) {
      const [recordingSha, decompositionSha] = await Promise.all([sha256OfFile(recordingPath), sha256Hex(decompositionBytes)]);
      const d = decisions.value;
      if (d.recordingSha256 !== recordingSha)
        throw new CliError(`${basename(decisionsPath)}: made for a recording with SHA-256 ${d.recordingSha256}, but ${basename(recordingPath)} has ${recordingSha} (use --ignore-hashes to apply anyway)`);
      if (d.decompositionSha256 !== decompositionSha)
        throw new CliError(`${basename(decisionsPath)}: made for a decomposition with SHA-256 ${d.decompositionSha256}, but ${basename(decompositionPath)} has ${decompositionSha} (use --ignore-hashes to apply anyway)`);
    }

    const k = decomposition.value.nComponents;
    const removed = decisions.value.components.filter((c) => c.verdict === 'remove').map((c) => c.index);
    const tooHigh = removed.find((i) => i > k);
    if (tooHigh !== undefined) throw new CliError(`${basename(decisionsPath)}: component ${tooHigh} does not exist (${basename(decompositionPath)} has ${k})`);

    // The decomposition's channels must all sit in one rate group; that block is cleaned, the others copied.
    const matchedAll = matchDecompositionToRecording(decomposition.value, info.channels.map((c) => c.label), basename(decompositionPath));
    if (!matchedAll.ok) throw new CliError(matchedAll.error.message);
    const rates = new Set(info.channels.filter((c) => matchedAll.value.channels.includes(c.label)).map((c) => c.sampleRate));
    if (rates.size !== 1)
      throw new CliError(`${basename(decompositionPath)}: its channels span several sampling rates of ${basename(recordingPath)}; a decomposition must use channels of one rate`);
    const recording = orFail(await readRecordingSignals(opened, { sampleRate: [...rates][0] }));
    const matched = matchDecompositionToRecording(decomposition.value, recording.signals.labels, basename(decompositionPath));
    if (!matched.ok) throw new CliError(matched.error.message);
    const otherBlocks = orFail(await readOtherRateBlocks(opened.source, recording));
    let made;
    try {
      made = cleanedRecordingInput(recording, {
        decomposition: matched.value,
        removed,
        otherBlocks,
        family: info.format.startsWith('BDF') ? 'BDF' : 'EDF',
        keepIdentity: values['keep-identity'] === true,
      });
    } catch (e) {
      if (e instanceof RangeError) throw new CliError(`${basename(decompositionPath)}: ${e.message}`);
      throw e;
    }
    for (const w of made.warnings) io.stderr(`warning: ${w}\n`);
    const input = made.input;
    await writeFileAtomicChunks(out, writeEdfChunks(input));
    io.stdout(
      `wrote ${out}: ${info.channels.length} channels, ${removed.length} of ${k} components removed` +
        `${removed.length ? ` (${removed.join(', ')})` : ''}, identifying fields ${input.keepIdentity ? 'kept' : 'blanked'}\n`,
    );
    return 0;
  } finally {
    await close();
  }
}
