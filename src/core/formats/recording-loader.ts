/**
 * Loads one recording (.edf/.bdf, .rec read as EDF: recording-file-name.ts) and its BIDS sidecars from a set
 * of files (a picker selection, a dropped folder, or files named on the command line) into a LoadedRecording.
 * The one way in for the workbench, every CLI command and the bench: `openRecording` reads the header and
 * sidecars, `readRecordingSignals` the samples of one rate; `loadRecording` does both.
 *
 * Pairing [BIDS specification, "inheritance principle"]: a sidecar belongs to the recording when every
 * entity it names (sub-, ses-, task-, acq-, run-) has the recording's value; among several, the one naming
 * the most entities wins. Plain `channels.tsv` / `electrodes.tsv` / `events.tsv` / `coordsystem.json`
 * (no entities, as the simulator writes them next to `recording.edf`) match any recording.
 *
 * Decisions:
 * - Several .edf/.bdf files: `opts.recording` names the one to load; otherwise the only BIDS `*_eeg` file or
 *   the only `recording.edf/.bdf` is taken (the others are named in a warning); otherwise the load fails.
 * - channels.tsv must describe the file's signal channels: same count and the same names (order may
 *   differ); otherwise the load fails with the file's name and the mismatch.
 * - Events: the file's annotations and events.tsv rows are merged. When an events.tsv row has the same
 *   label and an onset within 1 ms of an annotation, the events.tsv row is kept (it may carry a
 *   response_time) and the annotation is dropped, so an exporter that wrote both does not double events.
 * - Signals: the "main rate" is the most common rate among EEG-typed channels (ties: the higher rate; no
 *   EEG channels: among all). Every channel at that rate (or at the rate asked for) is read into one
 *   SignalBlock; channels at other rates stay listed in `channels` and a warning names them.
 * - Positions: electrodes.tsv when given (projected onto the sphere fitted to them by the centred least-squares
 *   fit of headmodel/sphere-fit.ts, as unit vectors), else the idealised 10-20/10-10 set. Only EEG-typed
 *   channels get positions; unmatched EEG channels are warned about.
 * - Sidecars named explicitly (`opts.sidecars`, the CLI's options) take the place of the paired ones.
 * - Mains: PowerLineFrequency of the paired `*_eeg.json` (plain `eeg.json` beside `recording.edf`) becomes
 *   `powerLine` when it is 50 or 60 Hz. A sidecar that is not valid JSON, or any other value, is warned about
 *   (the load goes on); the evidence then assumes 50 Hz and says so (`mainsFrequency`, power-line.ts).
 */
import { byteSourceBaseName, type ByteSource } from './byte-source.ts';
import { parseChannelsTsv, parseEegJson, parseElectrodesTsv, parseEventsTsv } from './bids.ts';
import { iterateEdfSignals, readEdfInfo, readEdfSignals, type EdfReadOptions, type EdfSignalChunk } from './edf.ts';
import { parseFail, parseOk, type ParseResult } from './parse-result.ts';
import { isRecordingFileName, recordingStem } from './recording-file-name.ts';
import type { ChannelInfo, LoadedRecording, PairedSidecar, PowerLine, RecordingEvent, RecordingInfo, RecordingReference, SignalBlock } from '../recording.ts';
import { matchMontage } from '../headmodel/montage-1020.ts';
import { electrodeDirections } from '../headmodel/sphere-fit.ts';
import { mainsHz } from './power-line.ts';

/**
 * Sidecars named explicitly (the CLI's --channels-tsv, --positions, --events): each takes the place of the
 * paired sidecar of its kind, whatever its file name; the same rules then apply as to a paired one.
 */
export interface RecordingSidecars {
  channels?: ByteSource;
  electrodes?: ByteSource;
  coordsystem?: ByteSource;
  events?: ByteSource;
}

export interface LoadRecordingOptions {
  /** Base name of the recording to load when the set holds several recording files. */
  recording?: string;
  sidecars?: RecordingSidecars;
  /** Called with the fraction done (0–1): the annotation scan is the first 30 %, the samples the rest. */
  onProgress?: (fraction: number) => void;
}

export interface ReadSignalsOptions {
  /** Hz: read the channels at this rate into the block (e.g. a decomposition's rate). Default: the main rate. */
  sampleRate?: number;
  /** Fraction done (0–1) of the sample reading. */
  onProgress?: (fraction: number) => void;
  /** Allocates the block's sample array (edf-samples.ts EdfReadOptions.allocate); default a plain Float32Array. */
  allocate?: (length: number) => Float32Array;
}

/** A recording whose header and sidecars are read, before any samples (what `inspect` and `read` need). */
export interface OpenedRecording {
  readonly source: ByteSource;
  /** The file's info with channels.tsv types/status applied and events.tsv merged into the events. */
  readonly info: RecordingInfo;
  /** Hz: the most common rate among EEG-typed channels (module comment). */
  readonly mainRate: number;
  /** The electrodes.tsv read (positions in mm as written, names as written), or null: the 10-20 layout. */
  readonly electrodes: { readonly file: string; readonly names: readonly string[]; readonly positionsMm: Float64Array } | null;
  readonly powerLine: PowerLine;
  /** The sidecars read, in the order read. */
  readonly sidecars: readonly PairedSidecar[];
  readonly reference: RecordingReference;
  readonly warnings: readonly string[];
}

const ENTITY_KEYS = ['sub', 'ses', 'task', 'acq', 'run'] as const;

/** BIDS entities and suffix of a file name: "sub-01_task-rest_eeg.edf" → {sub: '01', task: 'rest'}, 'eeg'. */
export function bidsNameParts(fileName: string): { entities: Record<string, string>; suffix: string; extension: string } {
  const base = byteSourceBaseName(fileName);
  const dot = base.indexOf('.');
  const stem = dot >= 0 ? base.slice(0, dot) : base;
  const extension = dot >= 0 ? base.slice(dot).toLowerCase() : '';
  const parts = stem.split('_');
  const entities: Record<string, string> = {};
  let suffix = '';
  for (const p of parts) {
    const m = /^([a-zA-Z0-9]+)-(.*)$/.exec(p);
    if (m) entities[m[1]] = m[2];
    else suffix = p;
  }
  return { entities, suffix, extension };
}

/** Score of a sidecar for the recording: −1 when an entity conflicts, else the number of entities shared. */
function pairingScore(rec: Record<string, string>, side: Record<string, string>): number {
  let score = 0;
  for (const k of ENTITY_KEYS) {
    if (side[k] === undefined) continue;
    if (rec[k] !== side[k]) return -1;
    score++;
  }
  return score;
}

function pickSidecar(files: ByteSource[], recEntities: Record<string, string>, suffix: string, extension: string): ByteSource | undefined {
  let best: ByteSource | undefined;
  let bestScore = -1;
  for (const f of files) {
    const p = bidsNameParts(f.name);
    if (p.suffix !== suffix || p.extension !== extension) continue;
    const s = pairingScore(recEntities, p.entities);
    if (s > bestScore) {
      best = f;
      bestScore = s;
    }
  }
  return best;
}

/**
 * The mains frequency stated by the *_eeg.json paired with `recordingName` among `files` (same pairing as the
 * other sidecars). Parse faults become warnings: the mains frequency only tunes the spectrum measures.
 */
export async function readPowerLine(
  files: ByteSource[],
  recordingName: string,
): Promise<{ powerLine: PowerLine; warnings: string[]; reference?: string | null }> {
  const side = pickSidecar(files, bidsNameParts(recordingName).entities, 'eeg', '.json');
  if (!side) return { powerLine: { hz: null, sidecar: null }, warnings: [] };
  const name = byteSourceBaseName(side.name);
  const parsed = parseEegJson(await readText(side), name);
  if (!parsed.ok) return { powerLine: { hz: null, sidecar: name }, warnings: [`${parsed.error.message}; mains frequency not read`] };
  const warnings = [...parsed.warnings];
  const v = parsed.value.powerLineFrequency;
  if (v !== null && v !== 50 && v !== 60) warnings.push(`${name}: PowerLineFrequency ${v} Hz is neither 50 nor 60; not used`);
  return { powerLine: { hz: v === 50 || v === 60 ? mainsHz(v) : null, sidecar: name }, warnings, reference: parsed.value.reference ?? null };
}

async function readText(source: ByteSource): Promise<string> {
  return new TextDecoder('utf-8').decode(await source.read(0, source.size));
}


/** Electrode positions of an electrodes.tsv (mm; the unit from its coordsystem.json when given), named by base name. */
export async function readElectrodes(
  electrodes: ByteSource,
  coordsystem?: ByteSource,
): Promise<ParseResult<{ file: string; names: string[]; positionsMm: Float64Array }>> {
  const name = byteSourceBaseName(electrodes.name);
  const parsed = parseElectrodesTsv(await readText(electrodes), name, coordsystem ? await readText(coordsystem) : undefined);
  if (!parsed.ok) return parsed;
  return parseOk({ file: name, names: parsed.value.names, positionsMm: parsed.value.positionsMm }, parsed.warnings);
}

/**
 * When several recordings are given, the one a set of files is about: the BIDS data file (suffix `eeg`), or
 * `recording.edf`/`.bdf` as the simulator names its sensor data (next to e.g. `neural.edf`).
 */
function isPrimaryRecording(f: ByteSource): boolean {
  const p = bidsNameParts(f.name);
  return p.suffix === 'eeg' || recordingStem(byteSourceBaseName(f.name)).toLowerCase() === 'recording';
}

function pickRecording(files: ByteSource[], wanted: string | undefined): ParseResult<{ rec: ByteSource; ignored: string[] }> {
  const recordings = files.filter((f) => isRecordingFileName(f.name));
  const names = (list: ByteSource[]) => list.map((f) => byteSourceBaseName(f.name)).join(', ');
  let rec: ByteSource | undefined;
  if (wanted !== undefined) {
    // A file named explicitly is read whatever its extension (the reader judges the bytes).
    rec = files.find((f) => f.name === wanted) ?? recordings.find((f) => byteSourceBaseName(f.name) === wanted);
    if (!rec) return parseFail({ code: 'unsupported', message: `${wanted}: not among the given files (${names(files)})`, file: wanted });
  } else if (recordings.length === 1) rec = recordings[0];
  else if (recordings.filter(isPrimaryRecording).length === 1) rec = recordings.find(isPrimaryRecording);
  else if (recordings.length === 0)
    return parseFail({ code: 'unsupported', message: `${names(files) || '(no files)'}: no .edf or .bdf recording among the files` });
  else
    return parseFail({
      code: 'unsupported',
      message: `${byteSourceBaseName(recordings[0].name)}: ${recordings.length} recordings given (${names(recordings)}); choose one`,
      file: recordings[0].name,
    });
  if (!rec) return parseFail({ code: 'unsupported', message: '(no files): no .edf or .bdf recording among the files' });
  const chosen = rec;
  return parseOk({ rec, ignored: recordings.filter((f) => f !== chosen).map((f) => byteSourceBaseName(f.name)) });
}

/** channels.tsv applied to the file's channels: same count, every channel named (exact, else case-insensitive). */
function applyChannelsTsv(channels: readonly ChannelInfo[], rows: { name: string; type: ChannelInfo['type']; status: 'good' | 'bad' }[], name: string, recName: string): ParseResult<ChannelInfo[]> {
  if (rows.length !== channels.length)
    return parseFail({ code: 'row-count-mismatch', message: `${name}: ${rows.length} channel rows but ${recName} has ${channels.length} signal channels`, file: name });
  const used = new Set<number>();
  const updated: ChannelInfo[] = [];
  for (const ch of channels) {
    let j = rows.findIndex((r, k) => !used.has(k) && r.name === ch.label);
    if (j < 0) j = rows.findIndex((r, k) => !used.has(k) && r.name.toLowerCase() === ch.label.toLowerCase());
    if (j < 0)
      return parseFail({
        code: 'unknown-channel',
        message: `${name}: no row for channel "${ch.label}" of ${recName} (rows name ${rows.map((r) => r.name).join(', ')})`,
        file: name,
      });
    used.add(j);
    updated.push({ ...ch, type: rows[j].type, status: rows[j].status });
  }
  return parseOk(updated);
}

/** The main rate: most common among EEG-typed channels (ties: the higher rate; no EEG channels: among all). */
function mainRateOf(channels: readonly ChannelInfo[]): number {
  const eegRates = channels.filter((c) => c.type === 'EEG').map((c) => c.sampleRate);
  const pool = eegRates.length > 0 ? eegRates : channels.map((c) => c.sampleRate);
  const counts = new Map<number, number>();
  for (const r of pool) counts.set(r, (counts.get(r) ?? 0) + 1);
  let mainRate = 0;
  let best = -1;
  for (const [r, n] of counts) if (n > best || (n === best && r > mainRate)) [mainRate, best] = [r, n];
  return mainRate;
}

/** Reads and parses one sidecar; when it parses, its warnings join `warnings` and it is listed in `sidecars`. */
async function parseSidecar<T>(
  side: ByteSource,
  kind: PairedSidecar['kind'],
  parse: (text: string, fileName: string) => ParseResult<T>,
  warnings: string[],
  sidecars: PairedSidecar[],
): Promise<ParseResult<T>> {
  const name = byteSourceBaseName(side.name);
  const parsed = parse(await readText(side), name);
  if (parsed.ok) {
    warnings.push(...parsed.warnings);
    sidecars.push({ kind, file: name });
  }
  return parsed;
}

/** Reads the header, annotations and sidecars of the recording in `files` (no samples). Module comment: the rules. */
export async function openRecording(files: ByteSource[], opts: LoadRecordingOptions = {}): Promise<ParseResult<OpenedRecording>> {
  const picked = pickRecording(files, opts.recording);
  if (!picked.ok) return picked;
  const { rec, ignored } = picked.value;
  const progress = opts.onProgress;
  const infoRes = await readEdfInfo(rec, { onProgress: progress && ((f) => progress(0.3 * f)) });
  if (!infoRes.ok) return infoRes;
  const info = infoRes.value;
  const warnings = [...infoRes.warnings];
  const recName = byteSourceBaseName(rec.name);
  if (ignored.length > 0) warnings.push(`${recName}: loaded; ${ignored.join(', ')} ignored (one recording at a time)`);
  const ent = bidsNameParts(rec.name).entities;
  const given = opts.sidecars ?? {};
  let channels: ChannelInfo[] = info.channels.map((c) => ({ ...c }));
  const sidecars: PairedSidecar[] = [];
  let channelsReference: string | null = null;

  // channels.tsv: types and status
  const chSide = given.channels ?? pickSidecar(files, ent, 'channels', '.tsv');
  if (chSide) {
    const parsed = await parseSidecar(chSide, 'channels', parseChannelsTsv, warnings, sidecars);
    if (!parsed.ok) return parsed;
    const refs = [...new Set(parsed.value.filter((r) => r.type === 'EEG' && r.reference).map((r) => r.reference as string))];
    channelsReference = refs.length ? refs.join('; ') : null;
    const applied = applyChannelsTsv(channels, parsed.value, byteSourceBaseName(chSide.name), recName);
    if (!applied.ok) return applied;
    channels = applied.value;
  }

  // events: annotations + events.tsv (events.tsv wins on duplicates)
  let events: RecordingEvent[] = [...info.events];
  const evSide = given.events ?? pickSidecar(files, ent, 'events', '.tsv');
  if (evSide) {
    const parsed = await parseSidecar(evSide, 'events', parseEventsTsv, warnings, sidecars);
    if (!parsed.ok) return parsed;
    const fromTsv = parsed.value;
    events = events.filter(
      (a) => a.source !== 'annotation' || !fromTsv.some((t) => t.label === a.label && Math.abs(t.onset - a.onset) <= 1e-3),
    );
    events.push(...fromTsv);
    events.sort((a, b) => a.onset - b.onset);
  }

  // electrodes.tsv (with its coordsystem.json for the unit)
  let electrodes: OpenedRecording['electrodes'] = null;
  const elSide = given.electrodes ?? pickSidecar(files, ent, 'electrodes', '.tsv');
  if (elSide) {
    const cs = given.coordsystem ?? pickSidecar(files, { ...ent, ...bidsNameParts(elSide.name).entities }, 'coordsystem', '.json');
    const parsed = await readElectrodes(elSide, cs);
    if (!parsed.ok) return parsed;
    warnings.push(...parsed.warnings);
    electrodes = parsed.value;
    sidecars.push({ kind: 'electrodes', file: parsed.value.file });
    if (cs) sidecars.push({ kind: 'coordsystem', file: byteSourceBaseName(cs.name) });
  }

  // mains frequency from *_eeg.json
  const mains = await readPowerLine(files, rec.name);
  warnings.push(...mains.warnings);
  if (mains.powerLine.sidecar) sidecars.push({ kind: 'eeg', file: mains.powerLine.sidecar });
  const reference: RecordingReference = { channels: channelsReference, eegJson: mains.reference ?? null };

  return parseOk(
    { source: rec, info: { ...info, channels, events }, mainRate: mainRateOf(channels), electrodes, powerLine: mains.powerLine, sidecars, reference, warnings },
    warnings,
  );
}

/**
 * Unit positions for the block's channels: electrodes.tsv projected onto the sphere fitted to it
 * (sphere-fit.ts), else the idealised 10-20/10-10 set. Only EEG-typed channels get one; NaN rows otherwise.
 */
function blockPositions(opened: OpenedRecording, block: readonly ChannelInfo[]): { positions: Float64Array; unmatched: string[] } {
  const eeg = block.map((c, j) => ({ c, j })).filter((x) => x.c.type === 'EEG');
  const positions = new Float64Array(block.length * 3).fill(NaN);
  const found = opened.electrodes
    ? electrodeDirections(eeg.map((x) => x.c.label), opened.electrodes.names, opened.electrodes.positionsMm)
    : (() => {
        const m = matchMontage(eeg.map((x) => x.c.label));
        return { positions: m.positions, missing: m.unmatched };
      })();
  eeg.forEach((x, i) => positions.set(found.positions.subarray(3 * i, 3 * i + 3), 3 * x.j));
  return { positions, unmatched: found.missing };
}

/**
 * The samples of the channels at one rate (default the main rate) with their positions: the LoadedRecording
 * every analysis starts from. Channels at other rates stay listed in `channels`; a warning names them.
 */
export async function readRecordingSignals(opened: OpenedRecording, opts: ReadSignalsOptions = {}): Promise<ParseResult<LoadedRecording>> {
  const { info, source } = opened;
  const recName = byteSourceBaseName(source.name);
  const rate = opts.sampleRate ?? opened.mainRate;
  const warnings = [...opened.warnings];
  const loaded = info.channels.filter((c) => c.sampleRate === rate);
  if (loaded.length === 0 && info.channels.length > 0)
    return parseFail({ code: 'unknown-channel', message: `${recName}: no channel at ${rate} Hz (the file has ${[...new Set(info.channels.map((c) => c.sampleRate))].join(', ')} Hz)`, file: recName });
  const others = info.channels.filter((c) => c.sampleRate !== rate);
  if (others.length > 0)
    warnings.push(`${recName}: ${others.map((c) => `${c.label} (${c.sampleRate} Hz)`).join(', ')} not loaded; the ${opts.sampleRate === undefined ? 'main ' : ''}rate is ${rate} Hz`);
  const sig = await readEdfSignals(source, info, { channels: loaded.map((c) => c.label), onProgress: opts.onProgress, allocate: opts.allocate });
  if (!sig.ok) return sig;
  // Labels may repeat in a file; readEdfSignals matches the first, so keep the block's own labels.
  const signals = sig.value;
  const { positions, unmatched } = blockPositions(opened, loaded);
  if (unmatched.length > 0)
    warnings.push(
      `${recName}: no electrode position for ${unmatched.join(', ')} (${opened.electrodes ? `not in ${opened.electrodes.file}` : 'not a 10-20/10-10 name'})`,
    );
  return parseOk({ ...info, signals, positions, powerLine: opened.powerLine, sidecars: opened.sidecars, reference: opened.reference, warnings }, warnings);
}

/** Loads the recording in `files` with its sidecars and its main-rate samples. See the module comment. */
export async function loadRecording(files: ByteSource[], opts: LoadRecordingOptions = {}): Promise<ParseResult<LoadedRecording>> {
  const opened = await openRecording(files, opts);
  if (!opened.ok) return opened;
  const progress = opts.onProgress;
  return readRecordingSignals(opened.value, { onProgress: progress && ((f) => progress(0.3 + 0.7 * f)) });
}

/**
 * The channels a LoadedRecording's block does not hold, read from its file: one block per other rate, in
 * the file's channel order (what a cleaned copy needs to keep every channel).
 */
export async function readOtherRateBlocks(source: ByteSource, recording: RecordingInfo & { readonly signals: SignalBlock }): Promise<ParseResult<SignalBlock[]>> {
  const inBlock = new Set(recording.signals.labels);
  const others = recording.channels.filter((c) => !inBlock.has(c.label));
  const blocks: SignalBlock[] = [];
  for (const rate of [...new Set(others.map((c) => c.sampleRate))]) {
    const res = await readEdfSignals(source, recording, { channels: others.filter((c) => c.sampleRate === rate).map((c) => c.label) });
    if (!res.ok) return res;
    blocks.push(res.value);
  }
  return parseOk(blocks);
}

/** Streams samples of an opened recording chunk by chunk (what `winnow read` prints), without loading them all. */
export function streamRecordingSignals(opened: OpenedRecording, opts: EdfReadOptions): AsyncGenerator<ParseResult<EdfSignalChunk>> {
  return iterateEdfSignals(opened.source, opened.info, opts);
}
