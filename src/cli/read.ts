/**
 * `winnow read <recording> [--start S] [--duration D] [--channels A,B]`: prints samples as TSV (contract of
 * issue 2): a header `time` then the labels; one row per sample; time in seconds from the first sample
 * (EDF+D: the sample's true time, so gaps show as jumps); physical values in normalised units (µV for
 * voltages). Rows are written chunk by chunk (about 8 MB of records at a time), never as one string.
 * Channels of different rates in one call → exit 2 with a message listing the rates.
 */
import { CliError, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openFileByteSource } from './node-byte-source.ts';
import { iterateEdfSignals, readEdfInfo } from '../core/formats/edf.ts';
import type { ByteSource } from '../core/formats/byte-source.ts';

/** Opens a recording for a command, turning a missing/unreadable file into an exit-2 error naming it. */
export async function openRecordingSource(path: string): Promise<ByteSource & { close(): Promise<void> }> {
  try {
    return await openFileByteSource(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory, not a recording file' : code === 'EACCES' ? 'permission denied' : (e as Error).message;
    throw new CliError(`${path}: ${why}`, 2);
  }
}

/** Seconds as text without floating-point noise (at most 9 decimals). */
function formatTime(t: number): string {
  return String(Number(t.toFixed(9)));
}

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

  const source = await openRecordingSource(positionals[0]);
  try {
    const infoRes = await readEdfInfo(source);
    if (!infoRes.ok) throw new CliError(infoRes.error.message, infoRes.error.code === 'io' ? 1 : 2);
    for (const w of infoRes.warnings) io.stderr(`warning: ${w}\n`);
    let headerDone = false;
    for await (const chunk of iterateEdfSignals(source, infoRes.value, { channels, startS, durationS })) {
      if (!chunk.ok) throw new CliError(chunk.error.message, chunk.error.code === 'io' ? 1 : 2);
      const { labels, nSamples: n, data, sampleTimes } = chunk.value;
      if (!headerDone) {
        if (labels.length === 0) throw new CliError(`${source.name}: the file has no signal channels to read`);
        io.stdout(['time', ...labels].join('\t') + '\n');
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
        io.stdout(lines.join('\n') + '\n');
      }
    }
    return 0;
  } finally {
    await source.close();
  }
}
