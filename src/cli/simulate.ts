/**
 * `winnow simulate --out DIR [--seed N] [--channels 32|64] [--minutes M] [--rate HZ] [--line 50|60]`:
 * simulates the walking-oddball session (src/core/simulate) and writes, in DIR:
 *
 *   recording.edf      EDF+C sensor data (µV) with tone and step annotations
 *   neural.edf         the neural-only back-projection, same layout (what a perfect cleaning keeps)
 *   channels.tsv, electrodes.tsv (mm), coordsystem.json, events.tsv, events.json, eeg.json   BIDS sidecars
 *   truth.json         every true source: id, class, map (channel order), dipole, activation location
 *   activations.f32    the activations, float32 little-endian, one source after another
 *   sensor-noise.f32   the exact sensor noise, float32 little-endian, channel-major
 *
 * Prints a one-line JSON summary on stdout. Files are written atomically.
 */
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { simulateSession, type SimulateOptions } from '../core/simulate/simulate.ts';
import { sessionEdf, sessionSidecars, sessionTruthFiles } from '../core/simulate/session-files.ts';
import { hz } from '../core/units.ts';

const USAGE = 'usage: winnow simulate --out DIR [--seed N] [--channels 32|64] [--minutes M] [--rate HZ] [--line 50|60]';

/** Help text for `winnow simulate --help` (first line: the usage). */
export const usage = `${USAGE}

Simulates a mobile EEG session with known sources and writes recording.edf, neural.edf, BIDS sidecars and
truth.json into DIR; prints a one-line JSON summary.

options:
  --out DIR                 output folder; required
  --seed N                  random seed, 0…4294967295 (default 1)
  --channels 32|64          number of EEG channels (default 32)
  --minutes M               length in minutes, > 0 and ≤ 240 (default 3)
  --rate HZ                 sampling rate in Hz (default 250)
  --line 50|60              mains frequency in Hz (default 50)
  -h, --help                show this help
`;

/** Validates the command line into simulator options (exit 2 with a message naming the option on bad input). */
export function parseSimulateArgs(args: string[]): { out: string; options: Required<Omit<SimulateOptions, 'sensorNoiseUv' | 'alphaPeakHz' | 'classGain'>> } {
  const { values, positionals } = parseCommandArgs('simulate', args, {
    out: { type: 'string' },
    seed: { type: 'string' },
    channels: { type: 'string' },
    minutes: { type: 'string' },
    rate: { type: 'string' },
    line: { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`winnow simulate: unexpected argument "${positionals[0]}"\n${USAGE}`);
  if (!values.out) throw new CliError(`winnow simulate: --out DIR is required\n${USAGE}`);
  const seed = numberOption('simulate', 'seed', values.seed, 1);
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new CliError(`winnow simulate: --seed must be an integer in 0…4294967295, got "${values.seed}"`);
  const channels = numberOption('simulate', 'channels', values.channels, 32);
  if (channels !== 32 && channels !== 64) throw new CliError(`winnow simulate: --channels must be 32 or 64, got "${values.channels}"`);
  const minutes = numberOption('simulate', 'minutes', values.minutes, 3);
  if (!(minutes > 0) || minutes > 240) throw new CliError(`winnow simulate: --minutes must be > 0 and ≤ 240, got "${values.minutes}"`);
  const line = numberOption('simulate', 'line', values.line, 50);
  if (line !== 50 && line !== 60) throw new CliError(`winnow simulate: --line must be 50 or 60, got "${values.line}"`);
  const rate = numberOption('simulate', 'rate', values.rate, 250);
  if (!Number.isInteger(rate) || rate < 2.5 * line || rate > 4096)
    throw new CliError(`winnow simulate: --rate must be a whole number of Hz from ${2.5 * line} to 4096 (1 s EDF records), got "${values.rate}"`);
  return { out: values.out, options: { seed, channels, minutes, rate: hz(rate), lineHz: line } };
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { out, options } = parseSimulateArgs(args);
  const session = simulateSession(options);
  await mkdir(out, { recursive: true });
  const truth = sessionTruthFiles(session, { activations: 'activations.f32', sensorNoise: 'sensor-noise.f32' });
  const files: [string, Uint8Array | string][] = [
    ['recording.edf', sessionEdf(session, 'data')],
    ['neural.edf', sessionEdf(session, 'neural')],
    ...sessionSidecars(session).map((f): [string, string] => [f.suffix, f.text]),
    ['truth.json', truth.truthJson],
    ['activations.f32', truth.activations],
    ['sensor-noise.f32', truth.sensorNoise],
  ];
  for (const [name, data] of files) await writeFileAtomic(join(out, name), data);
  io.stdout(
    JSON.stringify({
      out,
      seed: session.seed,
      channels: session.labels.length,
      sampleRate: session.sampleRate,
      seconds: session.nSamples / session.sampleRate,
      sources: session.sources.length,
      events: session.events.length,
      files: files.map(([name]) => name),
    }) + '\n',
  );
  return 0;
}
