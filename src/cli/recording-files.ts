/**
 * The files a CLI command hands to the recording loader (src/core/formats/recording-loader.ts), the same
 * loader the workbench uses: the recording as a node ByteSource (node-byte-source.ts), the `*_eeg.json` /
 * `eeg.json` files in its folder (mains frequency, paired by BIDS entities as in the workbench), and the
 * sidecars named by options (--channels-tsv, --positions, --events), which take the place of paired ones.
 * Faults become CliErrors naming the file (exit 2; 1 for a read fault of the disk).
 */
import { readdir, readFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { CliError, type CliIo } from './cli-support.ts';
import { openFileByteSource } from './node-byte-source.ts';
import { bytesByteSource, type ByteSource } from '../core/formats/byte-source.ts';
import type { ParseResult } from '../core/formats/parse-result.ts';
import { openRecording, readElectrodes, readRecordingSignals, type OpenedRecording, type ReadSignalsOptions, type RecordingSidecars } from '../core/formats/recording-loader.ts';
import type { LoadedRecording } from '../core/recording.ts';

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

/** The bytes of an input file named on the command line; a missing or unreadable file is an exit-2 error naming it. */
export async function readInputFile(path: string): Promise<Uint8Array> {
  try {
    return new Uint8Array(await readFile(path));
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : (e as Error).message}`);
  }
}

async function readSidecar(path: string): Promise<ByteSource> {
  return bytesByteSource(await readInputFile(path), path);
}

/** The *_eeg.json / eeg.json files in the recording's folder (none when the folder is unreadable). */
async function eegSidecarsBeside(recordingPath: string): Promise<ByteSource[]> {
  const folder = dirname(recordingPath);
  let names: string[];
  try {
    names = await readdir(folder);
  } catch {
    return [];
  }
  const out: ByteSource[] = [];
  for (const name of names.filter((n) => /(^|_)eeg\.json$/i.test(n))) {
    try {
      out.push(bytesByteSource(await readFile(join(folder, name)), name));
    } catch {
      // unreadable sidecar: skipped, as if absent
    }
  }
  return out;
}

/** Sidecar files named on the command line. */
export interface SidecarPaths {
  channels?: string;
  electrodes?: string;
  events?: string;
}

/** A ParseResult's failure as the CLI's error (exit 1 for an I/O fault, else 2). */
export function orFail<T>(res: ParseResult<T>): T {
  if (!res.ok) throw new CliError(res.error.message, res.error.code === 'io' ? 1 : 2);
  return res.value;
}

/** An electrodes.tsv named on the command line, with its sibling `*_coordsystem.json` when there is one. */
async function electrodeSidecars(path: string): Promise<{ electrodes: ByteSource; coordsystem?: ByteSource }> {
  const electrodes = await readSidecar(path);
  const coordsystem = path.endsWith('_electrodes.tsv')
    ? await readSidecar(path.replace(/_electrodes\.tsv$/, '_coordsystem.json')).catch(() => undefined)
    : undefined;
  return coordsystem ? { electrodes, coordsystem } : { electrodes };
}

/**
 * Electrode positions (mm) of an electrodes.tsv named on the command line, read as the recording loader reads
 * a paired one (readElectrodes, with the sibling coordsystem.json); warnings go to stderr unless `quiet` says so.
 */
export async function readCliElectrodes(path: string, io: CliIo, quiet: (warning: string) => boolean = () => false): Promise<{ names: string[]; positionsMm: Float64Array }> {
  const { electrodes, coordsystem } = await electrodeSidecars(path);
  const res = await readElectrodes(electrodes, coordsystem);
  const value = orFail(res);
  if (res.ok) for (const w of res.warnings) if (!quiet(w)) io.stderr(`warning: ${w}\n`);
  return value;
}

/**
 * Opens the recording at `path` through the loader: header, annotations and sidecars, no samples yet. A
 * sibling `*_coordsystem.json` of an explicit `*_electrodes.tsv` is read too (its unit). Close when done.
 */
export async function openCliRecording(path: string, paths: SidecarPaths = {}): Promise<{ opened: OpenedRecording; close(): Promise<void> }> {
  const sidecars: RecordingSidecars = {};
  if (paths.channels !== undefined) sidecars.channels = await readSidecar(paths.channels);
  if (paths.events !== undefined) sidecars.events = await readSidecar(paths.events);
  if (paths.electrodes !== undefined) Object.assign(sidecars, await electrodeSidecars(paths.electrodes));
  const source = await openRecordingSource(path);
  try {
    const files = [source, ...(await eegSidecarsBeside(path))];
    const opened = orFail(await openRecording(files, { recording: source.name, sidecars }));
    return { opened, close: () => source.close() };
  } catch (e) {
    await source.close();
    throw e;
  }
}

/** Reads the samples of one rate (default the main rate) and prints every loader warning to stderr. */
export async function readCliSignals(opened: OpenedRecording, io: CliIo, opts: ReadSignalsOptions = {}): Promise<LoadedRecording> {
  const loaded = orFail(await readRecordingSignals(opened, opts));
  for (const w of loaded.warnings) io.stderr(`warning: ${w}\n`);
  return loaded;
}
