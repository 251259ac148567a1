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
 * Output (format "winnow-evidence/1"):
 *   format, recording, decomposition   file names as given
 *   aim                                the aim whose suggestion is in `suggestion`
 *   lineHz, epochEvent, epochWindowS   settings used (epochEvent null when no events were epoched)
 *   lineHzSource                       where lineHz came from: "option", "sidecar" or "assumed"
 *   thresholds                         the threshold table used (src/core/review/thresholds.ts)
 *   warnings                           strings
 *   components: one object per component, in decomposition order —
 *     index                 1-based component number
 *     varianceShare         share (0–1) of the data's variance carried by the back-projected component
 *     spectrum              { frequencies (Hz), power (µV²/Hz at the strongest channel), powerDb, channel }
 *     oneOverFExponent     χ of P ∝ f^−χ, 2–40 Hz robust log–log fit; oneOverFOffset: log10 P at 1 Hz
 *     alphaPeakHz           7–14 Hz peak above the 1/f fit, or null; alphaProminence (log10 units)
 *     highFrequencyShare    BP(20, line−2) / BP(2, line−2); highFrequencySlope: log–log slope above 20 Hz
 *     mainsShare        Σ BP(h·line ± 1 Hz) / BP(1, fmax); linePeakRatio: P(line) / median neighbours
 *     lowFrequencyShare     BP(1, 4) / BP(1, 45)
 *     kurtosis              excess kurtosis of the activation
 *     focality              { share of map energy on one electrode, channel }
 *     frontalGradient, frontalShare, lateralAntisymmetry, stepLikeness   map and time-course ocular evidence
 *     eogCorrelation        { vertical, horizontal (|r|, or null), source, channels }
 *     cardiac               { bpm or null, peak (autocorrelation) }
 *     stepLocking           { share, event, nEpochs } or null
 *     erp                   { event, nEpochs, times (s), mean, lower, upper (µV, 95 % band), itc,
 *                             itcFrequencyHz, lockedShare, timeLockingStrength, permutationP } or null
 *     dipole                { position (mm, RAS), moment, residualVariance (0–1), atBoundary, region } or null
 *     strongestChannel      { index (0-based, decomposition order), label, weight }
 *     map                   scalp map (unit L2 norm), decomposition channel order
 *     suggestion            { verdict, reason, because } for --aim (default erp)
 *     suggestions           { erp, oscillations, conservative }, each { verdict, reason, because }
 *   Trial stacks (trials × time) are not written; the workbench computes them.
 *   NaN and infinite numbers are written as null.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openCliRecording, readCliSignals } from './recording-files.ts';
import type { Decomposition } from '../core/decomposition.ts';
import { computeEvidence, DEFAULT_EPOCH_WINDOW_S } from '../core/evidence/compute-evidence.ts';
import { LOCKING_MAX_SHUFFLES } from '../core/evidence/time-locking.ts';
import type { ComponentEvidence } from '../core/evidence/types.ts';
import { parseDecompositionJson } from '../core/formats/decomposition-file.ts';
import { matchDecompositionToRecording } from '../core/formats/decomposition-match.ts';
import { evidenceInputOf } from '../core/recording-input.ts';
import { resolveThresholds } from '../core/review/thresholds.ts';
import { AIMS, type Aim } from '../core/review/vocabulary.ts';

const USAGE =
  'usage: winnow evidence <recording> <decomposition.json> [--positions electrodes.tsv] [--events events.tsv] [--aim erp|oscillations|conservative] [--out FILE] [--line-frequency 50|60] [--epoch-event LABEL] [--window TMIN,TMAX]';

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

const finite = (v: number) => (Number.isFinite(v) ? v : null);
const list = (a: ArrayLike<number>) => Array.from(a, finite);

/** The JSON object of one component (names documented at the top of this file). */
export function componentJson(e: ComponentEvidence, aim: Aim): Record<string, unknown> {
  return {
    index: e.index,
    varianceShare: finite(e.varianceShare),
    spectrum: { frequencies: list(e.spectrum.frequencies), power: list(e.spectrum.power), powerDb: list(e.spectrum.powerDb), channel: e.strongestChannel.label },
    oneOverFExponent: finite(e.oneOverF.exponent),
    oneOverFOffset: finite(e.oneOverF.offset),
    alphaPeakHz: e.alphaPeakHz,
    alphaProminence: finite(e.alphaProminence),
    highFrequencyShare: finite(e.highFrequencyShare),
    highFrequencySlope: finite(e.highFrequencySlope),
    mainsShare: finite(e.mainsShare),
    linePeakRatio: finite(e.linePeakRatio),
    lowFrequencyShare: finite(e.lowFrequencyShare),
    kurtosis: finite(e.kurtosis),
    focality: { share: finite(e.focality.share), channel: e.focality.channel },
    frontalGradient: finite(e.frontalGradient),
    frontalShare: finite(e.frontalShare),
    lateralAntisymmetry: finite(e.lateralAntisymmetry),
    stepLikeness: finite(e.stepLikeness),
    eogCorrelation: {
      vertical: e.eogCorrelation.vertical === null ? null : finite(e.eogCorrelation.vertical),
      horizontal: e.eogCorrelation.horizontal === null ? null : finite(e.eogCorrelation.horizontal),
      source: e.eogCorrelation.source,
      channels: e.eogCorrelation.channels,
    },
    cardiac: { bpm: e.cardiac.bpm, peak: finite(e.cardiac.peak) },
    stepLocking: e.stepLocking ? { share: finite(e.stepLocking.share), event: e.stepLocking.event, nEpochs: e.stepLocking.nEpochs } : null,
    erp: e.erp
      ? {
          event: e.erp.event,
          nEpochs: e.erp.nEpochs,
          times: list(e.erp.times),
          mean: list(e.erp.mean),
          lower: list(e.erp.band.lower),
          upper: list(e.erp.band.upper),
          itc: finite(e.erp.itc),
          itcFrequencyHz: finite(e.erp.itcFrequencyHz),
          lockedShare: finite(e.erp.lockedShare),
          timeLockingStrength: finite(e.erp.timeLockingStrength),
          permutationP: e.erp.permutationP === undefined ? null : finite(e.erp.permutationP),
        }
      : null,
    dipole: e.dipole
      ? {
          position: e.dipole.position.map(finite),
          moment: e.dipole.moment.map(finite),
          residualVariance: finite(e.dipole.residualVariance),
          atBoundary: e.dipole.atBoundary,
          region: e.dipole.region,
        }
      : null,
    strongestChannel: { index: e.strongestChannel.index, label: e.strongestChannel.label, weight: finite(e.strongestChannel.weight) },
    map: list(e.map),
    suggestion: e.suggestions[aim],
    suggestions: e.suggestions,
  };
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
  let epochWindow: [number, number] = [DEFAULT_EPOCH_WINDOW_S[0], DEFAULT_EPOCH_WINDOW_S[1]];
  if (values.window !== undefined) {
    const parts = values.window.split(',').map((s) => Number(s.trim()));
    if (parts.length !== 2 || !parts.every(Number.isFinite) || !(parts[0] < 0 && parts[1] > 0))
      throw new CliError(`winnow evidence: --window must be TMIN,TMAX in seconds with TMIN < 0 < TMAX, got "${values.window}"`);
    epochWindow = [parts[0], parts[1]];
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
    if (values['epoch-event'] !== undefined && !info.events.some((e) => e.source !== 'boundary' && (e.label === values['epoch-event'] || e.label.split('/')[0] === values['epoch-event'])))
      throw new CliError(`winnow evidence: --epoch-event "${values['epoch-event']}" matches no event`);

    const thresholds = resolveThresholds();
    // mains frequency: option, else the recording's *_eeg.json, else 50 Hz assumed
    const { input, mains } = evidenceInputOf(recording, decomposition, {
      lineHz: lineOverride as 50 | 60 | undefined,
      epochEvent: values['epoch-event'],
      window: epochWindow,
      thresholds,
      // Sequential time-locking test up to 999 shuffles, so permutationP can reach 1/1000 (time-locking.ts).
      permutations: LOCKING_MAX_SHUFFLES,
    });
    if (mains.origin === 'assumed')
      io.stderr(`warning: ${basename(recordingPath)}: no PowerLineFrequency in a paired *_eeg.json and no --line-frequency; mains assumed to be 50 Hz\n`);
    const lineHz = mains.hz;
    const result = computeEvidence({ ...input, aim });
    for (const w of result.warnings) io.stderr(`warning: ${w}\n`);
    const json = {
      format: 'winnow-evidence/1',
      recording: recordingPath,
      decomposition: decompositionPath,
      aim,
      lineHz,
      lineHzSource: mains.origin,
      epochEvent: result.epochEvent,
      epochWindowS: epochWindow,
      thresholds,
      warnings: result.warnings,
      components: result.components.map((c) => componentJson(c, aim)),
    };
    const text = `${JSON.stringify(json)}\n`;
    if (values.out !== undefined) {
      await writeFileAtomic(values.out, text);
      const counts = new Map<string, number>();
      for (const c of result.components) counts.set(c.suggestions[aim].verdict, (counts.get(c.suggestions[aim].verdict) ?? 0) + 1);
      io.stdout(
        `${values.out}: evidence for ${result.components.length} components (aim ${aim}: ${[...counts].map(([v, n]) => `${n} ${v}`).join(', ')})\n`,
      );
    } else io.stdout(text);
    return 0;
  } finally {
    await close();
  }
}
