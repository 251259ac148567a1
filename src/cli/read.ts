/**
 * `winnow read <recording> [--start S] [--duration D] [--channels A,B]`: prints samples as TSV (contract of
 * issue 2): a header `time` then the labels; one row per sample; time in seconds from the first sample
 * (EDF+D: the sample's true time, so gaps show as jumps); physical values in normalised units (µV for
 * voltages). Rows are written chunk by chunk (about 8 MB of records at a time), never as one string.
 * Channels of different rates in one call → exit 2 with a message listing the rates.
 */
import { once } from 'node:events';
import { CliError, numberOption, parseCommandArgs, processIo, type CliIo } from './cli-support.ts';
import { openCliRecording } from './recording-files.ts';
import { streamRecordingSignals } from '../core/formats/recording-loader.ts';

/**
 * Output of `read`: with the real stdout, waits for 'drain' when the pipe is full (so a long recording piped
 * into a slow reader never piles up in memory) and stops quietly when the reader closes the pipe
 * (EPIPE, e.g. `| head`). With any other CliIo (tests) it writes straight through.
 */
function rowSink(io: CliIo): { write(text: string): Promise<void>; closed(): boolean; dispose(): void } {
  if (io !== processIo) return { write: async (t) => io.stdout(t), closed: () => false, dispose: () => undefined };
  const out = process.stdout;
  let broken = false;
  let wake: (() => void) | null = null;
  const onError = (e: NodeJS.ErrnoException) => {
    if (e.code !== 'EPIPE') throw e;
    broken = true;
    wake?.();
  };
  const onReady = () => wake?.();
  out.on('error', onError);
  out.on('drain', onReady);
  out.on('close', onReady);
  return {
    async write(t) {
      if (broken) return;
      if (!out.write(t)) await new Promise<void>((resolve) => (wake = resolve));
      wake = null;
    },
    closed: () => broken,
    dispose: () => {
      out.off('drain', onReady);
      out.off('close', onReady);
      // keep swallowing a late EPIPE from data still buffered when the reader went away
      if (!broken) out.off('error', onError);
    },
  };
}

/** Seconds as text without floating-point noise (at most 9 decimals). */
function formatTime(t: number): string {
  return String(Number(t.toFixed(9)));
}

/** Help text for `winnow read --help` (first line: the usage). */
export const usage = `usage: winnow read <recording> [--start S] [--duration D] [--channels A,B]

Prints samples as TSV: a header \`time\` then the channel labels, one row per sample; time in seconds from
the first sample, values in physical units (µV for voltages). Channels of different rates in one call are refused.

options:
  --start S                 first second to print (default 0)
  --duration D              seconds to print (default: to the end)
  --channels A,B            comma-separated channel labels (default: all)
  -h, --help                show this help
`;

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('read', args, {
    start: { type: 'string' },
    duration: { type: 'string' },
    channels: { type: 'string' },
  });
  if (positionals.length !== 1)
    throw new CliError('winnow read: give exactly one recording (usage: winnow read <recording> [--start S] [--duration D] [--channels A,B])');
  const startS = numberOption('read', 'start', values.start, 0);
  const durationS = values.duration === undefined ? undefined : numberOption('read', 'duration', values.duration, 0);
  if (startS < 0) throw new CliError(`winnow read: --start must be ≥ 0, got ${values.start}`);
  if (durationS !== undefined && durationS < 0) throw new CliError(`winnow read: --duration must be ≥ 0, got ${values.duration}`);
  const channels = values.channels === undefined ? undefined : values.channels.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (channels !== undefined && channels.length === 0) throw new CliError('winnow read: --channels is empty');

  const { opened, close } = await openCliRecording(positionals[0]);
  try {
    for (const w of opened.warnings) io.stderr(`warning: ${w}\n`);
    let headerDone = false;
    const sink = rowSink(io);
    for await (const chunk of streamRecordingSignals(opened, { channels, startS, durationS })) {
      if (!chunk.ok) throw new CliError(chunk.error.message, chunk.error.code === 'io' ? 1 : 2);
      const { labels, nSamples: n, data, sampleTimes } = chunk.value;
      if (!headerDone) {
        if (labels.length === 0) throw new CliError(`${opened.source.name}: the file has no signal channels to read`);
        await sink.write(['time', ...labels].join('\t') + '\n');
        headerDone = true;
      }
      const nc = labels.length;
      const lines: string[] = new Array(Math.min(n, 4096));
      for (let j0 = 0; j0 < n; j0 += 4096) {
        const j1 = Math.min(n, j0 + 4096);
        lines.length = j1 - j0;
        for (let j = j0; j < j1; j++) {
          let line = formatTime(sampleTimes[j]);
          for (let c = 0; c < nc; c++) line += '\t' + String(data[c * n + j]);
          lines[j - j0] = line;
        }
        await sink.write(lines.join('\n') + '\n');
        if (sink.closed()) break;
      }
      if (sink.closed()) break;
    }
    sink.dispose();
    return 0;
  } finally {
    await close();
  }
}
