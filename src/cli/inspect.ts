/**
 * `winnow inspect <recording>`: prints the header, signal channels and annotations of an EDF/EDF+/BDF/BDF+
 * file as JSON (contract of issue 2). Units are the normalised ones (voltages in uV, ranges scaled to match
 * the values `winnow read` prints). Events are the file's annotations; for EDF+D/BDF+D the start of every
 * data record is added as `recordOnsets` so the gaps are known. Warnings go to stderr as "warning: …".
 */
import { CliError, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openCliRecording } from './recording-files.ts';

export async function run(args: string[], io: CliIo): Promise<number> {
  const { positionals } = parseCommandArgs('inspect', args, {});
  if (positionals.length !== 1) throw new CliError('winnow inspect: give exactly one recording (usage: winnow inspect <recording>)');
  const { opened, close } = await openCliRecording(positionals[0]);
  try {
    for (const w of opened.warnings) io.stderr(`warning: ${w}\n`);
    const info = opened.info;
    const out: Record<string, unknown> = {
      format: info.format,
      channels: info.channels.map((c) => ({
        label: c.label,
        unit: c.unit,
        sampleRate: c.sampleRate,
        physicalMin: c.physicalMin,
        physicalMax: c.physicalMax,
        digitalMin: c.digitalMin,
        digitalMax: c.digitalMax,
        transducer: c.transducer,
        prefilter: c.prefilter,
      })),
      records: info.header.records,
      recordDurationSeconds: info.header.recordDurationSeconds,
      durationSeconds: info.durationSeconds,
      start: info.header.start,
      events: info.events.filter((e) => e.source === 'annotation').map((e) => ({ onset: e.onset, duration: e.duration, label: e.label })),
    };
    if (info.format.endsWith('+D')) out.recordOnsets = Array.from(info.header.recordOnsets);
    io.stdout(JSON.stringify(out, null, 2) + '\n');
    return 0;
  } finally {
    await close();
  }
}
