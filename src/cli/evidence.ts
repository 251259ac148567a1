/**
 * `winnow evidence <recording> <decomposition.json> [--positions electrodes.tsv] [--events events.tsv]
 * [--aim erp|oscillations|conservative] [--out FILE] [--line-frequency 50|60] [--epoch-event LABEL]
 * [--window TMIN,TMAX]` (issue 6 contract): computes every component's evidence and suggested verdict and
 * writes JSON (to --out atomically, else to stdout).
 *
 * Mains frequency: --line-frequency (alias --line) when given; else PowerLineFrequency of the recording's
 * BIDS *_eeg.json in the recording's folder, paired as the workbench pairs it (recording-loader.ts; plain
 * eeg.json beside recording.edf); else 50 Hz with a warning that it was assumed.
 *
 * Inputs: read through the workbench's recording loader (src/core/formats/recording-loader.ts) and its
 * adapter (src/core/recording-input.ts), so a recording gives the same inputs here and in the workbench: the
 * channels at the decomposition channels' sampling rate (EOG channels at that rate serve as eye references);
 * electrode positions from --positions (BIDS electrodes.tsv, projected onto its fitted sphere) or else the
 * idealised 10-20/10-10 layout by label; the recording's EDF+ annotations merged with --events (BIDS
 * events.tsv; a row with an annotation's label and onset replaces it).
 *
 * Output: the evidence file "winnow-evidence/1" (src/core/formats/evidence-file.ts lists the fields), with
 * every component's suggestion for each aim and the rules that fired, computed at output time.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, parseCommandArgs, sha256OfFile, type CliIo } from './cli-support.ts';
import { openCliRecording, readCliSignals } from './recording-files.ts';
import type { Decomposition } from '../core/decomposition.ts';
import { computeEvidence, DEFAULT_EPOCH_WINDOW_S } from '../core/evidence/compute-evidence.ts';
import { parseSelectionKey, selectEvents } from '../core/evidence/event-selection.ts';
import { LOCKING_MAX_SHUFFLES } from '../core/evidence/time-locking.ts';
import { formatEvidenceJson } from '../core/formats/evidence-file.ts';
import { suggestWithRules } from '../core/review/suggest.ts';
import { parseDecompositionJson } from '../core/formats/decomposition-file.ts';
import { matchDecompositionToRecording } from '../core/formats/decomposition-match.ts';
import { evidenceInputOf } from '../core/recording-input.ts';
import { secondsWindow, type SecondsWindow } from '../core/units.ts';
import { resolveThresholds } from '../core/review/thresholds.ts';
import { AIMS, type Aim } from '../core/review/vocabulary.ts';

const USAGE =
  'usage: winnow evidence <recording> <decomposition.json> [--positions electrodes.tsv] [--events events.tsv] [--aim erp|oscillations|conservative] [--out FILE] [--line-frequency 50|60] [--epoch-event LABEL] [--lock-column COLUMN] [--window TMIN,TMAX]';

/** Help text for `winnow evidence --help` (first line: the usage). */
export const usage = `${USAGE}

Computes every component's evidence and suggested verdict and writes JSON (winnow-evidence/1) to --out, or
to stdout.

options:
  --positions FILE          BIDS electrodes.tsv (default: 10-20/10-10 layout by label)
  --events FILE             BIDS events.tsv, merged with the recording's annotations
  --aim erp|oscillations|conservative  aim of the suggestion (default erp)
  --out FILE                output file (default stdout)
  --line-frequency 50|60    mains frequency in Hz (alias --line; default from eeg.json, else 50)
  --epoch-event LABEL       event to epoch on
  --lock-column COLUMN      events.tsv column whose values are also tested for time-locking within each type
  --window TMIN,TMAX        epoch window in seconds (TMIN < 0 < TMAX)
  -h, --help                show this help
`;

async function readTextFile(path: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : (e as Error).message}`);
  }
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('evidence', args, {
    positions: { type: 'string' },
    events: { type: 'string' },
    aim: { type: 'string' },
    out: { type: 'string' },
    line: { type: 'string' },
    'line-frequency': { type: 'string' },
    'epoch-event': { type: 'string' },
    'lock-column': { type: 'string' },
    window: { type: 'string' },
  });
  if (positionals.length !== 2) throw new CliError(`winnow evidence: give a recording and a decomposition file (${USAGE})`);
  const [recordingPath, decompositionPath] = positionals;
  const aim = (values.aim ?? 'erp') as Aim;
  if (!AIMS.includes(aim)) throw new CliError(`winnow evidence: --aim must be erp, oscillations or conservative, got "${values.aim}"`);
  const lineOption = values['line-frequency'] !== undefined ? '--line-frequency' : '--line';
  const lineText = values['line-frequency'] ?? values.line;
  const lineOverride = lineText === undefined ? undefined : Number(lineText);
  if (lineOverride !== undefined && lineOverride !== 50 && lineOverride !== 60)
    throw new CliError(`winnow evidence: ${lineOption} must be 50 or 60 (Hz), got "${lineText}"`);
  let epochWindow: SecondsWindow = DEFAULT_EPOCH_WINDOW_S;
  if (values.window !== undefined) {
    const parts = values.window.split(',').map((s) => Number(s.trim()));
    if (parts.length !== 2 || !parts.every(Number.isFinite) || !(parts[0] < 0 && parts[1] > 0))
      throw new CliError(`winnow evidence: --window must be TMIN,TMAX in seconds with TMIN < 0 < TMAX, got "${values.window}"`);
    epochWindow = secondsWindow(parts[0], parts[1]);
  }

  // decomposition
  const parsedDec = parseDecompositionJson(await readTextFile(decompositionPath), decompositionPath);
  if (!parsedDec.ok) throw new CliError(parsedDec.error.message);
  for (const w of parsedDec.warnings) io.stderr(`warning: ${w}\n`);

  // recording, its sidecars and the explicit --positions / --events, through the workbench's loader
  const { opened, close } = await openCliRecording(recordingPath, { electrodes: values.positions, events: values.events });
  try {
    const info = opened.info;
    const matched = matchDecompositionToRecording(parsedDec.value, info.channels.map((c) => c.label), decompositionPath);
    if (!matched.ok) throw new CliError(matched.error.message);
    for (const w of matched.warnings) io.stderr(`warning: ${w}\n`);
    const decomposition: Decomposition = matched.value;
    const decRates = new Set(info.channels.filter((c) => decomposition.channels.includes(c.label)).map((c) => c.sampleRate));
    if (decRates.size !== 1) throw new CliError(`${decompositionPath}: its channels do not share one sampling rate in ${recordingPath}`);
    const recording = await readCliSignals(opened, io, { sampleRate: [...decRates][0] });
    if (values['epoch-event'] !== undefined && !info.events.some((e) => e.source !== 'boundary' && selectEvents([e], parseSelectionKey(values['epoch-event']!)).length > 0))
      throw new CliError(`winnow evidence: --epoch-event "${values['epoch-event']}" matches no event`);

    const thresholds = resolveThresholds();
    // mains frequency: option, else the recording's *_eeg.json, else 50 Hz assumed
    const { input, mains } = evidenceInputOf(recording, decomposition, {
      lineHz: lineOverride as 50 | 60 | undefined,
      epochEvent: values['epoch-event'],
      window: epochWindow,
      // Sequential time-locking test up to 999 shuffles, so permutationP can reach 1/1000 (time-locking.ts).
      permutations: LOCKING_MAX_SHUFFLES,
    });
    if (mains.origin === 'assumed')
      io.stderr(`warning: ${basename(recordingPath)}: no PowerLineFrequency in a paired *_eeg.json and no --line-frequency; mains assumed to be 50 Hz\n`);
    const lineHz = mains.hz;
    const lockColumn = values['lock-column'];
    if (lockColumn !== undefined && !(input.events ?? []).some((e) => e.columns?.[lockColumn] !== undefined))
      throw new CliError(`winnow evidence: --lock-column "${lockColumn}" is not a column of the events`);
    const result = computeEvidence(lockColumn !== undefined ? { ...input, lockColumn } : input);
    for (const w of result.warnings) io.stderr(`warning: ${w}\n`);
    const header = {
      recording: recordingPath, decomposition: decompositionPath, aim, lineHz, lineHzSource: mains.origin,
      // the input files' hashes, so a workbench can tell this evidence belongs to the files it opened
      recordingSha256: await sha256OfFile(recordingPath), decompositionSha256: await sha256OfFile(decompositionPath),
      epochEvent: result.epochEvent, epochWindowS: epochWindow, thresholds, warnings: result.warnings, maxShuffles: LOCKING_MAX_SHUFFLES,
    };
    const text = formatEvidenceJson(header, result.components);
    if (values.out !== undefined) {
      await writeFileAtomic(values.out, text);
      const counts = new Map<string, number>();
      for (const c of result.components) {
        const v = suggestWithRules(c, aim, thresholds).suggestion.verdict;
        counts.set(v, (counts.get(v) ?? 0) + 1);
      }
      io.stdout(
        `${values.out}: evidence for ${result.components.length} components (aim ${aim}: ${[...counts].map(([v, n]) => `${n} ${v}`).join(', ')})\n`,
      );
    } else io.stdout(text);
    return 0;
  } finally {
    await close();
  }
}
